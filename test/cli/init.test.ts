/**
 * `linkwright init`: a starter design repository whose note builds at once,
 * with its checks passing, and a second init that overwrites nothing.
 */
import { execFileSync, spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'

const bin = join(new URL('../../', import.meta.url).pathname, 'bin', 'linkwright.js')
const run = (args: readonly string[], cwd: string) => spawnSync(process.execPath, [bin, ...args], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } })

describe('linkwright init', () => {
  it('should write a starter note that builds, its checks passing, dated from git', () => {
    const dir = mkdtempSync(join(tmpdir(), 'linkwright-init-'))
    execFileSync('git', ['init', '-q'], { cwd: dir })
    expect(run(['init'], dir).status).toBe(0)
    execFileSync('git', ['add', '.'], { cwd: dir })
    execFileSync('git', ['-c', 'user.name=T', '-c', 'user.email=t@example.org', 'commit', '-q', '-m', 'start'], { cwd: dir })
    const built = run(['build', 'notes', '--no-pdf'], dir)
    expect(built.stderr).not.toMatch(/ error /)
    expect(built.status).toBe(0)
    expect(built.stdout).toMatch(/^notes\/crank-drive\.md: out\/crank-drive\/index\.html \(2 of 2 checks pass\)$/m)
    const results = JSON.parse(readFileSync(join(dir, 'out', 'crank-drive', 'results.json'), 'utf8'))
    expect(results.document.date).toMatch(/^\d{4}-\d{2}-\d{2}$/)
    expect(readFileSync(join(dir, '.gitignore'), 'utf8')).toMatch(/^out\/$/m)
  })

  it('should leave files that are there as they are', () => {
    const dir = mkdtempSync(join(tmpdir(), 'linkwright-init-again-'))
    run(['init'], dir)
    writeFileSync(join(dir, 'notes', 'crank-drive.md'), 'my own note')
    const again = run(['init'], dir)
    expect(again.status).toBe(0)
    expect(again.stdout).toMatch(/notes\/crank-drive\.md: there already, left as it is/)
    expect(readFileSync(join(dir, 'notes', 'crank-drive.md'), 'utf8')).toBe('my own note')
  })
})
