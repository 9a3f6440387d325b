/**
 * Messages for the terminal: `file:line:column  severity  reason  [rule]`, the
 * note's line with a caret under the place, and a count. Sorted by place.
 */
import type { VFile } from 'vfile'
import type { VFileMessage } from 'vfile-message'

/** Severity word of a vfile message. */
function severity(message: VFileMessage): string {
  return message.fatal === true ? 'error' : message.fatal === false ? 'warning' : 'info'
}

/** Report the messages of several files as text. */
export function report(files: readonly VFile[], options: { quiet?: boolean } = {}): string {
  const lines: string[] = []
  let errors = 0
  let warnings = 0
  for (const file of files) {
    const messages = [...file.messages]
      .filter((m) => !options.quiet || m.fatal === true)
      .sort((a, b) => (a.line ?? 0) - (b.line ?? 0) || (a.column ?? 0) - (b.column ?? 0) || severity(a).localeCompare(severity(b)))
    const sourceLines = String(file.value ?? '').split(/\r?\n/)
    for (const message of messages) {
      if (message.fatal === true) errors++
      else if (message.fatal === false) warnings++
      const where = `${file.path}:${message.line ?? 1}:${message.column ?? 1}`
      lines.push(`${where}  ${severity(message)}  ${message.reason}${message.ruleId ? `  [${message.ruleId}]` : ''}`)
      const line = message.line ? sourceLines[message.line - 1] : undefined
      if (line !== undefined) {
        const number = String(message.line)
        lines.push(`  ${number} | ${line}`)
        const start = Math.max(1, message.column ?? 1)
        const end = message.place && 'end' in message.place && message.place.end.line === message.line ? Math.max(start + 1, message.place.end.column) : start + 1
        lines.push(`  ${' '.repeat(number.length)} | ${' '.repeat(start - 1)}${'^'.repeat(Math.min(end - start, Math.max(1, line.length - start + 1)))}`)
      }
    }
  }
  if (errors + warnings > 0) lines.push(`${errors} error${errors === 1 ? '' : 's'}, ${warnings} warning${warnings === 1 ? '' : 's'}`)
  return lines.length > 0 ? `${lines.join('\n')}\n` : ''
}
