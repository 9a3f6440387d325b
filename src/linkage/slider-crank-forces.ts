/**
 * Slider-crank kinetostatics (straight path): for a crank motion, a process load
 * on the slider and the masses of slider, rod and crank (with a counterweight),
 * the forces at every joint and on the guide, the crank torque and power, and the
 * inertia forces the frame feels. Newton–Euler on slider, rod and crank, solved in
 * closed form; Coulomb friction on the guide by taking the sign of the normal force
 * that the solution itself gives. Pure, SI, no allocation.
 *
 * Frame as in slider-crank.ts: crank axis O at the origin, path y = e, θ
 * counter-clockwise from +x. Forces in N along +x, +y; moments counter-clockwise.
 */
import { LinkageError, requireFinite } from './errors.js'
import { sliderLoadForce, type Load } from './loads.js'
import { TAU } from './math.js'
import { CRANK_COS, CRANK_SIN, DDPHI, DDX, DPHI, DX, POSITION, ROD_COS, ROD_SIN, SLIDER_CRANK_STATE, sliderCrankForceKinematics, type SliderCrankLinkage } from './slider-crank.js'

/** Masses of a slider-crank (kg, m, kg·m²). */
export interface SliderCrankMasses {
  /** The slider and everything that reciprocates with it (ram, plunger, piston, crosshead). */
  readonly slider: number
  /** Connecting rod: mass, its centre of mass measured from the crank pin along the rod, its inertia about that centre. */
  readonly rod: number
  readonly rodCentre: number
  readonly rodInertia: number
  /** Crank: mass and radius of its centre of mass (along the crank); inertia about the crank axis of everything turning with it. */
  readonly crank: number
  readonly crankCentre: number
  readonly crankInertia: number
  /** Counterweight: mass, radius of its centre of mass, and its angle from the crank (usually π, opposite the pin). */
  readonly counterweight: number
  readonly counterweightRadius: number
  readonly counterweightPhase: number
}

/** No masses: the quasi-static case. */
export const MASSLESS: SliderCrankMasses = {
  slider: 0,
  rod: 0,
  rodCentre: 0,
  rodInertia: 0,
  crank: 0,
  crankCentre: 0,
  crankInertia: 0,
  counterweight: 0,
  counterweightRadius: 0,
  counterweightPhase: Math.PI,
}

/** What the force analysis takes besides the linkage. */
export interface SliderCrankForceInput {
  readonly masses: SliderCrankMasses
  readonly load: Load
  /** Coulomb friction coefficient of the slider guide (0: none). */
  readonly friction: number
  /** Gravity in the linkage's frame, m/s² (e.g. [0, −9.81] with +y up); [0, 0] for none. */
  readonly gravity: readonly [number, number]
}

/** Indices into the force state written by {@link sliderCrankForceState}. */
export const F = {
  /** The load's force on the slider, along +x. */
  LOAD: 0,
  /** Rod axial force at the wrist pin and at the crank pin, tension positive. */
  ROD: 1,
  ROD_AT_CRANK: 2,
  /** Guide normal force on the slider (+y) and guide friction on it (+x). */
  SIDE: 3,
  FRICTION: 4,
  /** Force of the rod on the slider (wrist pin), +x and +y. */
  WRIST_X: 5,
  WRIST_Y: 6,
  /** Force of the rod on the crank pin, frame axes and crank axes (radial outward, tangential counter-clockwise). */
  PIN_X: 7,
  PIN_Y: 8,
  PIN_RADIAL: 9,
  PIN_TANGENTIAL: 10,
  /** Force of the crank on the frame at the main bearing. */
  BEARING_X: 11,
  BEARING_Y: 12,
  /** Torque the drive applies to the crank, positive in the sense of rotation, and its power. */
  TORQUE: 13,
  POWER: 14,
  /** The load's own share of the torque: −P·dx/dθ, in the sense of rotation (massless, frictionless links). */
  LOAD_TORQUE: 15,
  /** Inertia force of the reciprocating mass (slider and the rod's wrist-pin share), along +x. */
  RECIPROCATING: 16,
  /** Resultant inertia force of every moving part on the frame, and its moment about O. */
  SHAKE_X: 17,
  SHAKE_Y: 18,
  SHAKE_MOMENT: 19,
} as const

