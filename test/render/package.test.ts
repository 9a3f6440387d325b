/**
 * The rendered package: every section in order, the core's numbers, failures
 * first, sanitised note HTML, deterministic bytes, the fingerprint and caution.
 */
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { dataReader } from '../../src/cli/data-files.js'
import type { Element } from 'hast'
import { fromHtml } from 'hast-util-from-html'
import { toString } from 'hast-util-to-string'
import { visit } from 'unist-util-visit'
import type { VFile } from 'vfile'
import { beforeAll, describe, expect, it } from 'vitest'
import type { BuiltNote } from '../../src/build.js'
import { analyseSliderCrank, sliderCrank } from '../../src/linkage/index.js'
import { formatNumber } from '../../src/notes/display.js'
import { build } from '../helpers/note.js'

const demo = readFileSync(new URL('../../reports/carton-pusher.md', import.meta.url), 'utf8')

function ids(html: string): string[] {
  const found: string[] = []
  visit(fromHtml(html), 'element', (node: Element) => {
    if (typeof node.properties.id === 'string') found.push(node.properties.id)
  })
  return found
}

function byId(html: string, id: string): Element | null {
  let hit: Element | null = null
  visit(fromHtml(html), 'element', (node: Element) => {
    if (node.properties.id === id) hit = node
  })
  return hit
}

describe('package sections', () => {
  let built: BuiltNote
  let file: VFile
  let html: string
  beforeAll(async () => {
    ;({ built, file } = await build(demo, 'reports/carton-pusher.md', dataReader(fileURLToPath(new URL('../../reports/carton-pusher.md', import.meta.url)))))
    html = built.html!
  })

  it('should build the demo note without errors', () => {
    expect(file.messages.filter((m) => m.fatal)).toEqual([])
    expect(built.ok).toBe(true)
  })

  it('should hold every section in the order a design review reads them', () => {
    const order = ['cover', 'contents', 'scope', 'caution', 'revisions', 'summary', 'conclusions', 'assumptions', 'references', 'software', 'sign-off']
    const found = ids(html)
    const positions = order.map((id) => found.indexOf(id))
    expect(positions.every((p) => p >= 0)).toBe(true)
    expect([...positions].sort((a, b) => a - b)).toEqual(positions)
    // The note's body sits between the summary and the assumptions.
    expect(found.indexOf('block-pusher')).toBeGreaterThan(found.indexOf('summary'))
    expect(found.indexOf('block-pusher')).toBeLessThan(found.indexOf('assumptions'))
  })

  it('should print the core’s numbers', () => {
    const core = analyseSliderCrank(sliderCrank({ crank: 0.0378, rod: 0.1, offset: 0.03, rotation: -1 }), { speed: (96 * 2 * Math.PI) / 60 })
    const block = toString(byId(html, 'block-pusher')!)
    expect(block).toContain(formatNumber(core.stroke * 1000, 5))
    expect(block).toContain(formatNumber(core.timeRatio!, 5))
    expect(block).toContain(formatNumber((core.transmissionMin.value * 180) / Math.PI, 5))
    expect(block).toContain(formatNumber(core.extremes.acceleration.min.value, 5))
  })

  it('should list every check in the summary, the gate first and the informative ones apart, in words', () => {
    const summary = toString(byId(html, 'summary')!)
    expect(summary).toContain('7 of 7 checks pass; 1 informative check, not part of the gate (1 FAIL).')
    const informative = summary.indexOf('informativeoption B quick return')
    const lastPass = summary.lastIndexOf('PASS')
    expect(informative).toBeGreaterThan(lastPass)
  })

  it('should carry the caution and claim no compliance', () => {
    const caution = toString(byId(html, 'caution')!)
    expect(caution).toContain('for checking by a qualified engineer')
    expect(caution).toContain('Guarding, fatigue, and the local codes and licensed engineering practice')
    expect(caution).toContain('does not claim compliance with any code or standard')
    expect(html).not.toMatch(/\bcomplies with\b|\bcompliant with\b|\bcertified\b/i)
  })

  it('should point to the caution from the cover', () => {
    const cover = toString(byId(html, 'cover')!)
    expect(cover).toContain('read the caution under Scope and caution before using any of them')
  })

  it('should state its scope and what it leaves out, near the front', () => {
    const scope = toString(byId(html, 'scope')!)
    expect(scope).toContain('This package calculates, for #pusher (slider-crank), #option_b (eccentric drive): kinematics')
    // The pusher's forces are found; its flywheel, rod buckling and pins are not, and the scope says so.
    expect(scope).toContain('forces, crank torque and drive power from the stated loads and masses')
    expect(scope).toContain('Flywheel sizing and speed fluctuation.')
    expect(scope).toContain('Buckling of the connecting rod.')
    expect(scope).toContain('Compliance with any code or standard: none is claimed.')
  })

  it('should conclude: what the checks show, the note’s recommendation, the open items', () => {
    const conclusions = toString(byId(html, 'conclusions')!)
    expect(conclusions).toContain('The acceptance checks pass.')
    expect(conclusions).toContain('Recommendation: build option A')
    expect(conclusions).toContain('Assumption A1 is to be verified: The gearbox output turns at a steady 96 rpm')
    // Printed once: in place the blocks only point to their sections.
    expect(html.split('Recommendation: build option A').length).toBe(2)
    expect(html.split('The gearbox output turns at a steady 96 rpm').length).toBe(3)
  })

  it('should show a checker as assigned, not signed, while the status is for review', () => {
    const signOff = toString(byId(html, 'sign-off')!)
    expect(signOff).toContain('M. Lindqvist (assigned)')
    expect(toString(byId(html, 'cover')!)).toContain('M. Lindqvist (assigned; not yet signed)')
  })

  it('should say how the program was verified: its outside sources and their standing', () => {
    const software = toString(byId(html, 'software')!)
    expect(software).toContain('J. B. Heywood, Internal Combustion Engine Fundamentals, McGraw-Hill, 1988, §2.2 (from memory)')
    expect(software).toContain('(independent library)')
    expect(software).not.toContain('listed with the program.')
  })

  it('should tie the sign-off to the fingerprint, shown there and in the footer', () => {
    const fingerprint = built.model.fingerprint
    expect(fingerprint).toMatch(/^[0-9a-f]{64}$/)
    expect(toString(byId(html, 'sign-off')!)).toContain(fingerprint)
    expect(html.match(new RegExp(fingerprint.slice(0, 4), 'g'))!.length).toBeGreaterThanOrEqual(3)
  })

  it('should typeset the method server-side with no KaTeX errors', () => {
    expect(html).toContain('class="katex-display"')
    expect(html).not.toContain('katex-error')
  })
})

