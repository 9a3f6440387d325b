/**
 * Block bodies have their own line grammar: a source after `;` is free text
 * (colons, brackets, quotes and all), and every part keeps its place.
 */
import { describe, expect, it } from 'vitest'
import { readBody } from '../../src/notes/body.js'

const origin = { line: 10, indent: 0 }

describe('readBody()', () => {
  it('should keep a colon, brackets and quotes in the source as text', () => {
    const body = readBody('crank: 38 mm ; [dwg-4410] item 3: "pin radius", see note: 4\nrod: 100 mm', origin)
    expect(body.problems).toEqual([])
    expect(body.entries.map((e) => [e.name, e.value, e.source])).toEqual([
      ['crank', '38 mm', '[dwg-4410] item 3: "pin radius", see note: 4'],
      ['rod', '100 mm', null],
    ])
  })

  it('should place the name, the value and the source in the note', () => {
    const [entry] = readBody('  speed:  duty.rate ; [spec] §2', { line: 20, indent: 2 }).entries
    expect(entry!.namePlace).toEqual({ start: { line: 20, column: 5 }, end: { line: 20, column: 10 } })
    expect(entry!.valuePlace).toEqual({ start: { line: 20, column: 13 }, end: { line: 20, column: 22 } })
    expect(entry!.sourcePlace).toEqual({ start: { line: 20, column: 25 }, end: { line: 20, column: 34 } })
  })

  it('should split a label with spaces from its condition at the first colon', () => {
    const [entry] = readBody('push is the slow stroke: pusher.outstroke_angle > 180 deg ; [spec-t3] §2.4', origin).entries
    expect([entry!.name, entry!.value, entry!.source]).toEqual(['push is the slow stroke', 'pusher.outstroke_angle > 180 deg', '[spec-t3] §2.4'])
  })

  it('should join a deeper-indented line to the entry or item above', () => {
    const body = readBody('- The gearbox runs at a steady speed;\n  slip is neglected. (to verify)\n- Second', origin)
    expect(body.items.map((i) => i.text)).toEqual(['The gearbox runs at a steady speed; slip is neglected. (to verify)', 'Second'])
    const entries = readBody('rod: 100 mm ; [dwg] item 5,\n   stock rod', origin).entries
    expect(entries[0]!.source).toBe('[dwg] item 5, stock rod')
  })

  it('should read an item with fields, the text holding commas and colons', () => {
    const [item] = readBody('- {text: Friction: neglected, for now, verify: yes}', origin).items
    expect(item!.text).toBe('Friction: neglected, for now')
    expect(item!.fields.verify).toBe('yes')
  })

  it('should skip blank and comment lines', () => {
    const body = readBody('\n# lengths from the drawing\ncrank: 40 mm\n\n', origin)
    expect(body.entries.map((e) => e.name)).toEqual(['crank'])
    expect(body.entries[0]!.namePlace.start.line).toBe(12)
  })

  it('should place a line that is neither an entry nor an item', () => {
    const body = readBody('crank: 40 mm\nrod 100 mm', origin)
    expect(body.problems).toEqual([{ reason: 'expected `name: value ; source` (or `- item`)', place: { start: { line: 11, column: 1 }, end: { line: 11, column: 11 } } }])
  })

  it('should refuse items mixed into entries, at the item', () => {
    const body = readBody('crank: 40 mm\n- stray', origin)
    expect(body.problems.map((p) => p.place.start.line)).toEqual([11])
  })
})
