/**
 * From a force analysis to a block outcome: results in the trade's words, the
 * extremes of every force, the method at the governing crank angle with its
 * numbers, warnings, assumptions, the sweep (kinematic and force quantities
 * together) and what the flywheel, column and pin-bearing blocks build on.
 */
import {
  DDX,
  DPHI,
  DX,
  F,
  FORCE_STATE,
  FOUR_BAR_STATE,
  H3,
  H4,
  ROD_ANGLE,
  SLIDER_CRANK_STATE,
  fourBarState,
  sliderCrankForceKinematics,
  sliderCrankForceState,
  sliderCrankState,
  type FourBarAnalysis,
  type FourBarForceAnalysis,
  type FourBarForceInput,
  type SliderCrankAnalysis,
  type SliderCrankForceAnalysis,
  type SliderCrankForceInput,
} from '../../linkage/index.js'
import { showQuantity } from '../display.js'
import { messages } from '../messages.js'
import { reportWarning } from '../report.js'
import type { CalcBlock, MethodStep, NamedValue } from '../types.js'
import { toDisplay } from './angles.js'
import { extremesRows, extremesValues } from './extremes.js'
import type { ForceView } from './forces-view.js'
import type { ReadInputs } from './inputs.js'
import { outcome, type Assumption, type BlockOutcome, type EvaluationContext, type ForceCycle, type SweepSource } from './kind.js'
import type { LoadReading } from './load-input.js'
import { asNamed } from './slider-crank-outcome.js'
import { publish, quantity, tex, texBare } from './values.js'

const DEG = 180 / Math.PI

interface Common {
  readonly block: CalcBlock
  readonly context: EvaluationContext
  /** The linkage block's id. */
  readonly id: string
  readonly linkage: BlockOutcome
  readonly inputs: ReadInputs
  readonly load: LoadReading
  readonly view: ForceView
}

/** The forces block's sweep: the linkage's quantities and the forces, at any crank angles. */
function forceSweep(source: SweepSource, view: ForceView): SweepSource {
  return {
    ...source,
    quantities: [...source.quantities, ...view.quantities],
    extremes: new Map([...source.extremes, ...view.extremes]),
    at(angles) {
      return { ...source.at(angles), ...view.at(angles) }
    },
  }
}

/** Results every linkage's forces share: torque, power, work and motor. */
function driveResults(view: ForceView, inputs: ReadInputs, delivered: boolean, rocks: boolean): NamedValue[] {
  const why = rocks ? 'the crank does not turn fully, so there is no cycle to average over' : 'the linkage cannot be driven at some angles'
  const k = inputs.si.service_factor ?? 1
  const eta = inputs.si.drive_efficiency ?? 1
  const motor = !delivered && view.powerMean !== null && view.powerMean > 0 ? (k * view.powerMean) / eta : null
  const peakPower = view.extremes.get(view.powerName)?.max.value ?? null
  const results: NamedValue[] = delivered
    ? [
        quantity('output_torque_mean', 'mean torque the crank delivers over a turn', 'T_m', 'torque', view.torqueMean, why),
        quantity('torque_rms', 'RMS crank torque over a turn', 'T_{rms}', 'torque', view.torqueRms, why),
        quantity('output_power_mean', 'mean power the crank delivers', 'P_m', 'power', view.powerMean, why),
        quantity('work_delivered', 'work the crank delivers per turn', 'W', 'energy', view.driveWork === null ? null : -view.driveWork, why),
      ]
    : [
        quantity('torque_mean', 'mean drive torque over a turn', 'T_m', 'torque', view.torqueMean, why),
        quantity('torque_rms', 'RMS drive torque over a turn', 'T_{rms}', 'torque', view.torqueRms, why),
        quantity('power_mean', 'mean drive power', 'P_m', 'power', view.powerMean, why),
        quantity('work_per_cycle', 'work done by the drive per turn', 'W', 'energy', view.driveWork, why),
        quantity('motor_power', 'motor power K_s·P_m/η (a flywheel carries the peaks)', 'P_{motor}', 'power', motor, view.powerMean !== null && view.powerMean <= 0 ? 'the mean drive power is not positive' : why),
        quantity('motor_power_peak', 'motor power K_s·P_peak/η to meet the peak without a flywheel', 'P_{motor,pk}', 'power', peakPower !== null && peakPower > 0 ? (k * peakPower) / eta : null, 'the drive power is never positive'),
      ]
  results.push(quantity('load_work', 'work done on the process load per turn', 'W_P', 'energy', view.loadWork, why))
  return results
}

