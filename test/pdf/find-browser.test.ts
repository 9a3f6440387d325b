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
