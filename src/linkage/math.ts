/**
 * Numeric helpers and named tolerances shared by the linkage core.
 * Everything here is pure and works on plain numbers in SI units.
 */

/** One full turn in radians. */
export const TAU = 2 * Math.PI

/** Degrees per radian, for messages and tests. */
export const DEG = 180 / Math.PI

/**
 * Relative tolerance for geometric equalities such as s + l = p + q (change point)
 * or b = a + |h| (crank just turns). Link lengths carry at most ~1e-15 relative
 * rounding each; 1e-12 of the summed lengths leaves three decades of margin
 * while still separating any real design from the boundary case.
 */
export const GEOMETRY_TOLERANCE = 1e-12

/**
 * How far (relative to rod²) a square-root argument may fall below zero and
 * still count as zero: a point exactly at a limit angle rounds either way.
 */
export const ROOT_TOLERANCE = 1e-12

/** Bound on iterations of any search (golden section, bisection). */
export const MAX_ITERATIONS = 200

/** Angle tolerance (rad) at which a golden-section search stops: ~1e-9 deg. */
export const ANGLE_TOLERANCE = 1e-11

/** Square root that treats tiny negative arguments (rounding) as zero, NaN otherwise. */
export function safeSqrt(value: number, scale: number): number {
  if (value >= 0) return Math.sqrt(value)
  return value > -ROOT_TOLERANCE * scale ? 0 : Number.NaN
}

/** acos clamped to [-1, 1] so that a dead-centre position does not give NaN. */
export function clampedAcos(value: number): number {
  return Math.acos(value > 1 ? 1 : Math.max(value, -1))
}

/** asin clamped to [-1, 1]. */
export function clampedAsin(value: number): number {
  return Math.asin(value > 1 ? 1 : Math.max(value, -1))
}

/** Angle reduced to [0, 2π). */
export function wrapTurn(angle: number): number {
  const wrapped = angle % TAU
  return wrapped < 0 ? wrapped + TAU : wrapped === TAU ? 0 : wrapped
}

/** Angle reduced to (-π, π]. */
export function wrapHalfTurn(angle: number): number {
  const wrapped = wrapTurn(angle)
  return wrapped > Math.PI ? wrapped - TAU : wrapped
}

/** Included angle between two directions, in [0, π]. */
export function includedAngle(a: number, b: number): number {
  return Math.abs(wrapHalfTurn(a - b))
}

/** True when |a - b| is within the relative geometry tolerance of `scale`. */
export function nearlyEqual(a: number, b: number, scale: number): boolean {
  return Math.abs(a - b) <= GEOMETRY_TOLERANCE * scale
}

/**
 * Golden-section search for the maximum of `f` on [lo, hi].
 * Used to refine a peak bracketed by a sweep; stops at ANGLE_TOLERANCE or MAX_ITERATIONS.
 */
export function maximise(f: (x: number) => number, lo: number, hi: number): { x: number; value: number } {
  const ratio = (Math.sqrt(5) - 1) / 2
  let a = lo
  let b = hi
  let c = b - ratio * (b - a)
  let d = a + ratio * (b - a)
  let fc = f(c)
  let fd = f(d)
  for (let i = 0; i < MAX_ITERATIONS && b - a > ANGLE_TOLERANCE; i++) {
    if (fc >= fd) {
      b = d
      d = c
      fd = fc
      c = b - ratio * (b - a)
      fc = f(c)
    } else {
      a = c
      c = d
      fc = fd
      d = a + ratio * (b - a)
      fd = f(d)
    }
  }
  const x = (a + b) / 2
  const value = f(x)
  // The ends of the bracket can hold the maximum on a limited range.
  const flo = f(lo)
  const fhi = f(hi)
  if (flo > value && flo >= fhi) return { x: lo, value: flo }
  if (fhi > value) return { x: hi, value: fhi }
  return { x, value }
}
