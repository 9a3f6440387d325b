/**
 * `linkwright compare note.md REV [REV2]`: the note at two git revisions (or a
 * revision and the working tree), each evaluated with the data files of its
 * own revision, and what moved between them: inputs (from → to, as shown),
 * results (with the relative change), checks whose status changed, blocks
 * added or removed. Reads with `git show`; touches nothing in the repository.
 * On the terminal, or as JSON with --json. Exit 0 when nothing moved, 1 when
 * something did, 2 for a wrong command line or revision.
 */
import { createHash } from 'node:crypto'
import { existsSync, readFileSync } from 'node:fs'
import { dirname, isAbsolute, join, relative, resolve, sep } from 'node:path'
import { VFile } from 'vfile'
import type { DataReader } from '../notes/block-kinds/kind.js'
import { readNote } from '../notes/note.js'
import { resultsDocument } from '../notes/results-json.js'
import { TOOL } from '../version.js'
import { dataReader } from './data-files.js'
import { commitOf, fileAt, workTree } from './git.js'
import { report } from './reporter.js'
import { changeLine, diffResults, type ResultsDoc } from './results-diff.js'

/** A reader of data files as they were at a revision (relative to the note, inside the work tree). */
function readerAt(top: string, revision: string, noteInTree: string): DataReader {
  return (path) => {
    if (isAbsolute(path)) return { ok: false, reason: 'write the path relative to the note' }
    const inTree = join(dirname(noteInTree), path).split(sep).join('/')
    if (inTree.startsWith('..')) return { ok: false, reason: 'it lies outside the design repository' }
    const bytes = fileAt(top, revision, inTree)
    if (bytes === null) return { ok: false, reason: `no such file at ${revision}` }
    return { ok: true, text: bytes.toString('utf8'), sha256: createHash('sha256').update(bytes).digest('hex') }
  }
}

/**
 * The results document of a note at a revision (or, with `revision` undefined,
 * in the working tree), evaluated with that revision's data files; or why not.
 */
export function resultsAt(notePath: string, revision: string | undefined, err: (text: string) => void = () => undefined): { doc: ResultsDoc; label: string } | string {
  const top = existsSync(dirname(resolve(notePath))) ? workTree(resolve(notePath)) : null
  if (top === null) return `${notePath} is not in a git work tree`
  const noteInTree = relative(top, resolve(notePath)).split(sep).join('/')
  const shown = relative(process.cwd(), notePath) || notePath
  let text: string
  let readData: DataReader
  let label: string
  if (revision === undefined) {
    if (!existsSync(notePath)) return `${notePath} is not in the working tree`
    text = readFileSync(notePath, 'utf8')
    readData = dataReader(notePath)
    label = 'working tree'
  } else {
    const commit = commitOf(top, revision)
    if (commit === null) return `\`${revision}\` is not a revision of this repository`
    const bytes = fileAt(top, commit, noteInTree)
    if (bytes === null) return `${noteInTree} is not in ${revision}`
    text = bytes.toString('utf8')
    readData = readerAt(top, commit, noteInTree)
    label = `${revision} (${commit})`
  }
  const file = new VFile({ path: `${shown} at ${label}`, value: text })
  // Both sides are evaluated by this tool: the comparison is of the note, not of two builds.
  const { model } = readNote(file, TOOL, { gitDate: () => null, readData })
  if (file.messages.some((m) => m.fatal === true)) {
    err(report([file]))
    return `the note at ${label} has errors, so it cannot be compared`
  }
  return { doc: resultsDocument(model, file, shown, model.date) as ResultsDoc, label }
}

/** Run the compare command; returns the exit code. */
export function compareCommand(args: readonly string[], json: boolean, out: (text: string) => void, err: (text: string) => void): number {
  if (args.length < 2 || args.length > 3) {
    err('linkwright compare: give the note and one or two revisions: linkwright compare note.md C [D] (without D, the working tree)\n')
    return 2
  }
  const [notePath, from, to] = args as [string, string, string | undefined]
  const shown = relative(process.cwd(), notePath) || notePath
  const side = (revision: string | undefined) => resultsAt(notePath, revision, err)
  const a = side(from)
  if (typeof a === 'string') {
    err(`linkwright compare: ${a}\n`)
    return 2
  }
  const b = side(to)
  if (typeof b === 'string') {
    err(`linkwright compare: ${b}\n`)
    return 2
  }
  const { changes } = diffResults(a.doc, b.doc)
  // Both sides were computed by this tool now: its own identity is no change of the note's.
  const moved = changes.filter((c) => c.what !== 'tool')
  if (json) out(`${JSON.stringify({ note: shown, from: a.label, to: b.label, changes: moved }, null, 2)}\n`)
  else if (moved.length === 0) out(`${shown}: nothing moved from ${a.label} to ${b.label}\n`)
  else out(`${shown}: from ${a.label} to ${b.label}\n${moved.map((c) => `  ${changeLine(c)}`).join('\n')}\n`)
  return moved.length === 0 ? 0 : 1
}
