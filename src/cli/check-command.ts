/**
 * `linkwright check`: evaluate notes and their acceptance checks, print every
 * problem, every FAIL and every check that could not be evaluated, exit
 * non-zero on any of them (informative checks are shown, never failing). Loads no renderer.
 */
import { readFileSync } from 'node:fs'
import { relative } from 'node:path'
import { VFile } from 'vfile'
import { CAUTION } from '../notes/caution.js'
import { readNote } from '../notes/note.js'
import { failuresFirst, tallyChecks, tallyWords } from '../notes/tally.js'
import { TOOL } from '../version.js'
import { findNotes } from './files.js'
import { dataReader } from './data-files.js'
import { gitDate } from './git.js'
import { report } from './reporter.js'

/** Options of the check command. */
export interface CheckOptions {
  readonly paths: readonly string[]
  readonly quiet: boolean
}

/** Run the check command; returns the exit code. */
export function checkCommand(options: CheckOptions, out: (text: string) => void, err: (text: string) => void): number {
  const { notes, missing } = findNotes(options.paths)
  for (const path of missing) err(`linkwright: cannot find ${path}\n`)
  if (notes.length === 0) {
    err(`linkwright: no notes (.md) found in ${options.paths.join(', ')}\n`)
    return missing.length > 0 ? 2 : 1
  }
  let failed = false
  const files: VFile[] = []
  for (const path of notes) {
    const file = new VFile({ path: relative(process.cwd(), path) || path, value: readFileSync(path, 'utf8') })
    const { model } = readNote(file, TOOL, { gitDate: () => gitDate(path), readData: dataReader(path) })
    files.push(file)
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
