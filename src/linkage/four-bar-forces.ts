/**
 * Four-bar kinetostatics: the pin forces and the input torque for a motion of the
 * input, the masses and inertias of the three moving links, gravity, and an
 * external torque (and a force at B) on the output link. The nine Newton–Euler
 * equations of the three links (the linear system of the standard matrix method)
 * are reduced by hand: the coupler's force balance puts F43 = F32 + m3(aG3 − g),
 * and the coupler's and output's moment equations leave a 2 × 2 system for F32.
 * Pure, SI, no allocation.
 *
 * Frame as in four-bar.ts: O2 at the origin, O4 at (groundX, groundY); angles
 * counter-clockwise; Fij is the force of link i on link j (1 the frame).
 */
import { LinkageError, requireFinite } from './errors.js'
import { FOUR_BAR_STATE, H3, H3P, H4, H4P, THETA3, THETA4, fourBarState, type FourBarLinkage } from './four-bar.js'
import { interpolate, type Load } from './loads.js'

/** Masses of a four-bar's moving links (kg, m, kg·m²). */
export interface FourBarMasses {
  /** Input (crank): mass, radius of its centre of mass along O2→A, inertia about O2 of all that turns with it. */
  readonly input: number
  readonly inputCentre: number
  readonly inputInertia: number
  /** Coupler: mass, centre of mass from A (distance and angle from the line A→B), inertia about that centre. */
  readonly coupler: number
  readonly couplerCentre: number
  readonly couplerCentreAngle: number
  readonly couplerInertia: number
  /** Output (rocker): mass, radius of its centre of mass along O4→B, inertia about O4. */
  readonly output: number
  readonly outputCentre: number
  readonly outputInertia: number
}

/** What the four-bar force analysis takes besides the linkage. */
export interface FourBarForceInput {
  readonly masses: FourBarMasses
  /** External torque on the output link (N·m): its table's abscissa 'angle' is the input angle; `sense` against-motion opposes ω4. */
  readonly outputLoad: Load
  /** A fixed sense for an output torque that does not oppose the motion: +1 counter-clockwise, −1 clockwise. */
  readonly outputLoadSense: 1 | -1
  /** Gravity in the frame, m/s². */
  readonly gravity: readonly [number, number]
  /** An external force at B along the output link's tangent (+ counter-clockwise about O4), N, for an arc-path slider's load. */
  readonly tangentialForce?: ((theta2: number, state: Float64Array) => number) | null
}

/** Indices into the four-bar force state. */
export const FB = {
  /** External torque on the output, counter-clockwise. */
  LOAD_TORQUE: 0,
  /** Torque the drive applies to the input, in the sense of rotation, and its power. */
  TORQUE: 1,
  POWER: 2,
  /** Frame on the input at O2; input on the coupler at A, i.e. −F32; coupler on the output at B (F34 = −F43); frame on the output at O4. */
  O2_X: 3,
  O2_Y: 4,
  A_X: 5,
  A_Y: 6,
  B_X: 7,
  B_Y: 8,
  O4_X: 9,
  O4_Y: 10,
  /** Coupler axial force along A→B, tension positive (its share of the pin force along the line of the pins). */
  COUPLER: 11,
  /** Resultant inertia force of the moving links on the frame. */
  SHAKE_X: 12,
  SHAKE_Y: 13,
} as const

export const FOUR_BAR_FORCE_STATE = 14

/** Check masses: none negative, finite. */
export function checkFourBarMasses(masses: FourBarMasses): void {
  for (const [name, value] of Object.entries(masses) as [string, number][]) {
    requireFinite(`four-bar ${name}`, value)
    if (name !== 'couplerCentreAngle' && value < 0) throw new LinkageError('invalid-number', `The four-bar's ${name} must be zero or more, got ${value}`, { name, value })
  }
}

/**
 * The forces at input angle θ2 for input speed ω2 and angular acceleration α2
 * (counter-clockwise positive). `kin` is scratch for the kinematic state (length
 * FOUR_BAR_STATE). Returns false at a position where the linkage cannot assemble
 * or the output cannot be driven (coupler and output in line).
 */
