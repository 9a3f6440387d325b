/**
 * Process loads: a force on the slider (or a torque on a four-bar's output) as a
 * constant or a table against crank angle, slider position or travel from the
 * outer dead centre, interpolated linearly, acting against the motion or in a
 * fixed sense, on one stroke or both. Pure; the table is searched without allocation.
 */
import { LinkageError } from './errors.js'
import { TAU } from './math.js'

/** What a load table's first column is. */
export type LoadAbscissa = 'angle' | 'position' | 'travel'

/** Which way a load acts. */
export type LoadSense = 'against-motion' | 'towards-crank' | 'away-from-crank'

/** On which stroke a load acts: both, the outstroke (inner → outer dead centre) or the instroke. */
export type LoadStroke = 'both' | 'outstroke' | 'instroke'

/** A load as the core takes it (SI: N, or N·m on a four-bar output). */
export interface Load {
  /** Constant value, or null for a table. */
  readonly constant: number | null
  /** The table's first column (rad, m) ascending, and its values; empty for a constant. */
  readonly xs: Float64Array
  readonly ys: Float64Array
  readonly abscissa: LoadAbscissa
  /** For an angle table: the core angle of its zero and its sense (display = sense·(θ − origin), one turn). */
  readonly angleOrigin: number
  readonly angleSense: 1 | -1
  readonly sense: LoadSense
  readonly stroke: LoadStroke
  /** A factor on every value (a piston area under a pressure table; 1 otherwise). */
  readonly scale: number
}

/** A load table checked: ascending abscissae, finite values. Throws LinkageError otherwise. */
export function loadTable(
  xs: readonly number[],
  ys: readonly number[],
  options: { abscissa: LoadAbscissa; sense: LoadSense; stroke?: LoadStroke; angleOrigin?: number; angleSense?: 1 | -1; scale?: number },
): Load {
  if (xs.length !== ys.length || xs.length < 2) {
    throw new LinkageError('invalid-number', `A load table needs at least two rows of two numbers, got ${xs.length}`)
  }
  for (let i = 0; i < xs.length; i++) {
    if (!Number.isFinite(xs[i]!) || !Number.isFinite(ys[i]!)) throw new LinkageError('invalid-number', `Row ${i + 1} of the load table is not a pair of finite numbers`, { row: i + 1 })
    if (i > 0 && !(xs[i]! > xs[i - 1]!)) {
      throw new LinkageError('invalid-number', `The load table's first column must rise from row to row; row ${i + 1} does not`, { row: i + 1 })
    }
  }
  return {
    constant: null,
    xs: Float64Array.from(xs),
    ys: Float64Array.from(ys),
    abscissa: options.abscissa,
    angleOrigin: options.angleOrigin ?? 0,
    angleSense: options.angleSense ?? 1,
    sense: options.sense,
    stroke: options.stroke ?? 'both',
    scale: options.scale ?? 1,
  }
}

/** A constant load. */
export function constantLoad(value: number, sense: LoadSense, stroke: LoadStroke = 'both', scale = 1): Load {
  if (!Number.isFinite(value)) throw new LinkageError('invalid-number', `The load must be a finite number, got ${value}`)
  return { constant: value, xs: new Float64Array(0), ys: new Float64Array(0), abscissa: 'angle', angleOrigin: 0, angleSense: 1, sense, stroke, scale }
}

/** No load. */
export const NO_LOAD: Load = constantLoad(0, 'against-motion')

/**
 * The table's value at x, linearly interpolated; outside the table, its end
 * value (the notes layer refuses a table that does not cover the motion).
 * An angle table is periodic over one turn.
 */
export function interpolate(load: Load, x: number): number {
  if (load.constant !== null) return load.constant * load.scale
  const { xs, ys } = load
  const n = xs.length
  let t = x
  if (load.abscissa === 'angle') {
    // A table over one turn: reduce into [xs[0], xs[0] + 2π) and close the last row onto the first.
    const first = xs[0]!
    const d = x - first
    t = first + (d - TAU * Math.floor(d / TAU))
    if (t > xs[n - 1]!) {
      const span = first + TAU - xs[n - 1]!
      const f = span > 0 ? (t - xs[n - 1]!) / span : 0
      return (ys[n - 1]! + f * (ys[0]! - ys[n - 1]!)) * load.scale
    }
  }
  if (t <= xs[0]!) return ys[0]! * load.scale
  if (t >= xs[n - 1]!) return ys[n - 1]! * load.scale
  // Binary search for the interval holding t.
  let lo = 0
  let hi = n - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (xs[mid]! <= t) lo = mid
    else hi = mid
  }
  const f = (t - xs[lo]!) / (xs[hi]! - xs[lo]!)
  return (ys[lo]! + f * (ys[hi]! - ys[lo]!)) * load.scale
}

/**
 * The load's force on the slider along +x of the path (N), at a crank angle θ with
 * the slider at `position`, `travel` from the outer dead centre, moving with
 * `velocity` (+x), on the outstroke or not; `side` is +1 when the slider is on the
 * +x side of the crank axis (towards the crank is then −x).
 */
export function sliderLoadForce(load: Load, theta: number, position: number, travel: number, outstroke: boolean, side: number): number {
  if (load.stroke === 'outstroke' && !outstroke) return 0
  if (load.stroke === 'instroke' && outstroke) return 0
  const x = load.abscissa === 'angle' ? load.angleSense * (theta - load.angleOrigin) : load.abscissa === 'position' ? position : travel
  const magnitude = interpolate(load, x)
  if (load.sense === 'towards-crank') return -side * magnitude
  if (load.sense === 'away-from-crank') return side * magnitude
  // Against the motion: the outstroke moves away from the crank, so the load points towards it.
  return outstroke ? -side * magnitude : side * magnitude
}
