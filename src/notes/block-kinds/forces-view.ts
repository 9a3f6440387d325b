/**
 * One view of a force analysis, whichever core made it (the slider-crank's
 * closed form, or the four-bar's for a four-bar and an arc-path slider): the
 * swept force quantities with their labels and extremes, values at any crank
 * angles, and the cycle figures. The forces block builds its results on it.
 */
import {
  FORCE_STATE,
  FOUR_BAR_FORCE_MEASURES,
  FOUR_BAR_FORCE_STATE,
  FourBarForceSweep,
  SLIDER_CRANK_FORCE_MEASURES,
  SliderCrankForceSweep,
  type Extremes,
  type FourBarForceAnalysis,
  type SliderCrankForceAnalysis,
} from '../../linkage/index.js'
import type { SweptQuantity } from './kind.js'

/** A force analysis seen the same way for every linkage. */
export interface ForceView {
  /** Swept force quantities, in the order tables and the extremes show them. */
  readonly quantities: readonly SweptQuantity[]
  /** Names whose extremes go into the block's extremes table. */
  readonly headline: readonly string[]
  readonly extremes: ReadonlyMap<string, Extremes>
  /** Values of every force quantity at core angles. */
  at(angles: Float64Array): Record<string, Float64Array>
  /** One quantity at one core angle. */
  value(theta: number, name: string): number
  /** Name of the torque and the power quantities (crank_torque, output_torque, input_torque …). */
  readonly torqueName: string
  readonly powerName: string
  /** +1 when the torque shown is the drive's, −1 when it is the torque delivered (a slider-driven machine). */
  readonly torqueSign: 1 | -1
  readonly torqueMean: number | null
  readonly torqueRms: number | null
  readonly powerMean: number | null
  readonly driveWork: number | null
  readonly loadWork: number | null
  readonly frictionWork: number | null
  /** Points where the linkage locks (friction) or cannot be driven. */
  readonly stuck: number
}

const q = (name: string, label: string, kind: SweptQuantity['kind']): SweptQuantity => ({ name, label, kind })

