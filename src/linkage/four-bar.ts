/**
 * Four-bar linkage: Grashof class, closed-form position of both circuits, and the
 * first- and second-order kinematic coefficients of coupler and output.
 *
 * Frame: input pivot O2 at the origin, output pivot O4 at `ground` along the
 * ground angle γ (γ = 0 puts O4 on +x). Input a = O2A, coupler b = AB,
 * output c = O4B. θ2, θ3, θ4 are absolute angles of O2→A, A→B and O4→B.
 */

import { LinkageError, mm, requireFinite, requireLength } from './errors.js'
import { GEOMETRY_TOLERANCE, TAU, clampedAcos, wrapTurn } from './math.js'
import type { AngleRange, Circuit, Rotation } from './types.js'

/** Grashof classes as the standard kinematics texts name them. */
export type GrashofClass =
  | 'crank-rocker'
  | 'rocker-crank'
  | 'double-crank'
  | 'double-rocker'
  | 'triple-rocker'
  | 'change-point'

/** Result of the Grashof test on four link lengths. */
export interface GrashofResult {
  /** 'grashof' when s + l < p + q, 'non-grashof' when s + l > p + q, 'change-point' when equal. */
  readonly condition: 'grashof' | 'non-grashof' | 'change-point'
  readonly className: GrashofClass
  /** Class in words, e.g. "Grashof crank-rocker". */
  readonly label: string
  /** Sum of the shortest and longest links, s + l. */
  readonly shortPlusLong: number
  /** Sum of the other two links, p + q. */
  readonly otherTwo: number
  /** Which link is shortest. */
  readonly shortest: 'ground' | 'input' | 'coupler' | 'output'
  /** Whether each moving link can make full turns relative to the ground (for a change-point linkage: of its usual assembly). */
  readonly inputTurnsFully: boolean
  readonly couplerTurnsFully: boolean
  readonly outputTurnsFully: boolean
  /**
   * The shape of a change-point linkage: opposite links equal in pairs (parallelogram,
   * whose crossed assembly is the antiparallelogram), adjacent links equal in pairs
   * (deltoid, or kite), all four equal (rhombus), or none of these; null otherwise.
   */
  readonly form: 'parallelogram' | 'deltoid' | 'rhombus' | 'general' | null
}

const LINK_NAMES = ['ground', 'input', 'coupler', 'output'] as const

/**
 * Grashof's condition and the class of a four-bar.
 * Equality is decided within GEOMETRY_TOLERANCE × (sum of the four links).
 */
export function grashof(ground: number, input: number, coupler: number, output: number): GrashofResult {
  requireLength('ground link', ground)
  requireLength('input link', input)
  requireLength('coupler', coupler)
  requireLength('output link', output)
  const lengths = [ground, input, coupler, output]
  let shortestIndex = 0
  let longest = lengths[0]!
  for (let i = 1; i < 4; i++) {
    if (lengths[i]! < lengths[shortestIndex]!) shortestIndex = i
    if (lengths[i]! > longest) longest = lengths[i]!
  }
  const s = lengths[shortestIndex]!
  const sum = ground + input + coupler + output
  const shortPlusLong = s + longest
  const otherTwo = sum - shortPlusLong
  const shortest = LINK_NAMES[shortestIndex]!
  const equal = Math.abs(shortPlusLong - otherTwo) <= GEOMETRY_TOLERANCE * sum
  if (!equal && shortPlusLong > otherTwo) {
    return {
      condition: 'non-grashof',
      className: 'triple-rocker',
      label: 'non-Grashof triple-rocker',
      shortPlusLong,
      otherTwo,
      shortest,
      inputTurnsFully: false,
      couplerTurnsFully: false,
      outputTurnsFully: false,
      form: null,
    }
  }
  // Grashof (or its boundary): the shortest link turns fully relative to all others.
  const turns = {
    inputTurnsFully: shortest === 'ground' || shortest === 'input',
    couplerTurnsFully: shortest === 'ground' || shortest === 'coupler',
    outputTurnsFully: shortest === 'ground' || shortest === 'output',
  }
  if (equal) {
    const same = (x: number, y: number): boolean => Math.abs(x - y) <= GEOMETRY_TOLERANCE * sum
    const opposite = same(ground, coupler) && same(input, output)
    const adjacent = (same(ground, input) && same(coupler, output)) || (same(input, coupler) && same(output, ground))
    const form = opposite && adjacent ? 'rhombus' : opposite ? 'parallelogram' : adjacent ? 'deltoid' : 'general'
    const words = { rhombus: 'rhombus', parallelogram: 'parallelogram', deltoid: 'deltoid (kite)', general: 's + l = p + q' }[form]
    return {
      condition: 'change-point',
      className: 'change-point',
      label: `change-point linkage, ${words}`,
      shortPlusLong,
      otherTwo,
      shortest,
      ...turns,
      form,
    }
  }
  const byShortest = {
    ground: ['double-crank', 'Grashof double-crank (drag link)'],
    input: ['crank-rocker', 'Grashof crank-rocker'],
    output: ['rocker-crank', 'Grashof rocker-crank'],
    coupler: ['double-rocker', 'Grashof double-rocker'],
  } as const
  const [className, label] = byShortest[shortest]
  return { condition: 'grashof', className, label, shortPlusLong, otherTwo, shortest, ...turns, form: null }
}

