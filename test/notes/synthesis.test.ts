/**
 * The synthesis blocks through the notes layer: the answers feed analysis blocks
 * that give the requirement back, and every impossible requirement is a positioned
 * message naming what can be had.
 */
import type { VFile } from 'vfile'
import { describe, expect, it } from 'vitest'
import type { BlockOutcome } from '../../src/notes/block-kinds/kind.js'
import { expectClose } from '../helpers/close.js'
import { BODY_LINE, read } from '../helpers/note.js'

const D = Math.PI / 180
const errors = (file: VFile) => file.messages.filter((m) => m.fatal === true)
function value(outcomes: readonly (BlockOutcome | null)[], id: string, name: string): number {
  const o = outcomes.find((x) => x?.block.id === id)!
  const r = o.results.find((x) => x.name === name) ?? o.extremes.flatMap((row) => [row.min, row.max, row.absMax]).find((x) => x.name === name)!
  if (r.value.type !== 'quantity') throw new Error(`${id}.${name}: ${JSON.stringify(r.value)}`)
  return r.value.si
}

describe('synthesis blocks, requirement → dimensions → analysis', () => {
  it('should hand a slider-crank block lengths that give the stroke and time ratio back to 1e-9', () => {
    for (const choice of ['offset: 40 mm', 'crank: 45 mm', 'rod: 150 mm', 'choose: best-transmission']) {
      const { file, model } = read(`\`\`\`slider-crank-synthesis #design
stroke: 100 mm
time_ratio: 1.2
${choice}
\`\`\`

\`\`\`slider-crank #drive
crank: design.crank
rod: design.rod
offset: design.offset
speed: 60 rpm
\`\`\`
`)
      expect(errors(file), choice).toEqual([])
      expectClose(value(model.outcomes, 'drive', 'stroke'), 0.1, { rel: 1e-9 })
      expectClose(value(model.outcomes, 'drive', 'time_ratio'), 1.2, { rel: 1e-9 })
      expect(model.outcomes.find((o) => o?.block.id === 'design')!.chart !== null).toBe(choice !== 'offset: 40 mm')
    }
  })

  it('should hand a four-bar block a crank-rocker with the swing and time ratio, circuit included', () => {
    const { file, model } = read(`\`\`\`crank-rocker-synthesis #design
swing: 70 deg
time_ratio: 1.15
output: 80 mm
\`\`\`

\`\`\`four-bar #sieve
ground: design.ground
input: design.input
coupler: design.coupler
output: design.output
circuit: design.circuit
speed: 120 rpm
\`\`\`
`)
    expect(errors(file)).toEqual([])
    expectClose(value(model.outcomes, 'sieve', 'output_swing'), 70 * D, { rel: 1e-9 })
    expectClose(value(model.outcomes, 'sieve', 'time_ratio'), 1.15, { rel: 1e-9 })
    expectClose(value(model.outcomes, 'sieve', 'transmission_angle_worst'), value(model.outcomes, 'design', 'transmission_angle_worst'), { abs: 1e-9 })
  })

  it('should give an in-line drive whose peak acceleration is the limit', () => {
    const { file, model } = read(`\`\`\`slider-crank-synthesis #design
stroke: 100 mm
time_ratio: 1
acceleration_limit: 180 m/s^2
speed: 50 rad/s
\`\`\`

\`\`\`slider-crank #drive
crank: design.crank
rod: design.rod
speed: 50 rad/s
\`\`\`
`)
    expect(errors(file)).toEqual([])
    expectClose(value(model.outcomes, 'drive', 'acceleration_abs_max'), 180, { rel: 1e-9 })
  })
})

describe('impossible or incomplete requirements', () => {
  it('should name the feasible range and the nearest achievable crank, at the block', () => {
    const { file } = read('```slider-crank-synthesis #design\nstroke: 100 mm\ntime_ratio: 1.2\ncrank: 60 mm\n```\n')
    const e = errors(file)
    expect(e.map((m) => [m.ruleId, m.line])).toEqual([['linkage-error', BODY_LINE]])
    expect(e[0]!.reason).toMatch(/must lie between .* and 49\.98.* mm; the nearest achievable is 49\.98/)
  })

  it('should ask for one free choice, and refuse two at the second', () => {
    expect(errors(read('```slider-crank-synthesis #d\nstroke: 100 mm\ntime_ratio: 1.2\n```\n').file).map((m) => m.ruleId)).toEqual(['missing-input'])
    const two = errors(read('```slider-crank-synthesis #d\nstroke: 100 mm\ntime_ratio: 1.2\noffset: 40 mm\nrod: 150 mm\n```\n').file)
    expect(two.map((m) => [m.ruleId, m.line])).toEqual([['duplicate-input', BODY_LINE + 4]])
  })

  it('should ask a unit-time-ratio crank-rocker for its least transmission angle', () => {
    const e = errors(read('```crank-rocker-synthesis #d\nswing: 60 deg\ntime_ratio: 1\nground: 100 mm\n```\n').file)
    expect(e.map((m) => [m.ruleId, m.line])).toEqual([['missing-input', BODY_LINE + 2]])
  })

  it('should refuse a function that is not an expression in x, at the function', () => {
    const e = errors(read('```function-generator #squares\nfunction: x^^2\nx_start: 1\nx_end: 2\ninput_start: 90 deg\ninput_span: 90 deg\noutput_start: 240 deg\noutput_span: 60 deg\nground: 100 mm\n```\n').file)
    expect(e.map((m) => [m.ruleId, m.line])).toEqual([['invalid-expression', BODY_LINE + 1]])
  })
})
