/**
 * From a slider-crank analysis to a block outcome: results in the trade's
 * words, the method with its governing equations and numbers, warnings,
 * assumptions and the sweep for tables and charts. Shared by the slider-crank
 * and eccentric kinds.
 */
import { ROD_ANGLE, SLIDER_CRANK_STATE, SliderCrankSweep, sliderCrankState, type SliderCrankAnalysis } from '../../linkage/index.js'
import { displayUnit, formatNumber, showQuantity, unitLabel } from '../display.js'
import { messages } from '../messages.js'
import { reportWarning } from '../report.js'
import type { CalcBlock, InputValue, MethodStep, NamedValue } from '../types.js'
import type { Assumption, AngleMarker, EvaluationContext, LinkageGeometry, SweepSource } from './kind.js'
import { kinematicAssumptions } from './linkage-common.js'
import { flag, quantity, tex, texBare } from './values.js'

/** The least transmission angle commonly accepted (common practice; criterion after Alt, 1932). */
export const TRANSMISSION_LIMIT = (40 * Math.PI) / 180

const DEG = 180 / Math.PI

/** Results of a slider-crank analysis in the trade's words. */
export function sliderCrankResults(analysis: SliderCrankAnalysis): NamedValue[] {
  const a = analysis
  const rocks = 'the crank cannot turn fully'
  const outer = a.outerDeadCentre
  const inner = a.innerDeadCentre
  const results: NamedValue[] = [
    flag('full_rotation', 'crank turns fully', a.fullRotation),
    quantity('rod_ratio', 'crank-to-rod ratio a/b', '\\lambda', 'ratio', a.linkage.crank / a.linkage.rod),
    quantity('stroke', 'stroke', 'S', 'length', a.stroke),
    quantity('outer_dead_centre_angle', 'crank angle at outer dead centre', '\\theta_o', 'angle', outer?.theta ?? null, 'outside the crank’s range'),
    quantity('outer_dead_centre_position', 'slider position at outer dead centre', 'x_o', 'length', outer?.position ?? null, 'outside the crank’s range'),
    quantity('inner_dead_centre_angle', 'crank angle at inner dead centre', '\\theta_i', 'angle', inner?.theta ?? null, 'outside the crank’s range'),
    quantity('inner_dead_centre_position', 'slider position at inner dead centre', 'x_i', 'length', inner?.position ?? null, 'outside the crank’s range'),
    quantity('instroke_angle', 'crank travel during the instroke (outer → inner dead centre)', '\\beta_{in}', 'angle', a.instrokeAngle, rocks),
    quantity('outstroke_angle', 'crank travel during the outstroke (inner → outer dead centre)', '\\beta_{out}', 'angle', a.outstrokeAngle, rocks),
    quantity('time_ratio', 'quick-return time ratio (slower / faster stroke)', 'Q', 'ratio', a.timeRatio, rocks),
    quantity('transmission_angle_min', 'least transmission angle', '\\mu_{\\min}', 'angle', a.transmissionMin.value),
    quantity('transmission_angle_min_at', 'crank angle at the least transmission angle', null, 'angle', a.transmissionMin.theta),
    quantity('transmission_angle_max', 'greatest transmission angle', '\\mu_{\\max}', 'angle', a.transmissionMax.value),
    quantity('transmission_angle_max_at', 'crank angle at the greatest transmission angle', null, 'angle', a.transmissionMax.theta),
    quantity('rod_angle_max', 'largest rod angle from the slider path', '\\varphi_{\\max}', 'angle', a.rodAngleMax),
    quantity('peak_velocity', 'peak slider velocity', 'v_{\\max}', 'velocity', a.peakVelocity.value),
    quantity('peak_velocity_at', 'crank angle at the peak slider velocity', null, 'angle', a.peakVelocity.theta),
    quantity('peak_acceleration', 'peak slider acceleration', 'a_{\\max}', 'acceleration', a.peakAcceleration.value),
    quantity('peak_acceleration_at', 'crank angle at the peak slider acceleration', null, 'angle', a.peakAcceleration.theta),
    quantity('mean_speed', 'mean slider speed 2·S·n', 'v_m', 'velocity', a.meanSpeed, rocks),
    quantity('cycle_time', 'time for one crank turn', 'T', 'time', a.cycleTime, rocks),
  ]
  if (a.limitAngles) {
    results.push(
      quantity('limit_angle_start', 'crank limit angle (start of range)', '\\theta_{L1}', 'angle', a.limitAngles[0]),
      quantity('limit_angle_end', 'crank limit angle (end of range)', '\\theta_{L2}', 'angle', a.limitAngles[1]),
    )
  }
  return results
}