describe('determinism', () => {
  it('should give byte-identical packages for the same note', async () => {
    const one = await build(demo, 'reports/carton-pusher.md')
    const two = await build(demo, 'reports/carton-pusher.md')
    expect(two.built.html).toBe(one.built.html)
    expect(JSON.stringify(two.built.results)).toBe(JSON.stringify(one.built.results))
  })

  it('should change the fingerprint when any character of the note changes', async () => {
    const one = (await build(demo)).built.model.fingerprint
    const two = (await build(demo.replace('crank: 37.8 mm', 'crank: 37.80 mm'))).built.model.fingerprint
    expect(two).not.toBe(one)
    expect((await build(demo.replace(/\n/g, '\r\n'))).built.model.fingerprint).toBe(one)
  })
})

describe('sanitising', () => {
  const note = [
    'Inline <b>bold</b> and <sub>2</sub>.',
    '',
    '<script>alert("x")</script>',
    '',
    '<img src="x.png" onerror="alert(1)">',
    '',
    '<a href="javascript:alert(1)">link</a> <iframe src="https://example.org"></iframe>',
    '',
    '<div style="position:fixed" class="lw-caution" id="summary">spoof</div>',
    '',
    'Math stays: $\\mu = \\arccos(a/b)$.',
    '',
  ].join('\n')
  let html: string
  beforeAll(async () => {
    html = (await build(note)).built.html!
  })

  it('should drop scripts, handlers, javascript: links, frames and styles from the note’s HTML', () => {
    expect(html).not.toMatch(/<script/i)
    expect(html).not.toMatch(/onerror/i)
    expect(html).not.toMatch(/javascript:/i)
    expect(html).not.toMatch(/<iframe/i)
    expect(html).not.toContain('position:fixed')
  })

  it('should keep harmless markup, the math and the package’s own markup', () => {
    expect(html).toContain('<b>bold</b>')
    expect(html).toContain('<sub>2</sub>')
    expect(html).toContain('class="katex"')
    // The spoofed id is prefixed, so the real summary keeps its id.
    expect(ids(html).filter((id) => id === 'summary')).toHaveLength(1)
    expect(html).toContain('class="lw-caution"')
  })
})
