/**
 * Four-bar sweep: coupler, output and coupler-point quantities over an input
 * range, one Float64Array per quantity, allocated once, recomputed by `update()`.
 */

import { LinkageError } from './errors.js'
import { FOUR_BAR_STATE, H3, H3P, H4, H4P, THETA3, THETA4, fourBarRange, fourBarState, type FourBarLinkage } from './four-bar.js'
import { includedAngle, wrapHalfTurn, wrapTurn } from './math.js'
import type { CrankMotion } from './slider-crank-sweep.js'
import type { AngleRange } from './types.js'

/** Quantities of a four-bar sweep, each a Float64Array of `count` values. */
export class FourBarSweep {
  readonly linkage: FourBarLinkage
  readonly count: number
  /** Input angle θ2, rad, ascending. */
  readonly inputAngle: Float64Array
  /** Time from the start of the range in the sense of rotation, s. */
  readonly time: Float64Array
  /** Coupler angle θ3, rad, within half a turn of {@link couplerReference}. */
  readonly couplerAngle: Float64Array
  /** Output angle θ4, rad, within half a turn of {@link outputReference} (a rocker's angles never jump by a turn). */
  readonly outputAngle: Float64Array
  /** θ3 and θ4 at the start of the linkage's range: the angles are reported within half a turn of these. */
  readonly couplerReference: number
  readonly outputReference: number
  readonly couplerAngularVelocity: Float64Array
  readonly outputAngularVelocity: Float64Array
  readonly couplerAngularAcceleration: Float64Array
  readonly outputAngularAcceleration: Float64Array
  /** Transmission angle μ between the coupler and the link it drives (the output, or the input when the output drives), rad in [0, π]. */
  readonly transmissionAngle: Float64Array
  /** Coupler-point path and speed (NaN without a coupler point). */
  readonly couplerPointX: Float64Array
  readonly couplerPointY: Float64Array
  readonly couplerPointSpeed: Float64Array
  private readonly state = new Float64Array(FOUR_BAR_STATE)

  /** Allocate the arrays for `count` input angles (≥ 1; a range sweep needs ≥ 2, ends included). */
  constructor(linkage: FourBarLinkage, count: number) {
    if (!Number.isInteger(count) || count < 1) {
      throw new LinkageError('invalid-number', `A sweep needs a whole number of at least 1 input angle, got ${count}`)
    }
    this.linkage = linkage
    this.count = count
    this.inputAngle = new Float64Array(count)
    this.time = new Float64Array(count)
    this.couplerAngle = new Float64Array(count)
    this.outputAngle = new Float64Array(count)
    this.couplerAngularVelocity = new Float64Array(count)
    this.outputAngularVelocity = new Float64Array(count)
    this.couplerAngularAcceleration = new Float64Array(count)
    this.outputAngularAcceleration = new Float64Array(count)
    this.transmissionAngle = new Float64Array(count)
    this.couplerPointX = new Float64Array(count)
    this.couplerPointY = new Float64Array(count)
    this.couplerPointSpeed = new Float64Array(count)
    const start = fourBarRange(linkage).range.start
    fourBarState(linkage, start + 1e-6, this.state)
    this.couplerReference = Number.isFinite(this.state[THETA3]!) ? this.state[THETA3]! : 0
    this.outputReference = Number.isFinite(this.state[THETA4]!) ? this.state[THETA4]! : 0
  }

  /** Recompute every array in place for an input range and input motion. Returns this. */
  update(range: AngleRange, motion: CrankMotion): this {
    const { count, inputAngle } = this
    if (count < 2) throw new LinkageError('invalid-number', `A sweep over a range needs at least 2 input angles, got ${count}`)
    const step = (range.end - range.start) / (count - 1)
    // Angles first, the last one exactly at the end of the range.
    for (let i = 0; i < count; i++) inputAngle[i] = i === count - 1 ? range.end : range.start + i * step
    const origin = this.linkage.rotation === 1 ? range.start : range.end
    return this.compute(motion, origin, false)
  }

