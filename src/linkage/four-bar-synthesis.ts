/**
 * Four-bar synthesis. A crank-rocker for an output swing ψ and a time ratio Q by
 * the toggle-circle construction: with the rocker pin at its two extremes B1 and
 * B2 (a chord of the rocker's circle), the crank pivot O2 sees the chord under the
 * angle Δ = 180°·(Q − 1)/(Q + 1) (inscribed-angle theorem), so it lies on a circle
 * of radius |B1B2|/(2 sin Δ) through B1 and B2 — on the chord's line itself for
 * Q = 1. At the toggles |O2B1| = b + a and |O2B2| = b − a. The pivot's place on
 * the circle is the one free choice: searched for the best transmission angle.
 * And a function generator through three precision points by Freudenstein's
 * equation with Chebyshev spacing. Pure, SI.
 */
import { analyseFourBar } from './four-bar-analysis.js'
import { FOUR_BAR_STATE, THETA4, fourBar, fourBarState, grashof } from './four-bar.js'
import type { Circuit } from './types.js'
import { LinkageError, requireFinite, requireLength } from './errors.js'
import { excessAngle } from './synthesis.js'

/** A crank-rocker found by the construction, with how well it meets the requirement. */
export interface CrankRockerDesign {
  readonly ground: number
  readonly input: number
  readonly coupler: number
  readonly output: number
  /** Angle of the line O2→O4 in the construction's frame (the rocker's chord symmetric about +x from O4), rad; and the pivot's place on its circle. */
  readonly pivotAngle: number
  /** Swing and time ratio found by forward analysis, and the worst transmission angle min(μmin, 180° − μmax), rad. */
  readonly swing: number
  readonly timeRatio: number
  readonly transmissionWorst: number
  readonly circuit: Circuit
  /** The pivot's place t on its circle (rad about the circle's centre) and which of the two circles through B1, B2. */
  readonly place: number
  readonly family: 0 | 1
}

/**
 * The construction at one place t of the pivot on its circle (radians about the
 * circle's centre; for Q = 1, the signed distance along the chord's line past
 * B1, in rocker lengths), scaled to the ground or output length given. Null when
 * that place gives no crank-rocker with the swing and time ratio asked for.
 */
export function crankRockerAt(swing: number, timeRatio: number, scale: { readonly ground: number } | { readonly output: number }, t: number, family: 0 | 1 = 0): CrankRockerDesign | null {
  const delta = excessAngle(timeRatio)
  const half = swing / 2
  // Frame: O4 at the origin, the rocker's extremes B1, B2 symmetric about +x at radius 1.
  const b1x = Math.cos(half)
  const b1y = Math.sin(half)
  const b2x = b1x
  const b2y = -b1y
  let ox: number
  let oy: number
  if (delta < 1e-12) {
    // Q = 1: O2 on the chord's line, outside the chord.
    ox = b1x
    oy = t >= 0 ? b1y + t : b2y + t
  } else {
    const chord = 2 * Math.sin(half)
    const radius = chord / (2 * Math.sin(delta))
    // Two circles through B1 and B2: their centres on the x axis, either side of the chord.
    const cx = b1x + (family === 0 ? 1 : -1) * radius * Math.cos(delta)
    ox = cx + radius * Math.cos(t)
    oy = radius * Math.sin(t)
  }
  const l1 = Math.hypot(b1x - ox, b1y - oy)
  const l2 = Math.hypot(b2x - ox, b2y - oy)
  const input = Math.abs(l1 - l2) / 2
  const coupler = (l1 + l2) / 2
  const ground = Math.hypot(ox, oy)
  if (!(input > 1e-9 && ground > 1e-9)) return null
  const k = 'ground' in scale ? scale.ground / ground : scale.output
  const lengths = { ground: ground * k, input: input * k, coupler: coupler * k, output: k }
  const klass = grashof(lengths.ground, lengths.input, lengths.coupler, lengths.output)
  if (klass.className !== 'crank-rocker') return null
  // The construction fixes the toggles; the toggle formulas confirm the swing and the time
  // ratio, and the transmission angle's extremes sit at θ2 = 0 and 180° (closed form).
  const toggles = crankRockerToggles(lengths.ground, lengths.input, lengths.coupler, lengths.output)
  if (Math.abs(toggles.swing - swing) > 1e-7 || Math.abs(toggles.timeRatio - timeRatio) > 1e-7 * timeRatio) return null
  return { ...lengths, pivotAngle: Math.atan2(-oy, -ox), swing: toggles.swing, timeRatio: toggles.timeRatio, transmissionWorst: toggles.transmissionWorst, circuit: 'open', place: t, family }
}

