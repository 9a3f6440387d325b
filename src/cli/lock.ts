/**
 * One build at a time per output folder: a lock file created exclusively in
 * the folder, holding the builder's process id. A second build waits for the
 * first; a lock left by a process that no longer runs (killed) is taken over.
 */
import { openSync, closeSync, readFileSync, rmSync, writeSync } from 'node:fs'
import { join } from 'node:path'
import { codeOf, processAlive } from './files.js'

/** The lock's file name inside the output folder. */
export const LOCK_FILE = '.linkwright-build.lock'

/** A held lock. */
export interface BuildLock {
  release(): void
}

/** Held locks, released if the process is stopped. */
const held = new Set<string>()

/** Release every lock this process holds (on a signal). Synchronous. */
export function releaseHeldLocks(): void {
  for (const path of held) rmSync(path, { force: true })
  held.clear()
}

const pause = (ms: number) => new Promise<void>((done) => setTimeout(done, ms))

/**
 * Take the lock of `outDir` (which must exist), waiting up to `waitMs` for
 * another build to finish. `waiting` is called once, with the other build's
 * process id, when this build has to wait. Throws when the wait runs out.
 */
export async function lockOutput(outDir: string, options: { waitMs?: number; waiting?: (pid: number) => void } = {}): Promise<BuildLock> {
  const path = join(outDir, LOCK_FILE)
  const deadline = Date.now() + (options.waitMs ?? 10 * 60_000)
  let told = false
  for (;;) {
    try {
      const fd = openSync(path, 'wx')
      try {
        writeSync(fd, `${process.pid}\n`)
      } finally {
        closeSync(fd)
      }
      held.add(path)
      return {
        release() {
          if (held.delete(path)) rmSync(path, { force: true })
        },
      }
    } catch (error) {
      if (codeOf(error) !== 'EEXIST') throw error
    }
    let pid = Number.NaN
    try {
      pid = Number(readFileSync(path, 'utf8').trim())
    } catch {
      continue // released meanwhile
    }
    if (!processAlive(pid)) {
      // Left by a killed build (or half-written just now: then the owner is alive and rewrites it).
      if (Number.isNaN(pid)) await pause(50)
      try {
        const again = Number(readFileSync(path, 'utf8').trim())
        if (!processAlive(again)) rmSync(path, { force: true })
      } catch {
        // gone already
      }
      continue
    }
    if (!told) {
      told = true
      options.waiting?.(pid)
    }
    if (Date.now() > deadline) throw new Error(`another build (process ${pid}) has held ${path} for too long`)
    await pause(200)
  }
}
