/**
 * The dynamics blocks through the notes layer, checked against values from
 * outside the project (the field-check cases and textbook examples, sources
 * named beside each), and every bad input a positioned message.
 */
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { VFile } from 'vfile'
import type { VFileMessage } from 'vfile-message'
import { describe, expect, it } from 'vitest'
import { dataReader } from '../../src/cli/data-files.js'
import type { BlockOutcome } from '../../src/notes/block-kinds/kind.js'
import { expectClose } from '../helpers/close.js'
import { BODY_LINE, brief, build, read } from '../helpers/note.js'

const DEG = Math.PI / 180

function outcomeOf(model: { outcomes: readonly (BlockOutcome | null)[] }, id: string): BlockOutcome {
  const found = model.outcomes.find((o) => o?.block.id === id)
  if (!found) throw new Error(`no outcome for #${id}`)
  return found
}

function result(o: BlockOutcome, name: string): number {
  const r = o.results.find((x) => x.name === name) ?? o.extremes.flatMap((row) => [row.min, row.max, row.absMax, row.minAt, row.maxAt, row.absMaxAt]).find((x) => x.name === name)
  if (r?.value.type !== 'quantity') throw new Error(`${name} is not a quantity: ${JSON.stringify(r?.value)}`)
  return r.value.si
}

function errors(file: VFile): VFileMessage[] {
  return file.messages.filter((m) => m.fatal === true)
}

