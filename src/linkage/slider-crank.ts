/**
 * Slider-crank: closed form for a straight slider path (in-line or offset), and a
 * circular-arc path solved as the equivalent four-bar (the slider is the pin of a
 * rocker as long as the path radius).
 *
 * Frame: crank axis O at the origin, straight path along y = offset, crank angle
 * θ counter-clockwise from +x. Crank a = OA, rod b = AB, slider pin B.
 */

import { LinkageError, mm, requireFinite, requireLength } from './errors.js'
import {
  FOUR_BAR_STATE,
  H3,
  H3P,
  H4,
  H4P,
  THETA3,
  THETA4,
  fourBar,
  solveFourBar,
  type FourBarLinkage,
} from './four-bar.js'
import { ROOT_TOLERANCE, includedAngle, wrapHalfTurn } from './math.js'
import type { Rotation, SliderSide } from './types.js'

/** Which link drives: the crank (compressor, pump, press, feeder) or the slider (engine, cylinder). */
export type SliderCrankDriver = 'crank' | 'slider'

/** Options for {@link sliderCrank}. */
export interface SliderCrankInput {
  /** Crank radius a, m. */
  readonly crank: number
  /** Connecting-rod length b (pin centres), m. */
  readonly rod: number
  /** Signed offset h of the slider path from the crank axis, m. Default 0 (in-line). */
  readonly offset?: number | null
  /** Assembly branch: +1 slider on the +x side (default), -1 on the -x side. */
  readonly sliderSide?: SliderSide | null
  /**
   * Radius of a circular-arc slider path, m. Positive bends the path towards +y
   * (centre above), negative towards -y. Infinity or omitted: straight path.
   */
  readonly pathRadius?: number | null
  /**
   * x of the point where the arc path touches the straight line y = offset, m.
   * Default: the mid-stroke position of the straight-path linkage.
   */
  readonly pathTangentX?: number | null
  /** Default +1 (counter-clockwise). */
  readonly rotation?: Rotation | null
  /** Default 'crank'. */
  readonly driver?: SliderCrankDriver | null
}

/** A checked slider-crank, ready for evaluation. */
export interface SliderCrankLinkage {
  readonly crank: number
  readonly rod: number
  readonly offset: number
  readonly sliderSide: SliderSide
  readonly rotation: Rotation
  readonly driver: SliderCrankDriver
  /** Infinity for a straight path. */
  readonly pathRadius: number
  /** Tangent point of an arc path (x on the line y = offset); NaN for a straight path. */
  readonly pathTangentX: number
  /** The equivalent four-bar of an arc path (ground O→arc centre, output = |radius|), or null. */
  readonly equivalentFourBar: FourBarLinkage | null
}

/**
 * Check and normalise a slider-crank. Throws {@link LinkageError} for a length
 * that is not positive and finite, or when the rod cannot reach the path at all.
 */
export function sliderCrank(options: SliderCrankInput): SliderCrankLinkage {
  requireLength('crank', options.crank)
  requireLength('connecting rod', options.rod)
  const offset = options.offset ?? 0
  requireFinite('offset', offset)
  const side = options.sliderSide ?? 1
  if (side !== 1 && side !== -1) {
    throw new LinkageError('invalid-choice', `The slider side must be +1 or -1, got ${String(side)}`)
  }
  const rotation = options.rotation ?? 1
  if (rotation !== 1 && rotation !== -1) {
    throw new LinkageError('invalid-choice', `The rotation must be +1 (ccw) or -1 (cw), got ${String(rotation)}`)
  }
  const driver = options.driver ?? 'crank'
  if (driver !== 'crank' && driver !== 'slider') {
    throw new LinkageError('invalid-choice', `The driving link must be "crank" or "slider", got "${String(driver)}"`)
  }
  const { crank, rod } = options
  if (Math.abs(offset) > crank + rod) {
    throw new LinkageError(
      'cannot-assemble',
      `The connecting rod (${mm(rod)}) cannot reach the slider path at any crank angle: the offset (${mm(Math.abs(offset))}) exceeds crank + rod = ${mm(crank + rod)}`,
      { crank, rod, offset },
    )
  }
  const radius = options.pathRadius ?? Number.POSITIVE_INFINITY
  if (Number.isNaN(radius) || radius === 0) {
    throw new LinkageError('invalid-length', `The slider path radius must be non-zero (Infinity for a straight path), got ${String(radius)}`)
  }
  if (!Number.isFinite(radius)) {
    return { crank, rod, offset, sliderSide: side, rotation, driver, pathRadius: Number.POSITIVE_INFINITY, pathTangentX: Number.NaN, equivalentFourBar: null }
  }
  const tangentX = options.pathTangentX ?? straightMidStroke(crank, rod, offset, side)
  requireFinite('path tangent point', tangentX)
  const centreX = tangentX
  const centreY = offset + radius
  const equivalentFourBar = fourBar({
    ground: Math.hypot(centreX, centreY),
    input: crank,
    coupler: rod,
    output: Math.abs(radius),
    groundAngle: Math.atan2(centreY, centreX),
    // Slider on +x with the centre above means B is clockwise of the diagonal A→centre.
    circuit: -side * Math.sign(radius) === 1 ? 'open' : 'crossed',
    rotation,
    driver: driver === 'crank' ? 'input' : 'output',
  })
  return { crank, rod, offset, sliderSide: side, rotation, driver, pathRadius: radius, pathTangentX: tangentX, equivalentFourBar }
}

