/**
 * `linkwright check`: evaluate notes and their acceptance checks, print every
 * problem and every FAIL, exit non-zero on either. Loads no renderer.
 */
import { readFileSync } from 'node:fs'
import { relative } from 'node:path'
import { VFile } from 'vfile'
import { readNote } from '../notes/note.js'
import { TOOL } from '../version.js'
import { findNotes } from './files.js'
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
    const { model } = readNote(file, TOOL)
    files.push(file)
    if (file.messages.some((m) => m.fatal === true)) failed = true
    const failing = model.checks.filter((c) => !c.passed)
    if (failing.length > 0) failed = true
    if (!options.quiet || failing.length > 0) {
      const passedCount = model.checks.length - failing.length
      out(`${file.path}: ${passedCount} of ${model.checks.length} checks pass\n`)
    }
    for (const c of failing) {
      out(`${file.path}:${c.line}  FAIL  ${c.label}: ${c.actual}, limit ${c.limit} (margin ${c.margin})${c.source ? `  — ${c.source}` : ''}\n`)
    }
  }
  err(report(files, { quiet: options.quiet }))
  return failed || missing.length > 0 ? 1 : 0
}