/**
 * Swing, time ratio and worst transmission angle of a Grashof crank-rocker in
 * closed form: the rocker's extremes where crank and coupler are in line
 * (|O2B| = b ± a), and μ's extremes at θ2 = 0° and 180°, where the diagonal AO4 is
 * shortest and longest.
 */
export function crankRockerToggles(d: number, a: number, b: number, c: number): { swing: number; timeRatio: number; transmissionWorst: number } {
  const clamp = (v: number): number => Math.min(1, Math.max(-1, v))
  const gammaE = Math.acos(clamp((d * d + c * c - (a + b) ** 2) / (2 * d * c)))
  const gammaF = Math.acos(clamp((d * d + c * c - (b - a) ** 2) / (2 * d * c)))
  const psiE = Math.acos(clamp((d * d + (a + b) ** 2 - c * c) / (2 * d * (a + b))))
  const psiF = Math.acos(clamp((d * d + (b - a) ** 2 - c * c) / (2 * d * (b - a))))
  const alpha = Math.abs(psiF - psiE)
  const muMin = Math.acos(clamp((b * b + c * c - (d - a) ** 2) / (2 * b * c)))
  const muMax = Math.acos(clamp((b * b + c * c - (d + a) ** 2) / (2 * b * c)))
  return { swing: Math.abs(gammaE - gammaF), timeRatio: (Math.PI + alpha) / (Math.PI - alpha), transmissionWorst: Math.min(muMin, Math.PI - muMax) }
}

/**
 * The crank-rocker with the best worst transmission angle for swing ψ (0 < ψ < 180°)
 * and time ratio Q (1 < Q < 3): the pivot's place scanned over both circles, then
 * refined by golden-section search. Throws when no place gives a crank-rocker. (For
 * Q = 1 the best runs off to a vanishing crank: see unitTimeRatioCrankRocker.)
 */
export function bestCrankRocker(swing: number, timeRatio: number, scale: { readonly ground: number } | { readonly output: number }): CrankRockerDesign {
  requireFinite('swing', swing)
  requireFinite('time ratio', timeRatio)
  if (!(swing > 0 && swing < Math.PI)) throw new LinkageError('invalid-number', `The output swing must lie between 0° and 180°, got ${(swing * 180) / Math.PI}°`, { swing })
  if (!(timeRatio >= 1 && timeRatio < 3)) throw new LinkageError('invalid-number', `The time ratio must lie from 1 up to 3, got ${timeRatio}`, { timeRatio })
  if ('ground' in scale) requireLength('ground link', scale.ground)
  else requireLength('output link', scale.output)
  if (timeRatio === 1) {
    throw new LinkageError('invalid-number', 'For a time ratio of 1 the best transmission angle runs off to a vanishing crank: give the least transmission angle wanted (the unit-time-ratio construction)', { timeRatio })
  }
  const score = (t: number, family: 0 | 1): number => crankRockerAt(swing, timeRatio, scale, t, family)?.transmissionWorst ?? -1
  let best: { t: number; family: 0 | 1; value: number; step: number } | null = null
  const n = 720
  for (const family of [0, 1] as const) {
    for (let i = 0; i < n; i++) {
      const t = (2 * Math.PI * (i + 0.5)) / n
      const value = score(t, family)
      if (value > (best?.value ?? -0.5)) best = { t, family, value, step: (2 * Math.PI) / n }
    }
  }
  if (!best) throw new LinkageError('cannot-assemble', `No crank-rocker gives a swing of ${((swing * 180) / Math.PI).toFixed(3)}° at time ratio ${timeRatio}`, { swing, timeRatio })
  const golden = (Math.sqrt(5) - 1) / 2
  let lo = best.t - best.step
  let hi = best.t + best.step
  const f = (t: number): number => score(t, best!.family)
  let x1 = hi - golden * (hi - lo)
  let x2 = lo + golden * (hi - lo)
  let f1 = f(x1)
  let f2 = f(x2)
  for (let k = 0; k < 80 && hi - lo > 1e-10; k++) {
    if (f1 < f2) {
      lo = x1
      x1 = x2
      f1 = f2
      x2 = lo + golden * (hi - lo)
      f2 = f(x2)
    } else {
      hi = x2
      x2 = x1
      f2 = f1
      x1 = hi - golden * (hi - lo)
      f1 = f(x1)
    }
  }
  const t = f1 > f2 ? x1 : x2
  const refined = crankRockerAt(swing, timeRatio, scale, t, best.family)
  const design = refined && refined.transmissionWorst >= best.value ? refined : crankRockerAt(swing, timeRatio, scale, best.t, best.family)!
  return confirmed(design, swing, timeRatio)
}

