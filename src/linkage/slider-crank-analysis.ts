/**
 * Slider-crank analysis: where the crank can turn, dead centres and stroke,
 * quick-return time ratio, transmission-angle extremes, peak slider velocity and
 * acceleration, mean slider speed, and the change points of a slider-driven crank.
 */

import { deg, mm, type LinkageWarning } from './errors.js'
import { fourBarRange, fourBarToggles } from './four-bar.js'
import { extremesOf as extremesOver, inRange, type Extremes } from './extremes.js'
import { GEOMETRY_TOLERANCE, TAU, clampedAsin, wrapTurn } from './math.js'
import {
  DDPHI,
  DDX,
  DPHI,
  DX,
  POSITION,
  ROD_ANGLE,
  SLIDER_CRANK_STATE,
  TRANSMISSION,
  rodObliquity,
  sliderCrankState,
  type SliderCrankLinkage,
} from './slider-crank.js'
import { SliderCrankSweep, type CrankMotion } from './slider-crank-sweep.js'
import type { AngleRange, AngleValue, DeadCentre } from './types.js'

/** Everything a design check asks of a slider-crank, in SI units. */
export interface SliderCrankAnalysis {
  readonly linkage: SliderCrankLinkage
  /** Crank speed magnitude ω (rad/s) and angular acceleration α (rad/s², in the sense of rotation). */
  readonly speed: number
  readonly angularAcceleration: number
  /** True when the crank can make full turns (b ≥ a + |h| for a straight path). */
  readonly fullRotation: boolean
  /** Analysed crank-angle range: [0, 2π], or the range between the limit angles. */
  readonly range: AngleRange
  /** Limit angles of a crank that can only rock (rod square to the path there), else null. */
  readonly limitAngles: readonly [number, number] | null
  /** Outer dead centre: crank and rod in line, extended. Null when outside the range. */
  readonly outerDeadCentre: DeadCentre | null
  /** Inner dead centre: crank and rod in line, folded. Null when outside the range. */
  readonly innerDeadCentre: DeadCentre | null
  /** Slider travel between its extreme positions, m. */
  readonly stroke: number
  /** Extreme slider positions over the range. */
  readonly positionMin: AngleValue
  readonly positionMax: AngleValue
  /** Crank angle swept while the slider moves towards the crank axis (outer → inner dead centre), rad. */
  readonly instrokeAngle: number | null
  /** Crank angle swept while the slider moves away from the crank axis, rad. */
  readonly outstrokeAngle: number | null
  /** Quick-return time ratio, slower stroke over faster stroke (≥ 1), at constant crank speed. */
  readonly timeRatio: number | null
  /** Transmission angle extremes (between the rod and the link it drives), rad. */
  readonly transmissionMin: AngleValue
  readonly transmissionMax: AngleValue
  /** Largest rod angle from the slider path (straight path: π/2 − least rod-to-normal angle), rad. */
  readonly rodAngleMax: number
  /** Largest, least and largest-magnitude value of every swept quantity, with their crank angles. */
  readonly extremes: SliderCrankExtremes
  /** Mean slider speed 2·S·n over a full turn, m/s; null when the crank rocks. */
  readonly meanSpeed: number | null
  /** Time for one crank turn, s (Infinity at zero speed); null when the crank rocks. */
  readonly cycleTime: number | null
  /**
   * Dead points, where the driving link cannot move the driven one: for a
   * slider-driven crank the dead centres; for a crank that rocks, its limit angles
   * (value: the slider position there).
   */
  readonly deadPoints: readonly AngleValue[]
  /** True when the slider drives a crank that turns fully: stored energy (a flywheel) must carry it through the dead points. */
  readonly needsStoredEnergy: boolean
  /** Engineering cautions in plain words (crank cannot turn fully, dead centres to be carried through). */
  readonly warnings: readonly LinkageWarning[]
}

/** Extremes of the swept quantities of a slider-crank (SI: m, m/s, m/s², rad, rad/s, rad/s²). */
export interface SliderCrankExtremes {
  readonly position: Extremes
  readonly velocity: Extremes
  readonly acceleration: Extremes
  readonly rodAngle: Extremes
  readonly rodAngularVelocity: Extremes
  readonly rodAngularAcceleration: Extremes
  readonly transmissionAngle: Extremes
}