/** The part of the ForceCycle every linkage shares. */
function cycleBase(view: ForceView, analysis: { range: { start: number; end: number }; speed: number }, linkageId: string, fullTurn: boolean, rotation: 1 | -1) {
  return {
    linkageId,
    torque: (theta: number) => view.torqueSign * view.value(theta, view.torqueName),
    start: analysis.range.start,
    period: analysis.range.end - analysis.range.start,
    fullTurn,
    speed: analysis.speed,
    rotation,
    torqueMean: view.torqueMean === null ? null : view.torqueSign * view.torqueMean,
    loadWork: view.loadWork,
  }
}

/** Assumptions every force analysis makes. */
function forceAssumptions(from: string, extra: readonly Assumption[]): Assumption[] {
  return [
    { text: 'Links are rigid and planar: elastic deformation, clearances in pins and guides, lubricant films and pin friction are not included.', verify: false, from },
    { text: 'The crank (input) turns at the stated speed and angular acceleration whatever the load: the speed fluctuation a flywheel leaves is not fed back into the forces.', verify: false, from },
    ...extra,
  ]
}

/** Warnings where the linkage locks or cannot be driven. */
function stuckWarning(view: ForceView, block: CalcBlock, context: EvaluationContext, what: string): string[] {
  if (view.stuck === 0) return []
  const text = `${what} at ${view.stuck} of the 1441 crank angles swept: no force or torque there, and the cycle figures are not given`
  reportWarning(context.file, 'dynamics-warning', messages['dynamics-warning'](text), block.place)
  return [text]
}