/** The view of a straight-path slider-crank's force analysis. */
export function sliderCrankForceView(f: SliderCrankForceAnalysis, withFriction: boolean): ForceView {
  const delivered = f.kinematics.linkage.driver === 'slider'
  const sign: 1 | -1 = delivered ? -1 : 1
  const torqueName = delivered ? 'output_torque' : 'crank_torque'
  const powerName = delivered ? 'output_power' : 'power'
  const quantities: SweptQuantity[] = [
    q('load', 'process load on the slider (+x)', 'force'),
    q('rod_force', 'rod force (tension +, compression −)', 'force'),
    q('side_thrust', 'guide side thrust on the slider (+y)', 'force'),
    ...(withFriction ? [q('friction_force', 'guide friction on the slider (+x)', 'force')] : []),
    q('wrist_pin_force', 'wrist-pin force', 'force'),
    q('crank_pin_force', 'crank-pin force', 'force'),
    q('crank_pin_radial', 'crank-pin force along the crank (outward +)', 'force'),
    q('crank_pin_tangential', 'crank-pin force across the crank (counter-clockwise +)', 'force'),
    q('bearing_force', 'main-bearing force on the frame', 'force'),
    q('bearing_x', 'main-bearing force on the frame, x', 'force'),
    q('bearing_y', 'main-bearing force on the frame, y', 'force'),
    delivered
      ? q('output_torque', 'torque the crank delivers (+ in the sense of rotation)', 'torque')
      : q('crank_torque', 'drive torque on the crank (+ in the sense of rotation)', 'torque'),
    delivered ? q('output_power', 'power the crank delivers', 'power') : q('power', 'drive power', 'power'),
    q('reciprocating_force', 'inertia force of the reciprocating mass (+x)', 'force'),
    q('shaking_force', 'shaking force on the frame', 'force'),
    q('shaking_force_x', 'shaking force on the frame, x', 'force'),
    q('shaking_force_y', 'shaking force on the frame, y', 'force'),
    q('shaking_moment', 'shaking moment about the crank axis (counter-clockwise +)', 'torque'),
  ]
  const measureOf = (name: string): string => (name === 'output_torque' ? 'crank_torque' : name === 'output_power' ? 'power' : name)
  const signOf = (name: string): number => (name === 'output_torque' || name === 'output_power' ? -1 : 1)
  const extremes = new Map<string, Extremes>()
  for (const quantity of quantities) {
    const e = f.extremes.get(measureOf(quantity.name))!
    extremes.set(quantity.name, signOf(quantity.name) === 1 ? e : negate(e))
  }
  const snap = snapped(quantities, extremes)
  return {
    quantities,
    headline: ['load', 'rod_force', 'side_thrust', ...(withFriction ? ['friction_force'] : []), 'wrist_pin_force', 'crank_pin_force', 'bearing_force', torqueName, powerName, 'reciprocating_force', 'shaking_force', 'shaking_moment'],
    extremes,
    at(angles) {
      const sweep = new SliderCrankForceSweep(f.kinematics.linkage, f.input, f.timing, angles.length).updateAt(angles, f.kinematics.speed, f.kinematics.angularAcceleration)
      const out = new Float64Array(FORCE_STATE)
      const columns: Record<string, Float64Array> = {}
      for (const quantity of quantities) columns[quantity.name] = new Float64Array(angles.length)
      for (let i = 0; i < angles.length; i++) {
        for (let j = 0; j < FORCE_STATE; j++) out[j] = sweep.slots[j]![i]!
        for (const quantity of quantities) columns[quantity.name]![i] = snap(quantity.name, signOf(quantity.name) * SLIDER_CRANK_FORCE_MEASURES[measureOf(quantity.name)]!(out, angles[i]!))
      }
      return columns
    },
    value: (theta, name) => signOf(name) * f.at(theta, measureOf(name)),
    torqueName,
    powerName,
    torqueSign: sign,
    torqueMean: f.torqueMean === null ? null : sign * f.torqueMean,
    torqueRms: f.torqueRms,
    powerMean: f.powerMean === null ? null : sign * f.powerMean,
    driveWork: f.driveWork,
    loadWork: f.loadWork,
    frictionWork: f.frictionWork,
    stuck: f.lockedPoints,
  }
}