describe('forces block against outside values', () => {
  // TQ-1 (../shared/reference/field-checks.md §5): r = 50 mm, l = 200 mm, a force of 10 kN pushing the
  // slider towards the crank; T = −F·dx/dθ by virtual work, rod force F/cos φ, guide thrust F·tan φ.
  // The virtual-work identity is standard (e.g. Khurmi & Gupta, Theory of Machines, Ch. 15 "crank effort", from memory).
  const engine = `\`\`\`slider-crank #engine
crank: 50 mm
rod: 200 mm
speed: 600 rpm
driver: slider
\`\`\`

\`\`\`forces #gas
of: engine
load: 10 kN ; field check TQ-1
load_acts: towards-crank
\`\`\`
`
  it('should give the TQ-1 torque, rod force and guide thrust of a massless drive', () => {
    const { file, model } = read(engine)
    expect(errors(file)).toEqual([])
    const forces = outcomeOf(model, 'gas')
    const angles = Float64Array.from([30, 60, 90, 120], (d) => d * DEG)
    const at = forces.sweep!.at(angles)
    expectClose(Array.from(at.output_torque!), [304.554473, 488.454297, 500.0, 377.571107], { rel: 1e-8 })
    expectClose(Array.from(at.rod_force!), [-10079.0526, -10242.9504, -10327.9556, -10242.9504], { rel: 1e-8 })
    expectClose(Array.from(at.side_thrust!, Math.abs), [1259.88158, 2217.66381, 2581.98890, 2217.66381], { rel: 1e-8 })
  })

  it('should state that the slider-driven drive has dead points the flywheel must carry', () => {
    const { model } = read(engine)
    const forces = outcomeOf(model, 'gas')
    expect(forces.method.some((s) => /dead points/i.test(s.label))).toBe(true)
    // At the dead centres the load gives no torque (T_P = −P·dx/dθ with dx/dθ = 0).
    const at = forces.sweep!.at(Float64Array.of(0, Math.PI))
    expectClose(Array.from(at.output_torque!), [0, 0], { abs: 1e-9 })
  })

  // DY-2 (field-checks.md §5): a single cylinder, reciprocating mass 0.8 kg, r = 50 mm, l = 200 mm,
  // 3000 rpm. Primary m·r·ω² = 3947.84176 N; the exact second harmonic is 1.01610017 × m·r·ω²·λ
  // (the Fourier coefficient of the exact acceleration, field-checks.md); at the dead centres the
  // inertia force is m·r·ω²·(1 ± λ). The two-term series: Norton, Design of Machinery, Ch. 13 (from memory).
  it('should give the DY-2 primary and secondary inertia forces and the dead-centre values', () => {
    const { file, model } = read(`\`\`\`slider-crank #cyl
crank: 50 mm
rod: 200 mm
speed: 3000 rpm
\`\`\`

\`\`\`forces #f
of: cyl
load: 0 N
slider_mass: 0.8 kg
\`\`\`
`)
    expect(errors(file)).toEqual([])
    const f = outcomeOf(model, 'f')
    expectClose(result(f, 'primary_force'), 3947.84176, { rel: 1e-8 })
    expectClose(result(f, 'secondary_force'), 986.960440 * 1.01610017, { rel: 1e-7 })
    const at = f.sweep!.at(Float64Array.of(0, Math.PI))
    expectClose(Array.from(at.reciprocating_force!), [4934.80220, -2960.88132], { rel: 1e-8 })
    expectClose(result(f, 'reciprocating_mass'), 0.8, { rel: 1e-12 })
  })

  // DY-1 (field-checks.md §5): a 1.2 kg rod, 200 mm centres, centre of mass 60 mm from the crank pin.
  // As two masses at its pins its inertia about G is m·l_A·l_B = 0.01008 kg·m².
  it('should take the DY-1 two-mass inertia when none is given, and say so', () => {
    const masses = 'rod_mass: 1.2 kg\nrod_centre: 60 mm\nslider_mass: 0.5 kg'
    const note = (extra: string) => `\`\`\`slider-crank #d
crank: 50 mm
rod: 200 mm
speed: 1500 rpm
\`\`\`

\`\`\`forces #f
of: d
load: 2 kN
${masses}
${extra}
\`\`\`
`
    const twoMass = read(note(''))
    const given = read(note('rod_inertia: 0.01008 kg*m^2'))
    const angles = Float64Array.from({ length: 13 }, (_, i) => i * 30 * DEG)
    expectClose(Array.from(twoMass.model.outcomes.find((o) => o?.block.id === 'f')!.sweep!.at(angles).crank_torque!), Array.from(given.model.outcomes.find((o) => o?.block.id === 'f')!.sweep!.at(angles).crank_torque!), { rel: 1e-12, abs: 1e-9 })
    expect(twoMass.model.assumptions.some((a) => /two masses at its pins/.test(a.text) && a.verify)).toBe(true)
    expect(given.model.assumptions.some((a) => /two masses at its pins/.test(a.text))).toBe(false)
    // The kinematics-only line of the linkage gives way where forces are found.
    expect(twoMass.model.assumptions.some((a) => /^Kinematics only/.test(a.text))).toBe(false)
  })

  it('should make the work per turn equal to the work on a tabled load (the cycle integral)', () => {
    // A press load of 40 kN over the last 10 mm before the outer dead centre, outstroke only:
    // the work on it is the area under the table, 40 kN × 10 mm / 2 + 0 = 200 J (trapezoid, exact for a linear table).
    const { file, model } = read(`\`\`\`slider-crank #press
crank: 50 mm
rod: 250 mm
speed: 60 rpm
\`\`\`

\`\`\`forces #pf
of: press
load: table ; test
  0 mm, 40 kN
  10 mm, 0 kN
  100 mm, 0 kN
load_during: outstroke
\`\`\`
`)
    expect(errors(file)).toEqual([])
    const f = outcomeOf(model, 'pf')
    // Simpson's rule on 1441 crank angles across the load's jump at the dead centre: within 1e-4.
    expectClose(result(f, 'load_work'), 200, { rel: 1e-4 })
    expectClose(result(f, 'work_per_cycle'), 200, { rel: 1e-4 })
    expectClose(result(f, 'torque_mean'), 200 / (2 * Math.PI), { rel: 1e-4 })
    expect(f.data[0]!.rows).toEqual([
      ['0.00', '40000'],
      ['10.00', '0'],
      ['100.00', '0'],
    ])
  })
})

