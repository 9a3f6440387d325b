/**
 * From a slider-crank analysis to a block outcome: results in the trade's
 * words, the extremes of every swept quantity, the method with its governing
 * equations and numbers, warnings, assumptions and the sweep for tables and
 * charts. Shared by the slider-crank and eccentric kinds.
 */
import {
  ROD_ANGLE,
  SLIDER_CRANK_STATE,
  SliderCrankSweep,
  sliderCrankState,
  type Extremes,
  type SliderCrankAnalysis,
} from '../../linkage/index.js'
import { displayUnit, formatNumber, inNoteUnits, showQuantity, unitLabel } from '../display.js'
import { messages } from '../messages.js'
import { reportWarning } from '../report.js'
import type { CalcBlock, InputValue, MethodStep, NamedValue } from '../types.js'
import { angleConvention, displayRange, toDisplay } from './angles.js'
import { extremesRows, type ExtremesRow } from './extremes.js'
import type { AngleConvention, AngleMarker, Assumption, EvaluationContext, LinkageGeometry, SweepSource, SweptQuantity } from './kind.js'
import { kinematicAssumptions } from './linkage-common.js'
import { flag, quantity, tex, texBare } from './values.js'

/** The least transmission angle commonly accepted (common practice, no source; criterion after Alt, 1932). */
export const TRANSMISSION_LIMIT = (40 * Math.PI) / 180

const DEG = 180 / Math.PI

/** Swept quantities of a slider-crank. */
export const SLIDER_CRANK_QUANTITIES: readonly SweptQuantity[] = [
  { name: 'position', label: 'slider position', kind: 'length' },
  { name: 'displacement', label: 'slider travel from outer dead centre', kind: 'length' },
  { name: 'velocity', label: 'slider velocity', kind: 'velocity' },
  { name: 'acceleration', label: 'slider acceleration', kind: 'acceleration' },
  { name: 'rod_angle', label: 'rod angle from the line of stroke', kind: 'angle' },
  { name: 'rod_angular_velocity', label: 'rod angular velocity', kind: 'angular-velocity' },
  { name: 'rod_angular_acceleration', label: 'rod angular acceleration', kind: 'angular-acceleration' },
  { name: 'transmission_angle', label: 'transmission angle', kind: 'angle' },
  { name: 'time', label: 'time from the start of the cycle', kind: 'time' },
]

/** A slider-crank analysed, with the block's angle convention. */
export interface SliderCrankView {
  readonly analysis: SliderCrankAnalysis
  readonly convention: AngleConvention
  readonly source: SweepSource
}

/** The view of an analysis: its angle convention and sweep source. */
export function sliderCrankView(analysis: SliderCrankAnalysis, anglesFrom: string | undefined): SliderCrankView {
  const convention = angleConvention(anglesFrom, 'crank', analysis.linkage.rotation, analysis.fullRotation ? (analysis.outerDeadCentre?.theta ?? null) : null)
  return { analysis, convention, source: sliderCrankSweep(analysis, convention) }
}

