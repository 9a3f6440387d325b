/**
 * Integrals over a crank cycle from evenly spaced samples: composite Simpson's
 * rule (exact to rounding for the smooth periodic curves of a linkage at 1441
 * samples), means, RMS values and Fourier harmonics.
 */

/** ∫ y dθ over samples evenly spaced by `step` (Simpson's rule; a trapezoid closes an odd count of intervals). */
export function integrate(values: Float64Array, step: number): number {
  const n = values.length - 1
  if (n < 1) return 0
  const even = n - (n % 2)
  let sum = values[0]! + values[even]!
  for (let i = 1; i < even; i++) sum += (i % 2 === 1 ? 4 : 2) * values[i]!
  let total = (sum * step) / 3
  if (even < n) total += ((values[n - 1]! + values[n]!) * step) / 2
  return total
}

/** Mean over the span of the samples. */
export function mean(values: Float64Array, step: number): number {
  const span = (values.length - 1) * step
  return span > 0 ? integrate(values, step) / span : Number.NaN
}

/** Root mean square over the span of the samples. */
export function rms(values: Float64Array, step: number): number {
  const squares = new Float64Array(values.length)
  for (let i = 0; i < values.length; i++) squares[i] = values[i]! * values[i]!
  return Math.sqrt(mean(squares, step))
}

/** The k-th harmonic of a curve sampled over one turn from θ0: y ≈ a·cos kθ + b·sin kθ, with its amplitude. */
export function harmonic(values: Float64Array, angles: Float64Array, k: number): { a: number; b: number; amplitude: number } {
  const n = values.length
  const step = (angles[n - 1]! - angles[0]!) / (n - 1)
  const cosine = new Float64Array(n)
  const sine = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    cosine[i] = values[i]! * Math.cos(k * angles[i]!)
    sine[i] = values[i]! * Math.sin(k * angles[i]!)
  }
  const a = integrate(cosine, step) / Math.PI
  const b = integrate(sine, step) / Math.PI
  return { a, b, amplitude: Math.hypot(a, b) }
}