/** A checked four-bar, ready for evaluation. */
export interface FourBarLinkage {
  readonly ground: number
  readonly input: number
  readonly coupler: number
  readonly output: number
  /** Angle of the ground line O2→O4 from +x, rad. */
  readonly groundAngle: number
  /** Position of O4. */
  readonly groundX: number
  readonly groundY: number
  readonly circuit: Circuit
  /** Sign used by the dyad solution: +1 open, -1 crossed (for γ = 0 and any γ). */
  readonly circuitSign: 1 | -1
  readonly rotation: Rotation
  /** Which link drives: the input (crank) or the output (rocker). */
  readonly driver: 'input' | 'output'
  /** Coupler point: distance from A and angle from the line A→B, or null. */
  readonly couplerPoint: { readonly distance: number; readonly angle: number } | null
  /** For a change-point linkage whose input turns fully: the assembly followed through the change points; else null. */
  readonly branch: FourBarBranch | null
}

/**
 * The assembly of a change-point linkage followed through its change points.
 * There all four links fall in line and the circle-intersection sign that gives
 * the chosen assembly can change; between them it is fixed.
 */
export interface FourBarBranch {
  /** Input angles of the change points over the period, ascending from the ground angle (rad, absolute). */
  readonly changePoints: readonly number[]
  /** Dyad sign on each interval: signs[i] holds from changePoints[i] to the next (the last to the period's end). */
  readonly signs: readonly (1 | -1)[]
  /** Input turns before the motion repeats: 2 when a deltoid's output needs two input turns to come back. */
  readonly turns: 1 | 2
  /** True when no intervals of the period were forced onto the other assembly to stay continuous. */
  readonly assemblyKept: boolean
}

/** Options for {@link fourBar}. */
export interface FourBarInput {
  readonly ground: number
  readonly input: number
  readonly coupler: number
  readonly output: number
  /** Default 'open'. */
  readonly circuit?: Circuit | null
  /** Default 0. */
  readonly groundAngle?: number | null
  /** Default +1 (counter-clockwise). */
  readonly rotation?: Rotation | null
  /** Default 'input'. */
  readonly driver?: 'input' | 'output' | null
  readonly couplerPoint?: { readonly distance: number; readonly angle: number } | null
}

