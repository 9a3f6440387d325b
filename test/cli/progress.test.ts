/**
 * The progress line of a multi-note build: redrawn in place on a terminal;
 * nothing at all (no escape codes) when the output is not a terminal, with
 * NO_COLOR, with --quiet, or for fewer than three notes.
 */
import { describe, expect, it } from 'vitest'
import { progressLine } from '../../src/cli/progress.js'

function stream(isTTY: boolean) {
  let written = ''
  const write = (t: string) => {
    written += t
    return true
  }
  return { written: () => written, stream: { isTTY, columns: 40, write } as unknown as NodeJS.WriteStream }
}

describe('the progress line', () => {
  it('should redraw one line on a terminal and clear it at the end', () => {
    const s = stream(true)
    const report = progressLine(3, false, s.stream, {})
    report('notes/a.md')
    report('notes/b.md')
    report(null)
    expect(s.written()).toBe('\r\u001b[2Kbuilt 1 of 3: notes/a.md\r\u001b[2Kbuilt 2 of 3: notes/b.md\r\u001b[2K')
  })

  it('should write nothing when not a terminal, with NO_COLOR, when quiet, or for two notes', () => {
    for (const [tty, quiet, env, total] of [[false, false, {}, 5], [true, false, { NO_COLOR: '1' }, 5], [true, true, {}, 5], [true, false, {}, 2]] as const) {
      const s = stream(tty)
      const report = progressLine(total, quiet, s.stream, env)
      report('notes/a.md')
      report(null)
      expect(s.written()).toBe('')
    }
  })
})