/** Results of a slider-crank analysis in the trade's words (crank angles in the block's convention). */
export function sliderCrankResults(view: SliderCrankView): NamedValue[] {
  const a = view.analysis
  const angle = (theta: number | null | undefined): number | null => (theta === null || theta === undefined ? null : toDisplay(view.source, theta))
  const rocks = 'the crank cannot turn fully'
  const outer = a.outerDeadCentre
  const inner = a.innerDeadCentre
  const results: NamedValue[] = [
    flag('full_rotation', 'crank turns fully', a.fullRotation),
    quantity('rod_ratio', 'crank-to-rod ratio a/b', '\\lambda', 'ratio', a.linkage.crank / a.linkage.rod),
    quantity('stroke', 'stroke', 'S', 'length', a.stroke),
    quantity('outer_dead_centre_angle', `${view.convention.label} at outer dead centre`, '\\theta_o', 'angle', angle(outer?.theta), 'outside the crank’s range'),
    quantity('outer_dead_centre_position', 'slider position at outer dead centre', 'x_o', 'length', outer?.position ?? null, 'outside the crank’s range'),
    quantity('inner_dead_centre_angle', `${view.convention.label} at inner dead centre`, '\\theta_i', 'angle', angle(inner?.theta), 'outside the crank’s range'),
    quantity('inner_dead_centre_position', 'slider position at inner dead centre', 'x_i', 'length', inner?.position ?? null, 'outside the crank’s range'),
    quantity('instroke_angle', 'crank travel during the instroke (outer → inner dead centre)', '\\beta_{in}', 'angle', a.instrokeAngle, rocks),
    quantity('outstroke_angle', 'crank travel during the outstroke (inner → outer dead centre)', '\\beta_{out}', 'angle', a.outstrokeAngle, rocks),
    quantity('time_ratio', 'quick-return time ratio (slower / faster stroke)', 'Q', 'ratio', a.timeRatio, rocks),
    quantity('rod_angle_max', 'largest rod angle from the line of stroke', '\\varphi_{\\max}', 'angle', a.rodAngleMax),
    quantity('mean_speed', 'mean slider speed 2·S·n', 'v_m', 'velocity', a.meanSpeed, rocks),
    quantity('cycle_time', 'time for one crank turn', 't_c', 'time', a.cycleTime, rocks),
    flag('needs_stored_energy', 'needs stored energy (a flywheel) to pass the dead points', a.needsStoredEnergy),
    quantity('dead_point_count', 'dead points in the range (where the driving link cannot move the driven one)', null, 'count', a.deadPoints.length),
  ]
  if (a.limitAngles) {
    results.push(
      quantity('limit_angle_start', 'crank limit angle (start of range)', '\\theta_{L1}', 'angle', angle(a.limitAngles[0])),
      quantity('limit_angle_end', 'crank limit angle (end of range)', '\\theta_{L2}', 'angle', angle(a.limitAngles[1])),
    )
  }
  return results
}

/** The extremes table of a slider-crank: every swept quantity but travel and time. */
export function sliderCrankExtremes(view: SliderCrankView): ExtremesRow[] {
  const e = view.analysis.extremes
  const map = new Map<string, Extremes>([
    ['position', e.position],
    ['velocity', e.velocity],
    ['acceleration', e.acceleration],
    ['rod_angle', e.rodAngle],
    ['rod_angular_velocity', e.rodAngularVelocity],
    ['rod_angular_acceleration', e.rodAngularAcceleration],
    ['transmission_angle', e.transmissionAngle],
  ])
  const unbounded = (theta: number): string =>
    `unbounded at the crank limit angle ${formatNumber(toDisplay(view.source, theta) * DEG, 5)}°, where the rod stands square to the path and the crank cannot drive the slider`
  return extremesRows(
    SLIDER_CRANK_QUANTITIES.filter((q) => map.has(q.name)),
    map,
    (theta) => toDisplay(view.source, theta),
    unbounded,
    view.convention.label,
  )
}

