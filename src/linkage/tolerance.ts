/**
 * Tolerance analysis of a linkage's results over the tolerance box of its
 * dimensions: sensitivities by central differences, the worst case as the true
 * extremes over the box (every corner, then a box-constrained search from the
 * best), the statistical root-sum-square, and a seeded Monte Carlo (uniform, or
 * normal with the tolerance as three standard deviations) with its mean,
 * standard deviation, percentiles and histogram. The responses are closed forms
 * for the straight-path slider-crank (stroke, dead-centre positions, time ratio,
 * least transmission angle) and the crank-rocker (swing, time ratio, worst
 * transmission angle). Pure, SI; the generator is pure-rand's xoroshiro128+.
 */
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64'
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus'
import { LinkageError, requireFinite } from './errors.js'
import { crankRockerToggles } from './four-bar-synthesis.js'

/** A toleranced dimension: nominal and its deviations (lower ≤ 0 ≤ upper, SI). */
export interface Toleranced {
  readonly name: string
  readonly nominal: number
  readonly lower: number
  readonly upper: number
}

/** A response: results from dimensions (in the order of the inputs), written into `out`; false where the linkage cannot assemble. */
export interface Response {
  readonly names: readonly string[]
  evaluate(x: Float64Array, out: Float64Array): boolean
}

/** Slider-crank (straight path, crank turning fully): stroke, outer and inner dead-centre positions, time ratio, least transmission angle. Inputs: crank, rod, offset. */
export const SLIDER_CRANK_RESPONSE: Response = {
  names: ['stroke', 'outer_dead_centre_position', 'inner_dead_centre_position', 'time_ratio', 'transmission_angle_min'],
  evaluate(x, out) {
    const a = x[0]!
    const b = x[1]!
    const e = x[2]!
    const p2 = (b + a) * (b + a) - e * e
    const m2 = (b - a) * (b - a) - e * e
    if (!(a > 0 && b - a > Math.abs(e) && m2 > 0)) return false
    const P = Math.sqrt(p2)
    const M = Math.sqrt(m2)
    // Dead-centre crank angles: the crank travel between them is π ± Δ, Δ = asin(e/(b − a)) − asin(e/(b + a)).
    const delta = Math.abs(Math.asin(e / (b - a)) - Math.asin(e / (b + a)))
    out[0] = P - M
    out[1] = P
    out[2] = M
    out[3] = (Math.PI + delta) / (Math.PI - delta)
    out[4] = Math.acos((a + Math.abs(e)) / b)
    return true
  },
}

/** Crank-rocker: output swing, time ratio, worst transmission angle. Inputs: ground, input, coupler, output. */
export const CRANK_ROCKER_RESPONSE: Response = {
  names: ['output_swing', 'time_ratio', 'transmission_angle_worst'],
  evaluate(x, out) {
    const [d, a, b, c] = [x[0]!, x[1]!, x[2]!, x[3]!]
    const lengths = [d, a, b, c].sort((p, q) => p - q)
    // A Grashof crank-rocker: the input shortest and s + l < p + q.
    if (!(a === lengths[0] && lengths[0]! + lengths[3]! < lengths[1]! + lengths[2]!)) return false
    const t = crankRockerToggles(d, a, b, c)
    out[0] = t.swing
    out[1] = t.timeRatio
    out[2] = t.transmissionWorst
    return true
  },
}

/** One result's tolerance figures. */
export interface ResultSpread {
  readonly name: string
  readonly nominal: number
  /** ∂result/∂input for each input, by central differences. */
  readonly sensitivities: readonly number[]
  /** Each input's share of the variance (s_i² σ_i² / Σ), uniform or normal as the Monte Carlo draws. */
  readonly shares: readonly number[]
  /** Linear worst case Σ|s_i|·t_i about the middle of each tolerance, and the root-sum-square √Σ(s_i·t_i)², t_i the half-width. */
  readonly linearWorst: number
  readonly rss: number
  /** True extremes over the tolerance box (corners and a box-constrained search), and where. */
  readonly min: { readonly value: number; readonly at: readonly number[] }
  readonly max: { readonly value: number; readonly at: readonly number[] }
}

function check(inputs: readonly Toleranced[]): void {
  for (const t of inputs) {
    requireFinite(`${t.name} nominal`, t.nominal)
    requireFinite(`${t.name} lower deviation`, t.lower)
    requireFinite(`${t.name} upper deviation`, t.upper)
    if (!(t.lower <= t.upper)) throw new LinkageError('invalid-number', `The tolerance of ${t.name} must have its lower deviation below its upper, got ${t.lower} and ${t.upper}`)
  }
}

/**
 * Sensitivities, linear worst case, RSS and the true extremes of every result over
 * the tolerance box. Throws `cannot-assemble` when the nominal linkage, or a corner
 * of the box, does not assemble (the box is too large for the linkage).
 */
