/**
 * What a design review asks of a four-bar's forces (or an arc-path slider's,
 * through its equivalent four-bar): the extremes of the input torque, power and
 * every pin force over the cycle with their input angles, the torque's mean and
 * RMS and the work per cycle.
 */
import { LinkageError } from './errors.js'
import { extremesOf, type Extremes } from './extremes.js'
import { integrate, mean, rms } from './cycle.js'
import { FOUR_BAR_STATE, H4, type FourBarLinkage } from './four-bar.js'
import { FB, FOUR_BAR_FORCE_STATE, FourBarForceSweep, fourBarForceState, type FourBarForceInput } from './four-bar-forces.js'
import { TAU } from './math.js'
import type { AngleRange } from './types.js'

/** A force quantity: its value from the four-bar force state. */
export type FourBarForceMeasure = (out: Float64Array) => number

/** The force quantities of a four-bar, by name. */
export const FOUR_BAR_FORCE_MEASURES: Readonly<Record<string, FourBarForceMeasure>> = {
  input_torque: (o) => o[FB.TORQUE]!,
  power: (o) => o[FB.POWER]!,
  output_load_torque: (o) => o[FB.LOAD_TORQUE]!,
  input_pivot_force: (o) => Math.hypot(o[FB.O2_X]!, o[FB.O2_Y]!),
  input_pin_force: (o) => Math.hypot(o[FB.A_X]!, o[FB.A_Y]!),
  output_pin_force: (o) => Math.hypot(o[FB.B_X]!, o[FB.B_Y]!),
  output_pivot_force: (o) => Math.hypot(o[FB.O4_X]!, o[FB.O4_Y]!),
  coupler_force: (o) => o[FB.COUPLER]!,
  shaking_force: (o) => Math.hypot(o[FB.SHAKE_X]!, o[FB.SHAKE_Y]!),
}

/** The forces of a four-bar over its input range (SI). */
export interface FourBarForceAnalysis {
  readonly linkage: FourBarLinkage
  readonly input: FourBarForceInput
  readonly range: AngleRange
  /** Input speed (magnitude, rad/s) and angular acceleration (sense of rotation). */
  readonly motion: { readonly speed: number; readonly angularAcceleration: number }
  readonly sweep: FourBarForceSweep
  readonly extremes: ReadonlyMap<string, Extremes>
  /** Over one period of a fully turning input; null when the input rocks. */
  readonly torqueMean: number | null
  readonly torqueRms: number | null
  readonly powerMean: number | null
  readonly driveWork: number | null
  /** Work done by the output load on the linkage over the period (negative: the linkage does work on it). */
  readonly loadWork: number | null
  /** Points where the linkage cannot be driven (coupler and output in line). */
  readonly stuckPoints: number
  at(theta: number, name: string): number
}

/**
 * Analyse a four-bar's forces over a range at an input speed (magnitude) and
 * angular acceleration (sense of rotation).
 * @param fullTurn the input turns fully over the range (mean, RMS and work are taken)
 * @param candidates input angles where extremes may sit exactly (toggles)
 */
export function analyseFourBarForces(
  linkage: FourBarLinkage,
  input: FourBarForceInput,
  motion: { readonly range: AngleRange; readonly speed: number; readonly angularAcceleration: number; readonly fullTurn: boolean },
  options?: { samples?: number | null; candidates?: readonly number[] } | null,
): FourBarForceAnalysis {
  const samples = options?.samples ?? 1441
  const { range, speed, angularAcceleration, fullTurn } = motion
  if (!(speed >= 0) || !Number.isFinite(speed)) throw new LinkageError('invalid-number', `The input speed must be a finite number ≥ 0, got ${speed}`)
  const sweep = new FourBarForceSweep(linkage, input, samples).update(range, speed, angularAcceleration)
  const omega = linkage.rotation * speed
  const alpha = linkage.rotation * angularAcceleration
  const kin = new Float64Array(FOUR_BAR_STATE)
  const out = new Float64Array(FOUR_BAR_FORCE_STATE)
  const at = (theta: number, name: string): number => {
    const measure = FOUR_BAR_FORCE_MEASURES[name]
    if (!measure) throw new LinkageError('invalid-choice', `No four-bar force quantity ${name}`)
    return fourBarForceState(linkage, input, theta, omega, alpha, kin, out) ? measure(out) : Number.NaN
  }
  const column = new Float64Array(samples)
  const extremes = new Map<string, Extremes>()
  for (const [name, measure] of Object.entries(FOUR_BAR_FORCE_MEASURES)) {
    for (let i = 0; i < samples; i++) {
      for (let j = 0; j < FOUR_BAR_FORCE_STATE; j++) out[j] = sweep.slots[j]![i]!
      column[i] = measure(out)
    }
    extremes.set(name, extremesOf(sweep.inputAngle, column, (t) => at(t, name), range, options?.candidates ?? [], linkage.rotation))
  }
  let stuck = 0
  for (let i = 0; i < samples; i++) if (Number.isNaN(sweep.slots[FB.TORQUE]![i]!)) stuck++
  const step = (range.end - range.start) / (samples - 1)
  const periodic = fullTurn && range.end - range.start >= TAU - 1e-9 && stuck === 0
  // The load's power is T_load·ω4 = T_load·h4·ω2: per unit input angle, T_load·h4 in the sense of rotation.
  const loadRate = new Float64Array(samples)
  for (let i = 0; i < samples; i++) {
    const theta = sweep.inputAngle[i]!
    if (!fourBarForceState(linkage, input, theta, omega, alpha, kin, out)) continue
    loadRate[i] = linkage.rotation * out[FB.LOAD_TORQUE]! * kin[H4]!
  }
  return {
    linkage,
    input,
    range,
    motion: { speed, angularAcceleration },
    sweep,
    extremes,
    torqueMean: periodic ? mean(sweep.slots[FB.TORQUE]!, step) : null,
    torqueRms: periodic ? rms(sweep.slots[FB.TORQUE]!, step) : null,
    powerMean: periodic ? mean(sweep.slots[FB.POWER]!, step) : null,
    driveWork: periodic ? integrate(sweep.slots[FB.TORQUE]!, step) : null,
    loadWork: periodic ? integrate(loadRate, step) : null,
    stuckPoints: stuck,
    at,
  }
}
