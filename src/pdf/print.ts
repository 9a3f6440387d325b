/**
 * Printing packages to PDF with one Chromium: pages printed concurrently up to
 * the core count, nothing fetched from the network (only the package's own
 * files and data URLs load), a header and footer on every page, and the PDF's
 * metadata and dates taken from the note so a rebuild gives the same PDF.
 */
import { availableParallelism } from 'node:os'
import { resolve, sep } from 'node:path'
import { pathToFileURL, fileURLToPath } from 'node:url'
import { writeFileSync } from 'node:fs'
import { launchBrowser, type RunningBrowser } from './browser.js'
import { destinationPages } from './destinations.js'

/** One package to print. */
export interface PrintJob {
  /** The package's index.html. */
  readonly html: string
  /** Where the PDF goes. */
  readonly pdf: string
  /** The package folder: the only place the page may load files from. */
  readonly folder: string
  readonly paper: 'A4' | 'Letter'
  readonly title: string
  readonly number: string
  readonly revision: string
  /** DRAFT, FOR REVIEW or APPROVED. */
  readonly status: string
  readonly fingerprint: string
  /** People in their roles, for the PDF's author field. */
  readonly author: string
  /** YYYY-MM-DD from the note, used as the PDF's creation and modification date. */
  readonly date: string
  readonly tool: string
}

/** What printing one package gave. */
export interface PrintResult {
  readonly job: PrintJob
  readonly ok: boolean
  readonly error: string | null
  readonly pages: number
  /** Requests the page made that were refused (anything outside the package folder). */
  readonly blocked: readonly string[]
}

const esc = (text: string): string => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')

/** Page header and footer: inline styles only (Chromium prints them outside the page's CSS). */
export function headerFooter(job: PrintJob): { header: string; footer: string } {
  const style = 'font-family: DejaVu Sans, Liberation Sans, Arial, sans-serif; font-size: 7.5pt; color: #4d5962; width: 100%; margin: 0 16mm 0 25mm; display: flex; justify-content: space-between;'
  const draft = job.status === 'DRAFT' ? '<span style="color: #a11d21; font-weight: bold; letter-spacing: 0.1em;">DRAFT</span>' : ''
  const short = job.fingerprint.slice(0, 16).replace(/(.{4})(?=.)/g, '$1 ')
  return {
    header: `<div style="${style}"><span>${esc(job.title)}</span>${draft}<span>${esc(job.number)} rev ${esc(job.revision)}</span></div>`,
    footer: `<div style="${style}"><span>${esc(job.status)} · fingerprint ${short} · ${esc(job.tool)}</span><span>page <span class="pageNumber"></span> of <span class="totalPages"></span></span></div>`,
  }
}

/**
 * Print every job with one browser, `concurrency` pages at a time (default: the
 * core count). The browser is closed when done and on error; a browser that
 * cannot start throws (with the reason), before any job is touched.
 */
export async function printPackages(jobs: readonly PrintJob[], browserPath: string, concurrency = availableParallelism()): Promise<PrintResult[]> {
  if (jobs.length === 0) return []
  const running = await launchBrowser(browserPath)
  try {
    const results: PrintResult[] = new Array(jobs.length)
    let next = 0
    const worker = async () => {
      while (next < jobs.length) {
        const index = next++
        results[index] = await printOne(running, jobs[index]!)
      }
    }
    await Promise.all(Array.from({ length: Math.max(1, Math.min(concurrency, jobs.length)) }, worker))
    return results
  } finally {
    await running.close()
  }
}

async function printOne(running: RunningBrowser, job: PrintJob): Promise<PrintResult> {
  const blocked: string[] = []
  let page: Awaited<ReturnType<RunningBrowser['browser']['newPage']>>
  try {
    page = await running.browser.newPage()
  } catch (error) {
    return { job, ok: false, error: `the browser gave no page (${error instanceof Error ? error.message : String(error)})`, pages: 0, blocked }
  }
  try {
    const root = resolve(job.folder) + sep
    await page.setRequestInterception(true)
    page.on('request', (request) => {
      const url = request.url()
      if (url.startsWith('data:')) return void request.continue()
      if (url.startsWith('file:')) {
        const path = resolve(fileURLToPath(url))
        if (path.startsWith(root)) return void request.continue()
      }
      blocked.push(url)
      void request.abort('blockedbyclient')
    })
    await page.goto(pathToFileURL(resolve(job.html)).href, { waitUntil: 'load', timeout: 60_000 })
    await page.evaluate(() => document.fonts.ready.then(() => undefined))
    // Links to the package's other files would print as this machine's file:// paths: keep their text only.
    // The screen-only animation and KaTeX's hidden MathML copy (for screen readers of the HTML)
    // add nothing to paper but layout time and duplicate text in the PDF's text layer.
    await page.evaluate(() => {
      for (const link of document.querySelectorAll('a[href]')) {
        if (!(link.getAttribute('href') ?? '').startsWith('#')) link.removeAttribute('href')
      }
      for (const hidden of document.querySelectorAll('.katex-mathml, .lw-animation')) hidden.remove()
    })
    const { header, footer } = headerFooter(job)
    const print = () =>
      page.pdf({
        format: job.paper === 'Letter' ? 'letter' : 'a4',
        printBackground: true,
        displayHeaderFooter: true,
        headerTemplate: header,
        footerTemplate: footer,
        margin: { top: '22mm', bottom: '20mm', left: '25mm', right: '16mm' },
        preferCSSPageSize: false,
        timeout: 120_000,
      })
    // The contents gets its page numbers from a first printing (their boxes keep their width,
    // so the layout does not move); printed again until the numbers stand.
    let pdf = await print()
    for (let pass = 0; pass < 3; pass++) {
      const pages = [...destinationPages(pdf)]
      const changed = await page.evaluate((entries: [string, number][]) => {
        let moved = false
        for (const [id, n] of entries) {
          for (const cell of document.querySelectorAll(`.lw-contents-page[data-target="${id}"]`)) {
            if (cell.textContent !== String(n)) {
              cell.textContent = String(n)
              moved = true
            }
          }
        }
        return moved
      }, pages)
      if (!changed) break
      pdf = await print()
    }
    const bytes = withMetadata(normaliseStructureIds(pdf), job)
    writeFileSync(job.pdf, bytes)
    return { job, ok: true, error: null, pages: countPages(bytes), blocked }
  } catch (error) {
    return { job, ok: false, error: error instanceof Error ? error.message : String(error), pages: 0, blocked }
  } finally {
    await page.close().catch(() => undefined)
  }
}