export function spread(response: Response, inputs: readonly Toleranced[], distribution: 'uniform' | 'normal' = 'uniform'): ResultSpread[] {
  check(inputs)
  const n = inputs.length
  const k = response.names.length
  const x = Float64Array.from(inputs, (t) => t.nominal)
  const out = new Float64Array(k)
  const nominal = new Float64Array(k)
  if (!response.evaluate(x, nominal)) throw new LinkageError('cannot-assemble', 'The nominal linkage does not assemble')
  const half = inputs.map((t) => (t.upper - t.lower) / 2)
  const middle = inputs.map((t) => t.nominal + (t.upper + t.lower) / 2)
  // Central differences at the middle of the box, step 1e-6 of the dimension.
  const sens: number[][] = Array.from({ length: k }, () => new Array<number>(n).fill(0))
  const hi = new Float64Array(k)
  const lo = new Float64Array(k)
  for (let i = 0; i < n; i++) {
    const h = 1e-6 * Math.max(Math.abs(middle[i]!), 1e-6)
    const y = Float64Array.from(middle)
    y[i] = middle[i]! + h
    const okHi = response.evaluate(y, hi)
    y[i] = middle[i]! - h
    const okLo = response.evaluate(y, lo)
    if (!okHi || !okLo) throw new LinkageError('cannot-assemble', `The linkage does not assemble near the middle of ${inputs[i]!.name}'s tolerance`)
    for (let r = 0; r < k; r++) sens[r]![i] = (hi[r]! - lo[r]!) / (2 * h)
  }
  // A uniform deviation over ±t has σ = t/√3; a normal one, t/3 (the tolerance as 3σ).
  const sigma = half.map((t) => (distribution === 'uniform' ? t / Math.sqrt(3) : t / 3))
  // Corners of the box.
  const corners = 1 << n
  const results: { min: { value: number; at: number[] }; max: { value: number; at: number[] } }[] = response.names.map(() => ({ min: { value: Infinity, at: [] as number[] }, max: { value: -Infinity, at: [] as number[] } }))
  for (let mask = 0; mask < corners; mask++) {
    for (let i = 0; i < n; i++) x[i] = inputs[i]!.nominal + ((mask >> i) & 1 ? inputs[i]!.upper : inputs[i]!.lower)
    if (!response.evaluate(x, out)) throw new LinkageError('cannot-assemble', 'A corner of the tolerance box does not assemble: the tolerances are too large for the linkage', { corner: Array.from(x).join(', ') })
    for (let r = 0; r < k; r++) {
      if (out[r]! < results[r]!.min.value) results[r]!.min = { value: out[r]!, at: Array.from(x) }
      if (out[r]! > results[r]!.max.value) results[r]!.max = { value: out[r]!, at: Array.from(x) }
    }
  }
  // A result may peak inside the box (a transmission angle): coordinate search from the best corner, the box respected.
  for (let r = 0; r < k; r++) {
    for (const sense of [1, -1] as const) {
      const start = sense === 1 ? results[r]!.max : results[r]!.min
      const best = refine(response, inputs, r, sense, Float64Array.from(start.at), start.value)
      if (sense === 1 && best.value > results[r]!.max.value) results[r]!.max = best
      if (sense === -1 && best.value < results[r]!.min.value) results[r]!.min = best
    }
  }
  return response.names.map((name, r) => {
    const s = sens[r]!
    const variances = s.map((v, i) => (v * sigma[i]!) ** 2)
    const total = variances.reduce((p, q) => p + q, 0)
    return {
      name,
      nominal: nominal[r]!,
      sensitivities: s,
      shares: variances.map((v) => (total > 0 ? v / total : 0)),
      linearWorst: s.reduce((sum, v, i) => sum + Math.abs(v) * half[i]!, 0),
      rss: Math.sqrt(s.reduce((sum, v, i) => sum + (v * half[i]!) ** 2, 0)),
      min: results[r]!.min,
      max: results[r]!.max,
    }
  })
}

/** Coordinate search inside the box for a larger (sense +1) or smaller (−1) result, from a start point. */
function refine(response: Response, inputs: readonly Toleranced[], r: number, sense: 1 | -1, x: Float64Array, value: number): { value: number; at: number[] } {
  const out = new Float64Array(response.names.length)
  let best = value
  let step = 0.25
  for (let round = 0; round < 60 && step > 1e-7; round++) {
    let moved = false
    for (let i = 0; i < inputs.length; i++) {
      const t = inputs[i]!
      const width = t.upper - t.lower
      if (width === 0) continue
      for (const dir of [1, -1]) {
        const keep = x[i]!
        const next = Math.min(t.nominal + t.upper, Math.max(t.nominal + t.lower, keep + dir * step * width))
        if (next === keep) continue
        x[i] = next
        if (response.evaluate(x, out) && sense * (out[r]! - best) > 0) {
          best = out[r]!
          moved = true
        } else x[i] = keep
      }
    }
    if (!moved) step /= 2
  }
  return { value: best, at: Array.from(x) }
}