/** A slider-crank's forces as a block outcome. */
export function sliderCrankForcesOutcome(
  args: Common & {
    readonly analysis: SliderCrankAnalysis
    readonly input: SliderCrankForceInput
    readonly straight: SliderCrankForceAnalysis | null
    readonly assumed: { readonly rodCentre: boolean; readonly rodInertia: boolean }
  },
): BlockOutcome {
  const { block, context, id, linkage, analysis, inputs, load, input, view, straight, assumed } = args
  const source = forceSweep(linkage.sweep!, view)
  const delivered = analysis.linkage.driver === 'slider'
  const angle = (theta: number): number => toDisplay(source, theta)
  const rocks = !analysis.fullRotation
  const results = driveResults(view, inputs, delivered, rocks)
  const compressionE = view.extremes.get('rod_force')!
  const compression = compressionE.min.value < 0 ? { value: -compressionE.min.value, theta: compressionE.min.theta } : null
  const tension = compressionE.max.value > 0 ? { value: compressionE.max.value, theta: compressionE.max.theta } : null
  results.push(
    quantity('rod_compression_max', 'largest rod compression', 'S_{c}', 'force', compression?.value ?? 0),
    quantity('rod_compression_max_at', `${source.convention.label} at the largest rod compression`, null, 'angle', compression ? angle(compression.theta) : null, 'the rod is never in compression'),
    quantity('rod_tension_max', 'largest rod tension', 'S_{t}', 'force', tension?.value ?? 0),
    quantity('rod_tension_max_at', `${source.convention.label} at the largest rod tension`, null, 'angle', tension ? angle(tension.theta) : null, 'the rod is never in tension'),
  )
  if (straight) {
    results.push(
      quantity('friction_work', 'work lost in guide friction per turn', 'W_f', 'energy', straight.frictionWork, 'the crank does not turn fully'),
      quantity('reciprocating_mass', 'reciprocating mass m_s + m_r·g/b', 'm_{rec}', 'mass', straight.reciprocatingMass),
      quantity('rotating_mass_radius', 'rotating mass × radius at the crank pin (crank and the rod’s share)', 'm_{rot}r', 'mass-radius', straight.rotatingMassRadius),
      quantity('counterweight_mass_radius', 'counterweight mass × radius', 'm_w r_w', 'mass-radius', straight.counterweightMassRadius),
      quantity('primary_force', 'primary (first-harmonic) part of the reciprocating inertia force, amplitude', 'F_{I1}', 'force', straight.primary?.amplitude ?? null, 'the crank does not turn fully'),
      quantity('secondary_force', 'secondary (second-harmonic) part of the reciprocating inertia force, amplitude', 'F_{I2}', 'force', straight.secondary?.amplitude ?? null, 'the crank does not turn fully'),
      quantity('reciprocating_balanced', 'share of the reciprocating mass the counterweight balances (negative: not even the rotating mass is balanced)', '\\beta_w', 'ratio', straight.reciprocatingBalanced, 'no counterweight opposite the crank pin'),
      quantity('shaking_force_without_counterweight_max', 'largest shaking force without the counterweight', null, 'force', straight.shakingWithoutCounterweight.value),
      quantity('guide_locked_points', 'crank angles (of 1441) where guide friction locks the slider', null, 'count', straight.lockedPoints),
    )
  }
  const rows = extremesRows(
    view.headline.map((n) => view.quantities.find((q) => q.name === n)!),
    view.extremes,
    angle,
    (theta) => `unbounded at the crank limit angle ${angle(theta) * DEG}°`,
    source.convention.label,
  )
  publish(context, block.id, [...asNamed(inputs.values), ...results, ...extremesValues(rows)])
  const from = block.id ?? 'forces'
  const extra: Assumption[] = []
  if (assumed.rodCentre) extra.push({ text: 'The rod’s centre of mass is taken at mid-length (no `rod_centre` given).', verify: true, from })
  if (assumed.rodInertia) {
    extra.push({
      text: 'The rod is taken as two masses at its pins (no `rod_inertia` given): its inertia about its centre is then m_r·g·(b − g). A real rod’s inertia is usually less; the correction couple that difference needs is neglected.',
      verify: true,
      from,
    })
  }
  extra.push(
    input.friction > 0
      ? { text: `Guide friction is Coulomb friction with μ = ${input.friction}, opposing the slider’s velocity; pin friction is neglected.`, verify: false, from }
      : { text: 'Guide and pin friction are neglected.', verify: false, from },
    input.gravity[0] === 0 && input.gravity[1] === 0
      ? { text: 'The links’ weight is neglected (no `gravity`).', verify: false, from }
      : { text: `Gravity acts along ${inputs.words.gravity} of the linkage’s frame at 9.80665 m/s².`, verify: false, from },
    load.table
      ? { text: 'The load varies linearly between the rows of its table, and holds its end value where the table stops short of the motion by no more than 0.1 % of it.', verify: false, from }
      : { text: 'The load is constant over the strokes it acts on.', verify: false, from },
  )
  if (!straight) extra.push({ text: 'On the arc path the slider is a point mass at the tip of a massless rocker pivoted at the arc centre; the load acts along the arc.', verify: false, from })
  const warnings = stuckWarning(view, block, context, straight ? 'Guide friction locks the slider (the rod is too steep for the friction coefficient)' : 'The linkage cannot be driven')
  const cycle: ForceCycle = {
    ...cycleBase(view, analysis, id, analysis.fullRotation, analysis.linkage.rotation),
    linkageKind: 'slider-crank',
    driver: analysis.linkage.driver,
    rodCompression: compression,
    rodLength: analysis.linkage.rod,
    pin(name, theta) {
      const state = new Float64Array(SLIDER_CRANK_STATE)
      const ok = sliderCrankState(analysis.linkage, theta, state)
      const omega = analysis.linkage.rotation * analysis.speed
      const rod = ok ? state[DPHI]! * omega : Number.NaN
      return name === 'crank-pin'
        ? { force: view.value(theta, 'crank_pin_force'), relativeSpeed: omega - rod }
        : { force: view.value(theta, 'wrist_pin_force'), relativeSpeed: rod }
    },
    pinForceMax: {
      'crank-pin': view.extremes.get('crank_pin_force')!.max,
      'wrist-pin': view.extremes.get('wrist_pin_force')!.max,
    },
  }
  const method = straight ? sliderCrankForceMethod(straight, view, load, source, context, delivered, inputs) : fourBarTorqueMethod(view, source, context, inputs, delivered)
  const summary = delivered
    ? ['output_torque_mean', 'output_power_mean', 'output_torque_abs_max', 'rod_compression_max']
    : ['crank_torque_abs_max', 'torque_mean', 'power_mean', 'motor_power', 'rod_compression_max']
  return outcome(block, 'Forces and torque', {
    covers: ['forces'],
    inputs: [load.input, ...inputs.values],
    results,
    extremes: rows,
    method,
    warnings,
    assumptions: forceAssumptions(from, extra),
    summary: summary.filter((n) => results.some((r) => r.name === n) || rows.some((r) => `${r.quantity.name}_abs_max` === n)),
    sweep: source,
    data: load.table ? [load.table] : [],
    core: { type: 'forces', cycle },
  })
}

