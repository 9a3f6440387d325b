/**
 * Slider-crank sweep: every quantity over a crank-angle range, one Float64Array
 * per quantity, allocated once and recomputed in place by `update()`.
 */

import { LinkageError } from './errors.js'
import { wrapTurn } from './math.js'
import {
  DDPHI,
  DDX,
  DPHI,
  DX,
  POSITION,
  ROD_ANGLE,
  SLIDER_CRANK_STATE,
  TRANSMISSION,
  sliderCrankState,
  type SliderCrankLinkage,
} from './slider-crank.js'
import type { AngleRange } from './types.js'

/** Motion of the crank for a sweep: the same ω and α at every angle (a snapshot per angle). */
export interface CrankMotion {
  /** Crank speed magnitude, rad/s (≥ 0). */
  readonly speed: number
  /** Crank angular acceleration in the sense of rotation, rad/s² (positive speeds up). */
  readonly angularAcceleration?: number | null
}

/** Quantities of a slider-crank sweep, each a Float64Array of `count` values. */
export class SliderCrankSweep {
  readonly linkage: SliderCrankLinkage
  readonly count: number
  /** Crank angle θ, rad, ascending from range.start to range.end. */
  readonly crankAngle: Float64Array
  /** Time from the start of the range in the sense of rotation, s (NaN at zero speed). */
  readonly time: Float64Array
  /** Slider position along the path, m. */
  readonly position: Float64Array
  /** Slider velocity, m/s. */
  readonly velocity: Float64Array
  /** Slider acceleration along the path, m/s². */
  readonly acceleration: Float64Array
  /** Rod angle from the line of stroke (obliquity), rad in (−π/2, π/2], positive counter-clockwise. */
  readonly rodAngle: Float64Array
  /** Rod angular velocity, rad/s. */
  readonly rodAngularVelocity: Float64Array
  /** Rod angular acceleration, rad/s². */
  readonly rodAngularAcceleration: Float64Array
  /** Transmission angle, rad. */
  readonly transmissionAngle: Float64Array
  private readonly state = new Float64Array(SLIDER_CRANK_STATE)

  /** Allocate the arrays for `count` crank angles (≥ 1; a range sweep needs ≥ 2, ends included). */
  constructor(linkage: SliderCrankLinkage, count: number) {
    if (!Number.isInteger(count) || count < 1) {
      throw new LinkageError('invalid-number', `A sweep needs a whole number of at least 1 crank angle, got ${count}`)
    }
    this.linkage = linkage
    this.count = count
    this.crankAngle = new Float64Array(count)
    this.time = new Float64Array(count)
    this.position = new Float64Array(count)
    this.velocity = new Float64Array(count)
    this.acceleration = new Float64Array(count)
    this.rodAngle = new Float64Array(count)
    this.rodAngularVelocity = new Float64Array(count)
    this.rodAngularAcceleration = new Float64Array(count)
    this.transmissionAngle = new Float64Array(count)
  }

  /** Recompute every array in place for a crank-angle range and crank motion. Returns this. */
  update(range: AngleRange, motion: CrankMotion): this {
    const { count, crankAngle } = this
    if (count < 2) throw new LinkageError('invalid-number', `A sweep over a range needs at least 2 crank angles, got ${count}`)
    const step = (range.end - range.start) / (count - 1)
    // Angles first, the last one exactly at the end of the range.
    for (let i = 0; i < count; i++) crankAngle[i] = i === count - 1 ? range.end : range.start + i * step
    const origin = this.linkage.rotation === 1 ? range.start : range.end
    return this.compute(motion, origin, false)
  }

  /**
   * Recompute every array in place at given crank angles (as many as `count`).
   * Time is counted from the crank passing `timeOrigin`, wrapped to one turn.
   */
  updateAt(angles: ArrayLike<number>, motion: CrankMotion, timeOrigin: number): this {
    if (angles.length !== this.count) {
      throw new LinkageError('invalid-number', `Expected ${this.count} crank angles, got ${angles.length}`)
    }
    for (let i = 0; i < this.count; i++) this.crankAngle[i] = angles[i]!
    return this.compute(motion, timeOrigin, true)
  }

  private compute(motion: CrankMotion, origin: number, wrap: boolean): this {
    const { linkage, count, state } = this
    const omega = linkage.rotation * motion.speed
    const alpha = linkage.rotation * (motion.angularAcceleration ?? 0)
    const crankAngle = this.crankAngle
    const time = this.time
    const position = this.position
    const velocity = this.velocity
    const acceleration = this.acceleration
    const rodAngle = this.rodAngle
    const rodAngularVelocity = this.rodAngularVelocity
    const rodAngularAcceleration = this.rodAngularAcceleration
    const transmissionAngle = this.transmissionAngle
    const omega2 = omega * omega
    const inverse = omega === 0 ? Number.NaN : 1 / omega
    const rotation = linkage.rotation
    const fromPlusX = linkage.sliderSide === 1
    // One crank angle per step: state by closed form, then scale by ω and α.
    for (let i = 0; i < count; i++) {
      const theta = crankAngle[i]!
      sliderCrankState(linkage, theta, state)
      const dx = state[DX]!
      const dphi = state[DPHI]!
      const phi = state[ROD_ANGLE]!
      const travel = theta - origin
      time[i] = (wrap ? wrapTurn(rotation * travel) * rotation : travel) * inverse
      position[i] = state[POSITION]!
      velocity[i] = dx * omega
      acceleration[i] = state[DDX]! * omega2 + dx * alpha
      // The rod's obliquity (see rodObliquity), inline: φ from atan2 is within a half turn already.
      rodAngle[i] = fromPlusX ? phi : phi > 0 ? phi - Math.PI : phi + Math.PI
      rodAngularVelocity[i] = dphi * omega
      rodAngularAcceleration[i] = state[DDPHI]! * omega2 + dphi * alpha
      transmissionAngle[i] = state[TRANSMISSION]!
    }
    return this
  }
}
