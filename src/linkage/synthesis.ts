/**
 * Offset slider-crank synthesis: crank and rod for a required stroke S and
 * quick-return time ratio Q with a chosen offset h. The two dead-centre
 * triangles share the stroke as a side and the angle α between L1 = b − a and
 * L2 = b + a, so S² = L1² + L2² − 2·L1·L2·cos α (law of cosines) and
 * h·S = L1·L2·sin α (twice the triangle's area), which solve in closed form.
 */
import { LinkageError, mm, requireFinite, requireLength } from './errors.js'

/** Crank and rod found for a stroke and time ratio, with the design's margins. */
export interface SliderCrankSynthesis {
  /** Crank radius a, m. */
  readonly crank: number
  /** Rod length b, m. */
  readonly rod: number
  /** α = 180°·(Q − 1)/(Q + 1), the crank angle between the two dead centres beyond 180°, rad. */
  readonly alpha: number
  /** b − a − |h|: how far the crank is from not turning fully, m (> 0 for a full turn). */
  readonly fullTurnMargin: number
  /**
   * Largest offset for a crank that turns fully, S·cot α, m: there b − a = |h| and the
   * inner dead centre sits right above the crank axis.
   */
  readonly offsetLimit: number
  /** Largest offset for which the dead-centre triangle exists at all, (S/2)·cot(α/2), m. */
  readonly triangleLimit: number
}

/**
 * Crank and rod of an offset slider-crank for stroke S (m), time ratio Q (≥ 1)
 * and offset h (m). Q = 1 needs h = 0 and leaves the rod free: refused, since the
 * rod is then chosen for the transmission angle, not by this construction.
 */
export function synthesiseSliderCrank(stroke: number, timeRatio: number, offset: number): SliderCrankSynthesis {
  requireLength('stroke', stroke)
  requireFinite('time ratio', timeRatio)
  requireFinite('offset', offset)
  if (!(timeRatio > 1)) {
    throw new LinkageError(
      'invalid-number',
      timeRatio === 1
        ? 'A time ratio of 1 needs an in-line slider-crank: the crank is half the stroke and the rod is free, so choose it for the transmission angle'
        : `The time ratio must be 1 or more (slower stroke over faster), got ${timeRatio}`,
      { timeRatio },
    )
  }
  const h = Math.abs(offset)
  if (h === 0) {
    throw new LinkageError('invalid-length', 'A time ratio above 1 needs an offset: an in-line slider-crank always has equal strokes', { timeRatio })
  }
  const alpha = (Math.PI * (timeRatio - 1)) / (timeRatio + 1)
  const triangleLimit = stroke / 2 / Math.tan(alpha / 2)
  // Beyond S·cot α the formulas' triangle puts the crank axis over the stroke (the
  // inner dead centre on the far side), which no slider-crank that turns fully reaches.
  const offsetLimit = stroke / Math.tan(alpha)
  if (!(h < offsetLimit)) {
    throw new LinkageError(
      'cannot-assemble',
      `No slider-crank whose crank turns fully gives a ${mm(stroke)} stroke at time ratio ${timeRatio} with a ${mm(h)} offset: the offset must stay below S·cot α = ${offsetLimit > 0 ? mm(offsetLimit) : '0 mm (a time ratio of 3 or more cannot be reached)'}`,
      { offset: h, offsetLimit, triangleLimit },
    )
  }
  // (b − a)(b + a) = h·S / sin α
  const product = (h * stroke) / Math.sin(alpha)
  const crank = 0.5 * Math.sqrt(stroke * stroke - 2 * product * (1 - Math.cos(alpha)))
  const rod = 0.5 * Math.sqrt(stroke * stroke + 2 * product * (1 + Math.cos(alpha)))
  return { crank, rod, alpha, fullTurnMargin: rod - crank - h, offsetLimit, triangleLimit }
}

/** A member of the family of offset slider-cranks for one stroke and time ratio: its lengths and least transmission angle. */
export interface SliderCrankDesign {
  readonly crank: number
  readonly rod: number
  readonly offset: number
  /** Least transmission angle of a crank-driven drive, arccos((a + |e|)/b), rad. */
  readonly transmissionMin: number
  /** b − a − |e| (> 0: the crank turns fully), m. */
  readonly fullTurnMargin: number
}

/** Δ = 180°·(Q − 1)/(Q + 1), rad. */
export function excessAngle(timeRatio: number): number {
  return (Math.PI * (timeRatio - 1)) / (timeRatio + 1)
}

