/**
 * Four-bar analysis: Grashof class, input range and limit positions, toggle
 * positions with output swing and time ratio, transmission-angle extremes, the
 * extremes of every swept quantity, the dead points of an output-driven linkage,
 * and change-point linkages (parallelogram, deltoid) followed through their change points.
 */

import { deg, type LinkageWarning } from './errors.js'
import { extremesOf as extremesOver, type Extremes } from './extremes.js'
import {
  FOUR_BAR_STATE,
  H3,
  H3P,
  H4,
  H4P,
  THETA3,
  THETA4,
  fourBarRange,
  fourBarState,
  fourBarToggles,
  grashof,
  type FourBarLinkage,
  type FourBarToggle,
  type GrashofResult,
} from './four-bar.js'
import { TAU, includedAngle, wrapHalfTurn, wrapTurn } from './math.js'
import type { AnalysisOptions } from './slider-crank-analysis.js'
import type { CrankMotion } from './slider-crank-sweep.js'
import { FourBarSweep } from './four-bar-sweep.js'
import type { AngleRange, AngleValue } from './types.js'

/** Extremes of the swept quantities of a four-bar (SI: rad, rad/s, rad/s², m, m/s). */
export interface FourBarExtremes {
  readonly couplerAngle: Extremes
  readonly outputAngle: Extremes
  readonly couplerAngularVelocity: Extremes
  readonly outputAngularVelocity: Extremes
  readonly couplerAngularAcceleration: Extremes
  readonly outputAngularAcceleration: Extremes
  readonly transmissionAngle: Extremes
  /** Coupler point, when there is one. */
  readonly couplerPointX: Extremes | null
  readonly couplerPointY: Extremes | null
  readonly couplerPointSpeed: Extremes | null
}

/** Everything a design check asks of a four-bar, in SI units. */
export interface FourBarAnalysis {
  readonly linkage: FourBarLinkage
  readonly speed: number
  readonly angularAcceleration: number
  readonly grashof: GrashofResult
  /** True when the input can make full turns. */
  readonly inputTurnsFully: boolean
  /** True when the output makes full turns on the followed assembly. */
  readonly outputTurnsFully: boolean
  /** Analysed input range (two turns for a deltoid whose output needs two input turns to come back). */
  readonly range: AngleRange
  /** Input turns before the motion repeats. */
  readonly periodTurns: 1 | 2
  /** Limit positions of an input that can only rock (coupler and output in line), else null. */
  readonly inputLimits: readonly [number, number] | null
  /** Input-coupler toggle positions (output extremes when the input turns fully). */
  readonly toggles: readonly FourBarToggle[]
  /** Input angles of the change points of a change-point linkage (all four links in line), rad; else []. */
  readonly changePoints: readonly number[]
  /** Output swing between its extremes, rad; null when the output turns fully. */
  readonly outputSwing: number | null
  /** Crank angle swept from the extended to the folded toggle in the sense of rotation, rad. */
  readonly forwardAngle: number | null
  readonly returnAngle: number | null
  /** Time ratio of the output's two swings (slower over faster, ≥ 1) at constant input speed. */
  readonly timeRatio: number | null
  /** Transmission angle μ between the coupler and the driven link, extremes in [0, π]. */
  readonly transmissionMin: AngleValue
  readonly transmissionMax: AngleValue
  /** Worst deviation measure min(μmin, π − μmax), rad: the figure checked against a limit. */
  readonly transmissionWorst: AngleValue
  /** Largest, least and largest-magnitude value of every swept quantity, with their input angles. */
  readonly extremes: FourBarExtremes
  /** Dead points: input-coupler toggles when the output drives; the input's limits when it rocks (value: output angle). */
  readonly deadPoints: readonly AngleValue[]
  /** True when the output drives an input that turns fully: stored energy must carry it through the dead points. */
  readonly needsStoredEnergy: boolean
  /** Engineering cautions in plain words. */
  readonly warnings: readonly LinkageWarning[]
}