/** Check and normalise a four-bar. Throws {@link LinkageError} for bad lengths. */
export function fourBar(options: FourBarInput): FourBarLinkage {
  requireLength('ground link', options.ground)
  requireLength('input link', options.input)
  requireLength('coupler', options.coupler)
  requireLength('output link', options.output)
  const groundAngle = options.groundAngle ?? 0
  requireFinite('ground angle', groundAngle)
  const circuit = options.circuit ?? 'open'
  if (circuit !== 'open' && circuit !== 'crossed') {
    throw new LinkageError('invalid-choice', `The circuit must be "open" or "crossed", got "${String(circuit)}"`)
  }
  const point = options.couplerPoint ?? null
  if (point) {
    requireFinite('coupler-point angle', point.angle)
    if (!(point.distance >= 0) || !Number.isFinite(point.distance)) {
      throw new LinkageError(
        'invalid-coupler-point',
        `The coupler-point distance must be zero or more, got ${mm(point.distance)}`,
        { distance: point.distance },
      )
    }
  }
  const { ground, input, coupler, output } = options
  const longest = Math.max(ground, input, coupler, output)
  const sum = ground + input + coupler + output
  if (longest > sum - longest) {
    throw new LinkageError(
      'cannot-assemble',
      `The four links cannot close a loop: the longest (${mm(longest)}) exceeds the sum of the other three (${mm(sum - longest)})`,
      { longest, others: sum - longest },
    )
  }
  const plain = {
    ground,
    input,
    coupler,
    output,
    groundAngle,
    groundX: ground * Math.cos(groundAngle),
    groundY: ground * Math.sin(groundAngle),
    circuit,
    circuitSign: circuit === 'open' ? (1 as const) : (-1 as const),
    rotation: options.rotation ?? 1,
    driver: options.driver ?? 'input',
    couplerPoint: point,
    branch: null,
  }
  return { ...plain, branch: followBranch(plain) }
}

/** Change-point input angles in [γ, γ + 2π): where the triangle A-B-O4 flattens (|AO4| = b + c, |b − c| or 0). */
function changePointAngles(linkage: FourBarLinkage): number[] {
  const { ground: d, input: a, coupler: b, output: c, groundAngle } = linkage
  const angles: number[] = []
  for (const reach of [b + c, Math.abs(b - c)]) {
    const cos = snapUnit((a * a + d * d - reach * reach) / (2 * a * d))
    if (!(Math.abs(cos) <= 1)) continue
    const psi = Math.acos(cos)
    for (const theta of psi === 0 ? [0] : psi === Math.PI ? [Math.PI] : [psi, TAU - psi]) {
      if (!angles.some((t) => Math.abs(t - theta) < 1e-9)) angles.push(theta)
    }
  }
  return angles.sort((p, q) => p - q).map((t) => groundAngle + t)
}

/**
 * A cosine within 1e-9 of ±1 taken as ±1: the lengths of a change-point linkage
 * meet s + l = p + q only to rounding, and the change point is then exactly where
 * the links fall in line (else the two assemblies would miss each other by ~1e-8 rad
 * and the rates there would be noise).
 */
function snapUnit(cos: number): number {
  return Math.abs(Math.abs(cos) - 1) < 1e-9 ? Math.sign(cos) : cos
}

/** True when the quadrilateral O2-A-B-O4 crosses itself (two opposite sides cross, interiors only). */
function crossesItself(ax: number, ay: number, bx: number, by: number, gx: number, gy: number): boolean {
  return segmentsCross(0, 0, ax, ay, bx, by, gx, gy) || segmentsCross(ax, ay, bx, by, gx, gy, 0, 0)
}

function segmentsCross(x1: number, y1: number, x2: number, y2: number, x3: number, y3: number, x4: number, y4: number): boolean {
  const side = (px: number, py: number, qx: number, qy: number, rx: number, ry: number): number => (qx - px) * (ry - py) - (qy - py) * (rx - px)
  const d1 = side(x3, y3, x4, y4, x1, y1)
  const d2 = side(x3, y3, x4, y4, x2, y2)
  const d3 = side(x1, y1, x2, y2, x3, y3)
  const d4 = side(x1, y1, x2, y2, x4, y4)
  const scale = 1e-9 * (Math.abs(x1) + Math.abs(y1) + Math.abs(x2) + Math.abs(y2) + Math.abs(x3) + Math.abs(y3) + Math.abs(x4) + Math.abs(y4)) ** 2
  return ((d1 > scale && d2 < -scale) || (d1 < -scale && d2 > scale)) && ((d3 > scale && d4 < -scale) || (d3 < -scale && d4 > scale))
}

/**
 * Follow the chosen assembly of a change-point linkage whose input turns fully.
 * On each interval between change points the dyad sign is the one whose
 * quadrilateral is (open) or is not (crossed) self-crossing; where that would make
 * the output jump (a deltoid whose input pin passes over the output pivot), the
 * sign that keeps it continuous is taken instead, and the period may become two turns.
 */
