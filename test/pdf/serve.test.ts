/**
 * `linkwright serve`: on an ephemeral loopback port, Chromium opens a package,
 * the note is edited, and the page reloads with the new value; a note with an
 * error shows the message, with file, line and column, at the top of the page;
 * nothing outside the output folder is served; SIGTERM stops the server.
 */
import { spawn } from 'node:child_process'
import { mkdtempSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs'
import { request } from 'node:http'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { findBrowser, launchBrowser, type RunningBrowser } from '../../src/pdf/browser.js'

const root = new URL('../../', import.meta.url).pathname

const NOTE = (crank: string) => `---
title: Preview note
number: T-3
revision: A
status: draft
date: 2026-01-05
---

The stroke is :value[drive.stroke].

\`\`\`slider-crank #drive
crank: ${crank}
rod: 160 mm
speed: 100 rpm
\`\`\`
`

function get(port: number, path: string): Promise<number> {
  return new Promise((done, fail) => {
    const req = request({ host: '127.0.0.1', port, path, method: 'GET' }, (res) => {
      res.resume()
      done(res.statusCode ?? 0)
    })
    req.on('error', fail)
    req.end()
  })
}

describe.skipIf(findBrowser() === null)('linkwright serve', () => {
  let dir: string
  let running: RunningBrowser
  let server: ReturnType<typeof spawn>
  let port = 0
  let log = ''
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'linkwright-serve-'))
    writeFileSync(join(dir, 'note.md'), NOTE('40 mm'))
    server = spawn(process.execPath, [join(root, 'bin', 'linkwright.js'), 'serve', 'note.md', '--port', '0'], { cwd: dir, env: { ...process.env, NO_COLOR: '1' } })
    server.stdout!.on('data', (d) => (log += d))
    server.stderr!.on('data', (d) => (log += d))
    for (let i = 0; i < 300 && !/127\.0\.0\.1:(\d+)/.test(log); i++) await new Promise((r) => setTimeout(r, 50))
    port = Number(/127\.0\.0\.1:(\d+)/.exec(log)?.[1])
    expect(port, log).toBeGreaterThan(0)
    running = await launchBrowser(findBrowser()!)
  })
  afterAll(async () => {
    await running?.close()
    server?.kill('SIGKILL')
  })

  it('should reload the open page with the new value when the note is saved', async () => {
    const page = await running.browser.newPage()
    await page.goto(`http://127.0.0.1:${port}/note/index.html`, { waitUntil: 'load' })
    expect(await page.evaluate(() => document.body.textContent)).toContain('The stroke is 80.000 mm')
    const reloaded = page.waitForNavigation({ waitUntil: 'load', timeout: 20_000 })
    writeFileSync(join(dir, 'note.md'), NOTE('45 mm'))
    await reloaded
    expect(await page.evaluate(() => document.body.textContent)).toContain('The stroke is 90.000 mm')
    await page.close()
  })

  it('should show a note’s error at the top of the page, with its place', async () => {
    const page = await running.browser.newPage()
    await page.goto(`http://127.0.0.1:${port}/note/index.html`, { waitUntil: 'load' })
    const reloaded = page.waitForNavigation({ waitUntil: 'load', timeout: 20_000 })
    writeFileSync(join(dir, 'note.md'), NOTE('45 kg'))
    await reloaded
    const banner = await page.$eval('#lw-preview-problems', (d) => d.textContent ?? '')
    expect(banner).toMatch(/note\.md:12:8 {2}error {2}Unexpected value for `crank`/)
    // The last good package is still what is shown.
    expect(await page.evaluate(() => document.body.textContent)).toContain('The stroke is 90.000 mm')
    writeFileSync(join(dir, 'note.md'), NOTE('45 mm'))
    await page.close()
  })

  it('should serve nothing outside the output folder', async () => {
    symlinkSync('/etc', join(dir, 'out', 'etc'))
    expect(await get(port, '/etc/hostname')).toBe(403)
    expect(await get(port, '/../note.md')).toBe(404)
    expect(await get(port, '/%2e%2e/note.md')).toBe(404)
    expect(readFileSync(join(dir, 'note.md'), 'utf8')).toContain('45 mm')
  })

  it('should stop cleanly on SIGTERM', async () => {
    const closed = new Promise<number | null>((done) => server.on('close', (code) => done(code)))
    server.kill('SIGTERM')
    expect(await closed).toBe(143)
    expect(log).not.toMatch(/\n\s+at .+:\d+:\d+/)
  })
})
