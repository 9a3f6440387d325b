/**
 * Evaluation of notes: units at the boundary, dependency order across the note,
 * expressions over other blocks, checks, tables, assumptions and prose values.
 */
import { describe, expect, it } from 'vitest'
import { analyseFourBar, analyseSliderCrank, fourBar, sliderCrank } from '../../src/linkage/index.js'
import { resultsDocument } from '../../src/notes/results-json.js'
import type { NamedValue } from '../../src/notes/types.js'
import { expectClose } from '../helpers/close.js'
import { BODY_LINE, read } from '../helpers/note.js'

const si = (values: readonly NamedValue[], name: string): number => {
  const v = values.find((r) => r.name === name)?.value
  if (v?.type !== 'quantity') throw new Error(`${name} is not a quantity`)
  return v.si
}

describe('units at the boundary', () => {
  it('should take inches, millimetres and rpm and give the core SI numbers', () => {
    const { file, model } = read('```slider-crank #drive\ncrank: 1.5 in\nrod: 152.4 mm\noffset: 0.5 in\nspeed: 120 rpm\n```\n')
    expect(file.messages.filter((m) => m.fatal)).toEqual([])
    const outcome = model.outcomes[0]!
    expectClose(si(outcome.inputs, 'crank'), 0.0381, { rel: 1e-15 })
    expectClose(si(outcome.inputs, 'rod'), 0.1524, { rel: 1e-15 })
    expectClose(si(outcome.inputs, 'speed'), 4 * Math.PI, { rel: 1e-15 })
    // The numbers read, straight into the core, give the block's results exactly.
    const read_ = (name: string) => si(outcome.inputs, name)
    const core = analyseSliderCrank(sliderCrank({ crank: read_('crank'), rod: read_('rod'), offset: read_('offset') }), { speed: read_('speed') })
    expect(si(outcome.results, 'stroke')).toBe(core.stroke)
    expect(si(outcome.results, 'time_ratio')).toBe(core.timeRatio)
    const extremes = outcome.extremes.flatMap((r) => [r.min, r.max, r.absMax])
    expect(si(extremes, 'acceleration_min')).toBe(core.extremes.acceleration.min.value)
    expect(si(extremes, 'acceleration_abs_max')).toBe(core.extremes.acceleration.absMax.value)
  })
})

describe('dependency order', () => {
  it('should evaluate a block that uses a later block after it, whatever the order written', () => {
    const { file, model } = read(
      [
        '```slider-crank #follower',
        'crank: leader.stroke / 4',
        'rod: 3 * leader.crank',
        'speed: leader.speed * 2',
        '```',
        '',
        '```slider-crank #leader',
        'crank: 30 mm',
        'rod: 120 mm',
        'speed: 50 rpm',
        '```',
        '',
      ].join('\n'),
    )
    expect(file.messages.filter((m) => m.fatal)).toEqual([])
    const follower = model.outcomes[0]!
    expectClose(si(follower.inputs, 'crank'), 0.06 / 4, { rel: 1e-14 })
    expectClose(si(follower.inputs, 'rod'), 0.09, { rel: 1e-14 })
    expectClose(si(follower.inputs, 'speed'), (100 * 2 * Math.PI) / 60, { rel: 1e-14 })
  })

  it('should let an input use another input of the same block', () => {
    const { model } = read('```slider-crank #drive\nrod: 4.2 * crank\ncrank: 25 mm\nspeed: 60 rpm\n```\n')
    expectClose(si(model.outcomes[0]!.inputs, 'rod'), 0.105, { rel: 1e-14 })
  })

  it('should take design inputs with units and sources, each of its own kind', () => {
    const { model } = read('```design-inputs #duty\nstroke: 80 mm ; [alpha] p. 4\nrate: 96 rpm\nload: 1.2 kN\nfill: 2 l\n```\n')
    const inputs = model.outcomes[0]!.inputs
    expect(inputs.map((i) => [i.name, i.value.type, i.value.type === 'quantity' ? i.value.kind : null, i.source])).toEqual([
      ['stroke', 'quantity', 'length', '[alpha] p. 4'],
      ['rate', 'quantity', 'rotational-speed', null],
      ['load', 'quantity', 'force', null],
      ['fill', 'other', null, null],
    ])
    expect(model.references.map((r) => r.key)).toEqual(['alpha'])
  })

  it('should keep the SI unit of a value of another dimension, not the unit written', () => {
    const { model } = read('```design-inputs #duty\nfill: 2 l\n```\n')
    // 2 litres = 0.002 m³ (SI brochure: 1 L = 1 dm³).
    expect(model.outcomes[0]!.inputs[0]!.value).toMatchObject({ type: 'other', si: 0.002, siUnit: 'm^3', unit: 'l', shown: 2 })
  })

  it('should still read the old block name `given`, with a warning at the fence', () => {
    const { file, model } = read('```given #duty\nstroke: 80 mm\n```\n')
    expect(model.outcomes[0]!.block.kind).toBe('design-inputs')
    expect(file.messages.map((m) => [m.ruleId, m.fatal, m.line])).toEqual([['deprecated-block-kind', false, BODY_LINE]])
  })
})

