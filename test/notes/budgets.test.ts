/**
 * What one line of a note may cost: expressions that would allocate gigabytes
 * or run for minutes through mathjs (formatting, big numbers, fractions,
 * primality), complex numbers, an alias bomb in the front matter and an
 * unbounded chart range are each a positioned message, found fast.
 * Each case here crashed, hung or gave "internal error" at 1:1 before.
 */
import { describe, expect, it } from 'vitest'
import { BODY_LINE, build } from '../helpers/note.js'

const drive = '```slider-crank #drive\ncrank: 40 mm\nrod: 160 mm\nspeed: 100 rpm\n```\n'

interface Case {
  readonly name: string
  readonly note: string
  readonly rule: string
  /** Line from the start of the body (after the test front matter), or absolute when `absolute`. */
  readonly line: number
  readonly column: number
  readonly reason?: RegExp
  readonly absolute?: boolean
}

const cases: readonly Case[] = [
  { name: 'format with a billion digits in prose', note: 'Value :value[format(1, 1e9)] here.\n', rule: 'invalid-value-reference', line: 0, column: 7, reason: /`format` is not available/ },
  { name: 'a primality test on a 127-bit big number', note: 'Value :value[isPrime(bignumber(2^127 - 1))].\n', rule: 'invalid-value-reference', line: 0, column: 7, reason: /`isPrime` is not available/ },
  { name: 'a fraction raised to a billion', note: `${drive}\nValue :value[fraction(3)^1e9].\n`, rule: 'invalid-value-reference', line: 6, column: 7, reason: /`fraction` is not available/ },
  { name: 'a bignumber in a block value', note: drive.replace('40 mm', 'bignumber(40) mm'), rule: 'invalid-expression', line: 1, column: 8, reason: /`bignumber` is not available/ },
  { name: 'a complex-number length', note: drive.replace('40 mm', '(38 + 2i) mm'), rule: 'invalid-expression', line: 1, column: 8, reason: /complex number/ },
  { name: 'the root of a negative number', note: drive.replace('40 mm', 'sqrt(-1600) mm'), rule: 'invalid-expression', line: 1, column: 8, reason: /complex number/ },
  { name: 'a check on a complex value', note: `${drive}\n\`\`\`checks\nbad: drive.stroke <= sqrt(-1) mm\n\`\`\`\n`, rule: 'invalid-expression', line: 7, column: 6, reason: /complex number/ },
  {
    name: 'a chart over a billion degrees',
    note: `${drive}\n\`\`\`chart\nof: drive\nseries: position\nx_range: 0 deg, 1e9 deg\n\`\`\`\n`,
    rule: 'chart-syntax',
    line: 9,
    column: 10,
    reason: /at most ten turns/,
  },
  { name: 'an expression longer than the limit', note: drive.replace('40 mm', `${'1 + '.repeat(120)}40 mm`), rule: 'invalid-expression', line: 1, column: 8, reason: /longer than 400/ },
  { name: 'a nesting deeper than the length limit allows', note: drive.replace('40 mm', `${'('.repeat(5000)}40 mm${')'.repeat(5000)}`), rule: 'invalid-expression', line: 1, column: 8, reason: /longer than 400/ },
]

