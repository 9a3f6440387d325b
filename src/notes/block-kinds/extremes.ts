/**
 * The extremes of a linkage's swept quantities as results: for each quantity its
 * largest and least signed values and its largest magnitude (never negative),
 * each with the crank angle where it occurs, named so that a check cannot be
 * misread (`velocity_abs_max <= 1 m/s` bounds both directions; `velocity_max`
 * is the largest value towards +x only). A value that grows without bound at a
 * limit angle has no number, with the reason.
 */
import type { Extremes } from '../../linkage/index.js'
import type { NamedValue } from '../types.js'
import type { SweptQuantity } from './kind.js'
import { quantity } from './values.js'

/** One quantity's extremes as named results. */
export interface ExtremesRow {
  readonly quantity: SweptQuantity
  readonly min: NamedValue
  readonly minAt: NamedValue
  readonly max: NamedValue
  readonly maxAt: NamedValue
  readonly absMax: NamedValue
  readonly absMaxAt: NamedValue
}

/** Names a note used before the extremes had their own names, with what to write now. */
export const RENAMED_RESULTS: ReadonlyMap<string, string> = new Map([
  ['peak_velocity', '`velocity_abs_max` (largest magnitude, never negative) or `velocity_max` / `velocity_min` (signed)'],
  ['peak_velocity_at', '`velocity_abs_max_at`, `velocity_max_at` or `velocity_min_at`'],
  ['peak_acceleration', '`acceleration_abs_max` (largest magnitude, never negative) or `acceleration_max` / `acceleration_min` (signed)'],
  ['peak_acceleration_at', '`acceleration_abs_max_at`, `acceleration_max_at` or `acceleration_min_at`'],
  ['peak_output_velocity', '`output_angular_velocity_abs_max` (largest magnitude) or `output_angular_velocity_max` / `_min` (signed)'],
  ['peak_output_velocity_at', '`output_angular_velocity_abs_max_at`'],
  ['peak_output_acceleration', '`output_angular_acceleration_abs_max` (largest magnitude) or `output_angular_acceleration_max` / `_min` (signed)'],
  ['peak_output_acceleration_at', '`output_angular_acceleration_abs_max_at`'],
  ['alpha', '`excess_angle` (the slower stroke’s crank travel beyond 180°, written Δ: α is the crank’s angular acceleration)'],
])

/**
 * The rows of an extremes table.
 * @param angle a core crank angle (rad) in the block's own angle convention
 * @param unbounded why a quantity has no largest value where it grows without bound
 */
export function extremesRows(
  quantities: readonly SweptQuantity[],
  extremes: ReadonlyMap<string, Extremes>,
  angle: (theta: number) => number,
  unbounded: (theta: number) => string,
  angleLabel: string,
): ExtremesRow[] {
  const rows: ExtremesRow[] = []
  for (const q of quantities) {
    const e = extremes.get(q.name)
    if (!e) continue
    const value = (suffix: string, words: string, v: { theta: number; value: number }): NamedValue =>
      Number.isFinite(v.value)
        ? quantity(`${q.name}_${suffix}`, `${words} ${q.label}`, null, q.kind, v.value)
        : quantity(`${q.name}_${suffix}`, `${words} ${q.label}`, null, q.kind, null, unbounded(v.theta))
    const at = (suffix: string, words: string, v: { theta: number }): NamedValue =>
      quantity(`${q.name}_${suffix}_at`, `${angleLabel} at the ${words} ${q.label}`, null, 'angle', angle(v.theta))
    rows.push({
      quantity: q,
      min: value('min', 'least', e.min),
      minAt: at('min', 'least', e.min),
      max: value('max', 'greatest', e.max),
      maxAt: at('max', 'greatest', e.max),
      absMax: value('abs_max', 'largest magnitude of the', e.absMax),
      absMaxAt: at('abs_max', 'largest magnitude of the', e.absMax),
    })
  }
  return rows
}

/** Every named value of the rows, for publishing. */
export function extremesValues(rows: readonly ExtremesRow[]): NamedValue[] {
  return rows.flatMap((r) => [r.min, r.minAt, r.max, r.maxAt, r.absMax, r.absMaxAt])
}
