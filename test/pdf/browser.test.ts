/**
 * The HTML package in a real headless Chromium: no console errors, every chart
 * and drawing rendered with a size, a screenshot kept for inspection, and an
 * accessibility audit (axe-core) with no serious or critical violations.
 */
import { cpSync, mkdirSync, mkdtempSync, readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { spawnSync } from 'node:child_process'
import { pathToFileURL } from 'node:url'
import type { Browser } from 'puppeteer-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { findBrowser, launchBrowser, type RunningBrowser } from '../../src/pdf/browser.js'

const root = new URL('../../', import.meta.url).pathname
const artifacts = join(root, 'test-artifacts')
const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8')

describe('the HTML package in Chromium', () => {
  let dir: string
  let running: RunningBrowser
  let browser: Browser
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'linkwright-browser-'))
    cpSync(join(root, 'reports'), join(dir, 'reports'), { recursive: true })
    const built = spawnSync(process.execPath, [join(root, 'bin/linkwright.js'), 'build', '--no-pdf', '--quiet'], { cwd: dir, encoding: 'utf8' })
    expect(built.status).toBe(0)
    const path = findBrowser()
    expect(path, 'Chromium is needed for these tests (.ci/setup installs it)').not.toBeNull()
    running = await launchBrowser(path!)
    browser = running.browser
  })
  afterAll(async () => {
    await running?.close()
  })

  for (const note of ['carton-pusher', 'sieve-rocker', 'plunger-pump', 'air-agitator']) {
    it(`should show ${note} with no console errors and every figure drawn`, async () => {
      const page = await browser.newPage()
      const problems: string[] = []
      page.on('console', (message) => {
        if (message.type() === 'error' || message.type() === 'warn') problems.push(message.text())
      })
      page.on('pageerror', (error) => problems.push(String(error)))
      page.on('requestfailed', (request) => problems.push(`failed: ${request.url()}`))
      await page.setViewport({ width: 1100, height: 900 })
      await page.goto(pathToFileURL(join(dir, 'out', note, 'index.html')).href, { waitUntil: 'load' })
      await page.evaluate(() => document.fonts.ready.then(() => undefined))
      const sizes = await page.$$eval('figure svg', (svgs) =>
        svgs.map((svg) => {
          const box = svg.getBoundingClientRect()
          return { cls: svg.getAttribute('class') ?? '', width: box.width, height: box.height }
        }),
      )
      // As many drawings and charts as the note has blocks for.
      const source = readFileSync(join(dir, 'reports', `${note}.md`), 'utf8')
      expect(sizes.filter((s) => s.cls.includes('lw-drawing-svg'))).toHaveLength(source.match(/^```drawing\b/gm)?.length ?? 0)
      // Chart blocks, and the blocks that always chart (a tolerances histogram, a study of three values or more, a synthesis family or error curve).
      expect(sizes.filter((s) => s.cls.includes('marks')).length).toBe(source.match(/^```(?:chart|tolerances|study|crank-rocker-synthesis|function-generator)\b/gm)?.length ?? 0)
      for (const size of sizes) {
        expect(size.width, size.cls).toBeGreaterThan(50)
        expect(size.height, size.cls).toBeGreaterThan(50)
      }
      // The math fonts load from the package's own folder.
      expect(await page.evaluate(() => document.fonts.check('16px KaTeX_Main'))).toBe(true)
      mkdirSync(artifacts, { recursive: true })
      await page.screenshot({ path: join(artifacts, `${note}-screen.png`), fullPage: true })
      expect(problems).toEqual([])
      await page.close()
    })

    it(`should pass an accessibility audit for ${note} with no serious or critical violations`, async () => {
      const page = await browser.newPage()
      await page.goto(pathToFileURL(join(dir, 'out', note, 'index.html')).href, { waitUntil: 'load' })
      await page.addScriptTag({ content: axeSource })
      const violations = await page.evaluate(async () => {
        const axe = (window as unknown as { axe: { run(context: Document, options: object): Promise<{ violations: { id: string; impact: string; nodes: { target: string[] }[] }[] }> } }).axe
        const result = await axe.run(document, { resultTypes: ['violations'] })
        return result.violations.map((v) => ({ id: v.id, impact: v.impact, nodes: v.nodes.slice(0, 3).map((n) => n.target.join(' ')) }))
      })
      const severe = violations.filter((v) => v.impact === 'serious' || v.impact === 'critical')
      expect(severe).toEqual([])
      await page.close()
    })
  }
})