/** Analyse a four-bar for an input motion. */
export function analyseFourBar(linkage: FourBarLinkage, motion: CrankMotion, options?: AnalysisOptions | null): FourBarAnalysis {
  const samples = options?.samples ?? 1441
  const speed = Math.abs(motion.speed)
  const angularAcceleration = motion.angularAcceleration ?? 0
  const omega = linkage.rotation * speed
  const alpha = linkage.rotation * angularAcceleration
  const klass = grashof(linkage.ground, linkage.input, linkage.coupler, linkage.output)
  const { full, range, limits } = fourBarRange(linkage)
  const periodTurns = linkage.branch?.turns ?? 1
  const state = new Float64Array(FOUR_BAR_STATE)
  const solve = (theta: number): boolean => fourBarState(linkage, theta, state)
  const outputDriven = linkage.driver === 'output'
  // μ is the angle between the coupler and the link it drives.
  const mu = (theta: number): number => (solve(theta) ? includedAngle(state[THETA3]!, outputDriven ? theta : state[THETA4]!) : Number.NaN)
  const sweep = new FourBarSweep(linkage, samples * periodTurns).update(range, { speed, angularAcceleration })

  // 1. Does the output turn fully? Grashof says so, except for a change-point linkage: there, its followed assembly does.
  let outputTurnsFully = klass.outputTurnsFully
  if (linkage.branch !== null) {
    let net = 0
    for (let i = 1; i < sweep.count; i++) net += wrapHalfTurn(sweep.outputAngle[i]! - sweep.outputAngle[i - 1]!)
    outputTurnsFully = Math.abs(net) > Math.PI
  }

  // 2. Toggles (input and coupler in line): output extremes, swing and time ratio when the input turns fully.
  const toggles = linkage.branch === null ? fourBarToggles(linkage) : []
  const extended = toggles.find((t) => t.kind === 'extended')
  const folded = toggles.find((t) => t.kind === 'folded')
  let outputSwing: number | null = null
  let forwardAngle: number | null = null
  let returnAngle: number | null = null
  let timeRatio: number | null = null
  if (full && !outputTurnsFully && extended && folded) {
    outputSwing = Math.abs(wrapHalfTurn(extended.outputAngle - folded.outputAngle))
    forwardAngle = wrapTurn(linkage.rotation * (folded.theta - extended.theta))
    returnAngle = TAU - forwardAngle
    timeRatio = Math.max(forwardAngle, returnAngle) / Math.min(forwardAngle, returnAngle)
  }

  // 3. Extremes over the sweep. For the input-driven μ, the diagonal AO4 is shortest and
  //    longest at θ2 − γ = 0 and π: those and the range ends are exact candidates.
  const gamma = linkage.groundAngle
  const muCandidates = outputDriven ? [...toggles.map((t) => t.theta), range.start, range.end] : [range.start, range.end, wrapTurn(gamma), wrapTurn(gamma + Math.PI)]
  const reference = sweep.outputReference
  const couplerReference = sweep.couplerReference
  const slot = (index: number) => (t: number): number => (solve(t) ? state[index]! : Number.NaN)
  const rate = (first: number) => (t: number): number => (solve(t) ? state[first]! * omega : Number.NaN)
  const accel = (first: number, second: number) => (t: number): number => (solve(t) ? state[second]! * omega * omega + state[first]! * alpha : Number.NaN)
  const point = linkage.couplerPoint
  const pointAt = (t: number, which: 'x' | 'y' | 'speed'): number => {
    if (!point || !solve(t)) return Number.NaN
    const direction = state[THETA3]! + point.angle
    if (which === 'x') return linkage.input * Math.cos(t) + point.distance * Math.cos(direction)
    if (which === 'y') return linkage.input * Math.sin(t) + point.distance * Math.sin(direction)
    const h3 = state[H3]!
    return Math.hypot(-linkage.input * Math.sin(t) - point.distance * h3 * Math.sin(direction), linkage.input * Math.cos(t) + point.distance * h3 * Math.cos(direction)) * speed
  }
  const extremesOf = (angles: Float64Array, values: Float64Array, evaluate: (t: number) => number, r: AngleRange, candidates: readonly number[] = []): Extremes =>
    extremesOver(angles, values, evaluate, r, candidates, linkage.rotation)
  const extremes: FourBarExtremes = {
    couplerAngle: extremesOf(sweep.inputAngle, sweep.couplerAngle, (t) => couplerReference + wrapHalfTurn(slot(THETA3)(t) - couplerReference), range),
    outputAngle: extremesOf(sweep.inputAngle, sweep.outputAngle, (t) => reference + wrapHalfTurn(slot(THETA4)(t) - reference), range, toggles.map((t) => t.theta)),
    couplerAngularVelocity: extremesOf(sweep.inputAngle, sweep.couplerAngularVelocity, rate(H3), range),
    outputAngularVelocity: extremesOf(sweep.inputAngle, sweep.outputAngularVelocity, rate(H4), range),
    couplerAngularAcceleration: extremesOf(sweep.inputAngle, sweep.couplerAngularAcceleration, accel(H3, H3P), range),
    outputAngularAcceleration: extremesOf(sweep.inputAngle, sweep.outputAngularAcceleration, accel(H4, H4P), range),
    transmissionAngle: extremesOf(sweep.inputAngle, sweep.transmissionAngle, mu, range, muCandidates),
    couplerPointX: point ? extremesOf(sweep.inputAngle, sweep.couplerPointX, (t) => pointAt(t, 'x'), range) : null,
    couplerPointY: point ? extremesOf(sweep.inputAngle, sweep.couplerPointY, (t) => pointAt(t, 'y'), range) : null,
    couplerPointSpeed: point ? extremesOf(sweep.inputAngle, sweep.couplerPointSpeed, (t) => pointAt(t, 'speed'), range) : null,
  }
  const transmissionMin = extremes.transmissionAngle.min
  const transmissionMax = extremes.transmissionAngle.max
  const transmissionWorst =
    transmissionMin.value <= Math.PI - transmissionMax.value ? transmissionMin : { theta: transmissionMax.theta, value: Math.PI - transmissionMax.value }

  // A change-point linkage whose output rocks: its swing from the output's own extremes.
  if (linkage.branch !== null && !outputTurnsFully && periodTurns === 1) {
    const hi = extremes.outputAngle.max
    const lo = extremes.outputAngle.min
    outputSwing = hi.value - lo.value
    forwardAngle = wrapTurn(linkage.rotation * (lo.theta - hi.theta))
    returnAngle = TAU - forwardAngle
    timeRatio = Math.max(forwardAngle, returnAngle) / Math.min(forwardAngle, returnAngle)
  }

  // 4. Dead points and cautions.
  const deadPoints: AngleValue[] = []
  if (outputDriven) {
    for (const t of toggles) deadPoints.push({ theta: t.theta, value: t.outputAngle })
  }
  if (limits) {
    for (const theta of limits) deadPoints.push({ theta, value: solve(theta) ? state[THETA4]! : Number.NaN })
  }
  const needsStoredEnergy = outputDriven && full && toggles.length > 0
  const changePoints = linkage.branch?.changePoints ?? []
  const warnings = fourBarWarnings(linkage, klass, limits, toggles, changePoints, periodTurns, outputTurnsFully)
  return {
    linkage,
    speed,
    angularAcceleration,
    grashof: klass,
    inputTurnsFully: full,
    outputTurnsFully,
    range,
    periodTurns,
    inputLimits: limits,
    toggles,
    changePoints,
    outputSwing,
    forwardAngle,
    returnAngle,
    timeRatio,
    transmissionMin,
    transmissionMax,
    transmissionWorst,
    extremes,
    deadPoints,
    needsStoredEnergy,
    warnings,
  }
}

