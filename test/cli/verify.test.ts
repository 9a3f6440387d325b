/**
 * `linkwright verify`: a package checked against its note. A match exits 0; an
 * edited input, a changed data file and a changed tool (a copy of the built
 * tool with its core touched) are each named, with the results that moved, and
 * the exit status carries one bit for each.
 */
import { spawnSync } from 'node:child_process'
import { appendFileSync, cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { analyseSliderCrank, sliderCrank } from '../../src/linkage/index.js'

const root = new URL('../../', import.meta.url).pathname
const bin = join(root, 'bin', 'linkwright.js')

const NOTE = (crank: string) => `---
title: Verified note
number: T-8
revision: A
status: draft
date: 2026-01-05
---

\`\`\`slider-crank #drive
crank: ${crank}
rod: 160 mm
speed: 100 rpm
\`\`\`

\`\`\`forces #push
of: drive
load_file: load.csv
slider_mass: 1 kg
\`\`\`

\`\`\`checks
stroke: drive.stroke >= 70 mm
\`\`\`
`

function run(args: readonly string[], cwd: string, tool = bin) {
  const r = spawnSync(process.execPath, [tool, ...args], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } })
  return { code: r.status, stdout: r.stdout, stderr: r.stderr }
}

function built(): string {
  const dir = mkdtempSync(join(tmpdir(), 'linkwright-verify-'))
  writeFileSync(join(dir, 'a.md'), NOTE('40 mm'))
  writeFileSync(join(dir, 'load.csv'), 'travel (mm), force (N)\n0, 100\n80, 100\n')
  expect(run(['build', 'a.md', '--no-pdf', '--quiet'], dir).code).toBe(0)
  return dir
}

describe('linkwright verify', () => {
  it('should say a package matches its note, from the folder or its results.json', () => {
    const dir = built()
    const r = run(['verify', 'a.md', 'out/a'], dir)
    expect([r.code, r.stdout]).toEqual([0, expect.stringMatching(/^a\.md: matches out\/a\/results\.json \(fingerprint [0-9a-f]{16}\)\n$/)])
    expect(run(['verify', 'a.md', 'out/a/results.json'], dir).code).toBe(0)
  })

  it('should name an edited input and the results and checks it moved, exit 16 + 1 + 8', () => {
    const dir = built()
    writeFileSync(join(dir, 'a.md'), NOTE('30 mm'))
    const r = run(['verify', 'a.md', 'out/a'], dir)
    expect(r.code).toBe(16 + 1 + 8)
    expect(r.stdout).toMatch(/^ {2}note: edited$/m)
    expect(r.stdout).toMatch(/^ {2}input drive\.crank: 40\.000 mm → 30\.000 mm \(-25\.0 %\)$/m)
    // The stroke goes from 2 × 40 to 2 × 30 mm (an in-line slider-crank's stroke is twice the crank), −25 %.
    const strokes = [40, 30].map((a) => analyseSliderCrank(sliderCrank({ crank: a / 1000, rod: 0.16 }), { speed: 1 }).stroke * 1000)
    expect(strokes.map((s) => Math.round(s * 1e6) / 1e6)).toEqual([80, 60])
    expect(r.stdout).toMatch(/^ {2}result drive\.stroke: 80\.000 mm → 60\.000 mm \(-25\.0 %\)$/m)
    expect(r.stdout).toMatch(/^ {2}check acceptance?[^:]*: stroke: PASS → FAIL$|^ {2}check [^\n]*stroke: PASS → FAIL$/m)
  })

  it('should name a changed data file, exit 16 + 2 + 8', () => {
    const dir = built()
    writeFileSync(join(dir, 'load.csv'), 'travel (mm), force (N)\n0, 100\n80, 150\n')
    const r = run(['verify', 'a.md', 'out/a'], dir)
    expect(r.code).toBe(16 + 2 + 8)
    expect(r.stdout).toMatch(/^ {2}data file load\.csv: changed$/m)
    expect(r.stdout).not.toMatch(/note: edited/)
  })

  it('should name a changed tool whose numbers are the same, exit 16 + 4', () => {
    const dir = built()
    const tool = mkdtempSync(join(tmpdir(), 'linkwright-tool-'))
    for (const part of ['bin', 'dist', 'templates', 'package.json']) cpSync(join(root, part), join(tool, part), { recursive: true })
    symlinkSync(join(root, 'node_modules'), join(tool, 'node_modules'))
    const chunk = readdirSync(join(tool, 'dist', 'chunks')).find((n) => readFileSync(join(tool, 'dist', 'chunks', n), 'utf8').includes('function sliderCrankState('))!
    appendFileSync(join(tool, 'dist', 'chunks', chunk), '\n// a comment: a new build, the same numbers\n')
    const r = run(['verify', 'a.md', 'out/a'], dir, join(tool, 'bin', 'linkwright.js'))
    expect(r.code).toBe(16 + 4)
    expect(r.stdout).toMatch(/^ {2}tool: linkwright \S+ \(build [0-9a-f]{12}\) → linkwright \S+ \(build [0-9a-f]{12}\)$/m)
    expect(r.stdout).not.toMatch(/result /)
  })

  it('should refuse a wrong command line with exit 2', () => {
    const dir = mkdtempSync(join(tmpdir(), 'linkwright-verify-cli-'))
    mkdirSync(join(dir, 'x'))
    expect(run(['verify', 'a.md'], dir).code).toBe(2)
    expect(run(['verify', 'a.md', 'x'], dir).code).toBe(2)
  })
})