/** The method of a straight-path slider-crank's forces at the crank angle of the largest torque. */
function sliderCrankForceMethod(
  f: SliderCrankForceAnalysis,
  view: ForceView,
  load: LoadReading,
  source: SweepSource,
  context: EvaluationContext,
  delivered: boolean,
  inputs: ReadInputs,
): MethodStep[] {
  const { meta } = context
  const linkage = f.kinematics.linkage
  const peak = view.extremes.get(view.torqueName)!.absMax
  const theta = peak.theta
  const kin = new Float64Array(SLIDER_CRANK_STATE)
  const out = new Float64Array(FORCE_STATE)
  const omega = linkage.rotation * f.kinematics.speed
  const alpha = linkage.rotation * f.kinematics.angularAcceleration
  sliderCrankState(linkage, theta, kin)
  const phi = kin[ROD_ANGLE]!
  sliderCrankForceKinematics(linkage, theta, kin)
  sliderCrankForceState(linkage, f.input, f.timing, theta, omega, alpha, kin, out)
  const at = `${source.convention.label.replace(/^crank angle/, 'θ')} = ${showQuantity(toDisplay(source, theta), 'angle', meta.units, meta.digits)}`
  const N = (si: number): string => tex(meta, si, 'force')
  const m = f.input.masses
  const aB = kin[DDX]! * omega * omega + kin[DX]! * alpha
  const steps: MethodStep[] = []
  const position = kin[0]!
  const travel = f.timing ? Math.abs(f.timing.outerPosition - position) : null
  steps.push({
    label: `Load on the slider at the crank angle of the largest torque (${at})`,
    formula: load.table ? 'P = P_i + \\frac{s - s_i}{s_{i+1} - s_i}\\,(P_{i+1} - P_i)' : 'P = P_0',
    substituted: travel !== null ? `x = ${tex(meta, position, 'length')},\\quad s = ${tex(meta, travel, 'length')}` : `x = ${tex(meta, position, 'length')}`,
    result: `P = ${N(out[F.LOAD]!)}`,
    note: `P is the load’s force on the slider along +x (signed); the note gives its magnitude, acting ${senseWords(inputs.words.load_acts)}${inputs.words.load_during === 'both' ? '' : ` on the ${inputs.words.load_during} only`}. s is the travel from the outer dead centre, x the slider position.${load.kind === 'pressure' ? ' The table gives pressure; P = p·A_p.' : ''}`,
  })
  steps.push({
    label: 'Slider: forces along the path',
    formula: 'F_x = m_s\\,a_B - P - f - m_s g_x',
    substituted: `F_x = ${tex(meta, m.slider, 'mass')} \\times ${paren(tex(meta, aB, 'acceleration'))} - ${paren(N(out[F.LOAD]!))} - ${paren(N(out[F.FRICTION]!))} - ${paren(N(m.slider * f.input.gravity[0]))}`,
    result: `F_x = ${N(out[F.WRIST_X]!)},\\quad F_y = ${N(out[F.WRIST_Y]!)}`,
    note: 'F is the force of the rod on the slider at the wrist pin; a_B the slider’s acceleration along +x, f the guide friction. F_y follows from the rod’s moment balance about its centre of mass with the guide normal force N (see the derivation in DEVELOPERS.md).',
  })
  steps.push({
    label: 'Rod force',
    formula: 'S = -(F_x\\cos\\varphi + F_y\\sin\\varphi)',
    substituted: `S = -(${paren(N(out[F.WRIST_X]!))}\\cos ${paren(tex(meta, phi, 'angle'))} + ${paren(N(out[F.WRIST_Y]!))}\\sin ${paren(tex(meta, phi, 'angle'))})`,
    result: `S = ${N(out[F.ROD]!)}\\ \\text{(${out[F.ROD]! < 0 ? 'compression' : 'tension'})}`,
    note: 'φ is the rod’s angle from +x; tension positive.',
  })
  const a = linkage.crank
  const Ft = out[F.PIN_TANGENTIAL]!
  const [gx, gy] = f.input.gravity
  const c = Math.cos(theta)
  const sn = Math.sin(theta)
  const cw = Math.cos(theta + m.counterweightPhase)
  const sw = Math.sin(theta + m.counterweightPhase)
  const Mg = m.crank * m.crankCentre * (c * gy - sn * gx) + m.counterweight * m.counterweightRadius * (cw * gy - sw * gx)
  const Ia = m.crankInertia * alpha
  steps.push({
    label: 'Crank torque: moment balance of the crank about its axis',
    formula: 'T = \\sigma_r\\,(-a\\,F_t + I_c\\,\\alpha - M_g)',
    substituted: `T = ${linkage.rotation === 1 ? '' : '-'}(-${tex(meta, a, 'length')} \\times ${paren(N(Ft))} + ${paren(tex(meta, Ia, 'torque'))} - ${paren(tex(meta, Mg, 'torque'))})`,
    result: `T = ${tex(meta, out[F.TORQUE]!, 'torque')}`,
    note: `F_t is the rod’s force on the crank pin across the crank (counter-clockwise positive), σ_r = ${linkage.rotation === 1 ? '+1 (counter-clockwise)' : '−1 (clockwise)'}; α the crank’s angular acceleration counter-clockwise; M_g the moment of the crank’s and counterweight’s weight. T is the torque the drive applies, positive in the sense of rotation${delivered ? '; the torque the crank delivers is −T' : ''}.`,
  })
  steps.push({
    label: 'Check by virtual work: the load’s share of the torque',
    formula: 'T_P = -\\sigma_r\\,P\\,\\frac{dx}{d\\theta}',
    substituted: `T_P = -(${linkage.rotation === 1 ? '+1' : '-1'}) \\times ${paren(N(out[F.LOAD]!))} \\times ${paren(tex(meta, kin[DX]!, 'length'))}`,
    result: `T_P = ${tex(meta, out[F.LOAD_TORQUE]!, 'torque')},\\quad T - T_P = ${tex(meta, out[F.TORQUE]! - out[F.LOAD_TORQUE]!, 'torque')}`,
    note: 'dx/dθ (per radian) from the kinematics; the rest, T − T_P, is the inertia of the slider, rod and crank, friction and weight.',
  })
  if (f.torqueMean !== null && f.driveWork !== null && f.loadWork !== null) {
    const lost = f.frictionWork ?? 0
    steps.push({
      label: 'Mean torque and work per turn',
      formula: 'W = \\int_0^{2\\pi} T\\,d\\theta,\\qquad T_m = \\frac{W}{2\\pi}',
      substituted: `W = ${tex(meta, f.driveWork, 'energy')}`,
      result: `T_m = ${tex(meta, f.torqueMean, 'torque')},\\quad P_m = T_m\\,\\omega = ${tex(meta, f.powerMean ?? 0, 'power')}`,
      note: `Simpson’s rule over 1441 crank angles. The work balance: done on the load ${showQuantity(f.loadWork, 'energy', meta.units, meta.digits)}${lost !== 0 ? ` + lost in guide friction ${showQuantity(lost, 'energy', meta.units, meta.digits)}` : ''} = ${showQuantity(f.loadWork + lost, 'energy', meta.units, meta.digits)}; the inertia forces do no net work over a turn.${delivered ? ' A negative W is work the crank delivers.' : ''}`,
    })
  }
  if (f.primary && f.secondary && f.reciprocatingMass > 0) {
    const w2 = f.kinematics.speed ** 2
    const lambda = linkage.crank / linkage.rod
    steps.push({
      label: 'Reciprocating inertia force: primary and secondary parts',
      formula: 'F_I \\approx m_{rec}\\,a\\,\\omega^2(\\cos\\theta + \\lambda\\cos 2\\theta),\\quad m_{rec} = m_s + m_r\\frac{g}{b}',
      substituted: `m_{rec}\\,a\\,\\omega^2 = ${tex(meta, f.reciprocatingMass, 'mass')} \\times ${tex(meta, a, 'length')} \\times (${tex(meta, f.kinematics.speed, 'angular-velocity')})^2 = ${N(f.reciprocatingMass * a * w2)},\\quad \\lambda = ${texBare(meta, lambda, 'ratio')}`,
      result: `F_{I1} = ${N(f.primary.amplitude)},\\quad F_{I2} = ${N(f.secondary.amplitude)}`,
      note: 'The amplitudes in the result are the first and second Fourier harmonics of the exact inertia force over a turn; the two-term formula above is the usual approximation for an in-line drive, λ = a/b. A crank counterweight can balance only the primary part.',
    })
  }
  if (!delivered && f.powerMean !== null && f.powerMean > 0) {
    const k = inputs.si.service_factor ?? 1
    const eta = inputs.si.drive_efficiency ?? 1
    steps.push({
      label: 'Motor power',
      formula: 'P_{motor} = K_s\\,\\frac{P_m}{\\eta}',
      substituted: `P_{motor} = ${texBare(meta, k, 'ratio')} \\times \\frac{${tex(meta, f.powerMean, 'power')}}{${texBare(meta, eta, 'ratio')}}`,
      result: `P_{motor} = ${tex(meta, (k * f.powerMean) / eta, 'power')},\\quad P_{motor,pk} = K_s\\,\\frac{P_{pk}}{\\eta} = ${tex(meta, (k * (view.extremes.get(view.powerName)!.max.value)) / eta, 'power')}`,
      note: 'The motor meets the mean power only where a flywheel carries the peaks (see a flywheel block); without one it must meet the peak power P_pk.',
    })
  }
  if (delivered && f.kinematics.deadPoints.length > 0) {
    steps.push({
      label: 'Dead points: the slider’s load gives no torque',
      formula: 'T_P = -\\sigma_r\\,P\\,\\frac{dx}{d\\theta} = 0\\quad \\text{where}\\quad \\frac{dx}{d\\theta} = 0',
      substituted: null,
      result: f.kinematics.deadPoints.map((p) => `\\theta = ${tex(meta, toDisplay(source, p.theta), 'angle')}`).join(',\\ '),
      note: 'At the dead centres the rod and crank are in line: whatever the slider’s force, it cannot turn the crank. Stored kinetic energy (the flywheel) carries the crank through them.',
    })
  }
  return steps
}