/** The design confirmed by the forward analysis: the circuit that gives the swing and the time ratio, and its figures. */
function confirmed(design: CrankRockerDesign, swing: number, timeRatio: number): CrankRockerDesign {
  for (const circuit of ['open', 'crossed'] as const) {
    const analysis = analyseFourBar(fourBar({ ground: design.ground, input: design.input, coupler: design.coupler, output: design.output, circuit }), { speed: 1 })
    if (analysis.outputSwing === null || analysis.timeRatio === null) continue
    if (Math.abs(analysis.outputSwing - swing) < 1e-7 && Math.abs(analysis.timeRatio - timeRatio) < 1e-7 * timeRatio) {
      return { ...design, circuit, swing: analysis.outputSwing, timeRatio: analysis.timeRatio, transmissionWorst: analysis.transmissionWorst.value }
    }
  }
  throw new LinkageError('cannot-assemble', 'The construction’s crank-rocker does not give the swing and time ratio on either circuit', { ...design })
}

/**
 * The unit-time-ratio crank-rocker for swing ψ and least transmission angle μ
 * with ground d, in closed form: a² + d² = b² + c² and sin(ψ/2) = a/c, so
 * b = d·sin(ψ/2)/cos μ, c = d·√(1 − (b/d)²)/cos(ψ/2), a = c·sin(ψ/2).
 */
export function unitTimeRatioCrankRocker(swing: number, transmissionMin: number, ground: number): { ground: number; input: number; coupler: number; output: number } {
  requireLength('ground link', ground)
  const b = (ground * Math.sin(swing / 2)) / Math.cos(transmissionMin)
  if (!(b < ground)) throw new LinkageError('cannot-assemble', 'No unit-time-ratio crank-rocker has that swing and least transmission angle: the coupler would reach the ground length', { swing, transmissionMin })
  const c = (ground * Math.sqrt(1 - (b / ground) ** 2)) / Math.cos(swing / 2)
  return { ground, input: c * Math.sin(swing / 2), coupler: b, output: c }
}

/** A function generator through three precision points. */
export interface FunctionGenerator {
  readonly ground: number
  readonly input: number
  readonly coupler: number
  readonly output: number
  readonly circuit: Circuit
  /** Freudenstein's constants K1 = d/a, K2 = d/c, K3 = (a² − b² + c² + d²)/(2ac). */
  readonly k: readonly [number, number, number]
  /** The precision points: x, y, and the input and output angles there (rad). */
  readonly points: readonly { readonly x: number; readonly y: number; readonly input: number; readonly output: number }[]
  /** Structural error over the range: the greatest |y_generated − f(x)| and where, and the same in output angle. */
  readonly errorMax: number
  readonly errorMaxAt: number
  readonly angleErrorMax: number
  /** x, and the error y_generated − f(x), at evenly spaced points over the range. */
  readonly errorCurve: { readonly x: Float64Array; readonly error: Float64Array }
}

/** Chebyshev spacing of n precision points over [x0, xf]. */
export function chebyshevPoints(x0: number, xf: number, n = 3): number[] {
  return Array.from({ length: n }, (_, j) => (x0 + xf) / 2 - ((xf - x0) / 2) * Math.cos(((2 * (j + 1) - 1) * Math.PI) / (2 * n)))
}

/**
 * A four-bar whose output angle follows y = f(x) for x in [x0, xf]: the input
 * angle θ2 = θ2s + (x − x0)/(xf − x0)·Δθ2 and the output θ4 = θ4s + (y − y0)/(yf − y0)·Δθ4
 * (angles from the ground line O2→O4), exact at the three Chebyshev points.
 * Freudenstein's equation K1 cos θ4 − K2 cos θ2 + K3 = cos(θ2 − θ4) at the three
 * points is a linear system in K1, K2, K3; then a = d/K1, c = d/K2,
 * b² = a² + c² + d² − 2ac·K3. The circuit that passes through all three points is
 * taken (the branch defect is refused), and the structural error found over the range.
 */