function straightMidStroke(crank: number, rod: number, offset: number, side: number): number {
  const outer = Math.sqrt((rod + crank) ** 2 - offset * offset)
  const innerSquared = (rod - crank) ** 2 - offset * offset
  const inner = innerSquared > 0 ? Math.sqrt(innerSquared) : 0
  return (side * (outer + inner)) / 2
}

/**
 * One point of a straight path, for callers that want a single value: the same
 * closed form as the state the analysis, the sweeps and the forces use
 * ({@link straightKinematics}), through one scratch array (no allocation).
 */
let pointScratch: Float64Array | null = null
const pointState = (): Float64Array => (pointScratch ??= new Float64Array(CRANK_SIN + 1))

/** Slider position x on a straight path at crank angle θ; NaN where the rod cannot reach. */
export function sliderPosition(crank: number, rod: number, offset: number, side: number, theta: number): number {
  const point = pointState()
  straightKinematics(crank, rod, offset, side, theta, point)
  return point[POSITION]!
}

/** dx/dθ of a straight-path slider: slider velocity per unit crank speed, m/rad. */
export function sliderVelocityCoefficient(crank: number, rod: number, offset: number, side: number, theta: number): number {
  const point = pointState()
  straightKinematics(crank, rod, offset, side, theta, point)
  return point[DX]!
}

/** d²x/dθ² of a straight-path slider, m/rad². */
export function sliderAccelerationCoefficient(crank: number, rod: number, offset: number, side: number, theta: number): number {
  const point = pointState()
  straightKinematics(crank, rod, offset, side, theta, point)
  return point[DDX]!
}

/** Slider velocity dx/dt for crank speed ω (rad/s, signed), m/s. */
export function sliderVelocity(crank: number, rod: number, offset: number, side: number, theta: number, omega: number): number {
  return sliderVelocityCoefficient(crank, rod, offset, side, theta) * omega
}

/** Slider acceleration for crank speed ω and crank angular acceleration α (both signed), m/s². */
export function sliderAcceleration(
  crank: number,
  rod: number,
  offset: number,
  side: number,
  theta: number,
  omega: number,
  alpha: number,
): number {
  const point = pointState()
  straightKinematics(crank, rod, offset, side, theta, point)
  return point[DDX]! * omega * omega + point[DX]! * alpha
}

/** Rod angle φ (direction A→B from +x) on a straight path, rad. */
export function rodAngle(crank: number, rod: number, offset: number, side: number, theta: number): number {
  const point = pointState()
  straightKinematics(crank, rod, offset, side, theta, point)
  return Math.atan2(point[ROD_SIN]!, point[ROD_COS]!)
}

/**
 * The rod's angle from the line of stroke (its obliquity), rad in (−π/2, π/2],
 * positive counter-clockwise: the rod direction φ measured from +x for a slider on
 * the +x side, from −x for one on the −x side.
 */
export function rodObliquity(linkage: SliderCrankLinkage, phi: number): number {
  // φ comes from atan2, in (−π, π]: from +x it is already the obliquity; from −x it is a half turn off.
  if (linkage.sliderSide === 1) return phi
  return phi > 0 ? phi - Math.PI : phi + Math.PI
}

/** Indices into the state written by {@link sliderCrankState}. */
export const POSITION = 0
/** dx/dθ (or ds/dθ along an arc path). */
export const DX = 1
/** d²x/dθ² (tangential, along an arc path). */
export const DDX = 2
export const ROD_ANGLE = 3
/** dφ/dθ */
export const DPHI = 4
/** d²φ/dθ² */
export const DDPHI = 5
/**
 * Transmission angle, rad in [0, π/2], between the rod and the link it drives:
 * crank-driven, the angle between the rod and the normal to the path (90° with the
 * rod along the path); slider-driven, the angle between the rod and the crank
 * (0° at the dead points, where the slider cannot turn the crank).
 */
export const TRANSMISSION = 6
/** Length of the state array (the extra slots are scratch for the arc path). */
export const SLIDER_CRANK_STATE = 7 + FOUR_BAR_STATE

/**
 * Position, rod angle and their first and second derivatives with respect to
 * the crank angle, at θ. Writes into `out` (length ≥ SLIDER_CRANK_STATE);
 * returns false and writes NaN where the linkage cannot assemble. No allocation.
 */
