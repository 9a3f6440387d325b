/**
 * Incremental builds: a second build of unchanged notes builds nothing (per
 * the build report) and leaves every byte and modification time as it was;
 * editing one note, a data file one note reads, or the tool's template
 * rebuilds exactly the packages that depend on it; asking for PDFs where the
 * package has none rebuilds it; --force rebuilds all.
 */
import { spawnSync } from 'node:child_process'
import { appendFileSync, cpSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, statSync, symlinkSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { findBrowser } from '../../src/pdf/browser.js'

const root = new URL('../../', import.meta.url).pathname

const note = (n: number, extra = '') => `---
title: Note ${n}
number: T-${n}
revision: A
status: draft
date: 2026-01-05
---

\`\`\`slider-crank #drive
crank: ${30 + n} mm
rod: 160 mm
speed: 100 rpm
\`\`\`
${extra}`

const LOADED = `
\`\`\`forces #push
of: drive
load_file: data/load.csv
slider_mass: 1 kg
\`\`\`
`

function workspace(): string {
  const dir = mkdtempSync(join(tmpdir(), 'linkwright-incremental-'))
  mkdirSync(join(dir, 'notes', 'data'), { recursive: true })
  for (let n = 1; n <= 3; n++) writeFileSync(join(dir, 'notes', `n${n}.md`), note(n, n === 3 ? LOADED : ''))
  writeFileSync(join(dir, 'notes', 'data', 'load.csv'), 'travel (mm), force (N)\n0, 100\n80, 100\n')
  return dir
}

function run(args: readonly string[], cwd: string, bin = join(root, 'bin', 'linkwright.js')) {
  const result = spawnSync(process.execPath, [bin, ...args], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } })
  expect(result.stderr).not.toMatch(/ error |internal error/)
  return { code: result.status, stdout: result.stdout }
}

/** Every file of the output with its bytes and modification time. */
function state(dir: string): Map<string, string> {
  const files = new Map<string, string>()
  const walk = (d: string, prefix: string) => {
    for (const entry of readdirSync(d, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
      if (entry.name === '.cache') continue
      const full = join(d, entry.name)
      if (entry.isDirectory()) walk(full, `${prefix}${entry.name}/`)
      else files.set(`${prefix}${entry.name}`, `${statSync(full).mtimeMs} ${readFileSync(full).toString('base64')}`)
    }
  }
  walk(dir, '')
  return files
}

const rebuilt = (stdout: string) => [...stdout.matchAll(/^notes\/(n\d)\.md: out\//gm)].map((m) => m[1]).sort()

describe('incremental builds', () => {
  it('should build nothing the second time, byte for byte and time for time, and say so', () => {
    const dir = workspace()
    expect(run(['build', 'notes', '--no-pdf'], dir).stdout).toMatch(/^built 3, unchanged 0 of 3 notes$/m)
    const before = state(join(dir, 'out'))
    const again = run(['build', 'notes', '--no-pdf'], dir)
    expect(again.code).toBe(0)
    expect(again.stdout).toMatch(/^built 0, unchanged 3 of 3 notes$/m)
    expect(rebuilt(again.stdout)).toEqual([])
    expect(state(join(dir, 'out'))).toEqual(before)
  })

  it('should rebuild exactly the note that was edited, and the note that reads an edited data file', () => {
    const dir = workspace()
    run(['build', 'notes', '--no-pdf'], dir)
    writeFileSync(join(dir, 'notes', 'n1.md'), note(1, '\nA sentence added.\n'))
    expect(rebuilt(run(['build', 'notes', '--no-pdf'], dir).stdout)).toEqual(['n1'])
    writeFileSync(join(dir, 'notes', 'data', 'load.csv'), 'travel (mm), force (N)\n0, 100\n80, 120\n')
    expect(rebuilt(run(['build', 'notes', '--no-pdf'], dir).stdout)).toEqual(['n3'])
    expect(readFileSync(join(dir, 'out', 'n3', 'results.json'), 'utf8')).toMatch(/"sha256": "[0-9a-f]{64}"/)
  })

  it('should rebuild everything when --force is given', () => {
    const dir = workspace()
    run(['build', 'notes', '--no-pdf'], dir)
    expect(rebuilt(run(['build', 'notes', '--no-pdf', '--force'], dir).stdout)).toEqual(['n1', 'n2', 'n3'])
  })

  it('should rebuild every package when the tool’s template changes', () => {
    const tool = mkdtempSync(join(tmpdir(), 'linkwright-tool-'))
    for (const part of ['bin', 'dist', 'templates', 'package.json']) cpSync(join(root, part), join(tool, part), { recursive: true })
    symlinkSync(join(root, 'node_modules'), join(tool, 'node_modules'))
    const bin = join(tool, 'bin', 'linkwright.js')
    const dir = workspace()
    run(['build', 'notes', '--no-pdf'], dir, bin)
    expect(rebuilt(run(['build', 'notes', '--no-pdf'], dir, bin).stdout)).toEqual([])
    appendFileSync(join(tool, 'templates', 'package.css'), '\n/* a change */\n')
    expect(rebuilt(run(['build', 'notes', '--no-pdf'], dir, bin).stdout)).toEqual(['n1', 'n2', 'n3'])
  })

  it.skipIf(findBrowser() === null)('should rebuild a package without a PDF when PDFs are asked for, then leave it', () => {
    const dir = workspace()
    run(['build', 'notes/n1.md', '--no-pdf'], dir)
    const first = run(['build', 'notes/n1.md'], dir)
    expect(first.stdout).toMatch(/^notes\/n1\.md: out\/n1\/index\.html, out\/n1\/n1\.pdf/m)
    expect(run(['build', 'notes/n1.md'], dir).stdout).toMatch(/^built 0, unchanged 1 of 1 note$/m)
  })
})
