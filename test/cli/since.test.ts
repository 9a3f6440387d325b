/**
 * `build --since REV`: the package of revision B carries a "Changes since
 * revision A" section with exactly the edits' effects, and marks the changed
 * input and result rows of the block with Δ, and no other rows.
 */
import { execFileSync, spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Element } from 'hast'
import { fromHtml } from 'hast-util-from-html'
import { toString } from 'hast-util-to-string'
import { visit } from 'unist-util-visit'
import { describe, expect, it } from 'vitest'

const bin = join(new URL('../../', import.meta.url).pathname, 'bin', 'linkwright.js')
const NOTE = (crank: string) => `---
title: Since note
number: T-6
revision: B
status: draft
date: 2026-01-05
---

\`\`\`slider-crank #drive
crank: ${crank}
rod: 200 mm
offset: 10 mm
speed: 100 rpm
\`\`\`

\`\`\`checks
stroke: drive.stroke >= 85 mm
\`\`\`
`

describe('build --since', () => {
  it('should add the changes since a revision and mark exactly the changed rows', () => {
    const dir = mkdtempSync(join(tmpdir(), 'linkwright-since-'))
    const git = (...args: string[]) => execFileSync('git', ['-c', 'user.name=T', '-c', 'user.email=t@example.org', ...args], { cwd: dir, stdio: 'pipe' })
    git('init', '-q')
    writeFileSync(join(dir, 'note.md'), NOTE('40 mm'))
    git('add', '.')
    git('commit', '-q', '-m', 'A')
    git('tag', 'A')
    writeFileSync(join(dir, 'note.md'), NOTE('45 mm'))
    const r = spawnSync(process.execPath, [bin, 'build', 'note.md', '--no-pdf', '--since', 'A'], { cwd: dir, encoding: 'utf8' })
    expect(r.stderr).not.toMatch(/ error /)
    expect(r.status).toBe(0)
    const tree = fromHtml(readFileSync(join(dir, 'out', 'note', 'index.html'), 'utf8'))
    let section: Element | null = null
    const marked: string[] = []
    visit(tree, 'element', (node: Element) => {
      if (node.properties.id === 'changes') section = node
      if (node.tagName === 'tr' && String(node.properties.className ?? '').includes('lw-changed')) marked.push(toString(node))
    })
    expect(section, 'a changes section').not.toBeNull()
    const text = toString(section!)
    expect(text).toMatch(/^\d+ Changes since revision A \([0-9a-f]{12}\)/)
    expect(text).toContain('drive.crank40.000 mm45.000 mm+12.5 %')
    // The stroke, twice the crank with a small offset (80.10 → 90.12 mm), passes the 85 mm check now.
    expect(text).toMatch(/check.{0,40}stroke.{0,4}FAILPASS/)
    // The crank input and the results it moved are marked; the rod and offset inputs are not.
    expect(marked.some((row) => row.startsWith('a') || row.includes('Δ crank radius'))).toBe(true)
    expect(marked.some((row) => row.includes('Δ stroke'))).toBe(true)
    expect(marked.some((row) => row.includes('connecting-rod length'))).toBe(false)
    expect(marked.some((row) => row.includes('offset'))).toBe(false)
  })
})
