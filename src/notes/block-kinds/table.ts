/**
 * `table` blocks: chosen swept quantities of a linkage block at chosen crank
 * angles, always with rows at the dead centres (or toggles and limits), listed
 * in time order, each column printed with one count of decimals.
 *
 *     of: pusher
 *     quantities: position, velocity, acceleration, transmission_angle
 *     every: 30 deg
 *     peaks: yes               (rows also at each quantity's greatest and least value)
 */
import { columnDecimals, displayUnit, formatFixed, unitLabel } from '../display.js'
import { evaluateText } from '../expressions.js'
import { messages } from '../messages.js'
import { fromSI, readQuantity } from '../quantity.js'
import { reportError } from '../report.js'
import { toCore, toDisplay, travel } from './angles.js'
import { openSweepBlock, sweepDependencies } from './sweep-block.js'
import { outcome, type BlockKind, type TableOutcome } from './kind.js'

const KNOWN = ['of', 'quantities', 'every', 'at', 'peaks']
/** Most rows a table may have: a design review reads it. */
const MAX_ROWS = 400
/** A marked position this close (rad) to a stepped row is that row: one row, labelled. */
const SAME_ROW = 1e-7

export const tableKind: BlockKind = {
  name: 'table',
  label: 'Table',
  needsId: false,
  dependencies: sweepDependencies,
  evaluate(block, context) {
    const { file, meta } = context
    const opened = openSweepBlock(block, context, 'table-syntax', KNOWN)
    if (!opened) return null
    const { entries, of, source, fail } = opened
    const wanted = (entries.get('quantities')?.value ?? '').split(',').map((q) => q.trim()).filter(Boolean)
    if (wanted.length === 0) return fail('missing `quantities: name, name, …`')
    const known = source.quantities.map((q) => q.name)
    for (const name of wanted) {
      if (!known.includes(name)) {
        reportError(file, 'unknown-quantity', messages['unknown-quantity'](name, `${of.value} sweep`, known), entries.get('quantities')!.valuePlace)
        return null
      }
    }
    // Rows in display angles: every step over the range (or the listed angles), then the marked positions.
    const displays: number[] = []
    const at = entries.get('at')
    if (at) {
      for (const part of at.value.split(',')) {
        const evaluated = evaluateText(part.trim(), context.scope, {}, context.blockIds)
        const reading = evaluated.ok ? readQuantity(evaluated.value, 'angle') : null
        if (!reading?.ok) return fail(`expected angles in \`at\`, e.g. \`0 deg, 90 deg\` (${source.convention.label}); \`${part.trim()}\` is not one`, at.valuePlace)
        displays.push(source.fullTurn ? toDisplay(source, toCore(source, reading.si)) : reading.si)
      }
    } else {
      const every = entries.get('every')
      let step = (30 * Math.PI) / 180
      if (every) {
        const evaluated = evaluateText(every.value, context.scope, {}, context.blockIds)
        const reading = evaluated.ok ? readQuantity(evaluated.value, 'angle') : null
        if (!reading?.ok || !(reading.si > 0)) return fail('expected a positive angle step in `every`, e.g. `every: 30 deg`', every.valuePlace)
        step = reading.si
      }
      // Round angles (multiples of the step) across the range; its ends come as marked rows.
      const first = Math.ceil(source.displayStart / step - 1e-9)
      const last = Math.floor(source.displayEnd / step + 1e-9)
      if (last - first + 1 > MAX_ROWS) return fail(`\`every\` gives ${last - first + 1} rows; use a larger step (at most ${MAX_ROWS} rows)`, every?.valuePlace)
      for (let k = first; k <= last; k++) {
        const d = k * step
        if (source.fullTurn && d >= source.displayEnd - 1e-9) break
        displays.push(d)
      }
    }
    const rows: { display: number; marker: string | null }[] = displays.map((display) => ({ display, marker: null }))
    for (const marker of source.markers) {
      const display = toDisplay(source, marker.theta)
      const same = rows.find((r) => Math.abs(r.display - display) < SAME_ROW)
      if (same) same.marker = same.marker ? `${same.marker}, ${marker.label}` : marker.label
      else rows.push({ display, marker: marker.label })
    }
    // The exact extremes of the listed quantities, as rows of their own.
    const peaks = entries.get('peaks')
    if (peaks && peaks.value !== 'yes' && peaks.value !== 'no') {
      reportError(file, 'invalid-choice', messages['invalid-choice']('peaks', peaks.value, ['yes', 'no']), peaks.valuePlace)
      return null
    }
    if (peaks?.value === 'yes') {
      for (const name of wanted) {
        const e = source.extremes.get(name)
        if (!e) continue
        for (const [words, point] of [['greatest', e.max], ['least', e.min]] as const) {
          if (!Number.isFinite(point.value)) continue
          const display = toDisplay(source, point.theta)
          const label = `${words} ${name}`
          const same = rows.find((r) => Math.abs(r.display - display) < SAME_ROW)
          if (same) same.marker = same.marker ? `${same.marker}, ${label}` : label
          else rows.push({ display, marker: label })
        }
      }
    }
    // Time order: from where the cycle starts, in the sense of rotation.
    const order = (display: number): number => travel(source, toCore(source, display))
    rows.sort((p, q) => order(p.display) - order(q.display) || (p.marker ? 1 : -1))
    const columns = source.at(Float64Array.from(rows, (r) => toCore(source, r.display)))
    const angleUnit = displayUnit('angle', meta.units)
    const chosen = wanted.map((name) => source.quantities.find((q) => q.name === name)!)
    const angleColumn = rows.map((r) => fromSI(r.display, 'angle', angleUnit))
    const shown = chosen.map((q) => {
      const unit = displayUnit(q.kind, meta.units)
      const column = columns[q.name]!
      // Rounding dust (1e-17 m/s at a dead centre) prints as 0: below 1e-12 of the column's largest value.
      let largest = 0
      for (const v of column) if (Number.isFinite(v)) largest = Math.max(largest, Math.abs(v))
      const values = Array.from(column, (v) => (Math.abs(v) < 1e-12 * largest ? 0 : fromSI(v, q.kind, unit)))
      // At a limit angle a rate grows without bound: no number there, and none counted for the column's decimals.
      const unbounded = rows.map((r) => source.unboundedAtEnds.has(q.name) && r.marker !== null && /limit/.test(r.marker))
      const finite = values.filter((_, i) => !unbounded[i])
      return { q, unit, values, unbounded, decimals: columnDecimals(finite, meta.digits) }
    })
    const angleDecimals = columnDecimals(angleColumn, meta.digits)
    const table: TableOutcome = {
      of: of.value,
      angles: source.convention.words,
      columns: [
        { label: source.convention.label, unit: unitLabel(angleUnit), decimals: angleDecimals },
        ...shown.map((s) => ({ label: s.q.label, unit: unitLabel(s.unit), decimals: s.decimals })),
      ],
      rows: rows.map((row, i) => ({
        marker: row.marker,
        cells: [formatFixed(angleColumn[i]!, angleDecimals), ...shown.map((s) => (s.unbounded[i] ? 'unbounded' : formatFixed(s.values[i]!, s.decimals)))],
      })),
    }
    return outcome(block, 'Table', { table })
  },
}
