/**
 * The PDF packages, printed by a real Chromium and read back with a
 * general-purpose PDF library (pdfjs-dist) and poppler's pdftoppm. Needs
 * `npm run build` first and Chromium and poppler-utils installed (.ci/setup).
 */
import { execFileSync, spawnSync } from 'node:child_process'
import { cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { createServer } from 'node:http'
import type { AddressInfo } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs'
import { beforeAll, describe, expect, it } from 'vitest'
import { destinationPages } from '../../src/pdf/destinations.js'

const root = new URL('../../', import.meta.url).pathname
const bin = join(root, 'bin', 'linkwright.js')
const artifacts = join(root, 'test-artifacts')

function run(args: readonly string[], cwd: string, env: NodeJS.ProcessEnv = {}) {
  const result = spawnSync(process.execPath, [bin, ...args], { cwd, encoding: 'utf8', env: { ...process.env, ...env } })
  return { code: result.status, stdout: result.stdout, stderr: result.stderr }
}

/** Text of every page, in content order (enough for `includes`). */
async function pdfPages(path: string): Promise<{ pages: string[]; info: Record<string, unknown> }> {
  const doc = await getDocument({ data: new Uint8Array(readFileSync(path)), useSystemFonts: false, isEvalSupported: false }).promise
  const pages: string[] = []
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent()
    pages.push(content.items.map((item) => ('str' in item ? item.str : '')).join(' ').replace(/\s+/g, ' '))
  }
  const { info } = await doc.getMetadata()
  await doc.destroy()
  return { pages, info: info as Record<string, unknown> }
}

/** Share of dark pixels of a PDF page rendered by pdftoppm (grey map, 30 dpi). */
function inkOnPage(pdf: string, page: number): number {
  const pgm = execFileSync('pdftoppm', ['-gray', '-r', '30', '-f', String(page), '-l', String(page), pdf])
  // P5 header: magic, width, height, max value, then one byte a pixel.
  const header = pgm.subarray(0, 40).toString('latin1')
  const [, w, h] = /^P5\s+(\d+)\s+(\d+)\s+\d+\s/.exec(header)!
  const start = pgm.length - Number(w) * Number(h)
  let dark = 0
  for (let i = start; i < pgm.length; i++) if (pgm[i]! < 160) dark++
  return dark / (Number(w) * Number(h))
}

