/**
 * Extremes of a swept quantity: bracketed by the sweep, refined by bisection on
 * the slope (a golden-section search where the extreme sits at a range end), and
 * replaced by an exactly known angle (a candidate) when that is at least as extreme.
 */

import { MAX_ITERATIONS, TAU, maximise, wrapTurn } from './math.js'

/**
 * Step of the central difference used for the slope, rad. Rounding error of the
 * slope scales as ε/h and truncation as h², so 1e-5 puts a peak's angle within
 * ~1e-11 rad for quantities like slider velocity; a golden-section search on the
 * value alone stalls near √ε ≈ 1e-8 rad on a flat maximum.
 */
const SLOPE_STEP = 1e-5

/** Samples within this relative margin of the best count as a tie; the earliest angle wins. */
const SAMPLE_TIE = 1e-9
import type { AngleRange, AngleValue } from './types.js'

/** True when θ lies in the range (compared modulo a full turn). */
export function inRange(theta: number, range: AngleRange): boolean {
  const span = range.end - range.start
  if (span >= TAU - 1e-12) return true
  const offset = wrapTurn(theta - range.start)
  return offset <= span + 1e-12 || offset >= TAU - 1e-12
}

/**
 * The largest (sense +1) or smallest (sense -1) value of a quantity over a range.
 * @param angles sampled angles (ascending, as written by a sweep)
 * @param values the quantity at those angles
 * @param evaluate the quantity at any angle in the range (NaN outside)
 * @param candidates angles where an extreme is known to be possible (closed form)
 */
export function findExtreme(
  angles: Float64Array,
  values: Float64Array,
  sense: 1 | -1,
  evaluate: (theta: number) => number,
  range: AngleRange,
  candidates: readonly number[] = [],
): AngleValue {
  const count = angles.length
  let best = -1
  let bestValue = Number.NEGATIVE_INFINITY
  // Bracket: the best finite sample (a limit angle's ±∞ is judged apart, by `extremesOf`).
  for (let i = 0; i < count; i++) {
    const v = sense * values[i]!
    if (!Number.isFinite(v)) continue
    if (best < 0 ? v > bestValue : v > bestValue + SAMPLE_TIE * Math.abs(bestValue)) {
      bestValue = v
      best = i
    }
  }
  if (best < 0) return { theta: Number.NaN, value: Number.NaN }
  const periodic = range.end - range.start >= TAU - 1e-12
  const step = (range.end - range.start) / (count - 1)
  let lo = angles[best]! - step
  let hi = angles[best]! + step
  if (!periodic) {
    lo = Math.max(lo, range.start)
    hi = Math.min(hi, range.end)
  }
  const signed = (theta: number): number => {
    const v = sense * evaluate(theta)
    return Number.isFinite(v) ? v : Number.NEGATIVE_INFINITY
  }
  let theta = angles[best]!
  const refined = refine(signed, lo, hi)
  if (refined.value >= bestValue) {
    theta = refined.x
    bestValue = refined.value
  }
  // A closed-form candidate wins ties: its angle is exact, the search's is not.
  const tie = 1e-12 * Math.max(1, Math.abs(bestValue))
  for (const candidate of candidates) {
    if (!inRange(candidate, range)) continue
    const v = signed(candidate)
    if (v >= bestValue - tie) {
      bestValue = Math.max(v, bestValue)
      theta = candidate
    }
  }
  return { theta: wrapTurn(theta), value: evaluate(theta) }
}

/** Maximum of f on [lo, hi]: bisection on the central-difference slope when it changes sign, else golden section. */
function refine(f: (x: number) => number, lo: number, hi: number): { x: number; value: number } {
  const slope = (x: number): number => (f(x + SLOPE_STEP) - f(x - SLOPE_STEP)) / (2 * SLOPE_STEP)
  let a = lo
  let b = hi
  if (!(slope(a) > 0 && slope(b) < 0)) return maximise(f, lo, hi)
  for (let i = 0; i < MAX_ITERATIONS && b - a > 1e-13; i++) {
    const m = (a + b) / 2
    if (slope(m) > 0) a = m
    else b = m
  }
  const x = (a + b) / 2
  return { x, value: f(x) }
}

