/**
 * Four-bar analysis: Grashof class, input range and limit positions, toggle
 * positions with output swing and time ratio, transmission-angle extremes, peak
 * output velocity and acceleration, and the dead points of an output-driven linkage.
 */

import { deg, type LinkageWarning } from './errors.js'
import { findExtreme } from './extremes.js'
import {
  FOUR_BAR_STATE,
  H4,
  H4P,
  THETA3,
  THETA4,
  fourBarRange,
  fourBarToggles,
  grashof,
  solveFourBar,
  type FourBarLinkage,
  type FourBarToggle,
  type GrashofResult,
} from './four-bar.js'
import { TAU, includedAngle, wrapHalfTurn, wrapTurn } from './math.js'
import type { AnalysisOptions } from './slider-crank-analysis.js'
import type { CrankMotion } from './slider-crank-sweep.js'
import { FourBarSweep } from './four-bar-sweep.js'
import type { AngleRange, AngleValue } from './types.js'

/** Everything a design check asks of a four-bar, in SI units. */
export interface FourBarAnalysis {
  readonly linkage: FourBarLinkage
  readonly speed: number
  readonly angularAcceleration: number
  readonly grashof: GrashofResult
  /** True when the input can make full turns. */
  readonly inputTurnsFully: boolean
  /** Analysed input range. */
  readonly range: AngleRange
  /** Limit positions of an input that can only rock (coupler and output in line), else null. */
  readonly inputLimits: readonly [number, number] | null
  /** Input-coupler toggle positions (output extremes when the input turns fully). */
  readonly toggles: readonly FourBarToggle[]
  /** Output swing between its extremes, rad; null when the output turns fully. */
  readonly outputSwing: number | null
  /** Crank angle swept from the extended to the folded toggle in the sense of rotation, rad. */
  readonly forwardAngle: number | null
  readonly returnAngle: number | null
  /** Time ratio of the output's two swings (slower over faster, ≥ 1) at constant input speed. */
  readonly timeRatio: number | null
  /** Transmission angle μ between coupler and output, extremes in [0, π]. */
  readonly transmissionMin: AngleValue
  readonly transmissionMax: AngleValue
  /** Worst deviation measure min(μmin, π − μmax), rad: the figure checked against a limit. */
  readonly transmissionWorst: AngleValue
  /** Largest |output angular velocity| and |output angular acceleration| (signed values). */
  readonly peakOutputVelocity: AngleValue
  readonly peakOutputAcceleration: AngleValue
  /** Dead points: input-coupler toggles when the output drives; the input's limits when it rocks. */
  readonly changePoints: readonly AngleValue[]
  /** Engineering cautions in plain words. */
  readonly warnings: readonly LinkageWarning[]
}

