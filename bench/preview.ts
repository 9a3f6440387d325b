/**
 * Live preview: from saving a note to the open page showing the new value
 * (the watch, the rebuild of that one note, the page's reload), in Chromium
 * against `linkwright serve`, for the sieve-rocker demo note (HTML only).
 * Median of several saves; lower is better.
 */
import { spawn } from 'node:child_process'
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { findBrowser, launchBrowser } from '../src/pdf/browser.js'
import { record } from './measure.js'

export async function runPreviewBench(): Promise<void> {
  const browserPath = findBrowser()
  if (!browserPath) return
  const root = process.cwd()
  const dir = mkdtempSync(join(tmpdir(), 'linkwright-preview-bench-'))
  const note = readFileSync(join(root, 'reports', 'sieve-rocker.md'), 'utf8')
  writeFileSync(join(dir, 'note.md'), note)
  const server = spawn(process.execPath, [join(root, 'bin', 'linkwright.js'), 'serve', 'note.md', '--port', '0'], { cwd: dir })
  let log = ''
  server.stdout.on('data', (d) => (log += d))
  for (let i = 0; i < 400 && !/127\.0\.0\.1:(\d+)/.test(log); i++) await new Promise((r) => setTimeout(r, 50))
  const port = Number(/127\.0\.0\.1:(\d+)/.exec(log)?.[1])
  const running = await launchBrowser(browserPath)
  const times: number[] = []
  try {
    const page = await running.browser.newPage()
    await page.goto(`http://127.0.0.1:${port}/note/index.html`, { waitUntil: 'load' })
    for (let i = 0; i < 7; i++) {
      const marker = `Preview edit ${i}.`
      const reloaded = page.waitForNavigation({ waitUntil: 'load', timeout: 30_000 })
      const start = performance.now()
      writeFileSync(join(dir, 'note.md'), note.replace(/\n## /, `\n${marker}\n\n## `))
      await reloaded
      if (!(await page.evaluate((m) => document.body.textContent?.includes(m), marker))) throw new Error('the edit did not reach the page')
      times.push(performance.now() - start)
    }
  } finally {
    await running.close()
    server.kill('SIGTERM')
  }
  times.sort((a, b) => a - b)
  const median = times[Math.floor(times.length / 2)]!
  record('Live preview (linkwright serve, the sieve-rocker note, HTML only)', [
    { name: 'saved edit visible in the open page', value: median, unit: 'ms', note: `median of ${times.length}; ${times[0]!.toFixed(0)}–${times[times.length - 1]!.toFixed(0)} ms`, ratio: { value: median / 300, of: '× 300 ms', better: 'lower', target: 1 } },
  ])
}