/** Torque, mean and motor of a four-bar (or arc-path slider) force analysis. */
function fourBarTorqueMethod(view: ForceView, source: SweepSource, context: EvaluationContext, inputs: ReadInputs, delivered: boolean): MethodStep[] {
  const { meta } = context
  const peak = view.extremes.get(view.torqueName)!.absMax
  const steps: MethodStep[] = [
    {
      label: 'Input torque: kinetostatics of the three moving links',
      formula: '\\sum \\mathbf{F}_i = m_i\\,\\mathbf{a}_{G_i},\\qquad \\sum M_{G_i} = I_{G_i}\\,\\alpha_i \\quad (i = 2, 3, 4)',
      substituted: null,
      result: `|T|_{\\max} = ${tex(meta, peak.value, 'torque')}\\ \\text{at}\\ \\theta = ${tex(meta, toDisplay(source, peak.theta), 'angle')}`,
      note: 'Nine equations in the eight pin-force components and the input torque (the matrix method of kinetostatics), solved in closed form at each input angle: the coupler’s force balance gives the force at B from that at A, and the coupler’s and output’s moment balances leave a 2 × 2 system.',
    },
  ]
  if (view.torqueMean !== null && view.driveWork !== null) {
    steps.push({
      label: 'Mean torque and work per turn',
      formula: 'W = \\int_0^{2\\pi} T\\,d\\theta,\\qquad T_m = \\frac{W}{2\\pi}',
      substituted: `W = ${tex(meta, view.driveWork, 'energy')}`,
      result: `T_m = ${tex(meta, view.torqueMean, 'torque')}`,
      note: `Simpson’s rule over 1441 input angles; work done on the load per turn ${view.loadWork === null ? '—' : showQuantity(view.loadWork, 'energy', meta.units, meta.digits)}.${delivered ? ' T_m here is the torque the crank delivers.' : ''}`,
    })
  }
  if (!delivered && view.powerMean !== null && view.powerMean > 0) {
    const k = inputs.si.service_factor ?? 1
    const eta = inputs.si.drive_efficiency ?? 1
    steps.push({
      label: 'Motor power',
      formula: 'P_{motor} = K_s\\,\\frac{P_m}{\\eta}',
      substituted: `P_{motor} = ${texBare(meta, k, 'ratio')} \\times \\frac{${tex(meta, view.powerMean, 'power')}}{${texBare(meta, eta, 'ratio')}}`,
      result: `P_{motor} = ${tex(meta, (k * view.powerMean) / eta, 'power')}`,
      note: 'The motor meets the mean power only where a flywheel carries the peaks; without one it must meet the peak power.',
    })
  }
  return steps
}

