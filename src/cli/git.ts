/**
 * The one question the tool asks git: the date of a note's last commit, for
 * `date: git` (build and check ask it the same way).
 */
import { execFileSync } from 'node:child_process'
import { basename, dirname } from 'node:path'

/** Date of the note's last commit (YYYY-MM-DD), or null when it is not committed or git is missing. */
export function gitDate(path: string): string | null {
  try {
    const date = execFileSync('git', ['log', '-1', '--format=%cs', '--', basename(path)], {
      cwd: dirname(path),
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'ignore'],
    }).trim()
    return /^\d{4}-\d{2}-\d{2}$/.test(date) ? date : null
  } catch {
    return null
  }
}

/** The work tree holding `path`, or null outside git. */
export function workTree(path: string): string | null {
  try {
    return execFileSync('git', ['rev-parse', '--show-toplevel'], { cwd: dirname(path), encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim() || null
  } catch {
    return null
  }
}

/** A file's bytes at a revision (`git show REV:path`), or null when it is not there; touches nothing. */
export function fileAt(top: string, revision: string, pathInTree: string): Buffer | null {
  try {
    return execFileSync('git', ['show', `${revision}:${pathInTree}`], { cwd: top, stdio: ['ignore', 'pipe', 'ignore'], maxBuffer: 16 * 1024 * 1024 })
  } catch {
    return null
  }
}

/** The commit a revision names (short), or null. */
export function commitOf(top: string, revision: string): string | null {
  try {
    return execFileSync('git', ['rev-parse', '--short=12', '--verify', `${revision}^{commit}`], { cwd: top, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim()
  } catch {
    return null
  }
}