/** The method of a slider-crank: each key result with its equation, numbers and value. */
export function sliderCrankMethod(view: SliderCrankView, context: EvaluationContext): MethodStep[] {
  const analysis = view.analysis
  const { meta } = context
  const { crank: a, rod: b, offset: e, sliderSide: side, rotation, driver } = analysis.linkage
  const L = (si: number): string => texBare(meta, si, 'length')
  const A = (si: number): string => texBare(meta, si, 'angle')
  const angle = (theta: number): string => tex(meta, toDisplay(view.source, theta), 'angle')
  const sigma = side === 1 ? '+1' : '-1'
  const steps: MethodStep[] = []
  const lengthUnit = unitLabel(displayUnit('length', meta.units))
  const conventionNote = `Crank angles θ are ${view.convention.words}.`
  if (analysis.linkage.equivalentFourBar) {
    const fb = analysis.linkage.equivalentFourBar
    steps.push({
      label: 'Equivalent four-bar of the arc path',
      formula: 'd = |OC|,\\quad c = |R|',
      substituted: `d = ${L(fb.ground)},\\quad c = ${L(fb.output)}`,
      result: `\\text{input } a = ${tex(meta, a, 'length')},\\ \\text{coupler } b = ${tex(meta, b, 'length')}`,
      note: 'The slider on a circular path of radius R is the pin of a rocker pivoted at the arc centre C; positions are measured along the arc from its tangent point.',
    })
  } else {
    steps.push({
      label: 'Crank can turn fully',
      formula: 'b \\ge a + |e|',
      substituted: `${L(b)} \\ge ${L(a)} + ${L(Math.abs(e))} = ${L(a + Math.abs(e))}`,
      result: analysis.fullRotation ? '\\text{yes}' : '\\text{no}',
      note: analysis.fullRotation
        ? `Lengths in ${lengthUnit}; e is the offset of the slider path from the crank axis. The rod reaches the slider path at every crank angle.`
        : `Lengths in ${lengthUnit}; e is the offset. The crank can only rock between the limit angles where the rod stands square to the path, a sin θ = e ± b (θ from +x).`,
    })
  }
  const outer = analysis.outerDeadCentre
  const inner = analysis.innerDeadCentre
  if (!analysis.linkage.equivalentFourBar && outer) {
    steps.push({
      label: 'Outer dead centre (crank and rod in line, extended)',
      formula: 'x_o = \\sigma\\sqrt{(a+b)^2 - e^2},\\qquad \\theta_{o,x} = \\operatorname{atan2}(e,\\ x_o)',
      substituted: `x_o = ${sigma === '+1' ? '' : '-'}\\sqrt{(${L(a)} + ${L(b)})^2 - ${paren(L(e))}^2}`,
      result: `x_o = ${tex(meta, outer.position, 'length')},\\quad \\theta_o = ${angle(outer.theta)}`,
      note: `σ = ${sigma} (slider on the ${side === 1 ? 'right, +x' : 'left, −x'} side of the crank axis); θ_{o,x} is counter-clockwise from +x. ${conventionNote}`,
    })
  }
  if (!analysis.linkage.equivalentFourBar && inner) {
    steps.push({
      label: 'Inner dead centre (crank and rod in line, folded)',
      formula: 'x_i = \\sigma\\sqrt{(b-a)^2 - e^2},\\qquad \\theta_{i,x} = \\operatorname{atan2}(-e,\\ -x_i)',
      substituted: `x_i = ${sigma === '+1' ? '' : '-'}\\sqrt{(${L(b)} - ${L(a)})^2 - ${paren(L(e))}^2}`,
      result: `x_i = ${tex(meta, inner.position, 'length')},\\quad \\theta_i = ${angle(inner.theta)}`,
    })
  }
  if (analysis.linkage.equivalentFourBar && outer && inner) {
    steps.push({
      label: 'Dead centres (crank and rod in line)',
      formula: '|OB| = b + a \\ \\text{(outer)},\\qquad |OB| = b - a \\ \\text{(inner)},\\qquad |CB| = |R|',
      substituted: null,
      result: `\\theta_o = ${angle(outer.theta)},\\ \\theta_i = ${angle(inner.theta)}`,
      note: `Pin B where the circle about O meets the path arc about C, on the chosen assembly branch. ${conventionNote}`,
    })
  }
  if (outer && inner && analysis.fullRotation) {
    const closed = analysis.linkage.equivalentFourBar === null
    steps.push({
      label: 'Stroke',
      formula: closed ? 'S = |x_o - x_i| = \\sqrt{(a+b)^2-e^2} - \\sqrt{(b-a)^2-e^2}' : 'S = |s_o - s_i|\\ \\text{(along the arc)}',
      substituted: closed ? `S = |${L(outer.position)} - ${paren(L(inner.position))}|` : null,
      result: `S = ${tex(meta, analysis.stroke, 'length')}`,
    })
  } else {
    steps.push({
      label: 'Slider travel over the crank’s range',
      formula: 'S = x_{\\max} - x_{\\min}',
      substituted: `S = ${L(analysis.positionMax.value)} - ${paren(L(analysis.positionMin.value))}`,
      result: `S = ${tex(meta, analysis.stroke, 'length')}`,
      note: 'Extremes among the dead centres inside the range and the limit angles.',
    })
  }
  if (analysis.timeRatio !== null && analysis.instrokeAngle !== null && analysis.outstrokeAngle !== null) {
    const slow = Math.max(analysis.instrokeAngle, analysis.outstrokeAngle)
    const fast = Math.min(analysis.instrokeAngle, analysis.outstrokeAngle)
    steps.push({
      label: 'Quick-return time ratio at constant crank speed',
      formula: 'Q = \\frac{180^\\circ + \\Delta}{180^\\circ - \\Delta},\\qquad \\Delta = \\beta_{slow} - 180^\\circ',
      substituted: `Q = \\frac{${A(slow)}}{${A(fast)}}`,
      result: `Q = ${texBare(meta, analysis.timeRatio, 'ratio')}`,
      note: `Δ is the crank travel of the slower stroke beyond 180°. The crank turns ${rotation === 1 ? 'counter-clockwise' : 'clockwise'}: the instroke (outer → inner dead centre, towards the crank) takes ${formatNumber(analysis.instrokeAngle * DEG, meta.digits)}° of crank travel, the outstroke (inner → outer) ${formatNumber(analysis.outstrokeAngle * DEG, meta.digits)}°.`,
    })
  }
  const mu = analysis.extremes.transmissionAngle
  if (driver === 'slider') {
    steps.push({
      label: 'Least transmission angle (rod against the crank it drives)',
      formula: '\\mu = \\angle(\\text{rod}, \\text{crank}),\\ \\text{folded to}\\ 0^\\circ \\ldots 90^\\circ',
      substituted: null,
      result: `\\mu_{\\min} = ${tex(meta, mu.min.value, 'angle')}\\ \\text{at}\\ \\theta = ${angle(mu.min.theta)}`,
      note: 'The slider drives: the torque it puts on the crank is the rod force times a·sin μ, nil at the dead points (μ = 0°), which stored energy must carry the crank through.',
      cites: ['lw-transmission'],
    })
  } else if (!analysis.linkage.equivalentFourBar && analysis.fullRotation) {
    steps.push({
      label: 'Least transmission angle (rod against the path normal)',
      formula: '\\mu = \\arccos\\frac{|a\\sin\\theta_x - e|}{b},\\qquad \\mu_{\\min} = \\arccos\\frac{a + |e|}{b}',
      substituted: `\\mu_{\\min} = \\arccos\\frac{${L(a)} + ${L(Math.abs(e))}}{${L(b)}}`,
      result: `\\mu_{\\min} = ${tex(meta, mu.min.value, 'angle')}\\ \\text{at}\\ \\theta = ${angle(mu.min.theta)}`,
      note: 'θ_x is the crank angle counter-clockwise from +x.',
      cites: ['lw-transmission'],
    })
  } else {
    steps.push({
      label: 'Least transmission angle',
      formula: '\\mu = \\min(\\angle(AB, CB),\\ 180^\\circ - \\angle(AB, CB))',
      substituted: null,
      result: `\\mu_{\\min} = ${tex(meta, mu.min.value, 'angle')}\\ \\text{at}\\ \\theta = ${angle(mu.min.theta)}`,
      note: 'Found over the crank’s range by a sweep, refined by bisection on the slope.',
      cites: ['lw-transmission'],
    })
  }
  if (analysis.meanSpeed !== null) {
    const n = analysis.speed / (2 * Math.PI)
    steps.push({
      label: 'Mean slider speed',
      formula: 'v_m = 2\\,S\\,n',
      substituted: `v_m = 2 \\times ${tex(meta, analysis.stroke, 'length')} \\times ${texBare(meta, n, 'ratio')}\\,\\mathrm{s^{-1}}`,
      result: `v_m = ${tex(meta, analysis.meanSpeed, 'velocity')}`,
    })
  }
  const omega = analysis.speed
  const v = analysis.extremes.velocity
  const acc = analysis.extremes.acceleration
  const extreme = (value: number, theta: number, kind: 'velocity' | 'acceleration'): string =>
    Number.isFinite(value) ? `${tex(meta, value, kind)}\\ \\text{at}\\ \\theta = ${angle(theta)}` : `\\text{unbounded at}\\ \\theta = ${angle(theta)}`
  steps.push({
    label: 'Slider velocity: greatest and least',
    formula: analysis.linkage.equivalentFourBar
      ? 'v = \\omega\\,R\\,\\frac{d\\theta_4}{d\\theta}'
      : 'v = \\omega\\frac{dx}{d\\theta},\\quad \\frac{dx}{d\\theta} = -a\\sin\\theta_x - \\frac{u\\,a\\cos\\theta_x}{\\sigma\\sqrt{b^2 - u^2}},\\quad u = a\\sin\\theta_x - e',
    substituted: `\\omega = ${tex(meta, omega, 'angular-velocity')}`,
    result: `\\begin{gathered}v_{\\max} = ${extreme(v.max.value, v.max.theta, 'velocity')}\\\\ v_{\\min} = ${extreme(v.min.value, v.min.theta, 'velocity')}\\end{gathered}`,
    note: `Signed along +x: positive ${side === 1 ? 'away from' : 'towards'} the crank axis. Bracketed by a 1441-point sweep, refined by bisection on the slope; the largest magnitude is the greater of |v_max| and |v_min|.`,
  })
  steps.push({
    label: 'Slider acceleration: greatest and least',
    formula: 'a_s = \\omega^2\\frac{d^2x}{d\\theta^2} + \\alpha\\frac{dx}{d\\theta}',
    substituted: `\\omega = ${tex(meta, omega, 'angular-velocity')},\\ \\alpha = ${tex(meta, analysis.angularAcceleration, 'angular-acceleration')}`,
    result: `\\begin{gathered}a_{s,\\max} = ${extreme(acc.max.value, acc.max.theta, 'acceleration')}\\\\ a_{s,\\min} = ${extreme(acc.min.value, acc.min.theta, 'acceleration')}\\end{gathered}`,
    note: 'd²x/dθ² in closed form; α is the crank’s angular acceleration in the sense of rotation (positive speeds it up). Signed along +x; found as for the velocity.',
  })
  return steps
}

