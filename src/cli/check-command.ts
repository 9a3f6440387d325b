/**
 * `linkwright check`: evaluate notes and their acceptance checks, print every
 * problem, every FAIL and every check that could not be evaluated, exit
 * non-zero on any of them (informative checks are shown, never failing). Loads no renderer.
 */
import { relative } from 'node:path'
import type { VFile } from 'vfile'
import { CAUTION } from '../notes/caution.js'
import { readNote } from '../notes/note.js'
import { failuresFirst, tallyChecks, tallyWords } from '../notes/tally.js'
import { TOOL } from '../version.js'
import { toolWithBuild } from './tool-build.js'
import { findNotes } from './files.js'
import { dataReader } from './data-files.js'
import { gitDate } from './git.js'
import { messages, SOURCE } from '../notes/messages.js'
import { noteFile, pathProblemFile, report } from './reporter.js'

/** Options of the check command. */
export interface CheckOptions {
  readonly paths: readonly string[]
  readonly quiet: boolean
}

/** Run the check command; returns the exit code. */
export function checkCommand(options: CheckOptions, out: (text: string) => void, err: (text: string) => void): number {
  const { notes, missing, problems } = findNotes(options.paths)
  for (const path of missing) err(`linkwright: cannot find ${path}\n`)
  const files: VFile[] = problems.map((p) => pathProblemFile(p, messages['unreadable-note'](p.reason), p.fatal !== false))
  let failed = files.some((f) => f.messages.some((m) => m.fatal === true))
  if (notes.length === 0) {
    err(`linkwright: no notes (.md) found in ${options.paths.join(', ')}\n`)
    err(report(files, { quiet: options.quiet }))
    return missing.length > 0 ? 2 : 1
  }
  for (const path of notes) {
    const read = noteFile(path, relative(process.cwd(), path) || path)
    const file = read.file
    if (read.problem !== null) {
      file.message(messages['unreadable-note'](read.problem), { place: { line: 1, column: 1 }, ruleId: 'unreadable-note', source: SOURCE }).fatal = true
      files.push(file)
      failed = true
      continue
    }
    files.push(file)
    let model: ReturnType<typeof readNote>['model']
    try {
      model = readNote(file, toolWithBuild(TOOL), { gitDate: () => gitDate(path), readData: dataReader(path) }).model
    } catch (error) {
      // A bug, not a bad note: say so with the note's name and go on with the others.
      file.message(messages['internal-error'](error instanceof Error ? error.message : String(error)), { place: { line: 1, column: 1 }, ruleId: 'internal-error', source: SOURCE }).fatal = true
      failed = true
      continue
    }
    if (file.messages.some((m) => m.fatal === true)) failed = true
    const tally = tallyChecks(model.checks)
    if (!tally.gatePasses) failed = true
    const shown = failuresFirst(model.checks).filter((c) => c.status !== 'pass')
    if (!options.quiet || shown.some((c) => !c.informative)) out(`${file.path}: ${tallyWords(tally)}\n`)
    for (const c of shown) {
      if (options.quiet && c.informative) continue
      const mark = c.status === 'fail' ? 'FAIL' : 'NOT EVALUATED'
      const detail = c.status === 'fail' ? `${c.actual}, limit ${c.limit} (margin ${c.margin})` : (c.reason ?? '')
      out(`${file.path}:${c.line}  ${mark}${c.informative ? ' (informative)' : ''}  ${c.label}: ${detail}${c.source ? `  — ${c.source}` : ''}\n`)
    }
  }
  if (!options.quiet) out(`\nCaution: ${CAUTION}\n`)
  err(report(files, { quiet: options.quiet }))
  return failed || missing.length > 0 ? 1 : 0
}
