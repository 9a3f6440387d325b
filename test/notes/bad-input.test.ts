/**
 * Every class of bad input becomes a positioned message (file, line, column,
 * rule id, the catalogue's words), never an exception, and no package.
 */
import { describe, expect, it } from 'vitest'
import { blockKinds } from '../../src/notes/block-kinds/index.js'
import { messages } from '../../src/notes/messages.js'
import { tallyChecks, tallyWords } from '../../src/notes/tally.js'
import { BODY_LINE, build, read } from '../helpers/note.js'

const crank = (body: string, id = 'drive') => `\`\`\`slider-crank #${id}\n${body}\n\`\`\`\n`
const base = 'rod: 150 mm\nspeed: 60 rpm'

/** The only error of a note: [line, column, rule id, reason]. */
async function onlyError(markdown: string): Promise<[number | undefined, number | undefined, string | undefined, string]> {
  const { file, built } = await build(markdown)
  const errors = file.messages.filter((m) => m.fatal === true)
  expect(built.ok).toBe(false)
  expect(built.html).toBeNull()
  expect(errors.map((e) => e.reason), 'exactly one error').toHaveLength(1)
  const e = errors[0]!
  return [e.line, e.column, e.ruleId, e.reason]
}

describe('bad input', () => {
  it('should place malformed front matter YAML', async () => {
    const [line, , rule] = await onlyError('---\ntitle: [unclosed\nnumber: X\n---\n\nText.\n')
    expect(rule).toBe('front-matter-syntax')
    // The YAML parser notices the unclosed list on the next line.
    expect(line).toBe(3)
  })

  it('should place a body line that is not `name: value` at its line in the note', async () => {
    const [line, , rule] = await onlyError(crank(`crank: 40 mm\n${base}\nthis line has no colon`))
    expect(rule).toBe('block-syntax')
    expect(line).toBe(BODY_LINE + 4)
  })

  it('should refuse an unknown block kind that carries an id', async () => {
    expect(await onlyError('```slidercrank #drive\ncrank: 40 mm\n```\n')).toEqual([
      BODY_LINE,
      1,
      'unknown-block-kind',
      // Every registered kind, in the registry's order: a new kind is listed without touching this test.
      messages['unknown-block-kind']('slidercrank', [...blockKinds.keys()]),
    ])
  })

  it('should leave ordinary code blocks alone', async () => {
    const { file, built } = await build('```js\nconsole.log(1)\n```\n')
    expect(file.messages).toEqual([])
    expect(built.html).toContain('console.log(1)')
  })

  it('should name an unknown input and list the known ones', async () => {
    const [line, column, rule, reason] = await onlyError(crank(`crank_radius: 40 mm\n${base}\ncrank: 40 mm`))
    expect([line, column, rule]).toEqual([BODY_LINE + 1, 1, 'unknown-input'])
    expect(reason).toMatch(/^Unexpected input `crank_radius` for a slider-crank block, expected one of `crank`, `rod`/)
  })

  it('should refuse a force where a length belongs', async () => {
    const [line, column, rule, reason] = await onlyError(crank(`crank: 40 N\n${base}`))
    expect([line, column, rule]).toEqual([BODY_LINE + 1, 8, 'dimension-mismatch'])
    expect(reason).toBe(messages['dimension-mismatch']('crank', 'crank radius', 'expected a length (45 mm, 1.75 in), got a force (40 N)'))
  })

  it('should refuse a bare number where a length belongs', async () => {
    const [, , rule, reason] = await onlyError(crank(`crank: 40\n${base}`))
    expect(rule).toBe('dimension-mismatch')
    expect(reason).toContain('with a unit')
  })

  it('should read a crank speed written as a frequency as turns per unit time, and say so', () => {
    for (const speed of ['2 Hz', '120 1/min', '120 rpm', '120 strokes/min', '120 spm', '120 cycle/min']) {
      const { file, model } = read(crank(`crank: 40 mm\nrod: 150 mm\nspeed: ${speed}`))
      expect(file.messages, speed).toEqual([])
      const input = model.outcomes[0]!.inputs.find((i) => i.name === 'speed')!
      // 2 turns per second = 4π rad/s.
      expect(input.value.type === 'quantity' && input.value.si, speed).toBeCloseTo(4 * Math.PI, 12)
      expect(input.note, speed).toBe(/Hz|1\/min/.test(speed) ? 'read as turns per unit time' : undefined)
    }
  })

  it('should read `/min` as the unit, not the function', () => {
    const { file, model } = read('```design-inputs #duty\nfeed: 12 m/min\nsmaller: min(3 mm, 4 mm)\n```\n')
    expect(file.messages).toEqual([])
    expect(model.outcomes[0]!.inputs.map((i) => (i.value.type === 'quantity' ? i.value.si : null))).toEqual([0.2, 0.003])
  })

  it('should flag a wrong design input where it was written, saying where it is used', async () => {
    const note = `\`\`\`design-inputs #duty\nrate: 96 mm ; [alpha]\n\`\`\`\n\n${crank('crank: 40 mm\nrod: 150 mm\nspeed: duty.rate')}`
    const [line, column, rule, reason] = await onlyError(note)
    expect([line, column, rule]).toEqual([BODY_LINE + 1, 7, 'dimension-mismatch'])
    expect(reason).toBe(messages['dimension-mismatch']('duty.rate', `used at line ${BODY_LINE + 7} as \`speed\` (crank speed) of #drive`, 'expected a rotational speed (96 rpm, 120 1/min, 10 rad/s, 1.6 Hz), got a length (96 mm)'))
  })

  it('should keep an error in one design input to its line: the other inputs and their users go on', async () => {
    const note = `\`\`\`design-inputs #duty\nrate: 96 rpm ; [nope] §2\nstroke: 80 mm\n\`\`\`\n\n${crank('crank: duty.stroke / 2\nrod: 150 mm\nspeed: duty.rate')}`
    const [line, column, rule] = await onlyError(note)
    // At the key itself, and the linkage is still evaluated.
    expect([line, column, rule]).toEqual([BODY_LINE + 1, 16, 'unknown-reference'])
    const { model } = read(note)
    expect(model.outcomes[1]).not.toBeNull()
  })

  it('should refuse a negative length in the engineer’s words', async () => {
    const [line, , rule, reason] = await onlyError(crank(`crank: -40 mm\n${base}`))
    expect([line, rule]).toEqual([BODY_LINE, 'linkage-error'])
    expect(reason).toBe('The crank length must be greater than zero, got -40 mm (invalid-length)')
  })

  it('should refuse a linkage that cannot assemble', async () => {
    const [, , rule, reason] = await onlyError(crank('crank: 20 mm\nrod: 50 mm\noffset: 80 mm\nspeed: 60 rpm'))
    expect(rule).toBe('linkage-error')
    expect(reason).toContain('cannot reach the slider path at any crank angle: the offset (80 mm) exceeds crank + rod = 70 mm')
  })

  it('should refuse an unknown reference key in a source', async () => {
    const [line, , rule, reason] = await onlyError(crank(`crank: 40 mm ; [nope] item 3\n${base}`))
    expect([line, rule, reason]).toEqual([BODY_LINE + 1, 'unknown-reference', messages['unknown-reference']('nope')])
  })

  it('should refuse an unknown reference key in prose', async () => {
    const [line, column, rule] = await onlyError('As :cite[nope] says.\n')
    expect([line, column, rule]).toEqual([BODY_LINE, 4, 'unknown-reference'])
  })

  it('should report a cycle between blocks at each block', async () => {
    const { file } = await build(
      `${crank('crank: 40 mm\nrod: lower.rod\nspeed: 60 rpm', 'upper')}\n${crank('crank: 40 mm\nrod: upper.rod\nspeed: 60 rpm', 'lower')}`,
    )
    const cycles = file.messages.filter((m) => m.ruleId === 'dependency-cycle')
    expect(cycles.map((m) => m.line)).toEqual([BODY_LINE, BODY_LINE + 6])
    expect(cycles[0]!.reason).toBe(messages['dependency-cycle'](['upper', 'lower', 'upper']))
    expect(file.messages.map((m) => m.ruleId)).toEqual(['dependency-cycle', 'dependency-cycle'])
  })

  it('should refuse a check that compares a length with an angle', async () => {
    const [line, , rule, reason] = await onlyError(`${crank(`crank: 40 mm\n${base}`)}\n\`\`\`checks\nodd: drive.stroke >= 40 deg\n\`\`\`\n`)
    expect([line, rule]).toEqual([BODY_LINE + 7, 'check-not-evaluable'])
    expect(reason).toContain('it compares a length (80 mm) with an angle (40 deg)')
  })

  it('should refuse a check that is not a comparison', async () => {
    const [, , rule, reason] = await onlyError(`${crank(`crank: 40 mm\n${base}`)}\n\`\`\`checks\nodd: drive.stroke\n\`\`\`\n`)
    expect(rule).toBe('check-syntax')
    expect(reason).toBe(messages['check-syntax']('drive.stroke'))
  })

  it('should refuse an unknown block id in an expression', async () => {
    const [line, , rule, reason] = await onlyError(crank('crank: 40 mm\nrod: 4 * other.crank\nspeed: 60 rpm'))
    expect([line, rule]).toEqual([BODY_LINE + 2, 'unknown-block'])
    expect(reason).toContain('`other` is neither a unit, a function, an input of this block nor a block id')
  })

  it('should refuse an unknown result and list the known ones', async () => {
    const [, , rule, reason] = await onlyError(`${crank(`crank: 40 mm\n${base}`)}\n${crank('crank: drive.strok / 2\nrod: 150 mm\nspeed: 60 rpm', 'follower')}`)
    expect(rule).toBe('unknown-result')
    expect(reason).toMatch(/^Cannot find `strok` in block `drive`, expected one of `crank`, `rod`/)
  })

  it('should report a missing input at the block', async () => {
    const [line, column, rule, reason] = await onlyError(crank('crank: 40 mm\nspeed: 60 rpm'))
    expect([line, column, rule, reason]).toEqual([BODY_LINE, 1, 'missing-input', messages['missing-input']('rod', 'connecting-rod length (pin centres)', 'slider-crank')])
  })

  it('should refuse definitions, imports and file access in expressions', async () => {
    for (const expression of ['f(x) = x', 'import({})', 'evaluate("1")', 'ones(3000, 3000)', 'a = 3']) {
      const { file } = await build(crank(`crank: ${expression}\n${base}`))
      expect(file.messages.filter((m) => m.fatal === true).map((m) => m.ruleId)).toEqual(['invalid-expression'])
    }
  })

  it('should refuse duplicate and unusable block ids', async () => {
    expect((await onlyError(`${crank(`crank: 40 mm\n${base}`)}\n${crank(`crank: 40 mm\n${base}`)}`))[2]).toBe('duplicate-block-id')
    expect((await onlyError(crank(`crank: 40 mm\n${base}`, 'mm')))[2]).toBe('invalid-block-id')
    expect((await onlyError(crank(`crank: 40 mm\n${base}`, 'sqrt')))[2]).toBe('invalid-block-id')
    // `second` is a unit (s): as an id it would shadow the unit in every expression.
    expect((await onlyError(crank(`crank: 40 mm\n${base}`, 'second')))[3]).toBe(messages['invalid-block-id']('second', 'it is the name of a unit'))
  })

  it('should refuse a choice word it does not know', async () => {
    const [, , rule, reason] = await onlyError(crank(`crank: 40 mm\n${base}\nrotation: clockwise`))
    expect(rule).toBe('invalid-choice')
    expect(reason).toBe(messages['invalid-choice']('rotation', 'clockwise', ['ccw', 'cw']))
  })

  it('should place problems of table, chart and drawing blocks', async () => {
    const drive = crank(`crank: 40 mm\n${base}`)
    const [line, , rule] = await onlyError(`${drive}\n\`\`\`table\nof: drive\nquantities: position\nevery: 30 deg\nrows: 3\n\`\`\`\n`)
    expect([line, rule]).toEqual([BODY_LINE + 10, 'table-syntax'])
    const [, , chartRule, chartReason] = await onlyError(`${drive}\n\`\`\`chart\nof: drive\nseries: speed\n\`\`\`\n`)
    expect(chartRule).toBe('unknown-quantity')
    expect(chartReason).toMatch(/^Unexpected quantity `speed` for a drive sweep, expected one of `position`, `displacement`, `velocity`/)
    const [drawingLine, drawingColumn, drawingRule] = await onlyError(`${drive}\n\`\`\`drawing\nof: drivee\n\`\`\`\n`)
    expect([drawingLine, drawingColumn, drawingRule]).toEqual([BODY_LINE + 7, 5, 'unknown-block'])
    const [, , limitRule, limitReason] = await onlyError(`${drive}\n\`\`\`chart\nof: drive\nseries: velocity\nat_most: 40 deg\n\`\`\`\n`)
    expect([limitRule, limitReason]).toEqual(['chart-syntax', messages['chart-syntax']('`at_most` must be a quantity of the kind of one of the series')])
  })

  it('should report missing front matter fields and a bad status', async () => {
    const { file } = await build('---\ntitle: Only a title\nstatus: finished\n---\n\nText.\n')
    expect(file.messages.map((m) => m.ruleId).sort()).toEqual(['front-matter-field', 'missing-front-matter'])
  })

  it('should refuse a checker who is also the preparer', async () => {
    const { file } = await build('---\ntitle: T\nnumber: N\nrevision: A\nstatus: draft\npeople:\n  prepared: A. Person\n  checked: A. Person\n---\n')
    expect(file.messages.map((m) => m.reason)).toEqual([
      'Unexpected front matter `people`: the checker must be someone other than the preparer (both are A. Person)',
    ])
  })

  it('should skip blocks that use a block with errors, count one error, and still evaluate the others', async () => {
    const { file, model } = read(`${crank('crank: 40 N\nrod: 150 mm\nspeed: 60 rpm', 'bad')}\n${crank('crank: bad.crank\nrod: 150 mm\nspeed: 60 rpm', 'user')}\n${crank(`crank: 30 mm\n${base}`, 'fine')}`)
    expect(file.messages.map((m) => [m.ruleId, m.fatal])).toEqual([
      ['dimension-mismatch', true],
      // The follow-on is information: the error count is the count of mistakes.
      ['depends-on-error', undefined],
    ])
    expect(model.outcomes.map((o) => o !== null)).toEqual([false, false, true])
  })

  it('should count a check that cannot be evaluated, not drop it', () => {
    const checks = '```checks\nfine: drive.stroke >= 10 mm\ntypo: drive.strok >= 10 mm\nbroken: bad.stroke >= 10 mm\n```\n'
    const { model } = read(`${crank(`crank: 40 mm\n${base}`)}\n${crank('crank: 40 N\nrod: 150 mm\nspeed: 60 rpm', 'bad')}\n${checks}`)
    expect(model.checks.map((c) => [c.label, c.status])).toEqual([
      ['fine', 'pass'],
      ['typo', 'not-evaluated'],
      ['broken', 'not-evaluated'],
    ])
    expect(tallyWords(tallyChecks(model.checks))).toBe('1 of 3 checks pass (2 could not be evaluated)')
  })

  it('should keep a colon in a source as text', async () => {
    const { file, built } = await build(crank(`crank: 40 mm ; [alpha] table 2: "pin radius", note: see 4\n${base}`))
    expect(file.messages).toEqual([])
    expect(built.ok).toBe(true)
  })
})