describe('four-bar block', () => {
  it('should give the core’s numbers for the block’s inputs', () => {
    const { model } = read('```four-bar #sieve\nground: 100 mm\ninput: 40 mm\ncoupler: 120 mm\noutput: 80 mm\nspeed: 10 rad/s\n```\n')
    const results = model.outcomes[0]!.results
    const core = analyseFourBar(fourBar({ ground: 0.1, input: 0.04, coupler: 0.12, output: 0.08 }), { speed: 10 })
    expect(results.find((r) => r.name === 'grashof_class')!.value).toEqual({ type: 'text', text: 'crank-rocker' })
    const extremes = model.outcomes[0]!.extremes.flatMap((r) => [r.min, r.max, r.absMax])
    expect(si(extremes, 'transmission_angle_min')).toBe(core.transmissionMin.value)
    expect(si(results, 'output_swing')).toBe(core.outputSwing)
    expect(si(results, 'time_ratio')).toBe(core.timeRatio)
    expect(model.outcomes[0]!.warnings.some((w) => w.startsWith('The transmission angle falls to 26.38'))).toBe(true)
  })
})

describe('checks', () => {
  const note = (conditions: string) =>
    `\`\`\`slider-crank #drive\ncrank: 40 mm\nrod: 160 mm\nspeed: 60 rpm\n\`\`\`\n\n\`\`\`checks\n${conditions}\n\`\`\`\n`

  it('should give PASS and FAIL with the margin, for limits and for bands', () => {
    const { model } = read(
      note(
        [
          'stroke in band: drive.stroke = 80 mm ± 0.5 mm ; [alpha] §3',
          'stroke off band: drive.stroke = 81 mm ± 0.5 mm',
          'angle: drive.transmission_angle_min >= 70 deg',
          'ratio: drive.time_ratio <= 1.0',
          'strict: drive.time_ratio < 1',
        ].join('\n'),
      ),
    )
    expect(model.checks.map((c) => [c.label, c.status === 'pass'])).toEqual([
      ['stroke in band', true],
      ['stroke off band', false],
      ['angle', true],
      ['ratio', true],
      ['strict', false],
    ])
    expect(model.checks[0]!.margin).toBe('0.50000 mm')
    expect(model.checks[1]!.margin).toBe('−0.50000 mm')
    // μmin = acos(40/160) = 75.52°, margin over 70°.
    expect(model.checks[2]!.actual).toBe('75.522°')
    expect(model.checks[0]!.source).toBe('[alpha] §3')
  })
})