function followBranch(linkage: FourBarLinkage): FourBarBranch | null {
  const klass = grashof(linkage.ground, linkage.input, linkage.coupler, linkage.output)
  if (klass.condition !== 'change-point' || !fourBarRange(linkage).full) return null
  const once = changePointAngles(linkage)
  if (once.length === 0) return null
  const { input: a, coupler: b, groundX, groundY } = linkage
  const state = new Float64Array(FOUR_BAR_STATE)
  const at = (theta: number, sign: number): { theta4: number; h4: number } =>
    solveNearChangePoint(linkage, sign, theta, state, 0) ? { theta4: state[THETA4]!, h4: state[H4]! } : { theta4: Number.NaN, h4: Number.NaN }
  const crossed = (theta: number, sign: number): boolean | null => {
    if (!solveNearChangePoint(linkage, sign, theta, state, 0)) return null
    const ax = a * Math.cos(theta)
    const ay = a * Math.sin(theta)
    return crossesItself(ax, ay, ax + b * Math.cos(state[THETA3]!), ay + b * Math.sin(state[THETA3]!), groundX, groundY)
  }
  const wantCrossed = linkage.circuit === 'crossed'
  const step = 1e-5
  const changePoints: number[] = []
  const signs: (1 | -1)[] = []
  let kept = true
  let previous: 1 | -1 | null = null
  /** How far the motion jumps at `start` going on with `sign`: the output angle, then its rate. */
  const jump = (start: number, sign: number): [number, number] => {
    const before = at(start - step, previous!)
    const after = at(start + step, sign)
    return [Math.abs(wrapHalfTurnLocal(after.theta4 - before.theta4)), Math.abs(after.h4 - before.h4)]
  }
  for (let turn = 0; turn < 2; turn++) {
    for (let i = 0; i < once.length; i++) {
      const start = once[i]! + turn * TAU
      const end = (i + 1 < once.length ? once[i + 1]! : once[0]! + TAU) + turn * TAU
      const middle = (start + end) / 2
      // The signs whose shape is the chosen assembly (both, when the other is degenerate).
      const shapes = ([1, -1] as const).filter((sign) => crossed(middle, sign) === wantCrossed)
      const candidates: (1 | -1)[] = shapes.length === 1 ? [shapes[0]!] : [1, -1]
      let sign: 1 | -1
      if (previous === null) {
        sign = candidates.includes(linkage.circuitSign) ? linkage.circuitSign : candidates[0]!
      } else {
        // Of the candidates, the one that goes on smoothly; if none can without a jump of the output, the other sign.
        const scored = candidates.map((s) => ({ s, j: jump(start, s) })).filter((x) => x.j[0] < 1e-3)
        scored.sort((p, q) => p.j[1] - q.j[1])
        if (scored.length > 0) sign = scored[0]!.s
        else {
          sign = -candidates[0]! as 1 | -1
          kept = false
        }
      }
      changePoints.push(start)
      signs.push(sign)
      previous = sign
    }
    // Back where it started after this many turns, going on smoothly: that is the period.
    const close = once[0]! + TAU * (turn + 1)
    const [dTheta, dRate] = jump(close, signs[0]!)
    if (dTheta < 1e-3 && dRate < 1e-2 * (1 + Math.abs(at(close + step, signs[0]!).h4))) {
      return { changePoints, signs, turns: (turn + 1) as 1 | 2, assemblyKept: kept }
    }
  }
  return { changePoints, signs, turns: 2, assemblyKept: kept }
}

function wrapHalfTurnLocal(angle: number): number {
  const wrapped = ((angle % TAU) + TAU) % TAU
  return wrapped > Math.PI ? wrapped - TAU : wrapped
}

/** The dyad sign of the followed assembly at input angle θ2 (rad, any turn). */
export function branchSign(linkage: FourBarLinkage, theta2: number): 1 | -1 {
  const branch = linkage.branch
  if (branch === null) return linkage.circuitSign
  const period = TAU * branch.turns
  const first = branch.changePoints[0]!
  const t = first + ((((theta2 - first) % period) + period) % period)
  let index = 0
  for (let i = 1; i < branch.changePoints.length; i++) if (t >= branch.changePoints[i]!) index = i
  return branch.signs[index]!
}