/** A four-bar's forces as a block outcome. */
export function fourBarForcesOutcome(args: Common & { readonly analysis: FourBarAnalysis; readonly input: FourBarForceInput; readonly forces: FourBarForceAnalysis }): BlockOutcome {
  const { block, context, id, linkage, analysis, inputs, load, view, forces } = args
  const source = forceSweep(linkage.sweep!, view)
  const angle = (theta: number): number => toDisplay(source, theta)
  const full = analysis.inputTurnsFully && analysis.periodTurns === 1
  const results = driveResults(view, inputs, false, !full)
  const coupler = view.extremes.get('coupler_force')!
  const compression = coupler.min.value < 0 ? { value: -coupler.min.value, theta: coupler.min.theta } : null
  results.push(
    quantity('coupler_compression_max', 'largest coupler compression', 'S_c', 'force', compression?.value ?? 0),
    quantity('coupler_compression_max_at', `${source.convention.label} at the largest coupler compression`, null, 'angle', compression ? angle(compression.theta) : null, 'the coupler is never in compression'),
  )
  const rows = extremesRows(view.quantities, view.extremes, angle, (theta) => `unbounded at the input limit angle ${angle(theta) * DEG}°`, source.convention.label)
  publish(context, block.id, [...asNamed(inputs.values), ...results, ...extremesValues(rows)])
  const from = block.id ?? 'forces'
  const input = args.input
  const extra: Assumption[] = [
    { text: 'Pin friction is neglected.', verify: false, from },
    input.gravity[0] === 0 && input.gravity[1] === 0
      ? { text: 'The links’ weight is neglected (no `gravity`).', verify: false, from }
      : { text: `Gravity acts along ${inputs.words.gravity} of the linkage’s frame at 9.80665 m/s².`, verify: false, from },
  ]
  const warnings = stuckWarning(view, block, context, 'The linkage cannot be driven (coupler and output in line)')
  const cycle: ForceCycle = {
    ...cycleBase(view, analysis, id, full, analysis.linkage.rotation),
    linkageKind: 'four-bar',
    driver: 'input',
    rodCompression: compression,
    rodLength: analysis.linkage.coupler,
    pin(name, theta) {
      const state = new Float64Array(FOUR_BAR_STATE)
      const ok = fourBarState(analysis.linkage, theta, state)
      const omega = analysis.linkage.rotation * analysis.speed
      const w3 = ok ? state[H3]! * omega : Number.NaN
      const w4 = ok ? state[H4]! * omega : Number.NaN
      return name === 'crank-pin'
        ? { force: view.value(theta, 'input_pin_force'), relativeSpeed: omega - w3 }
        : { force: view.value(theta, 'output_pin_force'), relativeSpeed: w3 - w4 }
    },
    pinForceMax: {
      'crank-pin': view.extremes.get('input_pin_force')!.max,
      'wrist-pin': view.extremes.get('output_pin_force')!.max,
    },
  }
  void forces
  return outcome(block, 'Forces and torque', {
    covers: ['forces'],
    inputs: [load.input, ...inputs.values],
    results,
    extremes: rows,
    method: fourBarTorqueMethod(view, source, context, inputs, false),
    warnings,
    assumptions: forceAssumptions(from, extra),
    summary: ['input_torque_abs_max', 'torque_mean', 'motor_power', 'coupler_compression_max'],
    sweep: source,
    data: load.table ? [load.table] : [],
    core: { type: 'forces', cycle },
  })
}

function senseWords(word: string | undefined): string {
  return word === 'towards-crank' ? 'towards the crank axis' : word === 'away-from-crank' ? 'away from the crank axis' : 'against the slider’s motion'
}

function paren(text: string): string {
  return text.startsWith('-') ? `(${text})` : text
}