export function fourBarForceState(
  linkage: FourBarLinkage,
  input: FourBarForceInput,
  theta2: number,
  omega2: number,
  alpha2: number,
  kin: Float64Array,
  out: Float64Array,
  index = 0,
  stride = 1,
): boolean {
  if (!fourBarState(linkage, theta2, kin)) {
    for (let j = 0; j < FOUR_BAR_FORCE_STATE; j++) out[index + j * stride] = Number.NaN
    return false
  }
  const { input: a, coupler: b, output: c, groundX, groundY, rotation } = linkage
  const m = input.masses
  const gx = input.gravity[0]
  const gy = input.gravity[1]
  const t3 = kin[THETA3]!
  const t4 = kin[THETA4]!
  const w3 = kin[H3]! * omega2
  const w4 = kin[H4]! * omega2
  const al3 = kin[H3P]! * omega2 * omega2 + kin[H3]! * alpha2
  const al4 = kin[H4P]! * omega2 * omega2 + kin[H4]! * alpha2
  const c2 = Math.cos(theta2)
  const s2 = Math.sin(theta2)
  const c4 = Math.cos(t4)
  const s4 = Math.sin(t4)
  const ax = a * c2
  const ay = a * s2
  const bx = groundX + c * c4
  const by = groundY + c * s4
  // Accelerations of the centres of mass.
  const aAx = a * (-alpha2 * s2 - omega2 * omega2 * c2)
  const aAy = a * (alpha2 * c2 - omega2 * omega2 * s2)
  const r2 = m.inputCentre
  const aG2x = (r2 / a) * aAx
  const aG2y = (r2 / a) * aAy
  const d3 = t3 + m.couplerCentreAngle
  const cd = Math.cos(d3)
  const sd = Math.sin(d3)
  const g3x = ax + m.couplerCentre * cd
  const g3y = ay + m.couplerCentre * sd
  const aG3x = aAx + m.couplerCentre * (-al3 * sd - w3 * w3 * cd)
  const aG3y = aAy + m.couplerCentre * (al3 * cd - w3 * w3 * sd)
  const r4 = m.outputCentre
  const aG4x = r4 * (-al4 * s4 - w4 * w4 * c4)
  const aG4y = r4 * (al4 * c4 - w4 * w4 * s4)
  // External load on the output: a torque, and a force along its tangent at B.
  const torqueMagnitude = interpolate(input.outputLoad, input.outputLoad.angleSense * (theta2 - input.outputLoad.angleOrigin))
  const loadTorque =
    input.outputLoad.sense === 'against-motion' ? -(w4 === 0 ? 0 : Math.sign(w4)) * torqueMagnitude : input.outputLoadSense * torqueMagnitude
  const ft = input.tangentialForce ? input.tangentialForce(theta2, kin) : 0
  const fex = -ft * s4
  const fey = ft * c4
  // F43 = F32 + K3 (coupler's force balance).
  const k3x = m.coupler * (aG3x - gx)
  const k3y = m.coupler * (aG3y - gy)
  const cross = (px: number, py: number, qx: number, qy: number): number => px * qy - py * qx
  // Coupler's moment about G3: (B − A) × F32 = I3·α3 − (B − G3) × K3.
  const rABx = bx - ax
  const rABy = by - ay
  const M3 = m.couplerInertia * al3 - cross(bx - g3x, by - g3y, k3x, k3y)
  // Output's moment about O4: (B − O4) × (Fext − F43) + (G4 − O4) × m4·g + T_load = I4·α4.
  const r4x = bx - groundX
  const r4y = by - groundY
  const M4 = -m.outputInertia * al4 - cross(r4x, r4y, k3x, k3y) + cross(r4x, r4y, fex, fey) + m.output * r4 * (c4 * gy - s4 * gx) + loadTorque
  const det = rABx * r4y - rABy * r4x
  if (!(Math.abs(det) > 1e-12 * (a + b + c) ** 2)) {
    for (let j = 0; j < FOUR_BAR_FORCE_STATE; j++) out[index + j * stride] = Number.NaN
    return false
  }
  // Solve −rABy·Fx + rABx·Fy = M3 and −r4y·Fx + r4x·Fy = M4 for F32 (Cramer's rule).
  const f32x = (M3 * r4x - rABx * M4) / det
  const f32y = (r4y * M3 - rABy * M4) / det
  const f43x = f32x + k3x
  const f43y = f32y + k3y
  // Input's moment about O2: A × F32 + G2 × m2·g + T = I2·α2.
  const torque = m.inputInertia * alpha2 - cross(ax, ay, f32x, f32y) - m.input * r2 * (c2 * gy - s2 * gx)
  const f12x = m.input * aG2x - f32x - m.input * gx
  const f12y = m.input * aG2y - f32y - m.input * gy
  const f14x = m.output * aG4x + f43x - m.output * gx - fex
  const f14y = m.output * aG4y + f43y - m.output * gy - fey
  const lengthAB = Math.hypot(rABx, rABy)
  out[index + FB.LOAD_TORQUE * stride] = loadTorque
  out[index + FB.TORQUE * stride] = rotation * torque
  out[index + FB.POWER * stride] = torque * omega2
  out[index + FB.O2_X * stride] = f12x
  out[index + FB.O2_Y * stride] = f12y
  out[index + FB.A_X * stride] = -f32x
  out[index + FB.A_Y * stride] = -f32y
  out[index + FB.B_X * stride] = -f43x
  out[index + FB.B_Y * stride] = -f43y
  out[index + FB.O4_X * stride] = f14x
  out[index + FB.O4_Y * stride] = f14y
  // The force on the coupler at B is F43; pulling it away from A along A→B is tension.
  out[index + FB.COUPLER * stride] = (f43x * rABx + f43y * rABy) / lengthAB
  out[index + FB.SHAKE_X * stride] = -(m.input * aG2x + m.coupler * aG3x + m.output * aG4x)
  out[index + FB.SHAKE_Y * stride] = -(m.input * aG2y + m.coupler * aG3y + m.output * aG4y)
  return true
}

