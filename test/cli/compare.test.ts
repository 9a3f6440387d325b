/**
 * `linkwright compare` on a scripted git repository with two revisions: the
 * changes it reports are exactly the edits made (one input, one data file,
 * one block added), with the results and the check they moved; nothing in the
 * repository is touched; the working tree compares against a revision too.
 */
import { execFileSync, spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'

const root = new URL('../../', import.meta.url).pathname
const bin = join(root, 'bin', 'linkwright.js')

const NOTE = (crank: string, extra = '') => `---
title: Compared note
number: T-5
revision: A
status: draft
date: 2026-01-05
---

\`\`\`slider-crank #drive
crank: ${crank}
rod: 200 mm
speed: 100 rpm
\`\`\`

\`\`\`forces #push
of: drive
load_file: data/load.csv
slider_mass: 1 kg
\`\`\`

\`\`\`checks
stroke: drive.stroke >= 85 mm
\`\`\`
${extra}`

function repository(): string {
  const dir = mkdtempSync(join(tmpdir(), 'linkwright-compare-'))
  const git = (...args: string[]) => execFileSync('git', args, { cwd: dir, stdio: 'pipe', env: { ...process.env, GIT_AUTHOR_NAME: 'T', GIT_AUTHOR_EMAIL: 't@example.org', GIT_COMMITTER_NAME: 'T', GIT_COMMITTER_EMAIL: 't@example.org' } })
  git('init', '-q')
  execFileSync('mkdir', ['-p', join(dir, 'data')])
  writeFileSync(join(dir, 'note.md'), NOTE('40 mm'))
  writeFileSync(join(dir, 'data', 'load.csv'), 'travel (mm), force (N)\n0, 100\n80, 100\n')
  git('add', '.')
  git('commit', '-q', '-m', 'revision A')
  git('tag', 'A')
  writeFileSync(join(dir, 'note.md'), NOTE('45 mm', '\n```design-inputs #extra\nmargin: 5 mm\n```\n'))
  writeFileSync(join(dir, 'data', 'load.csv'), 'travel (mm), force (N)\n0, 100\n90, 130\n')
  git('add', '.')
  git('commit', '-q', '-m', 'revision B')
  git('tag', 'B')
  return dir
}

function run(args: readonly string[], cwd: string) {
  const r = spawnSync(process.execPath, [bin, ...args], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } })
  return { code: r.status, stdout: r.stdout, stderr: r.stderr }
}

describe('linkwright compare', () => {
  it('should report exactly the edits between two revisions, and what they moved', () => {
    const dir = repository()
    const status = execFileSync('git', ['status', '--porcelain'], { cwd: dir, encoding: 'utf8' })
    const r = run(['compare', 'note.md', 'A', 'B', '--json'], dir)
    expect(r.stderr).toBe('')
    expect(r.code).toBe(1)
    const { changes } = JSON.parse(r.stdout) as { changes: { what: string; name: string; from: string | null; to: string | null }[] }
    const inputs = changes.filter((c) => c.what === 'input')
    // The one input edited; the push's load table changed through its file, not an input.
    expect(inputs.map((c) => [c.name, c.from, c.to])).toEqual([['drive.crank', '40.000 mm', '45.000 mm']])
    expect(changes.filter((c) => c.what === 'data').map((c) => c.name)).toEqual(['data/load.csv'])
    expect(changes.filter((c) => c.what === 'block').map((c) => [c.name, c.from, c.to])).toEqual([['extra', null, 'design-inputs']])
    // The in-line stroke is twice the crank: 80 → 90 mm, and the 85 mm check turns from FAIL to PASS.
    expect(changes.find((c) => c.name === 'drive.stroke')).toMatchObject({ what: 'result', from: '80.000 mm', to: '90.000 mm' })
    expect(changes.filter((c) => c.what === 'check').map((c) => [c.from, c.to])).toEqual([['FAIL', 'PASS']])
    expect(changes.some((c) => c.what === 'tool')).toBe(false)
    // Nothing in the repository was touched.
    expect(execFileSync('git', ['status', '--porcelain'], { cwd: dir, encoding: 'utf8' })).toBe(status)
  })

  it('should compare a revision with the working tree, and say when nothing moved', () => {
    const dir = repository()
    expect(run(['compare', 'note.md', 'B'], dir)).toMatchObject({ code: 0, stdout: expect.stringMatching(/^note\.md: nothing moved from B \([0-9a-f]{12}\) to working tree\n$/) })
    // 44 mm: the stroke (88 mm) stays inside the load table's 90 mm.
    writeFileSync(join(dir, 'note.md'), readFileSync(join(dir, 'note.md'), 'utf8').replace('45 mm', '44 mm'))
    const r = run(['compare', 'note.md', 'B'], dir)
    expect(r.stderr).toBe('')
    expect(r.code).toBe(1)
    expect(r.stdout).toMatch(/^ {2}input drive\.crank: 45\.000 mm → 44\.000 mm \(-2\.22 %\)$/m)
    // Values that print the same are not changes (no `→` between equal texts).
    for (const line of r.stdout.split('\n').filter((l) => l.includes('→'))) {
      const [from, to] = line.replace(/ \([^)]*%\)$/, '').split(': ').slice(1).join(': ').split(' → ')
      expect(from, line).not.toBe(to)
    }
  })

  it('should refuse a revision that does not exist, and a note outside git, with exit 2', () => {
    const dir = repository()
    expect(run(['compare', 'note.md', 'nope'], dir)).toMatchObject({ code: 2, stderr: expect.stringMatching(/`nope` is not a revision of this repository/) })
    const outside = mkdtempSync(join(tmpdir(), 'linkwright-nogit-'))
    writeFileSync(join(outside, 'note.md'), NOTE('40 mm'))
    expect(run(['compare', 'note.md', 'A'], outside).code).toBe(2)
  })
})