describe('tables', () => {
  it('should tabulate at the steps and always at the dead centres', () => {
    const { model } = read(
      '```slider-crank #drive\ncrank: 40 mm\nrod: 160 mm\noffset: 20 mm\nspeed: 60 rpm\n```\n\n```table\nof: drive\nquantities: position, velocity\nevery: 90 deg\n```\n',
    )
    const table = model.outcomes[1]!.table!
    expect(table.columns.map((c) => c.label)).toEqual(['crank angle', 'slider position', 'slider velocity'])
    expect(table.rows.map((r) => r.marker)).toEqual([null, 'outer dead centre', null, null, 'inner dead centre', null])
    // At the dead centres the slider stands still.
    for (const row of table.rows.filter((r) => r.marker)) expect(Number(row.cells[2])).toBe(0)
    const core = analyseSliderCrank(sliderCrank({ crank: 0.04, rod: 0.16, offset: 0.02 }), { speed: 2 * Math.PI })
    // One count of decimals per column: two for angles up to 270°, at five significant digits.
    expect(table.rows[1]!.cells[0]).toBe(((core.outerDeadCentre!.theta * 180) / Math.PI).toFixed(2))
    expect(table.columns.map((c) => c.decimals)).toEqual([2, 2, 5])
    for (const row of table.rows) expect(row.cells[2]!.split('.')[1]).toHaveLength(5)
  })

  it('should give one row, labelled, where a dead centre falls on a step', () => {
    const { model } = read('```slider-crank #drive\ncrank: 40 mm\nrod: 160 mm\nspeed: 60 rpm\n```\n\n```table\nof: drive\nquantities: position\nevery: 90 deg\n```\n')
    const rows = model.outcomes[1]!.table!.rows
    expect(rows.map((r) => [r.cells[0], r.marker])).toEqual([
      ['0.00', 'outer dead centre'],
      ['90.00', null],
      ['180.00', 'inner dead centre'],
      ['270.00', null],
    ])
  })

  it('should list the rows of a clockwise crank in time order', () => {
    const { model } = read('```slider-crank #drive\ncrank: 40 mm\nrod: 160 mm\nspeed: 60 rpm\nrotation: cw\n```\n\n```table\nof: drive\nquantities: position\nevery: 90 deg\n```\n')
    expect(model.outcomes[1]!.table!.rows.map((r) => r.cells[0])).toEqual(['0.00', '270.00', '180.00', '90.00'])
  })

  it('should measure angles from the outer dead centre in the sense of rotation when asked, everywhere alike', () => {
    // Offset 20 mm, clockwise: the outer dead centre at asin(e/(a + b)) from +x (OSC-1's formula).
    const { model } = read(
      '```slider-crank #drive\ncrank: 40 mm\nrod: 160 mm\noffset: 20 mm\nspeed: 60 rpm\nrotation: cw\nangles_from: outer-dead-centre\n```\n\n```table\nof: drive\nquantities: position\nevery: 90 deg\n```\n',
    )
    const outcome = model.outcomes[0]!
    const core = analyseSliderCrank(sliderCrank({ crank: 0.04, rod: 0.16, offset: 0.02, rotation: -1 }), { speed: 2 * Math.PI })
    expect(si(outcome.results, 'outer_dead_centre_angle')).toBe(0)
    // The inner dead centre comes after the instroke's crank travel.
    expectClose(si(outcome.results, 'inner_dead_centre_angle'), core.instrokeAngle!, { rel: 1e-12 })
    const rows = model.outcomes[1]!.table!.rows
    expect(rows[0]!.cells[0]).toBe('0.00')
    expect(rows[0]!.marker).toBe('outer dead centre')
    const angles = rows.map((r) => Number(r.cells[0]))
    for (let i = 1; i < angles.length; i++) expect(angles[i]!).toBeGreaterThan(angles[i - 1]!)
    expect(model.outcomes[1]!.table!.angles).toContain('from the outer dead centre in the sense of rotation (clockwise)')
  })
})

describe('assumptions', () => {
  it('should gather the note’s own first, then each method’s once, flagging those to verify', () => {
    const { model } = read(
      '```assumptions\n- Speed is steady. (to verify)\n- {text: Guides are straight, verify: yes}\n- Pins are greased.\n```\n\n```slider-crank #one\ncrank: 40 mm\nrod: 160 mm\nspeed: 60 rpm\n```\n\n```slider-crank #two\ncrank: 40 mm\nrod: 160 mm\nspeed: 60 rpm\n```\n',
    )
    expect(model.assumptions.slice(0, 3).map((a) => [a.text, a.verify, a.from])).toEqual([
      ['Speed is steady.', true, null],
      ['Guides are straight', true, null],
      ['Pins are greased.', false, null],
    ])
    const rigid = model.assumptions.find((a) => a.text.startsWith('Links are rigid'))!
    expect(rigid.from).toBe('one, two')
  })
})