/** Length of the force state. */
export const FORCE_STATE = 20

/** cos and sin of the last counterweight phase seen: a sweep keeps one phase, so they are found once. */
const phase = { angle: Number.NaN, cos: 1, sin: 0 }

/** Check masses and friction; throws LinkageError for a negative mass or a centre off the link. */
export function checkMasses(masses: SliderCrankMasses, rod: number, friction: number): void {
  for (const [name, value] of [
    ['slider mass', masses.slider],
    ['rod mass', masses.rod],
    ['rod moment of inertia', masses.rodInertia],
    ['crank mass', masses.crank],
    ['crank moment of inertia', masses.crankInertia],
    ['counterweight mass', masses.counterweight],
    ['counterweight radius', masses.counterweightRadius],
    ['crank centre-of-mass radius', masses.crankCentre],
    ['friction coefficient', friction],
  ] as const) {
    requireFinite(name, value)
    if (value < 0) throw new LinkageError('invalid-number', `The ${name} must be zero or more, got ${value}`, { name, value })
  }
  requireFinite('rod centre of mass', masses.rodCentre)
  if (masses.rodCentre < 0 || masses.rodCentre > rod) {
    throw new LinkageError('invalid-number', `The rod's centre of mass must lie between its pins (0 to ${rod} m from the crank pin), got ${masses.rodCentre} m`, { rodCentre: masses.rodCentre })
  }
}

/** Where the strokes are, for a load acting on one of them: the inner dead centre and the outstroke's crank travel (rad). */
export interface StrokeTiming {
  readonly innerAngle: number
  readonly outstrokeAngle: number
  /** Slider position at the outer dead centre, for travel. */
  readonly outerPosition: number
}

/**
 * The forces at one crank angle, from the kinematic state `kin` at θ written by
 * sliderCrankForceKinematics, crank speed ω and angular acceleration α (both counter-clockwise
 * positive). Writes FORCE_STATE slots into `out` at index + slot·stride (a sweep
 * writes straight into its slot-major buffer); returns false when the guide locks
 * (friction too high for the rod's angle) and writes NaN. No allocation.
 */
