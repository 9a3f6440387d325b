/**
 * The tolerances block through the notes layer: the published worst case and RSS
 * of an offset slider-crank's stroke come out of a note, a crank-rocker's
 * sensitivity agrees with the analysis the package prints at a shifted length,
 * the Monte Carlo is reproducible by its seed, and every bad tolerance is a
 * message at the place it was written.
 */
import type { VFile } from 'vfile'
import { describe, expect, it } from 'vitest'
import type { BlockOutcome } from '../../src/notes/block-kinds/kind.js'
import { expectClose } from '../helpers/close.js'
import { BODY_LINE, read } from '../helpers/note.js'

const errors = (file: VFile) => file.messages.filter((m) => m.fatal === true)
function outcomeOf(outcomes: readonly (BlockOutcome | null)[], id: string): BlockOutcome {
  return outcomes.find((x) => x?.block.id === id)!
}
function value(outcomes: readonly (BlockOutcome | null)[], id: string, name: string): number {
  const r = outcomeOf(outcomes, id).results.find((x) => x.name === name)
  if (!r) throw new Error(`${id}.${name} missing`)
  if (r.value.type === 'flag') return r.value.flag ? 1 : 0
  if (r.value.type !== 'quantity') throw new Error(`${id}.${name}: ${JSON.stringify(r.value)}`)
  return r.value.si
}

const DRIVE = `\`\`\`slider-crank #drive
crank: 50 mm
rod: 200 mm
offset: 30 mm
speed: 60 rpm
\`\`\`
`

describe('tolerances of a slider-crank', () => {
  // TS-2 in the field checks: hand-derived partial derivatives of S = √((l+r)² − e²) − √((l−r)² − e²),
  // confirmed there by a second route (exact corners); r 50 ± 0.05, l 200 ± 0.1, e 30 ± 0.2 mm.
  const note = `${DRIVE}
\`\`\`tolerances #tol
of: drive
crank: ± 0.05 mm ; drawing
rod: ± 0.1 mm
offset: +0.2 mm / -0.2 mm
samples: 200000
seed: 20240601
clearance: 0.01 mm
required: stroke ± 0.15 mm
\`\`\`
`
  const { file, model } = read(note)
  const v = (name: string) => value(model.outcomes, 'tol', name)

  it('should give the worst case, RSS and true corner extremes of TS-2', () => {
    expect(errors(file)).toEqual([])
    expectClose(v('stroke_nominal'), 101.224088e-3, { rel: 1e-8 })
    expectClose(v('stroke_linear_worst'), 0.119379314e-3, { rel: 1e-6 })
    expectClose(v('stroke_rss'), 0.102761605e-3, { rel: 1e-6 })
    expectClose(v('stroke_worst_max') - v('stroke_nominal'), 0.119480265e-3, { rel: 1e-6 })
    expectClose(v('stroke_worst_min') - v('stroke_nominal'), -0.119278805e-3, { rel: 1e-6 })
    expectClose(v('time_ratio_nominal'), 1.05297656, { rel: 1e-8 })
    expectClose(v('time_ratio_linear_worst'), 0.000493001973, { rel: 1e-5 })
  })

  it('should give a Monte Carlo spread near the RSS, as TS-2 finds with another generator', () => {
    // TS-2: 3σ = 0.103082 mm from 200000 unclipped normal draws; ours clips at the tolerance
    // (σ shrinks by about 0.1 %) and draws other numbers, so agreement to 1 % is what can be asked.
    expectClose(3 * v('stroke_std'), 0.103082e-3, { rel: 0.01 })
    // The mean's own spread is σ/√n ≈ 0.08 µm.
    expectClose(v('stroke_mean'), v('stroke_nominal'), { abs: 0.3e-6 })
    expect(v('stroke_p0_135')).toBeLessThan(v('stroke_p50'))
    expect(v('stroke_p99_865')).toBeLessThanOrEqual(v('stroke_worst_max'))
  })

  it('should add the effective-link-length play of three joints to the stroke', () => {
    // Three joints of 0.01 mm radial play: dead-centre positions ± 0.03 mm, stroke ± 0.06 mm.
    expectClose(v('clearance_dead_centre_shift'), 0.03e-3, { rel: 1e-12 })
    expectClose(v('stroke_worst_max_with_clearance') - v('stroke_worst_max'), 0.06e-3, { rel: 1e-9 })
  })

  it('should judge the worst case against the required tolerance and warn where it leaves it', () => {
    // ± 0.15 mm about the nominal: the box gives ± 0.119 mm but clearance adds 0.06 mm, so it fails.
    expect(v('worst_case_within_required')).toBe(0)
    expect(outcomeOf(model.outcomes, 'tol').warnings.some((w) => /leaves the required 101\.07 mm to 101\.37 mm/.test(w))).toBe(true)
    expect(v('share_within_required')).toBe(1)
  })

  it('should reproduce the Monte Carlo from its seed and change it with another', () => {
    const again = read(note)
    expect(value(again.model.outcomes, 'tol', 'stroke_std')).toBe(v('stroke_std'))
    const other = read(note.replace('seed: 20240601', 'seed: 7'))
    expect(value(other.model.outcomes, 'tol', 'stroke_std')).not.toBe(v('stroke_std'))
  })

  it('should read a general-tolerance class from the ISO 2768-1 table by the nominal size', () => {
    // ISO 2768-1:1989 Table 1: class m, over 6 up to 30 mm → ± 0.2 mm; over 120 up to 400 → ± 0.5 mm.
    const { file: f, model: m } = read(`${DRIVE}
\`\`\`tolerances #tol
of: drive
rod: class m ; ISO 2768-1
offset: class m
\`\`\`
`)
    expect(errors(f)).toEqual([])
    const lengths = outcomeOf(m.outcomes, 'tol').data.find((d) => d.caption.startsWith('Tolerances of the lengths'))!
    expect(lengths.rows.map((r) => [r[0], r[3]])).toEqual([
      ['connecting-rod length', '0.500'],
      ['offset', '0.200'],
    ])
    // With only e and l toleranced, the linear worst case is |∂S/∂l|·0.5 + |∂S/∂e|·0.2 (TS-2's derivatives).
    expectClose(value(m.outcomes, 'tol', 'stroke_linear_worst'), (0.0133420211 * 0.5 + 0.0832507006 * 0.2) * 1e-3, { rel: 1e-5 })
  })
})

