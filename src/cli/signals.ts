/**
 * Ctrl-C, SIGTERM and SIGHUP: undo what is half done (staged package folders,
 * the build lock, a running browser and its profile), say so in one line, and
 * exit with 128 + the signal number. Everything here is synchronous, so it
 * finishes before the process ends. SIGKILL cannot be caught: what it leaves
 * is tidied at the next start (see `recoverFolder`, `lockOutput`,
 * `removeStaleProfiles`).
 */

const cleanups = new Set<() => void>()

/** Run `fn` if the process is stopped by a signal; returns the function that unregisters it. */
export function onStop(fn: () => void): () => void {
  cleanups.add(fn)
  return () => cleanups.delete(fn)
}

const NUMBERS: Readonly<Record<string, number>> = { SIGHUP: 1, SIGINT: 2, SIGTERM: 15 }

let installed = false

/** Install the handlers (once). */
export function handleStopSignals(err: (text: string) => void): void {
  if (installed) return
  installed = true
  for (const signal of Object.keys(NUMBERS) as NodeJS.Signals[]) {
    process.on(signal, () => {
      for (const fn of [...cleanups].reverse()) {
        try {
          fn()
        } catch {
          // Go on with the others: each undoes its own part.
        }
      }
      cleanups.clear()
      err(`linkwright: stopped by ${signal}; the previous packages are as they were\n`)
      process.exit(128 + NUMBERS[signal]!)
    })
  }
}
