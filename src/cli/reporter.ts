/**
 * Messages for the terminal: `file:line:column  severity  reason  [rule]`, the
 * note's line with a caret under the place, and a count. Sorted by place.
 */
import { readFileSync, statSync } from 'node:fs'
import { relative } from 'node:path'
import { VFile } from 'vfile'
import type { VFileMessage } from 'vfile-message'
import { SOURCE } from '../notes/messages.js'
import { codeOf, type PathProblem } from './files.js'

/** Largest note read, bytes: a design note, not a data set. */
export const MAX_NOTE_BYTES = 2 * 1024 * 1024

/** A note's file read for evaluation, or an empty file and why it could not be read. */
export function noteFile(path: string, shown: string): { file: VFile; problem: string | null } {
  try {
    const size = statSync(path).size
    if (size > MAX_NOTE_BYTES) return { file: new VFile({ path: shown, value: '' }), problem: `it has ${size} bytes; a note of at most ${MAX_NOTE_BYTES} bytes is read (put data in load files)` }
    return { file: new VFile({ path: shown, value: readFileSync(path, 'utf8') }), problem: null }
  } catch (error) {
    return { file: new VFile({ path: shown, value: '' }), problem: `the file cannot be read (${codeOf(error)})` }
  }
}

/** A path that could not be taken as a note, as a file with one message at 1:1. */
export function pathProblemFile(problem: PathProblem, reason: string, fatal: boolean): VFile {
  const file = new VFile({ path: relative(process.cwd(), problem.path) || problem.path, value: '' })
  file.message(reason, { place: { line: 1, column: 1 }, ruleId: 'unreadable-note', source: SOURCE }).fatal = fatal
  return file
}

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
      // A file that could not be read has no line to show.
      if (line !== undefined && String(file.value ?? '') !== '') {
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
