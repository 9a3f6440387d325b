/**
 * Data files a note names (load tables as CSV): read relative to the note, and
 * only from inside its design repository (the git work tree holding the note,
 * or the note's folder outside git), so that a package never depends on a file
 * the repository does not keep.
 */
import { execFileSync } from 'node:child_process'
import { createHash } from 'node:crypto'
import { existsSync, readFileSync, realpathSync, statSync } from 'node:fs'
import { dirname, isAbsolute, relative, resolve, sep } from 'node:path'
import type { DataReader } from '../notes/block-kinds/kind.js'

/** Largest data file read, bytes: a load table, not a data set. */
const MAX_BYTES = 4 * 1024 * 1024

/** The design repository of a note: its git work tree, or its folder. */
export function repositoryRoot(notePath: string): string {
  const folder = dirname(resolve(notePath))
  try {
    const top = execFileSync('git', ['rev-parse', '--show-toplevel'], { cwd: folder, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim()
    if (top) return realpathSync(top)
  } catch {
    // Not in git: the note's own folder is the repository.
  }
  return realpathSync(folder)
}

/** A reader for the data files of the note at `notePath`. */
export function dataReader(notePath: string): DataReader {
  let root: string | null = null
  return (path) => {
    if (isAbsolute(path)) return { ok: false, reason: 'write the path relative to the note, so that the repository can move' }
    root ??= repositoryRoot(notePath)
    const full = resolve(dirname(resolve(notePath)), path)
    if (!existsSync(full)) return { ok: false, reason: 'no such file beside the note' }
    // Resolve links before the containment test, so that a link cannot lead outside.
    const real = realpathSync(full)
    const inside = relative(root, real)
    if (inside === '' || inside.startsWith('..') || isAbsolute(inside) || inside.split(sep)[0] === '..') {
      return { ok: false, reason: `it lies outside the design repository (${root}): keep the data the package depends on in the repository` }
    }
    const stat = statSync(real)
    if (!stat.isFile()) return { ok: false, reason: 'it is not a file' }
    if (stat.size > MAX_BYTES) return { ok: false, reason: `it has ${stat.size} bytes; a load table of at most ${MAX_BYTES} is read` }
    const bytes = readFileSync(real)
    return { ok: true, text: bytes.toString('utf8'), sha256: createHash('sha256').update(bytes).digest('hex') }
  }
}