describe('PDF packages of the demo notes', () => {
  let dir: string
  let result: ReturnType<typeof run>
  let pusher: { pages: string[]; info: Record<string, unknown> }
  let results: { checks: { label: string; status: string; actual: { display: string } }[]; blocks: { id: string; results: Record<string, { display: string }> }[] }
  const pdf = () => join(dir, 'out/carton-pusher/carton-pusher.pdf')

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'linkwright-pdf-'))
    cpSync(join(root, 'reports'), join(dir, 'reports'), { recursive: true })
    result = run(['build'], dir)
    pusher = await pdfPages(pdf())
    results = JSON.parse(readFileSync(join(dir, 'out/carton-pusher/results.json'), 'utf8'))
  })

  it('should print a PDF beside every HTML package', () => {
    // The one message: the agitator's dead points, a warning the package shows.
    expect(result.stderr).not.toMatch(/ {2}error {2}/)
    expect(result.stderr.match(/ {2}warning {2}/g)).toHaveLength(1)
    expect(result.code).toBe(0)
    expect(existsSync(pdf())).toBe(true)
    expect(existsSync(join(dir, 'out/sieve-rocker/sieve-rocker.pdf'))).toBe(true)
  })

  it('should carry the header and "page X of Y" on every page', () => {
    const total = pusher.pages.length
    pusher.pages.forEach((text, i) => {
      expect(text, `page ${i + 1}`).toContain('Carton pusher drive, transfer station T3')
      expect(text, `page ${i + 1}`).toContain('DN-T3-014 rev C')
      expect(text, `page ${i + 1}`).toContain(`page ${i + 1} of ${total}`)
      expect(text, `page ${i + 1}`).toContain('FOR REVIEW')
    })
  })

  it('should mark a draft on every page', async () => {
    const { pages } = await pdfPages(join(dir, 'out/sieve-rocker/sieve-rocker.pdf'))
    for (const text of pages) expect(text).toContain('DRAFT')
  })

  it('should hold every check’s result, the key results, the caution and the sign-off', () => {
    const all = pusher.pages.join(' ')
    for (const check of results.checks) {
      expect(all).toContain(check.label)
      expect(all).toContain(check.actual.display)
    }
    expect(all.match(/✖ FAIL|FAIL/g)!.length).toBeGreaterThanOrEqual(results.checks.filter((c) => c.status === 'FAIL').length)
    const drive = results.blocks.find((b) => b.id === 'pusher')!
    for (const name of ['stroke', 'time_ratio', 'transmission_angle_min', 'velocity_abs_max', 'acceleration_abs_max']) {
      expect(all).toContain(drive.results[name]!.display)
    }
    expect(all).toContain('for checking by a qualified engineer')
    expect(all).toContain('does not claim compliance with any code or standard')
    const last = pusher.pages[pusher.pages.length - 1]!
    for (const field of ['Sign-off', 'Prepared', 'Checked', 'Approved', 'Signature', 'Checker’s checklist', 'Fingerprint', 'R. Okafor', 'M. Lindqvist']) {
      expect(last).toContain(field)
    }
  })

  it('should give the contents the pages the sections print on, as a PDF library reads them', async () => {
    const doc = await getDocument({ data: new Uint8Array(readFileSync(pdf())), useSystemFonts: false, isEvalSupported: false }).promise
    const ours = destinationPages(readFileSync(pdf()))
    const sections = [...ours].filter(([id]) => id.startsWith('section-'))
    expect(sections.length).toBeGreaterThan(8)
    for (const [id, page] of sections) {
      const dest = (await doc.getDestination(id)) as [{ num: number; gen: number }, ...unknown[]]
      expect((await doc.getPageIndex(dest[0])) + 1, id).toBe(page)
    }
    await doc.destroy()
    // And the contents prints them: the page that holds the Assumptions table is the number after "Assumptions".
    const page = pusher.pages.findIndex((text) => text.includes('No. Assumption Stated by Status')) + 1
    expect(page).toBeGreaterThan(2)
    expect(pusher.pages[0]).toMatch(new RegExp(`Assumptions ${page}\\b`))
  })

  it('should need as many pages as the content: cover, contents and scope sharing the first, no blank page', () => {
    expect(pusher.pages.length).toBeGreaterThanOrEqual(8)
    // Kinematics, a rejected option and the forces of the push: dense pages, none wasted.
    expect(pusher.pages.length).toBeLessThanOrEqual(28)
    expect(pusher.pages[0]).toContain('Document DN-T3-014 Revision C')
    expect(pusher.pages[0]).toContain('Contents')
    expect(pusher.pages[0]).toContain('Scope and caution')
    for (const [i, text] of pusher.pages.entries()) {
      // Beyond the header and footer (~25 words) every page has content.
      expect(text.split(' ').length, `page ${i + 1}`).toBeGreaterThan(35)
    }
  })

  it('should take the PDF metadata and dates from the note', () => {
    expect(pusher.info.Title).toBe('Carton pusher drive, transfer station T3')
    expect(pusher.info.Subject).toBe('DN-T3-014 rev C (FOR REVIEW)')
    expect(pusher.info.Author).toBe('prepared by R. Okafor; checked by M. Lindqvist')
    expect(String(pusher.info.CreationDate)).toMatch(/^D:20261120000000/)
    expect(String(pusher.info.ModDate)).toMatch(/^D:20261120000000/)
  })

  it('should print the same bytes when built again', () => {
    const before = readFileSync(pdf())
    expect(run(['build', '--quiet'], dir).code).toBe(0)
    expect(readFileSync(pdf()).equals(before)).toBe(true)
  })

  it('should render page 1 and the sign-off page with ink on them (PNGs kept for inspection)', () => {
    mkdirSync(artifacts, { recursive: true })
    const last = pusher.pages.length
    for (const page of [1, last]) {
      expect(inkOnPage(pdf(), page), `page ${page}`).toBeGreaterThan(0.005)
      execFileSync('pdftoppm', ['-png', '-r', '60', '-f', String(page), '-l', String(page), '-singlefile', pdf(), join(artifacts, `carton-pusher-page-${page}`)])
    }
    expect(existsSync(join(artifacts, 'carton-pusher-page-1.png'))).toBe(true)
  })

  it('should follow --paper Letter', async () => {
    const letter = run(['build', 'reports/carton-pusher.md', '--paper', 'Letter', '--out', 'letter', '--quiet'], dir)
    expect(letter.code).toBe(0)
    const doc = await getDocument({ data: new Uint8Array(readFileSync(join(dir, 'letter/carton-pusher/carton-pusher.pdf'))) }).promise
    const [, , width, height] = (await doc.getPage(1)).view
    expect([Math.round(width!), Math.round(height!)]).toEqual([612, 792])
    await doc.destroy()
  })
})

