/**
 * `table` blocks: chosen swept quantities of a linkage block at chosen crank
 * angles, always with rows at the dead centres (or toggles and limits).
 *
 *     of: pusher
 *     quantities: position, velocity, acceleration, transmission_angle
 *     every: 30 deg
 */
import { displayUnit, formatNumber, unitLabel } from '../display.js'
import { evaluateText } from '../expressions.js'
import { messages } from '../messages.js'
import { fromSI, readQuantity } from '../quantity.js'
import { reportError } from '../report.js'
import { intoRange, openSweepBlock, sweepDependencies } from './sweep-block.js'
import { outcome, type BlockKind, type TableOutcome } from './kind.js'

const KNOWN = ['of', 'quantities', 'every', 'at']
const TURN = 2 * Math.PI
/** Most rows a table may have: a design review reads it. */
const MAX_ROWS = 400

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
    // Angles: every step over the range (or the listed ones), then the marked positions.
    const angles: number[] = []
    const at = entries.get('at')
    if (at) {
      for (const part of at.value.split(',')) {
        const evaluated = evaluateText(part.trim(), context.scope, {}, context.blockIds)
        const reading = evaluated.ok ? readQuantity(evaluated.value, 'angle') : null
        if (!reading?.ok) return fail(`expected angles in \`at\`, e.g. \`0 deg, 90 deg\`; \`${part.trim()}\` is not one`, at.valuePlace)
        angles.push(reading.si)
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
      const first = Math.ceil(source.start / step - 1e-9)
      const last = Math.floor(source.end / step + 1e-9)
      if (last - first + 1 > MAX_ROWS) return fail(`\`every\` gives ${last - first + 1} rows; use a larger step (at most ${MAX_ROWS} rows)`, every?.valuePlace)
      for (let k = first; k <= last; k++) {
        const theta = k * step
        if (source.fullTurn && theta >= source.start + TURN - 1e-9) break
        angles.push(theta)
      }
    }
    const rows: { theta: number; marker: string | null }[] = angles.map((theta) => ({ theta: source.fullTurn ? intoRange(theta, 0) : theta, marker: null }))
    for (const marker of source.markers) rows.push({ theta: intoRange(marker.theta, source.start), marker: marker.label })
    rows.sort((p, q) => p.theta - q.theta || (p.marker ? 1 : -1))
    const columns = source.at(Float64Array.from(rows, (r) => r.theta))
    const angleUnit = displayUnit('angle', meta.units)
    const chosen = wanted.map((name) => source.quantities.find((q) => q.name === name)!)
    // Rounding dust (1e-17 m/s at a dead centre) prints as 0: below 1e-12 of the column's largest value.
    for (const q of chosen) {
      const column = columns[q.name]!
      let largest = 0
      for (const v of column) if (Number.isFinite(v)) largest = Math.max(largest, Math.abs(v))
      for (let i = 0; i < column.length; i++) if (Math.abs(column[i]!) < 1e-12 * largest) column[i] = 0
    }
    const table: TableOutcome = {
      of: of.value,
      columns: [
        { label: source.angleLabel, unit: unitLabel(angleUnit) },
        ...chosen.map((q) => ({ label: q.label, unit: unitLabel(displayUnit(q.kind, meta.units)) })),
      ],
      rows: rows.map((row, i) => ({
        marker: row.marker,
        cells: [
          formatNumber(fromSI(row.theta, 'angle', angleUnit), meta.digits),
          ...chosen.map((q) => formatNumber(fromSI(columns[q.name]![i]!, q.kind, displayUnit(q.kind, meta.units)), meta.digits)),
        ],
      })),
    }
    return outcome(block, 'Table', { table })
  },
}