describe('flywheel, column and pin-bearing blocks against outside values', () => {
  it('should size the flywheel from ΔE of a torque curve integrated independently here', () => {
    // A compressor-like load: 3 kN against the motion on both strokes, r = 60 mm, l = 240 mm, 300 rpm.
    // Massless links: T = F·|dx/dθ|. The referee integrates T − T_mean by the trapezoid rule on 360 000 steps.
    const [a, b, F, n, cs] = [0.06, 0.24, 3000, 300, 0.04]
    const { file, model } = read(`\`\`\`slider-crank #c
crank: 60 mm
rod: 240 mm
speed: 300 rpm
\`\`\`

\`\`\`forces #f
of: c
load: 3 kN
\`\`\`

\`\`\`flywheel #fw
of: f
coefficient: 0.04
\`\`\`
`)
    expect(errors(file)).toEqual([])
    const dxdt = (t: number) => -a * Math.sin(t) - (a * a * Math.sin(t) * Math.cos(t)) / Math.sqrt(b * b - a * a * Math.sin(t) ** 2)
    const steps = 360000
    const h = (2 * Math.PI) / steps
    let mean = 0
    for (let i = 0; i < steps; i++) mean += F * Math.abs(dxdt((i + 0.5) * h))
    mean /= steps
    let e = 0
    let hi = 0
    let lo = 0
    for (let i = 0; i < steps; i++) {
      const t0 = i * h
      e += ((mean - F * Math.abs(dxdt(t0))) + (mean - F * Math.abs(dxdt(t0 + h)))) * h / 2
      hi = Math.max(hi, e)
      lo = Math.min(lo, e)
    }
    const deltaE = hi - lo
    const omega = (n * 2 * Math.PI) / 60
    const fw = outcomeOf(model, 'fw')
    expectClose(result(fw, 'energy_fluctuation'), deltaE, { rel: 1e-6 })
    expectClose(result(fw, 'inertia_required'), deltaE / (cs * omega * omega), { rel: 1e-6 })
    expectClose(result(fw, 'drive_torque'), (F * 2 * 2 * a) / (2 * Math.PI), { rel: 1e-6 })
  })

  it('should take a typical coefficient for the machine, print its table and name its source', () => {
    const { file, model } = read(`\`\`\`slider-crank #c
crank: 60 mm
rod: 240 mm
speed: 300 rpm
\`\`\`

\`\`\`forces #f
of: c
load: 3 kN
\`\`\`

\`\`\`flywheel #fw
of: f
machine: crusher-hammer-punch-press
density: 7200 kg/m^3
rim_speed_limit: 25 m/s
\`\`\`
`)
    expect(errors(file)).toEqual([])
    const fw = outcomeOf(model, 'fw')
    // 0.2 for crushers, hammers and punch presses: the stored reference page's table (field-checks.md §6), confirmed as quoted.
    expect(result(fw, 'coefficient')).toBe(0.2)
    expect(fw.data[0]!.source).toMatch(/names no original source/)
    // The largest diameter the rim speed allows at the greatest speed ω(1 + Cs/2).
    const omegaMax = ((300 * 2 * Math.PI) / 60) * 1.1
    expectClose(result(fw, 'flywheel_diameter'), (2 * 25) / omegaMax, { rel: 1e-12 })
    expectClose(result(fw, 'rim_speed'), 25, { rel: 1e-12 })
  })

  // BK-1: Budynas & Nisbett, Shigley's Mechanical Engineering Design, 9th ed., Example 4-17 (confirmed):
  // a round pinned-pinned strut, 22 kN, l = 1.5 m, d = 40 mm, E = 207 GPa, Sy = 500 MPa: l/k = 150,
  // (l/k)₁ = 90.4, Euler, P_cr = 114 103 N (field-checks.md §7), factor 5.19.
  it('should give the BK-1 Euler column', () => {
    const { file, model } = read(`\`\`\`column #strut
load: 22 kN
section: round
diameter: 40 mm
length: 1.5 m
modulus: 207 GPa
yield_strength: 500 MPa
\`\`\`
`)
    expect(errors(file)).toEqual([])
    const c = outcomeOf(model, 'strut')
    expectClose(result(c, 'slenderness_in_plane'), 150, { rel: 1e-12 })
    expectClose(result(c, 'transition_in_plane'), 90.3992945, { rel: 1e-8 })
    expectClose(result(c, 'critical_load'), 114103.098, { rel: 1e-8 })
    expectClose(result(c, 'safety_factor'), 5.18650446, { rel: 1e-8 })
    expect(c.results.find((r) => r.name === 'governing_formula')!.value).toEqual({ type: 'text', text: 'Euler' })
  })

  // BK-2 (field-checks.md §7, after Shigley Eq. 4-46 and 4-53): at l = 0.3 m the Johnson diameter
  // for P_cr = 88 kN is 17.6690559 mm, l/k = 67.9 < (l/k)₁: Johnson governs and gives back 88 kN.
  it('should give the BK-2 Johnson column', () => {
    const { model } = read(`\`\`\`column #strut
load: 22 kN
section: round
diameter: 17.6690559 mm
length: 0.3 m
modulus: 207 GPa
yield_strength: 500 MPa
\`\`\`
`)
    const c = outcomeOf(model, 'strut')
    expectClose(result(c, 'slenderness_in_plane'), 67.9153434, { rel: 1e-8 })
    expectClose(result(c, 'critical_load'), 88000, { rel: 1e-7 })
    expect(c.results.find((r) => r.name === 'governing_formula')!.value).toEqual({ type: 'text', text: 'Johnson' })
  })

  it('should give the pin bearing pressure at the largest pin force', () => {
    // TQ-1's 10 kN drive: the crank-pin force of a massless rod is the rod force, largest at 90° (10 327.9556 N).
    const { file, model } = read(`\`\`\`slider-crank #eng
crank: 50 mm
rod: 200 mm
speed: 600 rpm
driver: slider
\`\`\`

\`\`\`forces #gasf
of: eng
load: 10 kN
load_acts: towards-crank
\`\`\`

\`\`\`pin-bearing #cp1
of: gasf
pin: crank-pin
diameter: 30 mm
length: 40 mm
pressure_limit: 5 MPa
\`\`\`
`)
    const p = outcomeOf(model, 'cp1')
    expectClose(result(p, 'pin_force_max'), 10327.9556, { rel: 1e-8 })
    expectClose(result(p, 'pressure_max'), 10327.9556 / (0.03 * 0.04), { rel: 1e-8 })
    expect(p.results.find((r) => r.name === 'pressure_within_limit')!.value).toEqual({ type: 'flag', flag: false })
    expect(brief(file).filter((m) => m.includes('dynamics-warning'))).toHaveLength(1)
  })
})