describe('budgets of one line', () => {
  for (const c of cases) {
    it(`should refuse ${c.name} at its place`, async () => {
      const { file, built } = await build(c.note)
      const errors = file.messages.filter((m) => m.fatal === true)
      expect(built.ok).toBe(false)
      expect(errors.map((e) => `${e.line}:${e.column} ${e.ruleId}`)).toEqual([`${c.absolute ? c.line : BODY_LINE + c.line}:${c.column} ${c.rule}`])
      if (c.reason) expect(errors[0]!.reason).toMatch(c.reason)
    })
  }

  it('should evaluate at most 400 calculation blocks and say so at the first one left out', async () => {
    const blocks = Array.from({ length: 402 }, (_, i) => `\`\`\`design-inputs #d${i}\nv: ${i} mm\n\`\`\`\n`).join('\n')
    const { file, built } = await build(blocks)
    expect(built.ok).toBe(false)
    const errors = file.messages.filter((m) => m.fatal === true)
    // Each block is four lines (fence, value, fence, blank): block 401 starts 400 blocks below the first.
    expect(errors.map((m) => `${m.line}:${m.column} ${m.ruleId}`)).toEqual([`${BODY_LINE + 400 * 4}:1 block-syntax`])
    expect(errors[0]!.reason).toMatch(/402 calculation blocks; at most 400/)
  })

  it('should refuse Monte Carlo samples beyond the note’s budget, at the block that would pass it', async () => {
    const tol = (i: number) => `\`\`\`tolerances #t${i}\nof: drive\ncrank: ± 0.05 mm\nsamples: 2000000\n\`\`\`\n`
    const { file, built } = await build(`${drive}\n${Array.from({ length: 3 }, (_, i) => tol(i)).join('\n')}`)
    expect(built.ok).toBe(false)
    const errors = file.messages.filter((m) => m.fatal === true)
    // The third block's `samples:` line: 4 000 000 samples are drawn, 1 000 000 more are allowed.
    expect(errors.map((m) => `${m.line}:${m.column} ${m.ruleId}`)).toEqual([`${BODY_LINE + 6 + 2 * 6 + 3}:10 invalid-choice`])
    expect(errors[0]!.reason).toMatch(/at most 1000000 more: a note draws at most 5000000 Monte Carlo samples in all/)
  })

  it('should refuse an alias bomb in the front matter at its first alias', async () => {
    const levels = ['a: &a [x, x, x, x, x, x, x, x, x]']
    for (const [i, name] of ['b', 'c', 'd', 'e', 'f', 'g'].entries()) levels.push(`${name}: &${name} [${Array(9).fill(`*${'abcdef'[i]}`).join(', ')}]`)
    const note = `---\ntitle: Bomb\nnumber: T-1\nrevision: A\nstatus: draft\n${levels.join('\n')}\n---\n\nText.\n`
    const { file, built } = await build(note)
    expect(built.ok).toBe(false)
    expect(file.messages.filter((m) => m.fatal === true).map((m) => `${m.line}:${m.column} ${m.ruleId}`)).toEqual(['7:8 front-matter-syntax'])
  })

  it('should evaluate the deepest nesting the length limit allows, without overflowing the stack', async () => {
    const { file, built } = await build(drive.replace('40 mm', `${'('.repeat(195)}40 mm${')'.repeat(195)}`))
    expect(file.messages.filter((m) => m.fatal === true)).toEqual([])
    expect(built.ok).toBe(true)
  })

  it('should still read a front matter that repeats a person by an alias', async () => {
    const note = `---\ntitle: Alias\nnumber: T-1\nrevision: A\nstatus: draft\ndate: 2026-01-05\npeople:\n  prepared: &me { name: A. Person, date: 2026-01-05 }\n---\n\n${drive}`
    const { file, built } = await build(note)
    expect(file.messages.filter((m) => m.fatal === true)).toEqual([])
    expect(built.ok).toBe(true)
  })

  it('should keep the functions an engineering formula needs', async () => {
    const { file, built } = await build(drive.replace('40 mm', 'max(hypot(30, 20) mm, sqrt(1600) mm * cos(0 deg), round(39.6) mm)'))
    expect(file.messages.filter((m) => m.fatal === true)).toEqual([])
    expect(built.ok).toBe(true)
  })
})

describe('the core’s messages in the note’s units', () => {
  it('should word a refused linkage of a US note in inches, not the core’s millimetres', async () => {
    const note = `---\ntitle: US note\nnumber: T-1\nrevision: A\nstatus: draft\ndate: 2026-01-05\nunits:\n  system: US\n---\n\n\`\`\`slider-crank #drive\ncrank: 0.8 in\nrod: 2 in\noffset: 3.2 in\nspeed: 60 rpm\n\`\`\`\n`
    const { file } = await build(note)
    const error = file.messages.find((m) => m.ruleId === 'linkage-error')!
    // 2 in of rod cannot reach a path 3.2 in off the crank centre: crank + rod = 2.8 in.
    expect(error.reason).toBe('The connecting rod (2 in) cannot reach the slider path at any crank angle: the offset (3.2 in) exceeds crank + rod = 2.8 in (cannot-assemble)')
    expect(error.reason).not.toMatch(/mm/)
  })
})