  /**
   * Recompute every array in place at given input angles (as many as `count`).
   * Time is counted from the input passing `timeOrigin`, wrapped to one turn.
   */
  updateAt(angles: ArrayLike<number>, motion: CrankMotion, timeOrigin: number): this {
    if (angles.length !== this.count) {
      throw new LinkageError('invalid-number', `Expected ${this.count} input angles, got ${angles.length}`)
    }
    for (let i = 0; i < this.count; i++) this.inputAngle[i] = angles[i]!
    return this.compute(motion, timeOrigin, true)
  }

  private compute(motion: CrankMotion, origin: number, wrap: boolean): this {
    const { linkage, count, state } = this
    const { input } = linkage
    const outputDriven = linkage.driver === 'output'
    const couplerReference = this.couplerReference
    const outputReference = this.outputReference
    const omega = linkage.rotation * motion.speed
    const alpha = linkage.rotation * (motion.angularAcceleration ?? 0)
    const omega2 = omega * omega
    const hasPoint = linkage.couplerPoint !== null
    const pointDistance = linkage.couplerPoint?.distance ?? 0
    const pointAngle = linkage.couplerPoint?.angle ?? 0
    const inputAngle = this.inputAngle
    const time = this.time
    const couplerAngle = this.couplerAngle
    const outputAngle = this.outputAngle
    const couplerAngularVelocity = this.couplerAngularVelocity
    const outputAngularVelocity = this.outputAngularVelocity
    const couplerAngularAcceleration = this.couplerAngularAcceleration
    const outputAngularAcceleration = this.outputAngularAcceleration
    const transmissionAngle = this.transmissionAngle
    const couplerPointX = this.couplerPointX
    const couplerPointY = this.couplerPointY
    const couplerPointSpeed = this.couplerPointSpeed
    // One input angle per step: close the loop, then scale the coefficients by ω and α.
    for (let i = 0; i < count; i++) {
      const theta2 = inputAngle[i]!
      fourBarState(linkage, theta2, state)
      const theta3 = state[THETA3]!
      const h3 = state[H3]!
      const h4 = state[H4]!
      const travel = theta2 - origin
      time[i] = omega === 0 ? Number.NaN : (wrap ? wrapTurn(linkage.rotation * travel) * linkage.rotation : travel) / omega
      couplerAngle[i] = couplerReference + wrapHalfTurn(theta3 - couplerReference)
      outputAngle[i] = outputReference + wrapHalfTurn(state[THETA4]! - outputReference)
      couplerAngularVelocity[i] = h3 * omega
      outputAngularVelocity[i] = h4 * omega
      couplerAngularAcceleration[i] = state[H3P]! * omega2 + h3 * alpha
      outputAngularAcceleration[i] = state[H4P]! * omega2 + h4 * alpha
      transmissionAngle[i] = includedAngle(theta3, outputDriven ? theta2 : state[THETA4]!)
      if (hasPoint) {
        const pointDirection = theta3 + pointAngle
        const c2 = Math.cos(theta2)
        const s2 = Math.sin(theta2)
        const cp = Math.cos(pointDirection)
        const sp = Math.sin(pointDirection)
        couplerPointX[i] = input * c2 + pointDistance * cp
        couplerPointY[i] = input * s2 + pointDistance * sp
        // dP/dθ2 = a·i·e^{iθ2} + p·h3·i·e^{i(θ3+δ)}
        const dx = -input * s2 - pointDistance * h3 * sp
        const dy = input * c2 + pointDistance * h3 * cp
        couplerPointSpeed[i] = Math.hypot(dx, dy) * Math.abs(omega)
      } else {
        couplerPointX[i] = Number.NaN
        couplerPointY[i] = Number.NaN
        couplerPointSpeed[i] = Number.NaN
      }
    }
    return this
  }
}