/** Analyse a four-bar for an input motion. */
export function analyseFourBar(
  linkage: FourBarLinkage,
  motion: CrankMotion,
  options?: AnalysisOptions | null,
): FourBarAnalysis {
  const samples = options?.samples ?? 1441
  const speed = Math.abs(motion.speed)
  const angularAcceleration = motion.angularAcceleration ?? 0
  const omega = linkage.rotation * speed
  const alpha = linkage.rotation * angularAcceleration
  const klass = grashof(linkage.ground, linkage.input, linkage.coupler, linkage.output)
  const { full, range, limits } = fourBarRange(linkage)
  const state = new Float64Array(FOUR_BAR_STATE)
  const { input: a, coupler: b, output: c, groundX, groundY, circuitSign } = linkage
  const solve = (theta: number): boolean => solveFourBar(a, b, c, groundX, groundY, circuitSign, theta, state)
  const mu = (theta: number): number => (solve(theta) ? includedAngle(state[THETA3]!, state[THETA4]!) : Number.NaN)

  // 1. Toggles (input and coupler in line): output extremes, swing and time ratio when the input turns fully.
  const toggles = fourBarToggles(linkage)
  const extended = toggles.find((t) => t.kind === 'extended')
  const folded = toggles.find((t) => t.kind === 'folded')
  let outputSwing: number | null = null
  let forwardAngle: number | null = null
  let returnAngle: number | null = null
  let timeRatio: number | null = null
  if (full && !klass.outputTurnsFully && extended && folded) {
    outputSwing = Math.abs(wrapHalfTurn(extended.outputAngle - folded.outputAngle))
    forwardAngle = wrapTurn(linkage.rotation * (folded.theta - extended.theta))
    returnAngle = TAU - forwardAngle
    timeRatio = Math.max(forwardAngle, returnAngle) / Math.min(forwardAngle, returnAngle)
  }

  // 2. Extremes over a sweep. μ depends on θ2 only through the diagonal AO4, which is
  //    shortest and longest at θ2 − γ = 0 and π: those and the range ends are exact candidates.
  const sweep = new FourBarSweep(linkage, samples).update(range, { speed, angularAcceleration })
  const gamma = linkage.groundAngle
  const candidates = [range.start, range.end, wrapTurn(gamma), wrapTurn(gamma + Math.PI)]
  const transmissionMin = findExtreme(sweep.inputAngle, sweep.transmissionAngle, -1, mu, range, candidates)
  const transmissionMax = findExtreme(sweep.inputAngle, sweep.transmissionAngle, 1, mu, range, candidates)
  const transmissionWorst =
    transmissionMin.value <= Math.PI - transmissionMax.value
      ? transmissionMin
      : { theta: transmissionMax.theta, value: Math.PI - transmissionMax.value }
  const velocityAt = (t: number): number => (solve(t) ? state[H4]! * omega : Number.NaN)
  const accelerationAt = (t: number): number => (solve(t) ? state[H4P]! * omega * omega + state[H4]! * alpha : Number.NaN)
  const vPeak = findExtreme(sweep.inputAngle, sweep.outputAngularVelocity.map(Math.abs), 1, (t) => Math.abs(velocityAt(t)), range)
  const aPeak = findExtreme(sweep.inputAngle, sweep.outputAngularAcceleration.map(Math.abs), 1, (t) => Math.abs(accelerationAt(t)), range)

  // 3. Dead points.
  const changePoints: AngleValue[] = []
  if (linkage.driver === 'output') {
    for (const t of toggles) changePoints.push({ theta: t.theta, value: t.outputAngle })
  }
  if (limits) {
    for (const theta of limits) changePoints.push({ theta, value: solve(theta) ? state[THETA4]! : Number.NaN })
  }
  const warnings: LinkageWarning[] = []
  if (limits) {
    warnings.push({
      code: 'input-cannot-turn',
      message: `The input link cannot turn fully (${klass.label}): it can only rock between ${deg(limits[0])} and ${deg(limits[1])}, where coupler and output fall in line`,
      details: { from: limits[0], to: limits[1] },
    })
  }
  if (klass.condition === 'change-point') {
    warnings.push({
      code: 'change-point-linkage',
      message: `s + l = p + q: all four links fall in line at the change points, where the linkage can switch circuit unless something guides it through`,
      details: { shortPlusLong: klass.shortPlusLong, otherTwo: klass.otherTwo },
    })
  }
  if (linkage.driver === 'output' && toggles.length > 0) {
    warnings.push({
      code: 'dead-centres-need-momentum',
      message: `The output drives: where input and coupler fall in line (input at ${toggles.map((t) => deg(t.theta)).join(' and ')}) it cannot turn the input, so a flywheel or other stored momentum must carry the input through`,
      details: { count: toggles.length },
    })
  }
  return {
    linkage,
    speed,
    angularAcceleration,
    grashof: klass,
    inputTurnsFully: full,
    range,
    inputLimits: limits,
    toggles,
    outputSwing,
    forwardAngle,
    returnAngle,
    timeRatio,
    transmissionMin,
    transmissionMax,
    transmissionWorst,
    peakOutputVelocity: { theta: vPeak.theta, value: velocityAt(vPeak.theta) },
    peakOutputAcceleration: { theta: aPeak.theta, value: accelerationAt(aPeak.theta) },
    changePoints,
    warnings,
  }
}
