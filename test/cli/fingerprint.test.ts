/**
 * The fingerprint a checker signs covers what was computed: the note, its data
 * files and the tool's own build (code and templates as run). A copy of the
 * built tool is changed in one place at a time: its core (a chunk of the
 * bundle), its template, or nothing; the fingerprint must follow.
 */
import { spawnSync } from 'node:child_process'
import { appendFileSync, cpSync, mkdtempSync, readFileSync, readdirSync, symlinkSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'

const root = new URL('../../', import.meta.url).pathname

const NOTE = `---
title: Fingerprint note
number: T-7
revision: A
status: draft
date: 2026-01-05
---

\`\`\`slider-crank #drive
crank: 40 mm
rod: 160 mm
speed: 100 rpm
\`\`\`
`

/** A copy of the built tool that can be changed without touching the project. */
function toolCopy(): string {
  const dir = mkdtempSync(join(tmpdir(), 'linkwright-tool-'))
  for (const part of ['bin', 'dist', 'templates', 'package.json']) cpSync(join(root, part), join(dir, part), { recursive: true })
  symlinkSync(join(root, 'node_modules'), join(dir, 'node_modules'))
  return dir
}

function fingerprintWith(tool: string): { fingerprint: string; build: string; shown: string } {
  const work = mkdtempSync(join(tmpdir(), 'linkwright-fp-'))
  writeFileSync(join(work, 'a.md'), NOTE)
  const result = spawnSync(process.execPath, [join(tool, 'bin', 'linkwright.js'), 'build', 'a.md', '--no-pdf', '--quiet'], { cwd: work, encoding: 'utf8' })
  expect(result.status, result.stderr).toBe(0)
  const results = JSON.parse(readFileSync(join(work, 'out', 'a', 'results.json'), 'utf8'))
  const html = readFileSync(join(work, 'out', 'a', 'index.html'), 'utf8')
  return { fingerprint: results.fingerprint, build: results.tool.build, shown: /sha-256 of the note and linkwright [^;]+;/.exec(html)?.[0] ?? '' }
}

describe('the fingerprint', () => {
  it('should stay the same for the same note and the same build', () => {
    const tool = toolCopy()
    expect(fingerprintWith(tool).fingerprint).toBe(fingerprintWith(tool).fingerprint)
  })

  it('should change when the core changes, the version unchanged', () => {
    const tool = toolCopy()
    const before = fingerprintWith(tool)
    // The chunk that holds the slider-crank's closed form.
    const chunk = readdirSync(join(tool, 'dist', 'chunks')).find((name) => readFileSync(join(tool, 'dist', 'chunks', name), 'utf8').includes('function sliderCrankState('))
    expect(chunk, 'the core is in a chunk').toBeDefined()
    appendFileSync(join(tool, 'dist', 'chunks', chunk!), '\n// a change to the core\n')
    const after = fingerprintWith(tool)
    expect(after.build).not.toBe(before.build)
    expect(after.fingerprint).not.toBe(before.fingerprint)
  })

  it('should change when the template changes, and say in the package what it covers', () => {
    const tool = toolCopy()
    const before = fingerprintWith(tool)
    appendFileSync(join(tool, 'templates', 'package.css'), '\n/* a change to the template */\n')
    const after = fingerprintWith(tool)
    expect(after.fingerprint).not.toBe(before.fingerprint)
    expect(after.shown).toMatch(/^sha-256 of the note and linkwright \d+\.\d+\.\d+ \(build [0-9a-f]{12}: its code and templates\);$/)
  })
})