function fourBarWarnings(
  linkage: FourBarLinkage,
  klass: GrashofResult,
  limits: readonly [number, number] | null,
  toggles: readonly FourBarToggle[],
  changePoints: readonly number[],
  periodTurns: 1 | 2,
  outputTurnsFully: boolean,
): LinkageWarning[] {
  const warnings: LinkageWarning[] = []
  if (limits) {
    warnings.push({
      code: 'input-cannot-turn',
      message: `The input link cannot turn fully (${klass.label}): it can only rock between ${deg(limits[0])} and ${deg(limits[1])}, where coupler and output fall in line`,
      details: { from: limits[0], to: limits[1] },
    })
  }
  if (klass.condition === 'change-point') {
    const at = changePoints.length > 0 ? ` (input at ${changePoints.map((t) => deg(wrapTurn(t))).join(', ')})` : ''
    const followed = linkage.branch
      ? ` The analysis follows the ${linkage.circuit} assembly through them${linkage.branch.assemblyKept ? '' : ', changing to the other assembly where it must to keep moving continuously'}${periodTurns === 2 ? '; the motion repeats only after two input turns' : ''}; the output ${outputTurnsFully ? 'turns fully' : 'rocks'}.`
      : ''
    warnings.push({
      code: 'change-point-linkage',
      message: `s + l = p + q (${klass.label}): at the change points${at} all four links fall in line and the linkage can switch between its open and crossed assemblies unless something guides it through (a third link, a guide, enough momentum).${followed}`,
      details: { shortPlusLong: klass.shortPlusLong, otherTwo: klass.otherTwo },
    })
  }
  if (linkage.driver === 'output' && toggles.length > 0) {
    warnings.push({
      code: 'dead-points-need-stored-energy',
      message: `The output drives: at the dead points, where input and coupler fall in line (input at ${toggles.map((t) => deg(t.theta)).join(' and ')}), it cannot turn the input, so a flywheel or other stored energy must carry the input through`,
      details: { count: toggles.length },
    })
  }
  return warnings
}