export function sliderCrankForceState(
  linkage: SliderCrankLinkage,
  input: SliderCrankForceInput,
  timing: StrokeTiming | null,
  theta: number,
  omega: number,
  alpha: number,
  kin: Float64Array,
  out: Float64Array,
  index = 0,
  stride = 1,
): boolean {
  const { crank: a, rod: b, sliderSide: side, rotation } = linkage
  const { masses, load, friction } = input
  const gx = input.gravity[0]
  const gy = input.gravity[1]
  const c = kin[CRANK_COS]!
  const s = kin[CRANK_SIN]!
  const dx = kin[DX]!
  const ux = kin[ROD_COS]!
  const uy = kin[ROD_SIN]!
  const x = kin[POSITION]!
  const v = dx * omega
  const aB = kin[DDX]! * omega * omega + dx * alpha
  const phiDot = kin[DPHI]! * omega
  const phiDdot = kin[DDPHI]! * omega * omega + kin[DPHI]! * alpha
  // Accelerations: crank pin A, rod centre G.
  const aAx = a * (-alpha * s - omega * omega * c)
  const aAy = a * (alpha * c - omega * omega * s)
  const g = masses.rodCentre
  const aGx = aAx + g * (-phiDdot * uy - phiDot * phiDot * ux)
  const aGy = aAy + g * (phiDdot * ux - phiDot * phiDot * uy)
  // The load, on the stroke the crank angle is in.
  // Crank travel since the inner dead centre, in [0, 2π): floor, not %, which is a library call in a hot loop.
  const since = timing ? rotation * (theta - timing.innerAngle) : 0
  const outstroke = timing ? since - TAU * Math.floor(since / TAU) <= timing.outstrokeAngle + 1e-12 : v * side > 0
  const travel = timing ? Math.abs(timing.outerPosition - x) : 0
  const P = sliderLoadForce(load, theta, x, travel, outstroke, side)
  // Slider: Fx + f + P + ms·gx = ms·aB; Fy + N + ms·gy = 0, with f = k·N.
  // Rod moment about G gives ux·Fy − uy·Fx = Q (see the derivation in DEVELOPERS.md).
  const ms = masses.slider
  const mr = masses.rod
  const kax = mr * (aGx - gx)
  const kay = mr * (aGy - gy)
  const Q = -(masses.rodInertia * phiDdot + g * (ux * kay - uy * kax)) / b
  const fx0 = ms * aB - P - ms * gx
  // N = numerator / (k·uy − ux) for a friction factor k (f = k·N).
  const numerator = Q + ux * ms * gy + uy * fx0
  let N = numerator / -ux
  let k = 0
  if (friction > 0 && v !== 0) {
    // f = −μ|N|·sign(v): take the sign of N the frictionless solution gives, and keep it if the answer agrees.
    let sN = N >= 0 ? 1 : -1
    k = -friction * Math.sign(v) * sN
    N = numerator / (k * uy - ux)
    if ((N >= 0 ? 1 : -1) !== sN) {
      sN = -sN
      k = -friction * Math.sign(v) * sN
      N = numerator / (k * uy - ux)
      if ((N >= 0 ? 1 : -1) !== sN) {
        for (let j = 0; j < FORCE_STATE; j++) out[index + j * stride] = Number.NaN
        return false
      }
    }
  }
  const fr = k * N
  const Fx = fx0 - fr
  const Fy = -N - ms * gy
  const Ax = kax + Fx
  const Ay = kay + Fy
  // Crank: T + A×(−Af) + gravity moments = I·α about O.
  const mc = masses.crank
  const rc = masses.crankCentre
  const mw = masses.counterweight
  const rw = masses.counterweightRadius
  // The counterweight's direction θ + ψ by the angle-addition formulas (cos ψ, sin ψ kept from the last call).
  if (masses.counterweightPhase !== phase.angle) {
    phase.angle = masses.counterweightPhase
    phase.cos = Math.cos(phase.angle)
    phase.sin = Math.sin(phase.angle)
  }
  const cw = c * phase.cos - s * phase.sin
  const sw = s * phase.cos + c * phase.sin
  const crossA = a * c * Ay - a * s * Ax
  const gravityMoment = mc * rc * (c * gy - s * gx) + mw * rw * (cw * gy - sw * gx)
  const torque = masses.crankInertia * alpha + crossA - gravityMoment
  // Frame on crank at O: F_O = mc·aC + mw·aW + Af − (mc + mw)·g; the frame feels −F_O.
  const aCx = rc * (-alpha * s - omega * omega * c)
  const aCy = rc * (alpha * c - omega * omega * s)
  const aWx = rw * (-alpha * sw - omega * omega * cw)
  const aWy = rw * (alpha * cw - omega * omega * sw)
  const fOx = mc * aCx + mw * aWx + Ax - (mc + mw) * gx
  const fOy = mc * aCy + mw * aWy + Ay - (mc + mw) * gy
  const pinX = -Ax
  const pinY = -Ay
  // Inertia forces of every moving part, and their moment about O (the slider's line is y = e).
  const e = linkage.offset
  const shakeX = -(ms * aB + mr * aGx + mc * aCx + mw * aWx)
  const shakeY = -(mr * aGy + mc * aCy + mw * aWy)
  const gX = a * c + g * ux
  const gY = a * s + g * uy
  // Σ r × (−m·a) − Σ I·ε about O: slider at (x, e), rod centre at G, crank centre and counterweight on the crank.
  const shakeMoment =
    e * ms * aB -
    mr * (gX * aGy - gY * aGx) -
    mc * rc * (c * aCy - s * aCx) -
    mw * rw * (cw * aWy - sw * aWx) -
    masses.rodInertia * phiDdot -
    masses.crankInertia * alpha
  const wristShare = b > 0 ? (mr * g) / b : 0
  out[index + F.LOAD * stride] = P
  out[index + F.ROD * stride] = -(Fx * ux + Fy * uy)
  out[index + F.ROD_AT_CRANK * stride] = -(Ax * ux + Ay * uy)
  out[index + F.SIDE * stride] = N
  out[index + F.FRICTION * stride] = fr
  out[index + F.WRIST_X * stride] = Fx
  out[index + F.WRIST_Y * stride] = Fy
  out[index + F.PIN_X * stride] = pinX
  out[index + F.PIN_Y * stride] = pinY
  out[index + F.PIN_RADIAL * stride] = pinX * c + pinY * s
  out[index + F.PIN_TANGENTIAL * stride] = -pinX * s + pinY * c
  out[index + F.BEARING_X * stride] = -fOx
  out[index + F.BEARING_Y * stride] = -fOy
  out[index + F.TORQUE * stride] = rotation * torque
  out[index + F.POWER * stride] = torque * omega
  out[index + F.LOAD_TORQUE * stride] = rotation * (-P * dx)
  out[index + F.RECIPROCATING * stride] = -(ms + wristShare) * aB
  out[index + F.SHAKE_X * stride] = shakeX
  out[index + F.SHAKE_Y * stride] = shakeY
  out[index + F.SHAKE_MOMENT * stride] = shakeMoment
  return true
}