describe('tolerances of a crank-rocker', () => {
  const rocker = (input: string) => `\`\`\`four-bar #sieve
ground: 100 mm
input: ${input}
coupler: 90 mm
output: 70 mm
speed: 120 rpm
\`\`\`
`
  it('should give a swing sensitivity that the four-bar analysis confirms at a shifted input link', () => {
    const { file, model } = read(`${rocker('35 mm')}
\`\`\`tolerances #tol
of: sieve
input: ± 0.05 mm
coupler: ± 0.1 mm
distribution: uniform
samples: 1000
percentiles: 0, 100
\`\`\`
`)
    expect(errors(file)).toEqual([])
    const swing = (input: string) => value(read(rocker(input)).model.outcomes, 'sieve', 'output_swing')
    const slope = (swing('35.001 mm') - swing('34.999 mm')) / 0.002e-3
    const shown = outcomeOf(model.outcomes, 'tol').data.find((d) => d.caption.startsWith('Sensitivity'))!
    // ° per mm in the table, against the analysis's slope in rad per m.
    expectClose(Number(shown.rows[0]![2]!.replace('−', '-')), (slope * 180) / Math.PI / 1000, { rel: 1e-4 })
    expectClose(value(model.outcomes, 'tol', 'output_swing_nominal'), swing('35 mm'), { rel: 1e-12 })
    // A uniform draw never leaves the box.
    expect(value(model.outcomes, 'tol', 'output_swing_p100')).toBeLessThanOrEqual(value(model.outcomes, 'tol', 'output_swing_worst_max'))
  })
})

describe('bad tolerances', () => {
  const at = (body: string) => {
    const { file } = read(`${DRIVE}\n\`\`\`tolerances #tol\nof: drive\n${body}\n\`\`\`\n`)
    return errors(file).map((m) => [m.ruleId, m.line! - BODY_LINE, m.column])
  }
  it('should place each problem at the value or the name written', () => {
    // DRIVE is six lines and a blank; the block opens on body line 8, `of:` on 9.
    expect(at('crank: about 0.1 mm')).toEqual([['dimension-mismatch', 9, 8]])
    expect(at('crank: ± 0.1 N')).toEqual([['dimension-mismatch', 9, 8]])
    expect(at('pin: ± 0.1 mm')).toEqual([['unknown-input', 9, 1]])
    expect(at('crank: class q')).toEqual([['dimension-mismatch', 9, 8]])
    expect(at('crank: ± 0.1 mm\nsamples: 12.5')).toEqual([['invalid-choice', 10, 10]])
    expect(at('crank: ± 0.1 mm\nrequired: travel ± 1 mm')).toEqual([['invalid-choice', 10, 11]])
    expect(at('samples: 1000')).toEqual([['missing-input', 7, 1]])
  })
  it('should refuse a block that is not a full-turning straight-path slider-crank or a crank-rocker', () => {
    const { file } = read(`\`\`\`four-bar #dbl
ground: 40 mm
input: 100 mm
coupler: 90 mm
output: 110 mm
speed: 60 rpm
\`\`\`

\`\`\`tolerances #tol
of: dbl
input: ± 0.1 mm
\`\`\`
`)
    expect(errors(file).map((m) => [m.ruleId, m.line! - BODY_LINE])).toEqual([['wrong-block', 9]])
  })
})
