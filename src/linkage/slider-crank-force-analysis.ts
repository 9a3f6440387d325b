/**
 * What a design review asks of a slider-crank's forces: the extremes of every
 * force over the cycle with their crank angles, the crank torque's mean, RMS and
 * peaks, power and work per cycle, the reciprocating inertia force's primary and
 * secondary parts, the counterweight's balance and the shaking force left, and the
 * largest rod compression and pin loads for the strength checks.
 */
import { LinkageError } from './errors.js'
import { extremesOf, type Extremes } from './extremes.js'
import { harmonic, integrate, mean, rms } from './cycle.js'
import { TAU } from './math.js'
import { DX, SLIDER_CRANK_STATE, sliderCrankForceKinematics, sliderCrankState } from './slider-crank.js'
import type { SliderCrankAnalysis } from './slider-crank-analysis.js'
import {
  F,
  FORCE_STATE,
  SliderCrankForceSweep,
  checkMasses,
  sliderCrankForceState,
  type SliderCrankForceInput,
  type StrokeTiming,
} from './slider-crank-forces.js'
import type { AngleValue } from './types.js'

/** A force quantity: its value from the force state (and the crank angle). */
export type ForceMeasure = (out: Float64Array, theta: number) => number

/** The force quantities the analysis reports, by name. */
export const SLIDER_CRANK_FORCE_MEASURES: Readonly<Record<string, ForceMeasure>> = {
  load: (o) => o[F.LOAD]!,
  rod_force: (o) => o[F.ROD]!,
  rod_compression: (o) => Math.max(0, -o[F.ROD]!, -o[F.ROD_AT_CRANK]!),
  side_thrust: (o) => o[F.SIDE]!,
  friction_force: (o) => o[F.FRICTION]!,
  wrist_pin_force: (o) => Math.hypot(o[F.WRIST_X]!, o[F.WRIST_Y]!),
  crank_pin_force: (o) => Math.hypot(o[F.PIN_X]!, o[F.PIN_Y]!),
  crank_pin_radial: (o) => o[F.PIN_RADIAL]!,
  crank_pin_tangential: (o) => o[F.PIN_TANGENTIAL]!,
  crank_pin_x: (o) => o[F.PIN_X]!,
  crank_pin_y: (o) => o[F.PIN_Y]!,
  bearing_force: (o) => Math.hypot(o[F.BEARING_X]!, o[F.BEARING_Y]!),
  bearing_x: (o) => o[F.BEARING_X]!,
  bearing_y: (o) => o[F.BEARING_Y]!,
  crank_torque: (o) => o[F.TORQUE]!,
  power: (o) => o[F.POWER]!,
  load_torque: (o) => o[F.LOAD_TORQUE]!,
  reciprocating_force: (o) => o[F.RECIPROCATING]!,
  shaking_force: (o) => Math.hypot(o[F.SHAKE_X]!, o[F.SHAKE_Y]!),
  shaking_force_x: (o) => o[F.SHAKE_X]!,
  shaking_force_y: (o) => o[F.SHAKE_Y]!,
  shaking_moment: (o) => o[F.SHAKE_MOMENT]!,
}