/** Options for {@link analyseSliderCrank}. */
export interface AnalysisOptions {
  /** Crank angles in the bracketing sweep. Default 1441 (a quarter degree). */
  readonly samples?: number | null
}

/** Analyse a slider-crank for a crank motion. */
export function analyseSliderCrank(
  linkage: SliderCrankLinkage,
  motion: CrankMotion,
  options?: AnalysisOptions | null,
): SliderCrankAnalysis {
  const samples = options?.samples ?? 1441
  const speed = Math.abs(motion.speed)
  const angularAcceleration = motion.angularAcceleration ?? 0
  const omega = linkage.rotation * speed
  const alpha = linkage.rotation * angularAcceleration
  const where = crankRange(linkage)
  const { range, limits, full } = where
  const state = new Float64Array(SLIDER_CRANK_STATE)
  const at = (theta: number, slot: number): number => (sliderCrankState(linkage, theta, state) ? state[slot]! : Number.NaN)

  // 1. Dead centres: closed form for a straight path, toggles of the equivalent four-bar for an arc.
  const [outer, inner] = deadCentres(linkage, range, at)
  // 2. Stroke: for a full turn the dead centres are the extremes; otherwise the ends of the range may be.
  const candidates: DeadCentre[] = [outer, inner].filter((d): d is DeadCentre => d !== null)
  if (!full) {
    for (const theta of [range.start, range.end]) candidates.push({ theta: wrapTurn(theta), position: at(theta, POSITION) })
  }
  let positionMin: AngleValue = { theta: Number.NaN, value: Number.POSITIVE_INFINITY }
  let positionMax: AngleValue = { theta: Number.NaN, value: Number.NEGATIVE_INFINITY }
  for (const c of candidates) {
    if (c.position < positionMin.value) positionMin = { theta: c.theta, value: c.position }
    if (c.position > positionMax.value) positionMax = { theta: c.theta, value: c.position }
  }
  const stroke = positionMax.value - positionMin.value

  // 3. Time ratio: crank travel between the dead centres in the sense of rotation.
  let instrokeAngle: number | null = null
  let outstrokeAngle: number | null = null
  let timeRatio: number | null = null
  if (full && outer && inner) {
    instrokeAngle = wrapTurn(linkage.rotation * (inner.theta - outer.theta))
    outstrokeAngle = TAU - instrokeAngle
    timeRatio = Math.max(instrokeAngle, outstrokeAngle) / Math.min(instrokeAngle, outstrokeAngle)
  }

  // 4. Extremes of every swept quantity over a sweep, refined; closed-form angles are candidates.
  const sweep = new SliderCrankSweep(linkage, samples).update(range, { speed, angularAcceleration })
  const deadCentreAngles = [outer, inner].flatMap((d) => (d ? [d.theta] : []))
  const ends = [range.start, range.end]
  const extremesOf = (angles: Float64Array, values: Float64Array, evaluate: (t: number) => number, r: AngleRange, candidates: readonly number[] = []): Extremes =>
    extremesOver(angles, values, evaluate, r, candidates, linkage.rotation)
  const extremes: SliderCrankExtremes = {
    position: extremesOf(sweep.crankAngle, sweep.position, (t) => at(t, POSITION), range, [...deadCentreAngles, ...ends]),
    velocity: extremesOf(sweep.crankAngle, sweep.velocity, (t) => at(t, DX) * omega, range),
    // In-line at constant speed the largest acceleration is at the outer dead centre: an exact candidate.
    acceleration: extremesOf(sweep.crankAngle, sweep.acceleration, (t) => at(t, DDX) * omega * omega + at(t, DX) * alpha, range, deadCentreAngles),
    rodAngle: extremesOf(sweep.crankAngle, sweep.rodAngle, (t) => rodObliquity(linkage, at(t, ROD_ANGLE)), range, [Math.PI / 2, (3 * Math.PI) / 2, ...ends]),
    rodAngularVelocity: extremesOf(sweep.crankAngle, sweep.rodAngularVelocity, (t) => at(t, DPHI) * omega, range, [0, Math.PI]),
    rodAngularAcceleration: extremesOf(sweep.crankAngle, sweep.rodAngularAcceleration, (t) => at(t, DDPHI) * omega * omega + at(t, DPHI) * alpha, range),
    transmissionAngle: extremesOf(
      sweep.crankAngle,
      sweep.transmissionAngle,
      (t) => at(t, TRANSMISSION),
      range,
      linkage.driver === 'slider' ? [...deadCentreAngles, ...ends] : transmissionCandidates(linkage, range),
    ),
  }
  const transmissionMin = extremes.transmissionAngle.min
  const transmissionMax = extremes.transmissionAngle.max

  // 5. Speed figures and dead points.
  const meanSpeed = full ? (2 * stroke * speed) / TAU : null
  const cycleTime = full ? (speed === 0 ? Number.POSITIVE_INFINITY : TAU / speed) : null
  const deadPoints: AngleValue[] = []
  if (linkage.driver === 'slider') {
    for (const d of [outer, inner]) if (d) deadPoints.push({ theta: d.theta, value: d.position })
  }
  if (limits) {
    for (const theta of limits) deadPoints.push({ theta, value: at(theta, POSITION) })
  }
  const needsStoredEnergy = linkage.driver === 'slider' && full && deadPoints.length > 0
  // The rod's greatest lean from the line of stroke, whichever way it leans.
  const rodAngleMax = Math.max(Math.abs(extremes.rodAngle.max.value), Math.abs(extremes.rodAngle.min.value))
  const warnings = sliderCrankWarnings(linkage, limits, deadPoints)
  return {
    linkage,
    speed,
    angularAcceleration,
    fullRotation: full,
    range,
    limitAngles: limits,
    outerDeadCentre: outer,
    innerDeadCentre: inner,
    stroke,
    positionMin,
    positionMax,
    instrokeAngle,
    outstrokeAngle,
    timeRatio,
    transmissionMin,
    transmissionMax,
    rodAngleMax,
    extremes,
    meanSpeed,
    cycleTime,
    deadPoints,
    needsStoredEnergy,
    warnings,
  }
}