/** Four-bar forces over input angles: one Float64Array per slot, allocated once. */
export class FourBarForceSweep {
  readonly linkage: FourBarLinkage
  readonly input: FourBarForceInput
  readonly count: number
  readonly inputAngle: Float64Array
  readonly slots: readonly Float64Array[]
  private readonly kin = new Float64Array(FOUR_BAR_STATE)
  /** All slots in one slot-major buffer; `slots` are views of it. */
  private readonly buffer: Float64Array

  constructor(linkage: FourBarLinkage, input: FourBarForceInput, count: number) {
    if (!Number.isInteger(count) || count < 2) throw new LinkageError('invalid-number', `A force sweep needs a whole number of at least 2 input angles, got ${count}`)
    checkFourBarMasses(input.masses)
    this.linkage = linkage
    this.input = input
    this.count = count
    this.inputAngle = new Float64Array(count)
    this.buffer = new Float64Array(FOUR_BAR_FORCE_STATE * count)
    this.slots = Array.from({ length: FOUR_BAR_FORCE_STATE }, (_, j) => this.buffer.subarray(j * count, (j + 1) * count))
  }

  /** Recompute at given input angles (as many as `count`) for a speed magnitude and angular acceleration in the sense of rotation. */
  updateAt(angles: ArrayLike<number>, speed: number, angularAcceleration = 0): this {
    if (angles.length !== this.count) throw new LinkageError('invalid-number', `Expected ${this.count} input angles, got ${angles.length}`)
    const { linkage, input, count, inputAngle, kin, buffer } = this
    const omega = linkage.rotation * speed
    const alpha = linkage.rotation * angularAcceleration
    // One input angle per step: the kinematic state, then the forces written straight into their slots.
    for (let i = 0; i < count; i++) {
      const theta = angles[i]!
      inputAngle[i] = theta
      fourBarForceState(linkage, input, theta, omega, alpha, kin, buffer, i, count)
    }
    return this
  }

  /** Recompute over a range. */
  update(range: { start: number; end: number }, speed: number, angularAcceleration = 0): this {
    const angles = this.inputAngle
    const step = (range.end - range.start) / (this.count - 1)
    for (let i = 0; i < this.count; i++) angles[i] = i === this.count - 1 ? range.end : range.start + i * step
    return this.updateAt(angles, speed, angularAcceleration)
  }
}
