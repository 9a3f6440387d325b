/**
 * `linkwright verify note.md package`: recompute a note and compare it with a
 * built package (its folder or its results.json), as a checker does before
 * relying on a signature. Match, or exactly what differs: the note edited, a
 * data file changed, the tool changed (version or build), results moved or
 * checks changed. The exit status says which: 0 match; otherwise 16 plus the
 * sum of 1 (note edited), 2 (data file changed), 4 (tool changed), 8 (results
 * or checks differ); 1 when the note cannot be evaluated; 2 for a wrong
 * command line.
 */
import { existsSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { readNote } from '../notes/note.js'
import { resultsDocument } from '../notes/results-json.js'
import { TOOL } from '../version.js'
import { dataReader } from './data-files.js'
import { gitDate } from './git.js'
import { noteFile, report } from './reporter.js'
import { changeLine, diffResults, type ResultsDoc } from './results-diff.js'
import { toolWithBuild } from './tool-build.js'

/** Run the verify command; returns the exit code. */
export function verifyCommand(paths: readonly string[], out: (text: string) => void, err: (text: string) => void): number {
  if (paths.length !== 2) {
    err('linkwright verify: give the note and its package (folder or results.json): linkwright verify note.md out/note\n')
    return 2
  }
  const [notePath, target] = paths as [string, string]
  const resultsPath = existsSync(target) && statSync(target).isDirectory() ? join(target, 'results.json') : target
  let saved: ResultsDoc
  try {
    saved = JSON.parse(readFileSync(resultsPath, 'utf8')) as ResultsDoc
  } catch (error) {
    err(`linkwright verify: cannot read ${resultsPath} (${error instanceof Error ? error.message : String(error)})\n`)
    return 2
  }
  const shown = relative(process.cwd(), notePath) || notePath
  const read = noteFile(notePath, shown)
  if (read.problem !== null) {
    err(`linkwright verify: cannot read ${notePath}: ${read.problem}\n`)
    return 2
  }
  const { model } = readNote(read.file, toolWithBuild(TOOL), { gitDate: () => gitDate(notePath), readData: dataReader(notePath) })
  if (read.file.messages.some((m) => m.fatal === true)) {
    err(report([read.file]))
    err('linkwright verify: the note has errors, so it cannot be compared\n')
    return 1
  }
  const now = resultsDocument(model, read.file, shown, model.date) as ResultsDoc
  if (now.fingerprint === saved.fingerprint) {
    out(`${shown}: matches ${resultsPath} (fingerprint ${now.fingerprint!.slice(0, 16)})\n`)
    return 0
  }
  const { changes, bits } = diffResults(saved, now)
  const lines = [`fingerprint: ${saved.fingerprint?.slice(0, 16) ?? 'none'} → ${now.fingerprint!.slice(0, 16)}`, ...changes.map(changeLine)]
  out(`${shown}: differs from ${resultsPath}\n${lines.map((l) => `  ${l}`).join('\n')}\n`)
  return 16 + bits
}