/** Distance (rad) from θ2 to the nearest change point, or Infinity for a linkage without them. */
function changePointDistance(linkage: FourBarLinkage, theta2: number): number {
  const branch = linkage.branch
  if (branch === null) return Number.POSITIVE_INFINITY
  let best = Number.POSITIVE_INFINITY
  for (const cp of branch.changePoints) best = Math.min(best, Math.abs(wrapHalfTurnLocal(theta2 - cp)))
  return best
}

/** How close to a change point (rad) its state is taken as the mean of the two sides: the solution is 0/0 there. */
const CHANGE_POINT_BAND = 1e-9
const CHANGE_POINT_STEP = 1e-6

/**
 * {@link solveFourBar} on the linkage's own assembly: the chosen circuit, followed
 * through the change points of a change-point linkage. At a change point itself
 * the state is the mean of the states a micro-radian either side (the closed form
 * is 0/0 there). No allocation.
 */
export function fourBarState(linkage: FourBarLinkage, theta2: number, out: Float64Array, at = 0): boolean {
  const { input, coupler, output, groundX, groundY } = linkage
  if (linkage.branch === null) return solveFourBar(input, coupler, output, groundX, groundY, linkage.circuitSign, theta2, out, at)
  if (changePointDistance(linkage, theta2) > CHANGE_POINT_BAND) {
    return solveNearChangePoint(linkage, branchSign(linkage, theta2), theta2, out, at)
  }
  const lo = theta2 - CHANGE_POINT_STEP
  const hi = theta2 + CHANGE_POINT_STEP
  if (!solveNearChangePoint(linkage, branchSign(linkage, lo), lo, out, at)) return false
  const t3 = out[at + THETA3]!
  const t4 = out[at + THETA4]!
  const rates = [out[at + H3]!, out[at + H4]!, out[at + H3P]!, out[at + H4P]!]
  if (!solveNearChangePoint(linkage, branchSign(linkage, hi), hi, out, at)) return false
  out[at + THETA3] = t3 + wrapHalfTurnLocal(out[at + THETA3]! - t3) / 2
  out[at + THETA4] = t4 + wrapHalfTurnLocal(out[at + THETA4]! - t4) / 2
  out[at + H3] = (rates[0]! + out[at + H3]!) / 2
  out[at + H4] = (rates[1]! + out[at + H4]!) / 2
  out[at + H3P] = (rates[2]! + out[at + H3P]!) / 2
  out[at + H4P] = (rates[3]! + out[at + H4P]!) / 2
  return true
}

/** Indices into the state array written by {@link solveFourBar}. */
export const THETA3 = 0
export const THETA4 = 1
/** dθ3/dθ2 */
export const H3 = 2
/** dθ4/dθ2 */
export const H4 = 3
/** d²θ3/dθ2² */
export const H3P = 4
/** d²θ4/dθ2² */
export const H4P = 5
/** Length of the state array. */
export const FOUR_BAR_STATE = 6

/**
 * Close the loop at input angle θ2 and write θ3, θ4 and the kinematic
 * coefficients into `out` from index `at` (6 slots, see THETA3…H4P). Returns
 * false and writes NaN where the loop cannot close. No allocation.
 */
export function solveFourBar(
  input: number,
  coupler: number,
  output: number,
  groundX: number,
  groundY: number,
  circuitSign: number,
  theta2: number,
  out: Float64Array,
  at = 0,
): boolean {
  const c2 = Math.cos(theta2)
  const s2 = Math.sin(theta2)
  const ax = input * c2
  const ay = input * s2
  // Diagonal from the input pin A to the output pivot O4.
  const wx = groundX - ax
  const wy = groundY - ay
  const diagonal2 = wx * wx + wy * wy
  const diagonal = Math.sqrt(diagonal2)
  const cosBeta = (coupler * coupler + diagonal2 - output * output) / (2 * coupler * diagonal)
  if (!(Math.abs(cosBeta) <= 1 + GEOMETRY_TOLERANCE) || diagonal === 0) {
    out.fill(Number.NaN, at, at + FOUR_BAR_STATE)
    return false
  }
  const theta3 = Math.atan2(wy, wx) + circuitSign * clampedAcos(cosBeta)
  const c3 = Math.cos(theta3)
  const s3 = Math.sin(theta3)
  const theta4 = Math.atan2(ay + coupler * s3 - groundY, ax + coupler * c3 - groundX)
  rates(input, coupler, output, c2, s2, ax, ay, theta3, c3, s3, theta4, Math.cos(theta4), Math.sin(theta4), out, at)
  return true
}

