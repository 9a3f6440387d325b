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