/** The extremes of a swept quantity over a range. */
export interface Extremes {
  /** Largest signed value and its angle (+∞ at a limit angle where it grows without bound). */
  readonly max: AngleValue
  /** Least signed value and its angle (−∞ where it falls without bound). */
  readonly min: AngleValue
  /** Largest magnitude, ≥ 0, and its angle (+∞ where the quantity is unbounded). */
  readonly absMax: AngleValue
  /** Whether the quantity grows without bound towards an end of the range, upwards or downwards. */
  readonly unbounded: { readonly positive: boolean; readonly negative: boolean }
}

/**
 * How a quantity behaves approaching an end of a limited range: it diverges when
 * its magnitude keeps growing as the end is approached (a velocity at a limit
 * angle grows as ε^−½, an acceleration as ε^−3/2; a bounded one barely changes).
 * Returns the sign it diverges towards, or 0.
 */
function divergesAt(evaluate: (theta: number) => number, end: number, inward: 1 | -1, span: number): -1 | 0 | 1 {
  const far = evaluate(end + inward * 1e-6 * span)
  const near = evaluate(end + inward * 1e-9 * span)
  if (!Number.isFinite(far)) return 0
  if (!Number.isFinite(near)) return near > 0 ? 1 : near < 0 ? -1 : 0
  // A thousand times closer, over ten times larger, same sign: it diverges.
  return Math.abs(near) > 10 * Math.abs(far) && Math.sign(near) === Math.sign(far) ? (near > 0 ? 1 : -1) : 0
}

/**
 * Largest, least and largest-magnitude values of a quantity over a range, each
 * with its angle (see {@link findExtreme}); on a limited range the ends are
 * tested for a value that grows without bound, which is then reported as ±∞ at
 * that end rather than as a large number.
 */
export function extremesOf(
  angles: Float64Array,
  values: Float64Array,
  evaluate: (theta: number) => number,
  range: AngleRange,
  candidates: readonly number[] = [],
  rotation: 1 | -1 = 1,
): Extremes {
  const max = findExtreme(angles, values, 1, evaluate, range, candidates)
  const min = findExtreme(angles, values, -1, evaluate, range, candidates)
  const periodic = range.end - range.start >= TAU - 1e-12
  const span = range.end - range.start
  let positive = false
  let negative = false
  let maxOut: AngleValue = max
  let minOut: AngleValue = min
  if (!periodic) {
    for (const [end, inward] of [
      [range.start, 1],
      [range.end, -1],
    ] as const) {
      const sign = divergesAt(evaluate, end, inward, span)
      if (sign > 0 && !positive) {
        positive = true
        maxOut = { theta: wrapTurn(end), value: Number.POSITIVE_INFINITY }
      }
      if (sign < 0 && !negative) {
        negative = true
        minOut = { theta: wrapTurn(end), value: Number.NEGATIVE_INFINITY }
      }
    }
  }
  let absMax: AngleValue
  if (positive) absMax = { theta: maxOut.theta, value: Number.POSITIVE_INFINITY }
  else if (negative) absMax = { theta: minOut.theta, value: Number.POSITIVE_INFINITY }
  else {
    // Equal magnitudes (an in-line drive's two strokes): the one met first in the cycle.
    const [hi, lo] = [Math.abs(max.value), Math.abs(min.value)]
    const tie = Math.abs(hi - lo) <= 1e-12 * Math.max(hi, lo)
    const first = wrapTurn(rotation * (max.theta - range.start)) <= wrapTurn(rotation * (min.theta - range.start)) ? max : min
    const pick = tie ? first : hi > lo ? max : min
    absMax = { theta: pick.theta, value: Math.abs(pick.value) }
  }
  return { max: maxOut, min: minOut, absMax, unbounded: { positive, negative } }
}