describe('printing fetches nothing from the network', () => {
  it('should build a note that asks for remote files, with no request leaving the machine', async () => {
    const hits: string[] = []
    const server = createServer((request, response) => {
      hits.push(request.url ?? '')
      response.end('x')
    })
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
    const { port } = server.address() as AddressInfo
    try {
      const dir = mkdtempSync(join(tmpdir(), 'linkwright-net-'))
      mkdirSync(join(dir, 'notes'))
      const note = `---\ntitle: Remote things\nnumber: N-1\nrevision: A\nstatus: draft\ndate: 2026-01-02\n---\n\n![logo](http://127.0.0.1:${port}/logo.png)\n\n<img src="http://127.0.0.1:${port}/raw.png">\n\n<link rel="stylesheet" href="http://127.0.0.1:${port}/style.css">\n\nText.\n`
      writeFileSync(join(dir, 'notes/remote.md'), note)
      const built = run(['build', 'notes'], dir)
      expect(built.code).toBe(0)
      expect(existsSync(join(dir, 'out/remote/remote.pdf'))).toBe(true)
      expect(built.stderr).toContain(`Unexpected remote resource \`http://127.0.0.1:${port}/logo.png\``)
      expect(built.stderr).toContain(`Blocked a request for \`http://127.0.0.1:${port}/logo.png\``)
      expect(hits).toEqual([])
    } finally {
      server.close()
    }
  })
})

describe('without a browser', () => {
  it('should build the HTML, say how to install Chromium, and exit 3', () => {
    const dir = mkdtempSync(join(tmpdir(), 'linkwright-nobrowser-'))
    cpSync(join(root, 'reports'), join(dir, 'reports'), { recursive: true })
    const result = run(['build'], dir, { LINKWRIGHT_CHROMIUM: '/nonexistent/chromium' })
    expect(result.code).toBe(3)
    expect(result.stderr).toContain('apt-get install chromium')
    expect(result.stderr.match(/No Chromium found/g)).toHaveLength(1)
    expect(existsSync(join(dir, 'out/carton-pusher/index.html'))).toBe(true)
    expect(existsSync(join(dir, 'out/carton-pusher/carton-pusher.pdf'))).toBe(false)
  })

  it('should not look for one with --no-pdf', () => {
    const dir = mkdtempSync(join(tmpdir(), 'linkwright-nopdf-'))
    cpSync(join(root, 'reports'), join(dir, 'reports'), { recursive: true })
    const result = run(['build', '--no-pdf'], dir, { LINKWRIGHT_CHROMIUM: '/nonexistent/chromium' })
    expect(result.code).toBe(0)
    expect(result.stderr).not.toMatch(/No Chromium| {2}error {2}/)
  })
})
