/**
 * Parallel builds: the notes built in worker threads give exactly the bytes a
 * serial build gives (LINKWRIGHT_WORKERS=1), messages in the notes' order, and
 * a note that fails in a worker fails alone.
 */
import { spawnSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'

const root = new URL('../../', import.meta.url).pathname
const bin = join(root, 'bin', 'linkwright.js')

function files(dir: string, prefix = ''): Map<string, string> {
  const out = new Map<string, string>()
  for (const e of readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
    if (e.name === '.cache') continue
    if (e.isDirectory()) for (const [k, v] of files(join(dir, e.name), `${prefix}${e.name}/`)) out.set(k, v)
    else out.set(`${prefix}${e.name}`, readFileSync(join(dir, e.name)).toString('base64'))
  }
  return out
}

describe('parallel builds', () => {
  it('should give the bytes of a serial build, with the messages in the notes’ order', () => {
    const dir = mkdtempSync(join(tmpdir(), 'linkwright-parallel-'))
    mkdirSync(join(dir, 'notes', 'data'), { recursive: true })
    const demo = readFileSync(join(root, 'reports', 'sieve-rocker.md'), 'utf8')
    // Ten notes (enough for two worker threads), one of them with an error.
    for (let i = 0; i < 10; i++) writeFileSync(join(dir, 'notes', `n${i}.md`), i === 6 ? demo.replace(/^number: .*$/m, 'number: [broken') : demo.replace(/^number: (.*)$/m, `number: $1-${i}`))
    const run = (workers: string, out: string) => spawnSync(process.execPath, [bin, 'build', 'notes', '--out', out, '--no-pdf'], { cwd: dir, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', LINKWRIGHT_WORKERS: workers } })
    const parallel = run('2', 'parallel')
    const serial = run('1', 'serial')
    expect(parallel.status).toBe(1)
    expect(serial.status).toBe(1)
    expect(files(join(dir, 'parallel'))).toEqual(files(join(dir, 'serial')))
    expect(parallel.stderr.replaceAll('parallel/', '')).toBe(serial.stderr.replaceAll('serial/', ''))
    expect(parallel.stdout.replaceAll('parallel/', '')).toBe(serial.stdout.replaceAll('serial/', ''))
    expect(parallel.stderr).toMatch(/^notes\/n6\.md:\d+:\d+ {2}error/m)
    expect(parallel.stdout).toMatch(/^built 9, unchanged 0, not built 1 of 10 notes$/m)
  })
})