describe('values in prose', () => {
  it('should print values with their unit, converted and to the digits asked', () => {
    const { tree, file } = read(
      '```slider-crank #drive\ncrank: 40 mm\nrod: 160 mm\noffset: 20 mm\nspeed: 60 rpm\n```\n\nStroke :value[drive.stroke], or :value[drive.stroke]{unit=in digits=3}; ratio :value[drive.time_ratio]; :value[drive.full_rotation]; at 10:30 sharp, see:this.\n',
    )
    expect(file.messages).toEqual([])
    const values: string[] = []
    const texts: string[] = []
    const walk = (node: { type: string; children?: unknown[]; text?: string; value?: string }): void => {
      if (node.type === 'lwValue') values.push(node.text!)
      if (node.type === 'text') texts.push(node.value!)
      for (const child of (node.children ?? []) as (typeof node)[]) walk(child)
    }
    walk(tree as never)
    const stroke = analyseSliderCrank(sliderCrank({ crank: 0.04, rod: 0.16, offset: 0.02 }), { speed: 1 }).stroke
    // The note's own digits (5 by default), as in its results tables.
    expect(values).toEqual([`${(stroke * 1000).toPrecision(5)} mm`, `${(stroke / 0.0254).toPrecision(3)} in`, expect.stringMatching(/^1\.0\d\d\d$/), 'yes'])
    // Colons that are not directives stay text.
    expect(texts.join('')).toContain('at 10:30 sharp, see:this.')
  })
})

describe('tables of a crank that only rocks', () => {
  it('should step through round angles inside the range, with the limits as marked rows', () => {
    const { model } = read('```slider-crank #rocker\ncrank: 50 mm\nrod: 70 mm\noffset: 30 mm\nspeed: 10 rpm\n```\n\n```table\nof: rocker\nquantities: position\nevery: 60 deg\n```\n')
    const rows = model.outcomes[1]!.table!.rows
    // The range runs from −53.13° to 233.13°.
    expect(rows.filter((r) => !r.marker).map((r) => r.cells[0])).toEqual(['0.00', '60.00', '120.00', '180.00'])
    expect(rows[0]!.marker).toBe('crank limit')
    expect(rows[rows.length - 1]!.marker).toBe('crank limit')
  })

  it('should say a velocity is unbounded at the limit angles, not print a huge number', () => {
    const { model } = read('```slider-crank #rocker\ncrank: 50 mm\nrod: 70 mm\noffset: 30 mm\nspeed: 10 rpm\n```\n\n```table\nof: rocker\nquantities: position, velocity\nevery: 60 deg\n```\n')
    const outcome = model.outcomes[0]!
    const velocity = outcome.extremes.find((r) => r.quantity.name === 'velocity')!
    // At a limit the rod stands square to the path: dx/dθ = −a sinθ − u a cosθ/√(b² − u²) has √0 below (derived).
    expect(velocity.absMax.value.type).toBe('none')
    expect(velocity.absMax.value.type === 'none' && velocity.absMax.value.reason).toMatch(/^unbounded at the crank limit angle/)
    const position = outcome.extremes.find((r) => r.quantity.name === 'position')!
    expect(position.max.value.type).toBe('quantity')
    const rows = model.outcomes[1]!.table!.rows
    expect(rows[0]!.cells[2]).toBe('unbounded')
    expect(rows[1]!.cells[2]).not.toBe('unbounded')
    for (const cell of rows.slice(1, -1).map((r) => r.cells[2]!)) expect(Math.abs(Number(cell.replace('−', '-')))).toBeLessThan(1)
  })
})

describe('results.json', () => {
  it('should store a given 4.2 kN in the SI unit, newtons, with the display as written', () => {
    const { file, model } = read('```design-inputs #duty\nload: 4.2 kN ; [alpha]\nfill: 2 l\n```\n')
    const doc = resultsDocument(model, file, 'test.md', model.date) as { blocks: { inputs: Record<string, { si: number; siUnit: string; kind: string }> }[] }
    expect(doc.blocks[0]!.inputs.load).toMatchObject({ kind: 'force', si: 4200, siUnit: 'N' })
    expect(doc.blocks[0]!.inputs.fill).toMatchObject({ kind: 'other', si: 0.002, siUnit: 'm^3' })
  })
})

