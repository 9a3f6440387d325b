/**
 * Git holds the project's own sources and the lock file only: no downloaded
 * wheels, binaries or build output.
 */
import { execFileSync } from 'node:child_process'
import { statSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'

const root = join(import.meta.dirname, '..', '..')
const LIMIT = 1024 * 1024

describe('the repository', () => {
  it('should track no file over 1 MB', () => {
    const tracked = execFileSync('git', ['ls-files', '-z'], { cwd: root, encoding: 'utf8' }).split('\0').filter(Boolean)
    expect(tracked.length).toBeGreaterThan(20)
    const large = tracked.filter((path) => {
      try {
        return statSync(join(root, path)).size > LIMIT
      } catch {
        return false
      }
    })
    expect(large).toEqual([])
  })

  it('should track no built or downloaded artefacts', () => {
    const tracked = execFileSync('git', ['ls-files'], { cwd: root, encoding: 'utf8' }).split('\n').filter(Boolean)
    const artefacts = tracked.filter((p) => /^(dist|out|node_modules|test-artifacts)\//.test(p) || /\.(whl|tgz|zip|so|dll|exe|pdf)$/i.test(p))
    expect(artefacts).toEqual([])
  })
})
