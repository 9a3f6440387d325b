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
  /** Whether each moving link can make full turns relative to the ground. */
  readonly inputTurnsFully: boolean
  readonly couplerTurnsFully: boolean
  readonly outputTurnsFully: boolean
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
    }
  }
  // Grashof (or its boundary): the shortest link turns fully relative to all others.
  const turns = {
    inputTurnsFully: shortest === 'ground' || shortest === 'input',
    couplerTurnsFully: shortest === 'ground' || shortest === 'coupler',
    outputTurnsFully: shortest === 'ground' || shortest === 'output',
  }
  if (equal) {
    return {
      condition: 'change-point',
      className: 'change-point',
      label: 'change-point linkage (s + l = p + q)',
      shortPlusLong,
      otherTwo,
      shortest,
      ...turns,
    }
  }
  const byShortest = {
    ground: ['double-crank', 'Grashof double-crank (drag link)'],
    input: ['crank-rocker', 'Grashof crank-rocker'],
    output: ['rocker-crank', 'Grashof rocker-crank'],
    coupler: ['double-rocker', 'Grashof double-rocker'],
  } as const
  const [className, label] = byShortest[shortest]
  return { condition: 'grashof', className, label, shortPlusLong, otherTwo, shortest, ...turns }
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
  return {
    ground,
    input,
    coupler,
    output,
    groundAngle,
    groundX: ground * Math.cos(groundAngle),
    groundY: ground * Math.sin(groundAngle),
    circuit,
    circuitSign: circuit === 'open' ? 1 : -1,
    rotation: options.rotation ?? 1,
    driver: options.driver ?? 'input',
    couplerPoint: point,
  }
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
  const c4 = Math.cos(theta4)
  const s4 = Math.sin(theta4)
  // Loop closure differentiated once and twice, solved by Cramer's rule (det ∝ sin(θ3 − θ4)).
  const sin34 = s3 * c4 - c3 * s4
  const h3 = (-input * (s2 * c4 - c2 * s4)) / (coupler * sin34)
  const h4 = (-input * (s2 * c3 - c2 * s3)) / (output * sin34)
  const re = ax + coupler * h3 * h3 * c3 - output * h4 * h4 * c4
  const im = ay + coupler * h3 * h3 * s3 - output * h4 * h4 * s4
  out[at + THETA3] = theta3
  out[at + THETA4] = theta4
  out[at + H3] = h3
  out[at + H4] = h4
  out[at + H3P] = -(re * c4 + im * s4) / (coupler * sin34)
  out[at + H4P] = -(re * c3 + im * s3) / (output * sin34)
  return true
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
    return { full: true, range: { start: groundAngle, end: groundAngle + TAU }, limits: null }
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
      if (!solveFourBar(a, b, c, linkage.groundX, linkage.groundY, linkage.circuitSign, theta, state)) continue
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