/** The forces of a slider-crank over its cycle (SI: N, N·m, W, J). */
export interface SliderCrankForceAnalysis {
  readonly kinematics: SliderCrankAnalysis
  readonly input: SliderCrankForceInput
  readonly timing: StrokeTiming | null
  /** The sweep the figures come from (crank angles across the range). */
  readonly sweep: SliderCrankForceSweep
  /** Extremes of every force quantity, by name. */
  readonly extremes: ReadonlyMap<string, Extremes>
  /** Crank torque (drive on crank, sense of rotation): mean and RMS over a turn; null when the crank rocks. */
  readonly torqueMean: number | null
  readonly torqueRms: number | null
  readonly powerMean: number | null
  readonly powerRms: number | null
  /** Work per cycle: by the drive (∫T dθ), on the load (∫−P dx), and lost in guide friction. */
  readonly driveWork: number | null
  readonly loadWork: number | null
  readonly frictionWork: number | null
  /** Primary and secondary (first and second harmonic) parts of the reciprocating inertia force, amplitudes, N. */
  readonly primary: { readonly a: number; readonly b: number; readonly amplitude: number } | null
  readonly secondary: { readonly a: number; readonly b: number; readonly amplitude: number } | null
  /** Rotating mass × radius at the crank pin (crank and the rod's crank-pin share), reciprocating mass, counterweight mass × radius. */
  readonly rotatingMassRadius: number
  readonly reciprocatingMass: number
  readonly counterweightMassRadius: number
  /** Share of the reciprocating mass the counterweight balances beyond the rotating mass (opposite the pin), or null. */
  readonly reciprocatingBalanced: number | null
  /** Largest shaking force with the counterweight, and without it. */
  readonly shakingWithCounterweight: AngleValue
  readonly shakingWithoutCounterweight: AngleValue
  /** Largest rod compression (≥ 0) at either end, and where. */
  readonly rodCompressionMax: AngleValue
  /** Points where friction locks the guide (the rod too steep for the friction coefficient). */
  readonly lockedPoints: number
  /** Every force quantity at a crank angle. */
  at(theta: number, name: string): number
}