/**
 * {@link solveFourBar} for a change-point linkage, where the triangle A-B-O4
 * flattens and the law of cosines loses its digits (acos near ±1): the angle β
 * at A comes from its sine, whose vanishing factors r² − |AO4|² (r = b + c and
 * |b − c|) are written as products of sines of half-angle sums (exact near the
 * change point). Same slots, no allocation.
 */
function solveNearChangePoint(linkage: FourBarLinkage, sign: number, theta2: number, out: Float64Array, at: number): boolean {
  const { input: a, coupler: b, output: c, ground: d, groundX, groundY, groundAngle } = linkage
  const c2 = Math.cos(theta2)
  const s2 = Math.sin(theta2)
  const ax = a * c2
  const ay = a * s2
  const wx = groundX - ax
  const wy = groundY - ay
  const w2 = wx * wx + wy * wy
  const w = Math.sqrt(w2)
  if (w === 0) {
    out.fill(Number.NaN, at, at + FOUR_BAR_STATE)
    return false
  }
  const phi = theta2 - groundAngle
  // r² − w² = 2ad(cos φ − cos ψ_r) = −4ad·sin((φ + ψ_r)/2)·sin((φ − ψ_r)/2) where cos ψ_r = (a² + d² − r²)/(2ad).
  const gap = (r: number): number => {
    const cos = snapUnit((a * a + d * d - r * r) / (2 * a * d))
    if (!(Math.abs(cos) <= 1)) return r * r - w2
    const psi = Math.acos(cos)
    return -4 * a * d * Math.sin((phi + psi) / 2) * Math.sin((phi - psi) / 2)
  }
  const outer = gap(b + c) / (b + c + w)
  const inner = -gap(Math.abs(b - c)) / (w + Math.abs(b - c))
  const sinSquared = ((b + c + w) * Math.max(0, outer) * Math.max(0, inner) * (w + Math.abs(b - c))) / (4 * b * b * w2)
  const cosBeta = (b * b + w2 - c * c) / (2 * b * w)
  const beta = Math.atan2(Math.sqrt(sinSquared), cosBeta)
  const theta3 = Math.atan2(wy, wx) + sign * beta
  const c3 = Math.cos(theta3)
  const s3 = Math.sin(theta3)
  const theta4 = Math.atan2(ay + b * s3 - groundY, ax + b * c3 - groundX)
  writeRates(a, b, c, c2, s2, ax, ay, theta3, theta4, out, at)
  return true
}

/** θ3, θ4 and the velocity and acceleration coefficients from the loop closure, into `out` from `at`. */
function writeRates(a: number, b: number, c: number, c2: number, s2: number, ax: number, ay: number, theta3: number, theta4: number, out: Float64Array, at: number): void {
  rates(a, b, c, c2, s2, ax, ay, theta3, Math.cos(theta3), Math.sin(theta3), theta4, Math.cos(theta4), Math.sin(theta4), out, at)
}

/**
 * The one place the four-bar's rates are written: loop closure differentiated
 * once and twice, solved by Cramer's rule (det ∝ sin(θ3 − θ4)), with the
 * angles' cosines and sines the caller already has.
 */
function rates(a: number, b: number, c: number, c2: number, s2: number, ax: number, ay: number, theta3: number, c3: number, s3: number, theta4: number, c4: number, s4: number, out: Float64Array, at: number): void {
  const sin34 = s3 * c4 - c3 * s4
  const h3 = (-a * (s2 * c4 - c2 * s4)) / (b * sin34)
  const h4 = (-a * (s2 * c3 - c2 * s3)) / (c * sin34)
  const re = ax + b * h3 * h3 * c3 - c * h4 * h4 * c4
  const im = ay + b * h3 * h3 * s3 - c * h4 * h4 * s4
  out[at + THETA3] = theta3
  out[at + THETA4] = theta4
  out[at + H3] = h3
  out[at + H4] = h4
  out[at + H3P] = -(re * c4 + im * s4) / (b * sin34)
  out[at + H4P] = -(re * c3 + im * s3) / (c * sin34)
}