/** Monte Carlo of a response: every sample's results, one Float64Array per result (NaN where a sample does not assemble). */
export interface MonteCarlo {
  readonly count: number
  readonly seed: number
  readonly distribution: 'uniform' | 'normal'
  readonly samples: readonly Float64Array[]
  /** Samples that did not assemble. */
  readonly failed: number
}

/**
 * Draw `count` linkages from the tolerance box — uniform over each tolerance, or
 * normal about its middle with the half-width as 3σ (clipped to the box) — with a
 * seeded generator, so the same seed gives the same samples.
 */
export function monteCarlo(response: Response, inputs: readonly Toleranced[], count: number, seed: number, distribution: 'uniform' | 'normal' = 'uniform'): MonteCarlo {
  check(inputs)
  if (!Number.isInteger(count) || count < 1) throw new LinkageError('invalid-number', `A Monte Carlo needs a whole number of samples, got ${count}`)
  if (!Number.isInteger(seed)) throw new LinkageError('invalid-number', `The seed must be a whole number, got ${seed}`)
  const n = inputs.length
  const k = response.names.length
  const rng = xoroshiro128plus(seed)
  const samples = Array.from({ length: k }, () => new Float64Array(count))
  const x = new Float64Array(n)
  const out = new Float64Array(k)
  const lo = inputs.map((t) => t.nominal + t.lower)
  const width = inputs.map((t) => t.upper - t.lower)
  const middle = inputs.map((t) => t.nominal + (t.upper + t.lower) / 2)
  const sigma = inputs.map((t) => (t.upper - t.lower) / 6)
  let spare = Number.NaN
  let failed = 0
  for (let j = 0; j < count; j++) {
    for (let i = 0; i < n; i++) {
      if (distribution === 'uniform') x[i] = lo[i]! + width[i]! * uniformFloat64(rng)
      else {
        // Box–Muller, two normal deviates per pair of uniforms.
        let z: number
        if (Number.isNaN(spare)) {
          const u1 = 1 - uniformFloat64(rng)
          const u2 = uniformFloat64(rng)
          const radius = Math.sqrt(-2 * Math.log(u1))
          z = radius * Math.cos(2 * Math.PI * u2)
          spare = radius * Math.sin(2 * Math.PI * u2)
        } else {
          z = spare
          spare = Number.NaN
        }
        x[i] = Math.min(lo[i]! + width[i]!, Math.max(lo[i]!, middle[i]! + sigma[i]! * z))
      }
    }
    if (response.evaluate(x, out)) for (let r = 0; r < k; r++) samples[r]![j] = out[r]!
    else {
      failed++
      for (let r = 0; r < k; r++) samples[r]![j] = Number.NaN
    }
  }
  return { count, seed, distribution, samples, failed }
}

/** Mean, standard deviation, percentiles (0–100) and a histogram of samples (NaN left out). */
export function sampleStatistics(values: Float64Array, percentiles: readonly number[], bins = 40): { mean: number; std: number; min: number; max: number; percentiles: number[]; histogram: { edges: Float64Array; counts: Float64Array } } {
  const finite = values.filter((v) => Number.isFinite(v)).sort()
  const n = finite.length
  if (n === 0) throw new LinkageError('invalid-number', 'No sample assembled')
  let mean = 0
  for (let i = 0; i < n; i++) mean += finite[i]!
  mean /= n
  let sq = 0
  for (let i = 0; i < n; i++) sq += (finite[i]! - mean) ** 2
  const std = n > 1 ? Math.sqrt(sq / (n - 1)) : 0
  // Percentiles by linear interpolation between order statistics.
  const at = (p: number): number => {
    const h = (n - 1) * (p / 100)
    const i = Math.floor(h)
    return i + 1 < n ? finite[i]! + (h - i) * (finite[i + 1]! - finite[i]!) : finite[n - 1]!
  }
  const min = finite[0]!
  const max = finite[n - 1]!
  const edges = new Float64Array(bins + 1)
  const counts = new Float64Array(bins)
  const width = (max - min) / bins || 1
  for (let b = 0; b <= bins; b++) edges[b] = min + b * width
  for (let i = 0; i < n; i++) counts[Math.min(bins - 1, Math.floor((finite[i]! - min) / width))]!++
  return { mean, std, min, max, percentiles: percentiles.map(at), histogram: { edges, counts } }
}

/**
 * Pin clearance as an added radial play c_j at each joint (the effective-link-length
 * model): at a dead centre all the joints lie on the line of the links, so the
 * slider's position there can move by up to Σc_j either way, and the stroke by up to
 * 2·Σc_j in the worst case.
 */
export function clearanceEffect(clearances: readonly number[]): { readonly deadCentreShift: number; readonly strokeChange: number } {
  let sum = 0
  for (const c of clearances) {
    requireFinite('clearance', c)
    if (c < 0) throw new LinkageError('invalid-number', `A clearance must be zero or more, got ${c}`)
    sum += c
  }
  return { deadCentreShift: sum, strokeChange: 2 * sum }
}