/** Analyse a slider-crank's forces (straight path) on its kinematic analysis. */
export function analyseSliderCrankForces(kinematics: SliderCrankAnalysis, input: SliderCrankForceInput, options?: { samples?: number | null } | null): SliderCrankForceAnalysis {
  const linkage = kinematics.linkage
  if (linkage.equivalentFourBar !== null) throw new LinkageError('invalid-choice', 'The forces of an arc-path slider come from its equivalent four-bar')
  checkMasses(input.masses, linkage.rod, input.friction)
  const samples = options?.samples ?? 1441
  const outer = kinematics.outerDeadCentre
  const inner = kinematics.innerDeadCentre
  const timing: StrokeTiming | null =
    kinematics.fullRotation && outer && inner && kinematics.outstrokeAngle !== null
      ? { innerAngle: inner.theta, outstrokeAngle: kinematics.outstrokeAngle, outerPosition: outer.position }
      : null
  const range = kinematics.range
  const speed = kinematics.speed
  const alphaRot = kinematics.angularAcceleration
  const sweep = new SliderCrankForceSweep(linkage, input, timing, samples).update(range, speed, alphaRot)
  const omega = linkage.rotation * speed
  const alpha = linkage.rotation * alphaRot
  const kin = new Float64Array(SLIDER_CRANK_STATE)
  const out = new Float64Array(FORCE_STATE)
  const at = (theta: number, name: string): number => {
    const measure = SLIDER_CRANK_FORCE_MEASURES[name]
    if (!measure) throw new LinkageError('invalid-choice', `No force quantity ${name}`)
    if (!sliderCrankForceKinematics(linkage, theta, kin)) return Number.NaN
    if (!sliderCrankForceState(linkage, input, timing, theta, omega, alpha, kin, out)) return Number.NaN
    return measure(out, theta)
  }
  // Extremes: each quantity's samples from the sweep's slots, refined on the pointwise solution.
  const column = new Float64Array(samples)
  const extremes = new Map<string, Extremes>()
  const deadCentres = [outer?.theta, inner?.theta].filter((t): t is number => t !== undefined)
  for (const [name, measure] of Object.entries(SLIDER_CRANK_FORCE_MEASURES)) {
    for (let i = 0; i < samples; i++) {
      for (let j = 0; j < FORCE_STATE; j++) out[j] = sweep.slots[j]![i]!
      column[i] = measure(out, sweep.crankAngle[i]!)
    }
    extremes.set(name, extremesOf(sweep.crankAngle, column, (t) => at(t, name), range, deadCentres, linkage.rotation))
  }
  // Cycle integrals over a full turn.
  const full = kinematics.fullRotation
  const step = (range.end - range.start) / (samples - 1)
  const torque = sweep.slots[F.TORQUE]!
  const power = sweep.slots[F.POWER]!
  const loadTorque = sweep.slots[F.LOAD_TORQUE]!
  const frictionTorque = new Float64Array(samples)
  // Friction's power is f·v: its share of the torque, in the sense of rotation, is −f·dx/dθ·(sense).
  const state = new Float64Array(SLIDER_CRANK_STATE)
  for (let i = 0; i < samples; i++) {
    sliderCrankState(linkage, sweep.crankAngle[i]!, state)
    frictionTorque[i] = linkage.rotation * (-sweep.slots[F.FRICTION]![i]! * state[DX]!)
  }
  const m = input.masses
  const wristShare = (m.rod * m.rodCentre) / linkage.rod
  const rotatingMassRadius = m.crank * m.crankCentre + (m.rod - wristShare) * linkage.crank
  const reciprocatingMass = m.slider + wristShare
  const counterweightMassRadius = m.counterweight * m.counterweightRadius
  const opposite = Math.abs(Math.cos(m.counterweightPhase) + 1) < 1e-9
  // Shaking force with and without the counterweight (its inertia force put back).
  const withoutCw = new Float64Array(samples)
  for (let i = 0; i < samples; i++) {
    const theta = sweep.crankAngle[i]!
    const sx = sweep.slots[F.SHAKE_X]![i]!
    const sy = sweep.slots[F.SHAKE_Y]![i]!
    const ang = theta + m.counterweightPhase
    const cwx = -counterweightMassRadius * (-alpha * Math.sin(ang) - omega * omega * Math.cos(ang))
    const cwy = -counterweightMassRadius * (alpha * Math.cos(ang) - omega * omega * Math.sin(ang))
    withoutCw[i] = Math.hypot(sx - cwx, sy - cwy)
  }
  // The shaking force without the counterweight, refined like the others.
  const withoutAt = (theta: number): number => {
    if (!sliderCrankForceKinematics(linkage, theta, kin) || !sliderCrankForceState(linkage, input, timing, theta, omega, alpha, kin, out)) return Number.NaN
    const ang = theta + m.counterweightPhase
    const cwx = -counterweightMassRadius * (-alpha * Math.sin(ang) - omega * omega * Math.cos(ang))
    const cwy = -counterweightMassRadius * (alpha * Math.cos(ang) - omega * omega * Math.sin(ang))
    return Math.hypot(out[F.SHAKE_X]! - cwx, out[F.SHAKE_Y]! - cwy)
  }
  const shakingWithout = extremesOf(sweep.crankAngle, withoutCw, withoutAt, range, [], linkage.rotation).max
  const compression = extremes.get('rod_compression')!.max
  let locked = 0
  for (let i = 0; i < samples; i++) if (Number.isNaN(torque[i]!)) locked++
  return {
    kinematics,
    input,
    timing,
    sweep,
    extremes,
    torqueMean: full ? mean(torque, step) : null,
    torqueRms: full ? rms(torque, step) : null,
    powerMean: full ? mean(power, step) : null,
    powerRms: full ? rms(power, step) : null,
    driveWork: full ? integrate(torque, step) : null,
    loadWork: full ? integrate(loadTorque, step) : null,
    frictionWork: full ? integrate(frictionTorque, step) : null,
    primary: full && Math.abs(range.end - range.start - TAU) < 1e-9 ? harmonic(sweep.slots[F.RECIPROCATING]!, sweep.crankAngle, 1) : null,
    secondary: full && Math.abs(range.end - range.start - TAU) < 1e-9 ? harmonic(sweep.slots[F.RECIPROCATING]!, sweep.crankAngle, 2) : null,
    rotatingMassRadius,
    reciprocatingMass,
    counterweightMassRadius,
    reciprocatingBalanced: opposite && reciprocatingMass > 0 ? (counterweightMassRadius - rotatingMassRadius) / (reciprocatingMass * linkage.crank) : null,
    shakingWithCounterweight: extremes.get('shaking_force')!.max,
    shakingWithoutCounterweight: shakingWithout,
    rodCompressionMax: compression,
    lockedPoints: locked,
    at,
  }
}