/** The view of a four-bar's force analysis (a four-bar, or an arc-path slider through its equivalent four-bar). */
export function fourBarForceView(f: FourBarForceAnalysis, as: 'four-bar' | 'arc-slider', delivered: boolean): ForceView {
  const sign: 1 | -1 = delivered ? -1 : 1
  const names: Readonly<Record<string, readonly [string, string, SweptQuantity['kind']]>> =
    as === 'four-bar'
      ? {
          input_torque: ['input_torque', 'drive torque on the input (+ in the sense of rotation)', 'torque'],
          power: ['power', 'drive power', 'power'],
          output_load_torque: ['output_load_torque', 'load torque on the output (counter-clockwise +)', 'torque'],
          coupler_force: ['coupler_force', 'coupler force (tension +, compression −)', 'force'],
          input_pivot_force: ['input_pivot_force', 'force at the input pivot O2', 'force'],
          input_pin_force: ['input_pin_force', 'force at the input pin A', 'force'],
          output_pin_force: ['output_pin_force', 'force at the output pin B', 'force'],
          output_pivot_force: ['output_pivot_force', 'force at the output pivot O4', 'force'],
          shaking_force: ['shaking_force', 'shaking force on the frame', 'force'],
        }
      : {
          input_torque: delivered ? ['output_torque', 'torque the crank delivers (+ in the sense of rotation)', 'torque'] : ['crank_torque', 'drive torque on the crank (+ in the sense of rotation)', 'torque'],
          power: delivered ? ['output_power', 'power the crank delivers', 'power'] : ['power', 'drive power', 'power'],
          coupler_force: ['rod_force', 'rod force (tension +, compression −)', 'force'],
          input_pivot_force: ['bearing_force', 'main-bearing force on the frame', 'force'],
          input_pin_force: ['crank_pin_force', 'crank-pin force', 'force'],
          output_pin_force: ['wrist_pin_force', 'wrist-pin force', 'force'],
          output_pivot_force: ['guide_force', 'guide normal force (at the arc centre)', 'force'],
          shaking_force: ['shaking_force', 'shaking force on the frame', 'force'],
        }
  const quantities = Object.values(names).map(([name, label, kind]) => q(name, label, kind))
  const measureOf = new Map(Object.entries(names).map(([measure, [name]]) => [name, measure]))
  const signOf = (name: string): number => (delivered && (name === 'output_torque' || name === 'output_power') ? -1 : 1)
  const extremes = new Map<string, Extremes>()
  for (const quantity of quantities) {
    const e = f.extremes.get(measureOf.get(quantity.name)!)!
    extremes.set(quantity.name, signOf(quantity.name) === 1 ? e : negate(e))
  }
  const snap = snapped(quantities, extremes)
  const torqueName = names.input_torque![0]
  const powerName = names.power![0]
  return {
    quantities,
    headline: quantities.map((x) => x.name),
    extremes,
    at(angles) {
      const sweep = new FourBarForceSweep(f.linkage, f.input, angles.length).updateAt(angles, f.motion.speed, f.motion.angularAcceleration)
      const out = new Float64Array(FOUR_BAR_FORCE_STATE)
      const columns: Record<string, Float64Array> = {}
      for (const quantity of quantities) columns[quantity.name] = new Float64Array(angles.length)
      for (let i = 0; i < angles.length; i++) {
        for (let j = 0; j < FOUR_BAR_FORCE_STATE; j++) out[j] = sweep.slots[j]![i]!
        for (const quantity of quantities) columns[quantity.name]![i] = snap(quantity.name, signOf(quantity.name) * FOUR_BAR_FORCE_MEASURES[measureOf.get(quantity.name)!]!(out))
      }
      return columns
    },
    value: (theta, name) => signOf(name) * f.at(theta, measureOf.get(name) ?? name),
    torqueName,
    powerName,
    torqueSign: sign,
    torqueMean: f.torqueMean === null ? null : sign * f.torqueMean,
    torqueRms: f.torqueRms,
    powerMean: f.powerMean === null ? null : sign * f.powerMean,
    driveWork: f.driveWork,
    loadWork: f.loadWork === null ? null : -f.loadWork,
    frictionWork: null,
    stuck: f.stuckPoints,
  }
}

/**
 * Values that are zero but for rounding (the shaking moment of an in-line drive
 * with a two-mass rod) set to zero: below 1e-12 of the largest of their kind.
 */
function snapped(quantities: readonly SweptQuantity[], extremes: Map<string, Extremes>): (name: string, value: number) => number {
  const scale = new Map<string, number>()
  for (const quantity of quantities) {
    const v = extremes.get(quantity.name)!.absMax.value
    if (Number.isFinite(v)) scale.set(quantity.kind, Math.max(scale.get(quantity.kind) ?? 0, v))
  }
  const kindOf = new Map(quantities.map((x) => [x.name, x.kind]))
  const snap = (name: string, value: number): number => (Math.abs(value) < 1e-12 * (scale.get(kindOf.get(name)!) ?? 0) ? 0 : value)
  for (const quantity of quantities) {
    const e = extremes.get(quantity.name)!
    extremes.set(quantity.name, {
      ...e,
      max: { ...e.max, value: snap(quantity.name, e.max.value) },
      min: { ...e.min, value: snap(quantity.name, e.min.value) },
      absMax: { ...e.absMax, value: snap(quantity.name, e.absMax.value) },
    })
  }
  return snap
}

/** Extremes of the negated quantity. */
function negate(e: Extremes): Extremes {
  return {
    max: { theta: e.min.theta, value: -e.min.value },
    min: { theta: e.max.theta, value: -e.max.value },
    absMax: e.absMax,
    unbounded: { positive: e.unbounded.negative, negative: e.unbounded.positive },
  }
}