describe('bad dynamics input', () => {
  const press = (forces: string) => `\`\`\`slider-crank #press
crank: 50 mm
rod: 250 mm
speed: 60 rpm
\`\`\`

\`\`\`forces #pf
of: press
${forces}
\`\`\`
`
  // Lines in the note: the forces block's first body line (of:) is here.
  const OF_LINE = BODY_LINE + 7

  it('should refuse a load table that does not cover the stroke, at its last row', () => {
    const { file } = read(press('load: table ; test\n  0 mm, 0 kN\n  80 mm, 10 kN'))
    const e = errors(file)
    expect(e).toHaveLength(1)
    expect(e[0]!.ruleId).toBe('load-table')
    expect(e[0]!.line).toBe(OF_LINE + 3)
    expect(e[0]!.reason).toMatch(/must cover the stroke/)
  })

  it('should refuse positions that do not rise, at the cell', () => {
    const { file } = read(press('load: table\n  0 mm, 0 kN\n  60 mm, 1 kN\n  50 mm, 2 kN\n  100 mm, 0 kN'))
    const e = errors(file)
    expect(e).toHaveLength(1)
    expect([e[0]!.ruleId, e[0]!.line, e[0]!.column]).toEqual(['load-table', OF_LINE + 4, 3])
  })

  it('should refuse a negative mass where it is written', () => {
    const { file } = read(press('load: 1 kN\nslider_mass: -2 kg'))
    const e = errors(file)
    expect([e[0]!.ruleId, e[0]!.line]).toEqual(['dimension-mismatch', OF_LINE + 2])
    expect(e).toHaveLength(1)
  })

  it('should refuse a pressure load without a piston area', () => {
    const { file } = read(press('load: 2 MPa'))
    expect(errors(file).map((m) => m.ruleId)).toEqual(['missing-input'])
  })

  it('should read a CSV inside the repository, and refuse one outside it, at the load_file line', async () => {
    const root = mkdtempSync(join(tmpdir(), 'lw-data-'))
    mkdirSync(join(root, 'notes'))
    writeFileSync(join(root, 'notes', 'push.csv'), 'travel (mm), force (kN)\n0, 0\n50, 2\n100, 0\n')
    writeFileSync(join(root, 'outside.csv'), 'travel (mm), force (kN)\n0, 0\n100, 1\n')
    const reader = dataReader(join(root, 'notes', 'note.md'))
    const inside = read(press('load_file: push.csv ; test'), reader)
    expect(errors(inside.file)).toEqual([])
    expect(inside.model.dataFiles.map((f) => f.path)).toEqual(['push.csv'])
    const f = outcomeOf(inside.model, 'pf')
    expect(f.data[0]!.rows).toHaveLength(3)
    // The data file is part of the fingerprint: change it and the fingerprint changes.
    writeFileSync(join(root, 'notes', 'push.csv'), 'travel (mm), force (kN)\n0, 0\n50, 3\n100, 0\n')
    const changed = read(press('load_file: push.csv ; test'), reader)
    expect(changed.model.fingerprint).not.toBe(inside.model.fingerprint)
    const outside = read(press('load_file: ../outside.csv'), reader)
    const e = errors(outside.file)
    expect([e[0]!.ruleId, e[0]!.line]).toEqual(['data-file', OF_LINE + 1])
    expect(e[0]!.reason).toMatch(/outside the design repository/)
  })

  it('should warn, at the length, for a column too short for the column formulas and one too slender', () => {
    const column = (length: string) => read(`\`\`\`column #c
load: 1 kN
section: round
diameter: 20 mm
length: ${length}
modulus: 207 GPa
yield_strength: 350 MPa
\`\`\`
`)
    for (const [length, words] of [['40 mm', /below 10/], ['1.2 m', /above 200/]] as const) {
      const { file } = column(length)
      const warnings = file.messages.filter((m) => m.ruleId === 'column-slenderness')
      expect(warnings.length).toBe(2)
      expect(warnings[0]!.line).toBe(BODY_LINE + 4)
      expect(warnings[0]!.reason).toMatch(words)
    }
  })

  it('should print no NaN when a crank only rocks and the cycle figures do not exist', async () => {
    const { file, built } = await build(`\`\`\`slider-crank #rock
crank: 50 mm
rod: 60 mm
offset: 30 mm
speed: 30 rpm
\`\`\`

\`\`\`forces #rf
of: rock
load: table
  -1 m, 1 kN
  1 m, 1 kN
load_against: position
slider_mass: 2 kg
\`\`\`
`)
    expect(errors(file)).toEqual([])
    expect(built.html).not.toBeNull()
    expect(built.html!).not.toMatch(/NaN/)
    expect(built.html!).toMatch(/does not turn fully/)
  })
})
