/**
 * Progress of a multi-note build on a terminal: one line redrawn in place
 * (`building 12 of 200: notes/pump.md`). Nothing when the output is not a
 * terminal, with NO_COLOR, with --quiet, or for fewer than three notes: plain
 * logs stay free of escape codes.
 */

/** A progress reporter: call with each finished note's name, and with null at the end. */
export function progressLine(total: number, quiet: boolean, stream: NodeJS.WriteStream = process.stderr, env: NodeJS.ProcessEnv = process.env): (name: string | null) => void {
  const live = !quiet && total >= 3 && stream.isTTY === true && !env.NO_COLOR && env.TERM !== 'dumb'
  let done = 0
  return (name) => {
    if (!live) return
    if (name === null) {
      stream.write('\r\u001b[2K')
      return
    }
    done++
    const columns = stream.columns ?? 80
    stream.write(`\r\u001b[2K${`built ${done} of ${total}: ${name}`.slice(0, Math.max(10, columns - 1))}`)
  }
}