/** Input-angle range where the loop closes: a full turn, or the interval between the input's limit positions. */
export interface FourBarRange {
  readonly full: boolean
  /** The analysed range of θ2 (absolute). */
  readonly range: AngleRange
  /** Limit (toggle) positions of the input where coupler and output fall in line, or null when it turns fully. */
  readonly limits: readonly [number, number] | null
}

/**
 * Where the input can move. With both limits active the input can rock in two
 * mirror-image ranges; the one above the ground line is returned.
 */
export function fourBarRange(linkage: FourBarLinkage): FourBarRange {
  const { ground: d, input: a, coupler: b, output: c, groundAngle } = linkage
  // cos(θ2 − γ) must lie in [lower, upper] for |b − c| ≤ |AO4| ≤ b + c.
  const lower = (a * a + d * d - (b + c) * (b + c)) / (2 * a * d)
  const upper = (a * a + d * d - (b - c) * (b - c)) / (2 * a * d)
  const tol = GEOMETRY_TOLERANCE * 4
  const lowerActive = lower > -1 + tol
  const upperActive = upper < 1 - tol
  if (!lowerActive && !upperActive) {
    const turns = linkage.branch?.turns ?? 1
    return { full: true, range: { start: groundAngle, end: groundAngle + TAU * turns }, limits: null }
  }
  let start: number
  let end: number
  if (lowerActive && upperActive) {
    start = clampedAcos(upper)
    end = clampedAcos(lower)
  } else if (upperActive) {
    start = clampedAcos(upper)
    end = TAU - start
  } else {
    end = clampedAcos(lower)
    start = -end
  }
  return {
    full: false,
    range: { start: start + groundAngle, end: end + groundAngle },
    limits: [wrapTurn(start + groundAngle), wrapTurn(end + groundAngle)],
  }
}

/** A toggle position of the input and coupler (in line), where the output reverses. */
export interface FourBarToggle {
  /** Input angle, rad in [0, 2π). */
  readonly theta: number
  /** Output angle there, rad. */
  readonly outputAngle: number
  /** 'extended' (input and coupler pointing the same way) or 'folded'. */
  readonly kind: 'extended' | 'folded'
}

/**
 * Input angles where input and coupler fall in line (|O2B| = b ± a) on the
 * linkage's circuit. These are the output's extreme positions when the input
 * turns fully, and the dead points when the output drives.
 */
export function fourBarToggles(linkage: FourBarLinkage): FourBarToggle[] {
  const { input: a, coupler: b, output: c, ground: d, groundAngle } = linkage
  const state = new Float64Array(FOUR_BAR_STATE)
  const result: FourBarToggle[] = []
  for (const kind of ['extended', 'folded'] as const) {
    const reach = kind === 'extended' ? a + b : Math.abs(b - a)
    if (reach === 0) continue
    const cosPsi = (d * d + reach * reach - c * c) / (2 * d * reach)
    if (!(Math.abs(cosPsi) <= 1 + GEOMETRY_TOLERANCE)) continue
    const psi = clampedAcos(cosPsi)
    let best: FourBarToggle | null = null
    let bestResidual = Number.POSITIVE_INFINITY
    for (const side of [1, -1]) {
      // B lies at angle γ ± ψ from O2; A lies along O2B when extended, opposite when folded (b > a).
      const bAngle = groundAngle + side * psi
      const theta = wrapTurn(kind === 'extended' || b < a ? bAngle : bAngle + Math.PI)
      if (!fourBarState(linkage, theta, state)) continue
      const bx = a * Math.cos(theta) + b * Math.cos(state[THETA3]!)
      const by = a * Math.sin(theta) + b * Math.sin(state[THETA3]!)
      const residual = Math.abs(Math.hypot(bx - reach * Math.cos(bAngle), by - reach * Math.sin(bAngle)))
      if (residual < bestResidual) {
        bestResidual = residual
        best = { theta, outputAngle: state[THETA4]!, kind }
      }
    }
    if (best && bestResidual <= 1e-6 * (a + b + c + d)) result.push(best)
  }
  return result
}