export function functionGenerator(
  f: (x: number) => number,
  range: { readonly x0: number; readonly xf: number },
  input: { readonly start: number; readonly span: number },
  output: { readonly start: number; readonly span: number },
  ground: number,
  samples = 401,
): FunctionGenerator {
  requireLength('ground link', ground)
  for (const [name, v] of [['x start', range.x0], ['x end', range.xf], ['input start', input.start], ['input span', input.span], ['output start', output.start], ['output span', output.span]] as const) requireFinite(name, v)
  if (!(range.xf > range.x0)) throw new LinkageError('invalid-number', 'The function’s range must end above its start')
  const y0 = f(range.x0)
  const yf = f(range.xf)
  if (!Number.isFinite(y0) || !Number.isFinite(yf) || y0 === yf) throw new LinkageError('invalid-number', 'The function must be finite at the ends of its range and differ between them')
  const theta2 = (x: number): number => input.start + ((x - range.x0) / (range.xf - range.x0)) * input.span
  const theta4 = (y: number): number => output.start + ((y - y0) / (yf - y0)) * output.span
  const xs = chebyshevPoints(range.x0, range.xf)
  const points = xs.map((x) => {
    const y = f(x)
    if (!Number.isFinite(y)) throw new LinkageError('invalid-number', `The function is not finite at the precision point x = ${x}`)
    return { x, y, input: theta2(x), output: theta4(y) }
  })
  // K1 cos θ4 − K2 cos θ2 + K3 = cos(θ2 − θ4): three equations, Cramer's rule.
  const rows = points.map((p) => [Math.cos(p.output), -Math.cos(p.input), 1, Math.cos(p.input - p.output)] as const)
  const det3 = (m: readonly (readonly number[])[]): number =>
    m[0]![0]! * (m[1]![1]! * m[2]![2]! - m[1]![2]! * m[2]![1]!) - m[0]![1]! * (m[1]![0]! * m[2]![2]! - m[1]![2]! * m[2]![0]!) + m[0]![2]! * (m[1]![0]! * m[2]![1]! - m[1]![1]! * m[2]![0]!)
  const A = rows.map((r) => [r[0], r[1], r[2]])
  const D = det3(A)
  if (!(Math.abs(D) > 1e-12)) throw new LinkageError('cannot-assemble', 'The three precision points give a singular system: choose other angle ranges')
  const K = [0, 1, 2].map((col) => det3(A.map((r, i) => r.map((v, j) => (j === col ? rows[i]![3] : v)))) / D) as [number, number, number]
  const a = ground / K[0]
  const c = ground / K[1]
  const b2 = a * a + c * c + ground * ground - 2 * a * c * K[2]
  if (!(a > 0 && c > 0 && b2 > 0)) {
    throw new LinkageError('cannot-assemble', `The precision points need link lengths that are not positive (a = ${a.toFixed(6)}, c = ${c.toFixed(6)}, b² = ${b2.toFixed(6)} in ground lengths ${ground}): choose other angle ranges`, { a, c, b2 })
  }
  const b = Math.sqrt(b2)
  // The circuit through all three points.
  const state = new Float64Array(FOUR_BAR_STATE)
  let chosen: Circuit | null = null
  for (const circuit of ['open', 'crossed'] as const) {
    const linkage = fourBar({ ground, input: a, coupler: b, output: c, circuit })
    const hits = points.every((p) => fourBarState(linkage, p.input, state) && Math.abs(Math.atan2(Math.sin(state[THETA4]! - p.output), Math.cos(state[THETA4]! - p.output))) < 1e-7)
    if (hits) {
      chosen = circuit
      break
    }
  }
  if (!chosen) throw new LinkageError('cannot-assemble', 'No one assembly circuit passes through all three precision points (the branch defect): choose other angle ranges')
  const linkage = fourBar({ ground, input: a, coupler: b, output: c, circuit: chosen })
  const ex = new Float64Array(samples)
  const err = new Float64Array(samples)
  let errorMax = 0
  let errorMaxAt = range.x0
  let angleErrorMax = 0
  for (let i = 0; i < samples; i++) {
    const x = range.x0 + ((range.xf - range.x0) * i) / (samples - 1)
    ex[i] = x
    if (!fourBarState(linkage, theta2(x), state)) {
      err[i] = Number.NaN
      continue
    }
    const dAngle = Math.atan2(Math.sin(state[THETA4]! - theta4(f(x))), Math.cos(state[THETA4]! - theta4(f(x))))
    const generated = y0 + ((theta4(f(x)) + dAngle - output.start) / output.span) * (yf - y0)
    err[i] = generated - f(x)
    if (Math.abs(err[i]!) > Math.abs(errorMax)) { errorMax = err[i]!; errorMaxAt = x }
    angleErrorMax = Math.max(angleErrorMax, Math.abs(dAngle))
  }
  return { ground, input: a, coupler: b, output: c, circuit: chosen, k: K, points, errorMax: Math.abs(errorMax), errorMaxAt, angleErrorMax, errorCurve: { x: ex, error: err } }
}
