/**
 * The package site in headless Chromium: the index lists every package with
 * the counts of its checks in words, every link resolves to a file of the
 * output folder, and the text and status filters show the right rows. An
 * index.html linkwright did not write is left alone.
 */
import { spawnSync } from 'node:child_process'
import { cpSync, existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { findBrowser, launchBrowser, type RunningBrowser } from '../../src/pdf/browser.js'

const root = new URL('../../', import.meta.url).pathname

describe.skipIf(findBrowser() === null)('the package site', () => {
  let dir: string
  let running: RunningBrowser
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'linkwright-site-'))
    cpSync(join(root, 'reports'), join(dir, 'reports'), { recursive: true })
    const built = spawnSync(process.execPath, [join(root, 'bin/linkwright.js'), 'build', '--no-pdf', '--quiet'], { cwd: dir, encoding: 'utf8' })
    expect(built.status, built.stderr).toBe(0)
    running = await launchBrowser(findBrowser()!)
  })
  afterAll(async () => {
    await running?.close()
  })

  it('should list each package with its checks in words and links that all resolve', async () => {
    const page = await running.browser.newPage()
    await page.goto(pathToFileURL(join(dir, 'out', 'index.html')).href, { waitUntil: 'load' })
    const rows = await page.$$eval('tbody tr', (trs) => trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent ?? '')))
    expect(rows).toHaveLength(4)
    // Each row's counts are those of the package's own results.json.
    for (const row of rows) {
      const number = row[0]!
      const folder = ['carton-pusher', 'sieve-rocker', 'plunger-pump', 'air-agitator'].find((f) => JSON.parse(readFileSync(join(dir, 'out', f, 'results.json'), 'utf8')).document.number === number)!
      const summary = JSON.parse(readFileSync(join(dir, 'out', folder, 'results.json'), 'utf8')).summary
      expect(row[4]).toContain(`${summary.passed} of ${summary.checks} pass`)
      if (summary.informative.checks > 0) expect(row[4]).toContain(`${summary.informative.checks} informative`)
    }
    const links = await page.$$eval('a[href]', (as) => as.map((a) => (a as HTMLAnchorElement).href))
    expect(links.length).toBeGreaterThanOrEqual(4 * 3)
    for (const link of links) expect(existsSync(fileURLToPath(link)), link).toBe(true)
    await page.close()
  })

  it('should filter by text and by status', async () => {
    const page = await running.browser.newPage()
    await page.goto(pathToFileURL(join(dir, 'out', 'index.html')).href, { waitUntil: 'load' })
    const visible = () => page.$$eval('tbody tr', (trs) => trs.filter((tr) => !(tr as HTMLElement).hidden).length)
    await page.type('#filter-text', 'agitator')
    expect(await visible()).toBe(1)
    expect(await page.$eval('#shown', (s) => s.textContent)).toBe('1')
    await page.$eval('#filter-text', (input) => {
      ;(input as HTMLInputElement).value = ''
    })
    await page.type('#filter-text', ' ')
    const statuses = await page.$$eval('tbody tr', (trs) => trs.map((tr) => (tr as HTMLElement).dataset.status ?? ''))
    const first = statuses[0]!
    await page.select('#filter-status', first)
    expect(await visible()).toBe(statuses.filter((s) => s === first).length)
    await page.close()
  })

  it('should leave an index.html it did not write alone', () => {
    const work = mkdtempSync(join(tmpdir(), 'linkwright-site-foreign-'))
    cpSync(join(root, 'reports', 'sieve-rocker.md'), join(work, 'sieve-rocker.md'))
    writeFileSync(join(work, 'index.html'), '<p>the project’s own page</p>')
    const built = spawnSync(process.execPath, [join(root, 'bin/linkwright.js'), 'build', 'sieve-rocker.md', '--out', '.', '--no-pdf'], { cwd: work, encoding: 'utf8' })
    expect(built.status).toBe(0)
    expect(readFileSync(join(work, 'index.html'), 'utf8')).toBe('<p>the project’s own page</p>')
    expect(built.stderr).toMatch(/index\.html was not written by linkwright; the package index is not written there/)
  })
})
