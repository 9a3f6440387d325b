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