/** Forces of a slider-crank over crank angles: one Float64Array per force slot, allocated once, recomputed in place. */
export class SliderCrankForceSweep {
  readonly linkage: SliderCrankLinkage
  readonly input: SliderCrankForceInput
  readonly timing: StrokeTiming | null
  readonly count: number
  /** Crank angle θ, rad. */
  readonly crankAngle: Float64Array
  /** The force slots (see F), each a Float64Array of `count` values; NaN where the guide locks. */
  readonly slots: readonly Float64Array[]
  /** True at a point where friction locks the guide. */
  locked = 0
  private readonly kin = new Float64Array(SLIDER_CRANK_STATE)
  /** All slots in one slot-major buffer; `slots` are views of it. */
  private readonly buffer: Float64Array

  constructor(linkage: SliderCrankLinkage, input: SliderCrankForceInput, timing: StrokeTiming | null, count: number) {
    if (!Number.isInteger(count) || count < 2) throw new LinkageError('invalid-number', `A force sweep needs a whole number of at least 2 crank angles, got ${count}`)
    if (linkage.equivalentFourBar !== null) {
      throw new LinkageError('invalid-choice', 'Forces on an arc-path slider are found through its equivalent four-bar (four-bar-forces.ts)')
    }
    checkMasses(input.masses, linkage.rod, input.friction)
    this.linkage = linkage
    this.input = input
    this.timing = timing
    this.count = count
    this.crankAngle = new Float64Array(count)
    this.buffer = new Float64Array(FORCE_STATE * count)
    this.slots = Array.from({ length: FORCE_STATE }, (_, j) => this.buffer.subarray(j * count, (j + 1) * count))
  }

  /** Recompute over a range at a crank speed (magnitude, rad/s) and angular acceleration (sense of rotation). Returns this. */
  update(range: { start: number; end: number }, speed: number, angularAcceleration = 0): this {
    const { count, crankAngle } = this
    const step = (range.end - range.start) / (count - 1)
    for (let i = 0; i < count; i++) crankAngle[i] = i === count - 1 ? range.end : range.start + i * step
    return this.compute(speed, angularAcceleration)
  }

  /** Recompute at given crank angles (as many as `count`). Returns this. */
  updateAt(angles: ArrayLike<number>, speed: number, angularAcceleration = 0): this {
    if (angles.length !== this.count) throw new LinkageError('invalid-number', `Expected ${this.count} crank angles, got ${angles.length}`)
    for (let i = 0; i < this.count; i++) this.crankAngle[i] = angles[i]!
    return this.compute(speed, angularAcceleration)
  }

  private compute(speed: number, angularAcceleration: number): this {
    const { linkage, input, timing, count, crankAngle, kin, buffer } = this
    const omega = linkage.rotation * speed
    const alpha = linkage.rotation * angularAcceleration
    let locked = 0
    // One crank angle per step: the kinematic state by closed form, then the forces written straight into their slots.
    for (let i = 0; i < count; i++) {
      const theta = crankAngle[i]!
      sliderCrankForceKinematics(linkage, theta, kin)
      if (!sliderCrankForceState(linkage, input, timing, theta, omega, alpha, kin, buffer, i, count)) locked++
    }
    this.locked = locked
    return this
  }
}