function sliderCrankWarnings(
  linkage: SliderCrankLinkage,
  limits: readonly [number, number] | null,
  deadPoints: readonly AngleValue[],
): LinkageWarning[] {
  const warnings: LinkageWarning[] = []
  const { crank, rod, offset } = linkage
  if (limits) {
    const straight = linkage.equivalentFourBar === null
    const needed = crank + Math.abs(offset)
    const reason = straight
      ? `the connecting rod (${mm(rod)}) cannot reach the slider path for every crank angle: a full turn needs rod ≥ crank + |offset| = ${mm(needed)}`
      : `the connecting rod (${mm(rod)}) cannot follow the arc path for every crank angle`
    warnings.push({
      code: 'crank-cannot-turn',
      message: `The crank cannot turn fully: ${reason}. It can only rock between ${deg(limits[0])} and ${deg(limits[1])}, where the rod stands square to the path`,
      details: { rod, needed, from: limits[0], to: limits[1] },
    })
  }
  // Rod equal to the crank, no offset (the isosceles slider-crank): a change point at 90° and 270°.
  const scale = GEOMETRY_TOLERANCE * 1e3 * (crank + rod)
  if (linkage.equivalentFourBar === null && Math.abs(rod - crank) <= scale && Math.abs(offset) <= scale) {
    warnings.push({
      code: 'change-point-linkage',
      message: `Connecting rod equal to the crank (${mm(rod)}) with no offset: at 90° and 270° the rod folds onto the crank and the slider reaches the crank centre, where it can stay or go on (a change point). In the assembly followed it rests there for half a turn, so the inner dead centre is a dwell and the time ratio describes that assembly only; guide the linkage through the change points, or make the rod longer than the crank`,
      details: { crank, rod },
    })
  }
  if (linkage.driver === 'slider' && deadPoints.length > 0) {
    const angles = deadPoints.map((p) => deg(p.theta)).join(' and ')
    warnings.push({
      code: 'dead-points-need-stored-energy',
      message: `The slider drives: at the dead points (crank at ${angles}) it cannot turn the crank, so a flywheel or other stored energy must carry the crank through them`,
      details: { count: deadPoints.length },
    })
  }
  return warnings
}