export function sliderCrankState(linkage: SliderCrankLinkage, theta: number, out: Float64Array): boolean {
  const fb = linkage.equivalentFourBar
  if (fb === null) {
    const ok = straightState(linkage.crank, linkage.rod, linkage.offset, linkage.sliderSide, theta, out)
    if (ok && linkage.driver === 'slider') out[TRANSMISSION] = foldedAngle(out[ROD_ANGLE]!, theta)
    return ok
  }
  const scratch = 7
  const ok = solveFourBar(fb.input, fb.coupler, fb.output, fb.groundX, fb.groundY, fb.circuitSign, theta, out, scratch)
  if (!ok) {
    out.fill(Number.NaN, 0, 7)
    return false
  }
  const radius = linkage.pathRadius
  const tangentAngle = radius > 0 ? -Math.PI / 2 : Math.PI / 2
  const psi = out[scratch + THETA4]!
  out[POSITION] = linkage.pathTangentX + radius * wrapHalfTurn(psi - tangentAngle)
  out[DX] = radius * out[scratch + H4]!
  out[DDX] = radius * out[scratch + H4P]!
  out[ROD_ANGLE] = out[scratch + THETA3]!
  out[DPHI] = out[scratch + H3]!
  out[DDPHI] = out[scratch + H3P]!
  out[TRANSMISSION] = linkage.driver === 'slider' ? foldedAngle(out[scratch + THETA3]!, theta) : foldedAngle(out[scratch + THETA3]!, psi)
  return true
}

/** Slots the force analysis adds to the state: cos φ, sin φ of the rod and cos θ, sin θ of the crank. */
export const ROD_COS = 7
export const ROD_SIN = 8
export const CRANK_COS = 9
export const CRANK_SIN = 10

/**
 * The state the force analysis takes at θ: POSITION, DX, DDX, DPHI, DDPHI and the
 * four slots above (ROD_ANGLE and TRANSMISSION are not needed and, on a straight
 * path, not written: that saves the sweep an atan2 and an acos a point). The same
 * closed form as the full state; a test holds the two together. No allocation.
 */
export function sliderCrankForceKinematics(linkage: SliderCrankLinkage, theta: number, out: Float64Array): boolean {
  if (linkage.equivalentFourBar !== null) {
    // Arc path: the full state, then the cosines (its four-bar scratch is spent by now).
    if (!sliderCrankState(linkage, theta, out)) return false
    out[ROD_COS] = Math.cos(out[ROD_ANGLE]!)
    out[ROD_SIN] = Math.sin(out[ROD_ANGLE]!)
    out[CRANK_COS] = Math.cos(theta)
    out[CRANK_SIN] = Math.sin(theta)
    return true
  }
  return straightKinematics(linkage.crank, linkage.rod, linkage.offset, linkage.sliderSide, theta, out)
}

/** The angle between two lines (not directions), rad in [0, π/2]. */
function foldedAngle(a: number, b: number): number {
  const mu = includedAngle(a, b)
  return mu > Math.PI / 2 ? Math.PI - mu : mu
}

/**
 * The closed form of a straight path, the one every caller goes through (the
 * analysis, the sweeps, the forces and the single-point functions): with
 * u = a sinθ − e and the root √(b² − u²), position, dx/dθ, d²x/dθ², dφ/dθ,
 * d²φ/dθ², the rod's cos φ and sin φ and the crank's cos θ and sin θ. Writes
 * NaN and returns false where the rod cannot reach the path. No allocation.
 */
function straightKinematics(crank: number, rod: number, offset: number, side: number, theta: number, out: Float64Array): boolean {
  const s = Math.sin(theta)
  const c = Math.cos(theta)
  const u = crank * s - offset
  const rod2 = rod * rod
  const disc = rod2 - u * u
  if (!(disc > -ROOT_TOLERANCE * rod2)) {
    out.fill(Number.NaN, 0, CRANK_SIN + 1)
    return false
  }
  const root = disc > 0 ? Math.sqrt(disc) : 0
  const ac = crank * c
  const as = crank * s
  const root3 = root * root * root
  out[POSITION] = ac + side * root
  out[DX] = -as - (side * u * ac) / root
  out[DDX] = -ac - side * ((ac * ac - u * as) / root + (u * u * ac * ac) / root3)
  out[DPHI] = (-side * ac) / root
  out[DDPHI] = (side * as) / root - (side * ac * ac * u) / root3
  out[ROD_COS] = (side * root) / rod
  out[ROD_SIN] = -u / rod
  out[CRANK_COS] = c
  out[CRANK_SIN] = s
  return true
}

/** The full state of a straight path: the closed form, then the rod angle and the transmission angle from it. */
function straightState(crank: number, rod: number, offset: number, side: number, theta: number, out: Float64Array): boolean {
  if (!straightKinematics(crank, rod, offset, side, theta, out)) return false
  out[ROD_ANGLE] = Math.atan2(out[ROD_SIN]!, out[ROD_COS]!)
  // Angle between the rod and the normal to the path: acos(|u|/b) = acos(|sin φ|).
  out[TRANSMISSION] = Math.acos(Math.min(Math.abs(out[ROD_SIN]!), 1))
  return true
}