/** The design of the family at offset e (0 < e < S·cot Δ). */
export function sliderCrankAtOffset(stroke: number, timeRatio: number, offset: number): SliderCrankDesign {
  const s = synthesiseSliderCrank(stroke, timeRatio, offset)
  const e = Math.abs(offset)
  return { crank: s.crank, rod: s.rod, offset: e, transmissionMin: Math.acos(Math.min(1, (s.crank + e) / s.rod)), fullTurnMargin: s.fullTurnMargin }
}

/**
 * The family's designs over offsets in (0, S·cot Δ), `count` of them evenly spaced
 * inside the interval (its ends, where the crank stops turning, left out).
 */
export function sliderCrankFamily(stroke: number, timeRatio: number, count: number): SliderCrankDesign[] {
  const limit = stroke / Math.tan(excessAngle(timeRatio))
  const designs: SliderCrankDesign[] = []
  for (let i = 1; i <= count; i++) designs.push(sliderCrankAtOffset(stroke, timeRatio, (limit * i) / (count + 1)))
  return designs
}

/**
 * The member with the largest least transmission angle: μmin(e) is found on a scan
 * of the family and refined by golden-section search in the best bracket.
 */
export function bestTransmissionSliderCrank(stroke: number, timeRatio: number): SliderCrankDesign {
  requireLength('stroke', stroke)
  const limit = synthesiseSliderCrank(stroke, timeRatio, 1e-9 * stroke).offsetLimit
  const mu = (e: number): number => sliderCrankAtOffset(stroke, timeRatio, e).transmissionMin
  const n = 200
  let best = 1
  let bestMu = -1
  for (let i = 1; i < n; i++) {
    const value = mu((limit * i) / n)
    if (value > bestMu) { bestMu = value; best = i }
  }
  let lo = (limit * (best - 1)) / n || limit * 1e-9
  let hi = (limit * (best + 1)) / n
  if (best + 1 >= n) hi = limit * (1 - 1e-9)
  const golden = (Math.sqrt(5) - 1) / 2
  let x1 = hi - golden * (hi - lo)
  let x2 = lo + golden * (hi - lo)
  let f1 = mu(x1)
  let f2 = mu(x2)
  for (let k = 0; k < 200 && hi - lo > 1e-13 * limit; k++) {
    if (f1 < f2) {
      lo = x1
      x1 = x2
      f1 = f2
      x2 = lo + golden * (hi - lo)
      f2 = mu(x2)
    } else {
      hi = x2
      x2 = x1
      f2 = f1
      x1 = hi - golden * (hi - lo)
      f1 = mu(x1)
    }
  }
  return sliderCrankAtOffset(stroke, timeRatio, (lo + hi) / 2)
}

/** The interval a chosen crank or rod may take for a stroke and time ratio with the crank turning fully, m. */
export interface FeasibleInterval {
  readonly min: number
  readonly max: number
}

/** Feasible interval of the crank or rod over the family (scan and bisection on the full-turn margin). */
export function sliderCrankRange(stroke: number, timeRatio: number, which: 'crank' | 'rod'): FeasibleInterval {
  const family = sliderCrankFamily(stroke, timeRatio, 2000)
  const values = family.filter((d) => d.fullTurnMargin > 0).map((d) => (which === 'crank' ? d.crank : d.rod))
  return { min: Math.min(...values), max: Math.max(...values) }
}

/**
 * An offset slider-crank for stroke S and time ratio Q (> 1) with its crank (or its
 * rod) chosen: the other length and the offset in closed form from the two
 * dead-centre triangles, L1·L2 = b² − a² and S² = 2a² + 2b² − 2(b² − a²)cos Δ:
 *
 *     crank given   b² = (S² − 2a²(1 + cos Δ)) / (2(1 − cos Δ))
 *     rod given     a² = (S² − 2b²(1 − cos Δ)) / (2(1 + cos Δ))
 *     then          e  = (b² − a²)·sin Δ / S
 *
 * Throws `cannot-assemble` with the feasible interval of the chosen length (the
 * nearest achievable) when no slider-crank that turns fully has it.
 */