function paren(text: string): string {
  return text.startsWith('-') ? `(${text})` : text
}

/** Warnings of a slider-crank in the note's display units. */
export function sliderCrankWarnings(view: SliderCrankView, block: CalcBlock, context: EvaluationContext): string[] {
  const analysis = view.analysis
  const { meta } = context
  const show = (si: number, kind: 'length' | 'angle'): string => showQuantity(si, kind, meta.units, meta.digits)
  const angle = (theta: number): string => show(toDisplay(view.source, theta), 'angle')
  const warnings: string[] = []
  for (const warning of analysis.warnings) {
    let text = warning.message
    if (warning.code === 'crank-cannot-turn' && analysis.linkage.equivalentFourBar === null) {
      const { rod, crank, offset } = analysis.linkage
      text = `The crank cannot turn fully: the connecting rod (${show(rod, 'length')}) cannot reach the slider path for every crank angle: a full turn needs rod ≥ crank + |offset| = ${show(crank + Math.abs(offset), 'length')}. It can only rock between ${angle(analysis.limitAngles![0])} and ${angle(analysis.limitAngles![1])}, where the rod stands square to the path`
    }
    if (warning.code === 'dead-points-need-stored-energy') {
      text = `The slider drives: at the dead points (${view.convention.label} ${analysis.deadPoints.map((p) => angle(p.theta)).join(' and ')}) it cannot turn the crank, so a flywheel or other stored energy must carry the crank through them`
    }
    text = inNoteUnits(text, context.meta.units)
    warnings.push(text)
    reportWarning(context.file, 'linkage-warning', messages['linkage-warning'](text), block.place)
  }
  if (analysis.transmissionMin.value < TRANSMISSION_LIMIT && analysis.linkage.driver !== 'slider') {
    const text = messages['transmission-angle-low'](show(analysis.transmissionMin.value, 'angle'), `θ = ${angle(analysis.transmissionMin.theta)}`, '40°')
    warnings.push(text)
    reportWarning(context.file, 'transmission-angle-low', text, block.place)
  }
  return warnings
}