/** Crank-angle range of a slider-crank, with the limit angles when the crank rocks. */
export function crankRange(linkage: SliderCrankLinkage): {
  full: boolean
  range: AngleRange
  limits: readonly [number, number] | null
} {
  if (linkage.equivalentFourBar) {
    const r = fourBarRange(linkage.equivalentFourBar)
    return r.full ? { full: true, range: { start: 0, end: TAU }, limits: null } : { full: false, range: r.range, limits: r.limits }
  }
  const { crank: a, rod: b, offset: h, sliderSide: side } = linkage
  // The rod reaches the path where h − b ≤ a·sinθ ≤ h + b.
  const tol = GEOMETRY_TOLERANCE * (a + b + Math.abs(h))
  const upperActive = h + b < a - tol
  const lowerActive = h - b > -a + tol
  if (!upperActive && !lowerActive) return { full: true, range: { start: 0, end: TAU }, limits: null }
  const high = clampedAsin((h + b) / a)
  const low = clampedAsin((h - b) / a)
  let start: number
  let end: number
  if (upperActive && lowerActive) {
    // Two ranges, one through θ = 0 and one through θ = π: take the one holding the outer dead centre.
    const outer = Math.atan2(h, side * Math.sqrt((a + b) ** 2 - h * h))
    const rightRange = { start: low, end: high }
    ;[start, end] = inRange(outer, rightRange) ? [low, high] : [Math.PI - high, Math.PI - low]
  } else if (lowerActive) {
    start = low
    end = Math.PI - low
  } else {
    start = Math.PI - high
    end = TAU + high
  }
  return { full: false, range: { start, end }, limits: [wrapTurn(start), wrapTurn(end)] }
}

function deadCentres(
  linkage: SliderCrankLinkage,
  range: AngleRange,
  at: (theta: number, slot: number) => number,
): [DeadCentre | null, DeadCentre | null] {
  const keep = (theta: number): DeadCentre | null =>
    inRange(theta, range) ? { theta: wrapTurn(theta), position: at(theta, POSITION) } : null
  if (linkage.equivalentFourBar) {
    const toggles = fourBarToggles(linkage.equivalentFourBar)
    const outer = toggles.find((t) => t.kind === 'extended')
    const inner = toggles.find((t) => t.kind === 'folded')
    return [outer ? keep(outer.theta) : null, inner ? keep(inner.theta) : null]
  }
  const { crank: a, rod: b, offset: h, sliderSide: side } = linkage
  // Outer: |OB| = a + b with B on y = h (Uicker, Pennock & Shigley's dead-centre construction).
  const outerX = side * Math.sqrt((a + b) ** 2 - h * h)
  const outerTheta = Math.atan2(h, outerX)
  const outer = inRange(outerTheta, range) ? { theta: wrapTurn(outerTheta), position: outerX } : null
  // Inner: |OB| = |b − a|; A lies opposite B when b > a, beside it when b < a.
  const reach = Math.abs(b - a)
  let inner: DeadCentre | null = null
  // The same absolute tolerance as the crank's range: a rod of exactly a + |h| turns fully and has both dead centres.
  if (Math.abs(h) <= reach + GEOMETRY_TOLERANCE * (a + b + Math.abs(h))) {
    const along = Math.sqrt(Math.max(0, reach * reach - h * h))
    const innerX = b >= a ? side * along : -side * along
    const innerTheta = b >= a ? Math.atan2(-h, -innerX) : Math.atan2(h, innerX)
    if (inRange(innerTheta, range)) inner = { theta: wrapTurn(innerTheta), position: innerX }
  }
  return [outer, inner]
}

function transmissionCandidates(linkage: SliderCrankLinkage, range: AngleRange): number[] {
  const list = [range.start, range.end]
  if (linkage.equivalentFourBar) {
    const gamma = linkage.equivalentFourBar.groundAngle
    // Four-bar μ is extreme where the diagonal AO4 is shortest or longest: θ − γ = 0 or π.
    list.push(wrapTurn(gamma), wrapTurn(gamma + Math.PI))
    return list
  }
  const { crank: a, offset: h } = linkage
  // μ = acos(|a sinθ − h| / b): extreme at θ = 90°, 270° and where a sinθ = h.
  list.push(Math.PI / 2, (3 * Math.PI) / 2)
  if (Math.abs(h) <= a) list.push(Math.asin(h / a), Math.PI - Math.asin(h / a))
  return list
}