export function sliderCrankWith(stroke: number, timeRatio: number, choice: { readonly crank: number } | { readonly rod: number }): SliderCrankDesign {
  requireLength('stroke', stroke)
  if (!(timeRatio > 1)) throw new LinkageError('invalid-number', `A chosen crank or rod needs a time ratio above 1 (an offset drive), got ${timeRatio}`, { timeRatio })
  const delta = excessAngle(timeRatio)
  const c = Math.cos(delta)
  let a: number
  let b: number
  if ('crank' in choice) {
    requireLength('crank', choice.crank)
    a = choice.crank
    b = Math.sqrt(Math.max(0, (stroke * stroke - 2 * a * a * (1 + c)) / (2 * (1 - c))))
  } else {
    requireLength('rod', choice.rod)
    b = choice.rod
    a = Math.sqrt(Math.max(0, (stroke * stroke - 2 * b * b * (1 - c)) / (2 * (1 + c))))
  }
  const e = ((b * b - a * a) * Math.sin(delta)) / stroke
  const margin = b - a - e
  if (!(a > 0 && b > a && e > 0 && margin > 0)) {
    const which = 'crank' in choice ? 'crank' : 'rod'
    const range = sliderCrankRange(stroke, timeRatio, which)
    const given = 'crank' in choice ? choice.crank : choice.rod
    const nearest = Math.min(range.max, Math.max(range.min, given))
    throw new LinkageError(
      'cannot-assemble',
      `No slider-crank whose crank turns fully gives a ${mm(stroke)} stroke at time ratio ${timeRatio} with a ${mm(given)} ${which}: the ${which} must lie between ${mm(range.min)} and ${mm(range.max)}; the nearest achievable is ${mm(nearest)}`,
      { which, given, min: range.min, max: range.max, nearest },
    )
  }
  return { crank: a, rod: b, offset: e, transmissionMin: Math.acos(Math.min(1, (a + e) / b)), fullTurnMargin: margin }
}

/** An in-line slider-crank for a stroke: crank S/2 and a rod for a rod-to-crank ratio, or the shortest rod within a peak-acceleration limit. */
export interface InlineDesign {
  readonly crank: number
  readonly rod: number
  /** The largest slider acceleration, a·ω²·(1 + a/b) at the outer dead centre, m/s² (null without a speed). */
  readonly accelerationMax: number | null
}

/**
 * In-line slider-crank for stroke S: a = S/2, and b = n·a for a rod-to-crank ratio
 * n > 1, or the shortest b with a·ω²·(1 + a/b) ≤ A_max at crank speed ω. Throws
 * with the least achievable acceleration a·ω² (an endless rod) when A_max is below it.
 */
export function inlineSliderCrank(stroke: number, choice: { readonly rodRatio: number } | { readonly accelerationLimit: number; readonly speed: number }): InlineDesign {
  requireLength('stroke', stroke)
  const a = stroke / 2
  if ('rodRatio' in choice) {
    requireFinite('rod-to-crank ratio', choice.rodRatio)
    if (!(choice.rodRatio > 1)) throw new LinkageError('invalid-number', `The rod-to-crank ratio must exceed 1 for the crank to turn, got ${choice.rodRatio}`, { rodRatio: choice.rodRatio })
    return { crank: a, rod: choice.rodRatio * a, accelerationMax: null }
  }
  const { accelerationLimit: A, speed: w } = choice
  requireFinite('acceleration limit', A)
  requireFinite('speed', w)
  const floor = a * w * w
  if (!(A > floor)) {
    throw new LinkageError(
      'cannot-assemble',
      `An in-line slider-crank of ${mm(stroke)} stroke at ${(w * 30 / Math.PI).toFixed(1)} rpm has a peak acceleration of at least a·ω² = ${floor.toFixed(3)} m/s² (an endless rod): the limit of ${A} m/s² cannot be met; the nearest achievable is ${floor.toFixed(3)} m/s²`,
      { floor, limit: A },
    )
  }
  // a·ω²·(1 + a/b) = A  ⇒  b = a / (A/(a·ω²) − 1).
  const lambda = A / floor - 1
  if (!(lambda < 1)) {
    throw new LinkageError(
      'invalid-number',
      `The limit of ${A} m/s² is at least 2·a·ω² = ${(2 * floor).toFixed(3)} m/s²: it allows a rod shorter than the crank, so it does not decide the rod; choose it by its ratio to the crank instead`,
      { floor, limit: A },
    )
  }
  const rod = a / lambda
  return { crank: a, rod, accelerationMax: floor * (1 + a / rod) }
}