/** Assumptions a slider-crank analysis makes. */
export function sliderCrankAssumptions(analysis: SliderCrankAnalysis, from: string): Assumption[] {
  const list = kinematicAssumptions(from, 'crank', 'pin joints and the slider guide')
  if (analysis.linkage.equivalentFourBar) {
    list.push({
      text: 'The slider path is a circular arc touching the line of the offset at the stated tangent point; the slider is treated as the pin of a rocker pivoted at the arc centre.',
      verify: false,
      from,
    })
  }
  return list
}

/** Swept quantities of a slider-crank at any crank angles, in a convention. */
function sliderCrankSweep(analysis: SliderCrankAnalysis, convention: AngleConvention): SweepSource {
  const { linkage } = analysis
  const timeOrigin = convention.reference === 'outer-dead-centre' ? convention.origin : linkage.rotation === 1 ? analysis.range.start : analysis.range.end
  const origin = analysis.outerDeadCentre?.position ?? analysis.positionMax.value
  const markers: AngleMarker[] = []
  if (analysis.outerDeadCentre) markers.push({ name: 'outer', label: 'outer dead centre', short: 'ODC', theta: analysis.outerDeadCentre.theta })
  if (analysis.innerDeadCentre) markers.push({ name: 'inner', label: 'inner dead centre', short: 'IDC', theta: analysis.innerDeadCentre.theta })
  if (analysis.limitAngles) {
    markers.push({ name: 'limit-start', label: 'crank limit', short: 'limit', theta: analysis.limitAngles[0] })
    markers.push({ name: 'limit-end', label: 'crank limit', short: 'limit', theta: analysis.limitAngles[1] })
  }
  const columnsOf = (sweep: SliderCrankSweep): Record<string, Float64Array> => ({
    position: sweep.position,
    displacement: sweep.position.map((x) => Math.abs(origin - x)),
    velocity: sweep.velocity,
    acceleration: sweep.acceleration,
    rod_angle: sweep.rodAngle,
    rod_angular_velocity: sweep.rodAngularVelocity,
    rod_angular_acceleration: sweep.rodAngularAcceleration,
    transmission_angle: sweep.transmissionAngle,
    time: sweep.time,
  })
  const e = analysis.extremes
  const [displayStart, displayEnd] = displayRange(convention, analysis.range.start, analysis.range.end, analysis.fullRotation, 1)
  const unboundedAtEnds = new Set<string>()
  for (const [name, x] of [
    ['velocity', e.velocity],
    ['acceleration', e.acceleration],
    ['rod_angular_velocity', e.rodAngularVelocity],
    ['rod_angular_acceleration', e.rodAngularAcceleration],
  ] as const) {
    if (x.unbounded.positive || x.unbounded.negative) unboundedAtEnds.add(name)
  }
  return {
    geometry: sliderCrankGeometry(analysis),
    extremes: new Map<string, Extremes>([
      ['position', e.position],
      ['velocity', e.velocity],
      ['acceleration', e.acceleration],
      ['rod_angle', e.rodAngle],
      ['rod_angular_velocity', e.rodAngularVelocity],
      ['rod_angular_acceleration', e.rodAngularAcceleration],
      ['transmission_angle', e.transmissionAngle],
    ]),
    unboundedAtEnds,
    convention,
    displayStart,
    displayEnd,
    rotation: linkage.rotation,
    speed: analysis.speed,
    timeOrigin,
    start: analysis.range.start,
    end: analysis.range.end,
    fullTurn: analysis.fullRotation,
    periodTurns: 1,
    quantities: SLIDER_CRANK_QUANTITIES,
    markers,
    at(angles) {
      return columnsOf(new SliderCrankSweep(linkage, angles.length).updateAt(angles, analysis, timeOrigin))
    },
  }
}