/**
 * Chromium tags the PDF's structure elements with its DOM node numbers
 * (`(node00000097)`), which shift by one now and then between runs. Renumber
 * them 1, 2, 3 … keeping their order (the ID tree stays sorted) and their
 * length (so every byte offset stays valid).
 */
export function normaliseStructureIds(pdf: Uint8Array): Uint8Array {
  const text = Buffer.from(pdf).toString('latin1')
  const ids = [...new Set([...text.matchAll(/\(node(\d{8})\)/g)].map((m) => m[1]!))].sort()
  if (ids.length === 0) return pdf
  const renamed = new Map(ids.map((id, i) => [id, String(i + 1).padStart(8, '0')]))
  return Buffer.from(text.replace(/\(node(\d{8})\)/g, (_, id: string) => `(node${renamed.get(id)})`), 'latin1')
}

/** The document information a PDF carries. */
export interface PdfInfo {
  readonly title: string
  readonly subject: string
  readonly author: string
  readonly keywords: string
  readonly creator: string
  readonly producer: string
  /** YYYY-MM-DD */
  readonly date: string
}

/** A PDF text string: UTF-16BE with a byte-order mark, written in hex (safe for any character). */
function pdfText(text: string): string {
  let hex = 'FEFF'
  for (let i = 0; i < text.length; i++) hex += text.charCodeAt(i).toString(16).toUpperCase().padStart(4, '0')
  return `<${hex}>`
}

/**
 * Set the document information by an incremental update (a new Info object, a
 * one-entry cross-reference section and a trailer pointing back to the old one:
 * the standard way to amend a PDF without rewriting it), and put the note's date
 * in place of the clock's in the original Info, keeping its length.
 */
export function setPdfInfo(pdf: Uint8Array, info: PdfInfo): Uint8Array {
  const text = Buffer.from(pdf).toString('latin1')
  const compact = info.date.replace(/-/g, '')
  const pdfDate = `D:${compact}000000+00'00'`
  const dated = text.replace(/\/(CreationDate|ModDate) \(D:\d{14}[^)]*\)/g, (whole, key: string) => {
    const replacement = `/${key} (${pdfDate})`
    return replacement.length === whole.length ? replacement : whole
  })
  const tail = dated.slice(dated.lastIndexOf('trailer'))
  const size = /\/Size (\d+)/.exec(tail)
  const root = /\/Root (\d+ \d+ R)/.exec(tail)
  const previous = /startxref\s+(\d+)\s+%%EOF\s*$/.exec(dated)
  if (!size || !root || !previous) throw new Error('Cannot update the PDF’s document information: unexpected trailer')
  const number = Number(size[1])
  const object =
    `${number} 0 obj\n<</Title ${pdfText(info.title)} /Subject ${pdfText(info.subject)} /Author ${pdfText(info.author)} ` +
    `/Keywords ${pdfText(info.keywords)} /Creator ${pdfText(info.creator)} /Producer ${pdfText(info.producer)} ` +
    `/CreationDate (${pdfDate}) /ModDate (${pdfDate})>>\nendobj\n`
  const body = dated.endsWith('\n') ? dated : `${dated}\n`
  const objectOffset = Buffer.byteLength(body, 'latin1')
  const xrefOffset = objectOffset + Buffer.byteLength(object, 'latin1')
  // Each cross-reference entry is exactly 20 bytes, end of line included.
  const update =
    `${object}xref\n0 1\n0000000000 65535 f \n${number} 1\n${String(objectOffset).padStart(10, '0')} 00000 n \n` +
    `trailer\n<</Size ${number + 1} /Root ${root[1]} /Info ${number} 0 R /Prev ${previous[1]}>>\nstartxref\n${xrefOffset}\n%%EOF\n`
  return Buffer.from(body + update, 'latin1')
}

/** Title, subject (document number and revision), author (the roles), keywords (fingerprint) and the note's date. */
export function withMetadata(pdf: Uint8Array, job: PrintJob): Uint8Array {
  return setPdfInfo(pdf, {
    title: job.title,
    subject: `${job.number} rev ${job.revision} (${job.status})`,
    author: job.author,
    keywords: `fingerprint ${job.fingerprint}; linkage design calculation`,
    creator: job.tool,
    producer: `${job.tool} with Chromium`,
    date: job.date,
  })
}

/** Pages of a PDF printed by Chromium: its page-tree root's /Count. */
function countPages(pdf: Uint8Array): number {
  const text = Buffer.from(pdf).toString('latin1')
  const counts = [...text.matchAll(/\/Type \/Pages[^>]*?\/Count (\d+)/g)].map((m) => Number(m[1]))
  return counts.length > 0 ? Math.max(...counts) : 0
}
