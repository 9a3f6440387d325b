/**
 * A hostile note in a real Chromium: script put in through raw HTML, link
 * URLs, SVG, MathML, front-matter strings, block titles, values and sources
 * never runs (no flag set, no dialog, no console error, no request), and the
 * package and its PDF are still built. Each payload, if it ran, would set
 * `window.__lw` or open a dialog.
 */
import { spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import type { Element } from 'hast'
import { fromHtml } from 'hast-util-from-html'
import { visit } from 'unist-util-visit'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { findBrowser, launchBrowser, type RunningBrowser } from '../../src/pdf/browser.js'

const root = new URL('../../', import.meta.url).pathname
const run = (script: string) => `window.__lw=(window.__lw||0)+1;alert('${script}')`

const NOTE = `---
title: "Hostile <script>${run('title')}</script> note"
number: "<img src=x onerror=\\"${run('number')}\\">"
revision: A
status: draft
date: 2026-01-05
project: "</title><script>${run('project')}</script>"
references:
  evil: "<a href='javascript:${run('reference')}'>click</a> and <svg onload=\\"${run('ref-svg')}\\"></svg>"
---

# Hostile note <script>${run('heading')}</script>

<script>${run('raw')}</script>
<img src="x" onerror="${run('img')}">
<a href="javascript:${run('link')}">a link</a> [markdown link](javascript:${run('md-link')}) [data](data:text/html,<script>${run('data')}</script>)
<svg><script>${run('svg')}</script><a xlink:href="javascript:${run('xlink')}"><text>t</text></a><animate onbegin="${run('animate')}" attributeName="x" dur="1s"/></svg>
<math><mtext><style><img src=x onerror="${run('math')}"></style></mtext></math>
<iframe src="javascript:${run('iframe')}"></iframe>
<object data="javascript:${run('object')}"></object>
<form action="javascript:${run('form')}"><button>go</button></form>
<div style="background:url(javascript:${run('style')})" onclick="${run('onclick')}">styled</div>
<meta http-equiv="refresh" content="0;url=javascript:${run('meta')}">

$\\href{javascript:${run('katex')}}{x}$ and $$\\htmlData{onload=${run('katex-data')}}{y}$$

\`\`\`slider-crank #drive Drive <img src=x onerror="${run('block-title')}">
crank: 40 mm ; <script>${run('source')}</script> [evil]
rod: 160 mm ; <img src=x onerror="${run('source-img')}">
speed: 100 rpm
\`\`\`

\`\`\`assumptions
- <script>${run('assumption')}</script> rigid links
\`\`\`

\`\`\`checks
stroke: drive.stroke >= 70 mm ; <svg onload="${run('check-source')}"> [evil]
\`\`\`

Stroke :value[drive.stroke] and :cite[evil].
`

describe.skipIf(findBrowser() === null)('a hostile note in Chromium', () => {
  let dir: string
  let running: RunningBrowser
  let stderr: string
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'linkwright-hostile-'))
    writeFileSync(join(dir, 'hostile.md'), NOTE)
    const built = spawnSync(process.execPath, [join(root, 'bin/linkwright.js'), 'build', 'hostile.md', '--out', 'out'], { cwd: dir, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } })
    stderr = built.stderr
    running = await launchBrowser(findBrowser()!)
  })
  afterAll(async () => {
    await running?.close()
  })

  it('should build the package and its PDF (the payloads are text or dropped, not errors that stop the build)', () => {
    expect(stderr).not.toMatch(/internal error/)
    expect(stderr).not.toMatch(/ error /)
    expect(readFileSync(join(dir, 'out', 'hostile', 'hostile.pdf')).subarray(0, 5).toString()).toBe('%PDF-')
  })

  it('should run no script of the note: no flag, no dialog, no console error, no request off the package', async () => {
    const page = await running.browser.newPage()
    const problems: string[] = []
    page.on('dialog', (dialog) => {
      problems.push(`dialog: ${dialog.message()}`)
      void dialog.dismiss()
    })
    const packageRoot = pathToFileURL(join(dir, 'out', 'hostile')).href
    page.on('console', (message) => {
      // The note's <img src="x"> is kept (without its handler) and is missing from the package: not a script.
      const missingImage = /^Failed to load resource/.test(message.text()) && message.location().url === `${packageRoot}/x`
      if ((message.type() === 'error' || message.type() === 'warn') && !missingImage) problems.push(`console: ${message.text()} ${message.location().url ?? ''}`)
    })
    page.on('pageerror', (error) => problems.push(`page error: ${String(error)}`))
    page.on('request', (request) => {
      const url = request.url()
      if (!url.startsWith(packageRoot) && !url.startsWith('data:font') && !url.startsWith('data:image/svg+xml')) problems.push(`request: ${url.slice(0, 80)}`)
    })
    await page.goto(`${packageRoot}/index.html`, { waitUntil: 'load' })
    // Click everything a reader might click, and let any timer or animation fire.
    await page.$$eval('a, button, div, svg, text', (nodes) => {
      for (const node of nodes) (node as HTMLElement).click?.()
    })
    await new Promise((r) => setTimeout(r, 1500))
    expect(await page.evaluate(() => (window as unknown as { __lw?: number }).__lw ?? 0)).toBe(0)
    expect(page.url().replace(/#.*$/, '')).toBe(`${packageRoot}/index.html`)
    expect(problems).toEqual([])
    // The note's own words survive as text, so the reviewer sees what was written.
    expect(await page.evaluate(() => document.body.textContent ?? '')).toContain('rigid links')
    await page.close()
  })

  it('should leave no script element, inline handler or javascript: URL in the HTML (parsed, not matched as text)', () => {
    const tree = fromHtml(readFileSync(join(dir, 'out', 'hostile', 'index.html'), 'utf8'))
    const found: string[] = []
    visit(tree, 'element', (node: Element) => {
      if (['script', 'iframe', 'object', 'embed', 'form', 'meta', 'base'].includes(node.tagName) && !(node.tagName === 'meta' && !('httpEquiv' in node.properties))) found.push(node.tagName)
      for (const [name, value] of Object.entries(node.properties)) {
        if (/^on/i.test(name)) found.push(`${node.tagName}[${name}]`)
        if (/^(href|src|action|data|formAction|xLinkHref)$/.test(name) && /^\s*javascript:/i.test(String(value))) found.push(`${node.tagName}[${name}=javascript:]`)
      }
    })
    expect(found).toEqual([])
  })
})