/** The method of a slider-crank: each key result with its equation, numbers and value. */
export function sliderCrankMethod(analysis: SliderCrankAnalysis, context: EvaluationContext): MethodStep[] {
  const { meta } = context
  const { crank: a, rod: b, offset: h, sliderSide: side, rotation } = analysis.linkage
  const L = (si: number): string => texBare(meta, si, 'length')
  const A = (si: number): string => texBare(meta, si, 'angle')
  const sigma = side === 1 ? '+1' : '-1'
  const steps: MethodStep[] = []
  const lengthUnit = unitLabel(displayUnit('length', meta.units))
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
      formula: 'b \\ge a + |h|',
      substituted: `${L(b)} \\ge ${L(a)} + ${L(Math.abs(h))} = ${L(a + Math.abs(h))}`,
      result: analysis.fullRotation ? '\\text{yes}' : '\\text{no}',
      note: analysis.fullRotation
        ? `Lengths in ${lengthUnit}. The rod reaches the slider path at every crank angle.`
        : `Lengths in ${lengthUnit}. The crank can only rock between the limit angles where the rod stands square to the path, sin θ = (h ± b)/a.`,
    })
  }
  const outer = analysis.outerDeadCentre
  const inner = analysis.innerDeadCentre
  if (!analysis.linkage.equivalentFourBar && outer) {
    steps.push({
      label: 'Outer dead centre (crank and rod in line, extended)',
      formula: 'x_o = \\sigma\\sqrt{(a+b)^2 - h^2},\\qquad \\theta_o = \\operatorname{atan2}(h,\\ x_o)',
      substituted: `x_o = ${sigma === '+1' ? '' : '-'}\\sqrt{(${L(a)} + ${L(b)})^2 - ${paren(L(h))}^2}`,
      result: `x_o = ${tex(meta, outer.position, 'length')},\\quad \\theta_o = ${tex(meta, outer.theta, 'angle')}`,
      note: `σ = ${sigma} (slider on the ${side === 1 ? 'right, +x' : 'left, −x'} side of the crank axis).`,
    })
  }
  if (!analysis.linkage.equivalentFourBar && inner) {
    steps.push({
      label: 'Inner dead centre (crank and rod in line, folded)',
      formula: 'x_i = \\sigma\\sqrt{(b-a)^2 - h^2},\\qquad \\theta_i = \\operatorname{atan2}(-h,\\ -x_i)',
      substituted: `x_i = ${sigma === '+1' ? '' : '-'}\\sqrt{(${L(b)} - ${L(a)})^2 - ${paren(L(h))}^2}`,
      result: `x_i = ${tex(meta, inner.position, 'length')},\\quad \\theta_i = ${tex(meta, inner.theta, 'angle')}`,
    })
  }
  if (analysis.linkage.equivalentFourBar && outer && inner) {
    steps.push({
      label: 'Dead centres (crank and rod in line)',
      formula: '|OB| = b + a \\ \\text{(outer)},\\qquad |OB| = b - a \\ \\text{(inner)},\\qquad |CB| = |R|',
      substituted: null,
      result: `\\theta_o = ${tex(meta, outer.theta, 'angle')},\\ \\theta_i = ${tex(meta, inner.theta, 'angle')}`,
      note: 'Pin B where the circle about O meets the path arc about C, on the chosen assembly branch.',
    })
  }
  if (outer && inner && analysis.fullRotation) {
    const closed = analysis.linkage.equivalentFourBar === null
    steps.push({
      label: 'Stroke',
      formula: closed ? 'S = |x_o - x_i| = \\sqrt{(a+b)^2-h^2} - \\sqrt{(b-a)^2-h^2}' : 'S = |s_o - s_i|\\ \\text{(along the arc)}',
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
      formula: 'Q = \\frac{180^\\circ + \\alpha}{180^\\circ - \\alpha},\\qquad \\alpha = |\\theta_i - \\theta_o| - 180^\\circ',
      substituted: `Q = \\frac{${A(slow)}}{${A(fast)}}`,
      result: `Q = ${texBare(meta, analysis.timeRatio, 'ratio')}`,
      note: `The crank turns ${rotation === 1 ? 'counter-clockwise' : 'clockwise'}: the instroke (towards the crank) takes ${formatNumber(analysis.instrokeAngle * DEG, meta.digits)}° of crank travel, the outstroke ${formatNumber(analysis.outstrokeAngle * DEG, meta.digits)}°.`,
    })
  }
  if (!analysis.linkage.equivalentFourBar && analysis.fullRotation) {
    steps.push({
      label: 'Least transmission angle (rod against the path normal)',
      formula: '\\mu = \\arccos\\frac{|a\\sin\\theta - h|}{b},\\qquad \\mu_{\\min} = \\arccos\\frac{a + |h|}{b}',
      substituted: `\\mu_{\\min} = \\arccos\\frac{${L(a)} + ${L(Math.abs(h))}}{${L(b)}}`,
      result: `\\mu_{\\min} = ${tex(meta, analysis.transmissionMin.value, 'angle')}\\ \\text{at}\\ \\theta = ${tex(meta, analysis.transmissionMin.theta, 'angle')}`,
      cites: ['lw-transmission'],
    })
  } else {
    steps.push({
      label: 'Least transmission angle',
      formula: '\\mu = \\min(\\angle(AB, CB),\\ 180^\\circ - \\angle(AB, CB))',
      substituted: null,
      result: `\\mu_{\\min} = ${tex(meta, analysis.transmissionMin.value, 'angle')}\\ \\text{at}\\ \\theta = ${tex(meta, analysis.transmissionMin.theta, 'angle')}`,
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
  steps.push({
    label: 'Peak slider velocity',
    formula: analysis.linkage.equivalentFourBar
      ? 'v = \\omega\\,R\\,\\frac{d\\theta_4}{d\\theta}'
      : 'v = \\omega\\frac{dx}{d\\theta},\\quad \\frac{dx}{d\\theta} = -a\\sin\\theta - \\frac{u\\,a\\cos\\theta}{\\sigma\\sqrt{b^2 - u^2}},\\quad u = a\\sin\\theta - h',
    substituted: `\\omega = ${tex(meta, omega, 'angular-velocity')}`,
    result: `v_{\\max} = ${tex(meta, analysis.peakVelocity.value, 'velocity')}\\ \\text{at}\\ \\theta = ${tex(meta, analysis.peakVelocity.theta, 'angle')}`,
    note: `Largest |v| over the range: bracketed by a 1441-point sweep, refined by bisection on its slope. Signed: + along +x (${side === 1 ? 'away from' : 'towards'} the crank axis).`,
  })
  steps.push({
    label: 'Peak slider acceleration',
    formula: 'a_s = \\omega^2\\frac{d^2x}{d\\theta^2} + \\alpha\\frac{dx}{d\\theta}',
    substituted: `\\omega = ${tex(meta, omega, 'angular-velocity')},\\ \\alpha = ${tex(meta, analysis.angularAcceleration, 'angular-acceleration')}`,
    result: `a_{\\max} = ${tex(meta, analysis.peakAcceleration.value, 'acceleration')}\\ \\text{at}\\ \\theta = ${tex(meta, analysis.peakAcceleration.theta, 'angle')}`,
    note: 'd²x/dθ² in closed form; the largest |a| found as for the velocity.',
  })
  return steps
}

function paren(text: string): string {
  return text.startsWith('-') ? `(${text})` : text
}

/** Warnings of a slider-crank in the note's display units. */
export function sliderCrankWarnings(analysis: SliderCrankAnalysis, block: CalcBlock, context: EvaluationContext): string[] {
  const { meta } = context
  const show = (si: number, kind: 'length' | 'angle'): string => showQuantity(si, kind, meta.units, meta.digits)
  const warnings: string[] = []
  for (const warning of analysis.warnings) {
    let text = warning.message
    if (warning.code === 'crank-cannot-turn' && analysis.linkage.equivalentFourBar === null) {
      const { rod, crank, offset } = analysis.linkage
      text = `The crank cannot turn fully: the connecting rod (${show(rod, 'length')}) cannot reach the slider path for every crank angle: a full turn needs rod ≥ crank + |offset| = ${show(crank + Math.abs(offset), 'length')}. It can only rock between ${show(analysis.limitAngles![0], 'angle')} and ${show(analysis.limitAngles![1], 'angle')}, where the rod stands square to the path`
    }
    warnings.push(text)
    reportWarning(context.file, 'linkage-warning', messages['linkage-warning'](text), block.place)
  }
  if (analysis.transmissionMin.value < TRANSMISSION_LIMIT) {
    const text = messages['transmission-angle-low'](
      show(analysis.transmissionMin.value, 'angle'),
      `θ = ${show(analysis.transmissionMin.theta, 'angle')}`,
      '40°',
    )
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

/** Swept quantities of a slider-crank at any crank angles. */
export function sliderCrankSweep(analysis: SliderCrankAnalysis): SweepSource {
  const { linkage } = analysis
  const timeOrigin = linkage.rotation === 1 ? analysis.range.start : analysis.range.end
  const origin = analysis.outerDeadCentre?.position ?? analysis.positionMax.value
  const markers: AngleMarker[] = []
  if (analysis.outerDeadCentre) markers.push({ name: 'outer', label: 'outer dead centre', theta: analysis.outerDeadCentre.theta })
  if (analysis.innerDeadCentre) markers.push({ name: 'inner', label: 'inner dead centre', theta: analysis.innerDeadCentre.theta })
  if (analysis.limitAngles) {
    markers.push({ name: 'limit-start', label: 'crank limit', theta: analysis.limitAngles[0] })
    markers.push({ name: 'limit-end', label: 'crank limit', theta: analysis.limitAngles[1] })
  }
  markers.sort((p, q) => p.theta - q.theta)
  const columnsOf = (sweep: SliderCrankSweep): Record<string, Float64Array> => {
    const displacement = sweep.position.map((x) => Math.abs(origin - x))
    return {
      position: sweep.position,
      displacement,
      velocity: sweep.velocity,
      acceleration: sweep.acceleration,
      rod_angle: sweep.rodAngle,
      rod_angular_velocity: sweep.rodAngularVelocity,
      rod_angular_acceleration: sweep.rodAngularAcceleration,
      transmission_angle: sweep.transmissionAngle,
      time: sweep.time,
    }
  }
  return {
    geometry: sliderCrankGeometry(analysis),
    peaks: {
      velocity: { ...analysis.peakVelocity, label: 'peak' },
      acceleration: { ...analysis.peakAcceleration, label: 'peak' },
      transmission_angle: { ...analysis.transmissionMin, label: 'least' },
    },
    angleLabel: 'crank angle',
    start: analysis.range.start,
    end: analysis.range.end,
    fullTurn: analysis.fullRotation,
    quantities: [
      { name: 'position', label: 'slider position', kind: 'length' },
      { name: 'displacement', label: 'slider travel from outer dead centre', kind: 'length' },
      { name: 'velocity', label: 'slider velocity', kind: 'velocity' },
      { name: 'acceleration', label: 'slider acceleration', kind: 'acceleration' },
      { name: 'rod_angle', label: 'rod angle', kind: 'angle' },
      { name: 'rod_angular_velocity', label: 'rod angular velocity', kind: 'angular-velocity' },
      { name: 'rod_angular_acceleration', label: 'rod angular acceleration', kind: 'angular-acceleration' },
      { name: 'transmission_angle', label: 'transmission angle', kind: 'angle' },
      { name: 'time', label: 'time from the start of the range', kind: 'time' },
    ],
    markers,
    at(angles) {
      return columnsOf(new SliderCrankSweep(linkage, angles.length).updateAt(angles, analysis, timeOrigin))
    },
    sample(count) {
      const sweep = new SliderCrankSweep(linkage, count).update(analysis.range, analysis)
      return { angles: sweep.crankAngle, columns: columnsOf(sweep) }
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

/** Inputs of the block shown as given (shared shape check for the summary). */
export function summaryNames(analysis: SliderCrankAnalysis): string[] {
  return analysis.fullRotation
    ? ['stroke', 'time_ratio', 'transmission_angle_min', 'peak_velocity', 'peak_acceleration']
    : ['stroke', 'limit_angle_start', 'limit_angle_end', 'transmission_angle_min']
}

/** Input values as named values (for publishing alongside results). */
export function asNamed(inputs: readonly InputValue[]): NamedValue[] {
  return inputs.map(({ name, label, symbol, value }) => ({ name, label, symbol, value }))
}