/** Joint positions of a slider-crank: crank axis O, crank pin A, slider pin B. */
function sliderCrankGeometry(analysis: SliderCrankAnalysis): LinkageGeometry {
  const { linkage } = analysis
  const state = new Float64Array(SLIDER_CRANK_STATE)
  const fb = linkage.equivalentFourBar
  return {
    kind: 'slider-crank',
    pivots: [[0, 0]],
    path: fb ? { type: 'arc', cx: fb.groundX, cy: fb.groundY, radius: fb.output } : { type: 'line', y: linkage.offset },
    rotation: linkage.rotation,
    crank: linkage.crank,
    pose(theta) {
      if (!sliderCrankState(linkage, theta, state)) return null
      const ax = linkage.crank * Math.cos(theta)
      const ay = linkage.crank * Math.sin(theta)
      const phi = state[ROD_ANGLE]!
      return { O: [0, 0], A: [ax, ay], B: [ax + linkage.rod * Math.cos(phi), ay + linkage.rod * Math.sin(phi)] }
    },
  }
}

/** Names of the results that go into the package summary. */
export function summaryNames(analysis: SliderCrankAnalysis): string[] {
  const drive = analysis.linkage.driver === 'slider' ? ['needs_stored_energy'] : []
  return analysis.fullRotation
    ? ['stroke', 'time_ratio', 'transmission_angle_min', 'velocity_abs_max', 'acceleration_abs_max', ...drive]
    : ['stroke', 'limit_angle_start', 'limit_angle_end', 'transmission_angle_min']
}

/** Input values as named values (for publishing alongside results). */
export function asNamed(inputs: readonly InputValue[]): NamedValue[] {
  return inputs.map(({ name, label, symbol, value }) => ({ name, label, symbol, value }))
}
