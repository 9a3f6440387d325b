/**
 * Finding the browser and keeping printed PDFs byte-stable (no browser needed).
 */
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { BROWSER_PATHS, findBrowser } from '../../src/pdf/browser.js'
import { headerFooter, normaliseStructureIds } from '../../src/pdf/print.js'

describe('findBrowser()', () => {
  const fake = () => {
    const path = join(mkdtempSync(join(tmpdir(), 'linkwright-fake-')), 'chromium')
    writeFileSync(path, '#!/bin/sh\n', { mode: 0o755 })
    return path
  }

  it('should take an explicit path first, then LINKWRIGHT_CHROMIUM, then the usual paths (Debian’s first)', () => {
    const explicit = fake()
    const fromEnv = fake()
    expect(findBrowser(explicit, { LINKWRIGHT_CHROMIUM: fromEnv })).toBe(explicit)
    expect(findBrowser(null, { LINKWRIGHT_CHROMIUM: fromEnv })).toBe(fromEnv)
    expect(BROWSER_PATHS[0]).toBe('/usr/bin/chromium')
  })

  it('should refuse a path that is not an executable rather than fall back silently', () => {
    expect(findBrowser('/nonexistent/chromium', {})).toBeNull()
    expect(findBrowser(null, { LINKWRIGHT_CHROMIUM: '/nonexistent/chromium' })).toBeNull()
  })
})

describe('normaliseStructureIds()', () => {
  it('should renumber structure ids in order, keeping every byte offset', () => {
    const pdf = Buffer.from('<< /ID (node00000097) >> << /ID (node00000121) >> /Names [ (node00000097) 1 0 R (node00000121) 2 0 R ]', 'latin1')
    const out = Buffer.from(normaliseStructureIds(pdf)).toString('latin1')
    expect(out).toBe('<< /ID (node00000001) >> << /ID (node00000002) >> /Names [ (node00000001) 1 0 R (node00000002) 2 0 R ]')
    expect(out.length).toBe(pdf.length)
    // The same ids shifted by one (as Chromium does now and then) give the same bytes.
    const shifted = Buffer.from(pdf.toString('latin1').replace('97', '98').replace('97', '98').replace(/121/g, '122'), 'latin1')
    expect(Buffer.from(normaliseStructureIds(shifted)).toString('latin1')).toBe(out)
  })
})

describe('headerFooter()', () => {
  it('should put title, document, revision, status, fingerprint and page X of Y on every page, and mark a draft', () => {
    const job = { title: 'A & B', number: 'N-1', revision: 'C', status: 'DRAFT', fingerprint: 'abcdef0123456789ffff', tool: 'linkwright 0.1.0' }
    const { header, footer } = headerFooter(job as never)
    expect(header).toContain('A &amp; B')
    expect(header).toContain('N-1 rev C')
    expect(header).toContain('DRAFT')
    expect(footer).toContain('abcd ef01 2345 6789')
    expect(footer).toContain('page <span class="pageNumber"></span> of <span class="totalPages"></span>')
  })
})

describe('setPdfInfo()', () => {
  it('should append an Info object, an xref section pointing at it and a trailer to the old one', async () => {
    const { setPdfInfo } = await import('../../src/pdf/print.js')
    const head = "%PDF-1.4\n1 0 obj\n<</Title (T) /CreationDate (D:20261202040142+00'00')>>\nendobj\n2 0 obj\n<</Type /Catalog>>\nendobj\n"
    const xref = head.length
    const original = `${head}xref\n0 3\n0000000000 65535 f \n0000000009 00000 n \n0000000084 00000 n \ntrailer\n<</Size 3\n/Root 2 0 R\n/Info 1 0 R>>\nstartxref\n${xref}\n%%EOF`
    const out = Buffer.from(setPdfInfo(Buffer.from(original, 'latin1'), { title: 'Größe', subject: 'S', author: 'A', keywords: 'K', creator: 'C', producer: 'P', date: '2026-11-20' })).toString('latin1')
    // The clock's date is replaced in place, same length.
    expect(out.slice(0, head.length)).toBe(head.replace("D:20261202040142+00'00'", "D:20261120000000+00'00'"))
    const newXref = Number(/startxref\n(\d+)\n%%EOF\n$/.exec(out)![1])
    expect(out.slice(newXref, newXref + 4)).toBe('xref')
    const objectOffset = Number(/\n3 1\n(\d{10}) 00000 n \n/.exec(out)![1])
    expect(out.slice(objectOffset, objectOffset + 7)).toBe('3 0 obj')
    expect(out).toContain(`/Prev ${xref}`)
    expect(out).toContain('/Info 3 0 R')
    expect(out).toContain('/Title <FEFF0047007200F600DF0065>')
  })
})
