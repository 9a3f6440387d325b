/**
 * Printing: one package with its own browser, and ten packages with one shared
 * browser; the ratio (ten shared) / (ten × one) shows what sharing saves.
 */
import { cpSync, mkdtempSync, readFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { VFile } from 'vfile'
import { buildNote } from '../src/build.js'
import { dataReader } from '../src/cli/data-files.js'
import { findBrowser } from '../src/pdf/browser.js'
import { printPackages, type PrintJob } from '../src/pdf/print.js'
import { writeFolder } from '../src/cli/files.js'
import { katexDist } from '../src/cli/paths.js'
import { TOOL } from '../src/version.js'
import { median, record } from './measure.js'

export async function runPdfBench(): Promise<void> {
  const browser = findBrowser()
  if (!browser) {
    record('PDF printing', [{ name: 'skipped: no Chromium found (apt-get install chromium)', value: Number.NaN, unit: '' }])
    return
  }
  const root = process.cwd()
  const dir = mkdtempSync(join(tmpdir(), 'linkwright-bench-pdf-'))
  const note = readFileSync(join(root, 'reports/carton-pusher.md'), 'utf8')
  const template = readFileSync(join(root, 'templates/package.html'), 'utf8')
  const built = await buildNote(new VFile({ path: 'p.md', value: note }), { tool: TOOL, notePath: 'p.md', template, commit: 'bench', readData: dataReader(join(root, 'reports/carton-pusher.md')) })
  if (!built.html) throw new Error('reports/carton-pusher.md did not build')
  const files = new Map<string, string | Uint8Array>([
    ['index.html', built.html!],
    ['assets/package.css', readFileSync(join(root, 'templates/package.css'), 'utf8')],
    ...[...built.files],
  ])
  const jobs: PrintJob[] = []
  for (let i = 0; i < 10; i++) {
    const folder = join(dir, `p${i}`)
    writeFolder(folder, files)
    cpSync(katexDist(), join(folder, 'assets/katex'), { recursive: true })
    jobs.push({
      html: join(folder, 'index.html'),
      pdf: join(folder, 'p.pdf'),
      folder,
      paper: 'A4',
      title: 'Bench',
      number: 'B',
      revision: 'A',
      status: 'DRAFT',
      fingerprint: built.model.fingerprint,
      author: 'bench',
      date: '2026-01-01',
      tool: 'linkwright bench',
    })
  }
  const one = await median(() => printPackages([jobs[0]!], browser), 3, 1)
  const ten = await median(() => printPackages(jobs, browser), 3, 1)
  record('PDF printing (the carton-pusher package; two printings each, the second with the contents’ page numbers)', [
    { name: 'one package, its own browser (launch, print, close)', value: one, unit: 'ms' },
    { name: 'ten packages, one shared browser', value: ten, unit: 'ms', ratio: { value: ten / (10 * one), of: '× ten single runs', better: 'lower', target: 0.4 } },
  ])
}
