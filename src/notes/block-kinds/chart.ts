/**
 * `chart` blocks: swept quantities of a linkage block against crank angle, time
 * or another swept quantity (velocity against position, the coupler-point path),
 * with the dead centres, the peaks and a limit marked. The values are the core's
 * own sweep, converted to the note's display units; the render layer draws them.
 *
 *     of: pusher
 *     series: velocity, acceleration
 *     at_most: 6 m/s^2        (a limit on the series of that kind)
 */
import { displayUnit, unitLabel } from '../display.js'
import { evaluateText } from '../expressions.js'
import { messages } from '../messages.js'
import { fromSI, readQuantity, type QuantityKind } from '../quantity.js'
import { reportError } from '../report.js'
import { intoRange, openSweepBlock, sweepDependencies } from './sweep-block.js'
import { outcome, type BlockKind, type ChartOutcome, type ChartSeries, type SweepSource } from './kind.js'

const KNOWN = ['of', 'series', 'x', 'layout', 'at_least', 'at_most', 'size', 'x_range', 'y_range', 'samples']

export const chartKind: BlockKind = {
  name: 'chart',
  label: 'Chart',
  needsId: false,
  dependencies: sweepDependencies,
  evaluate(block, context) {
    const { file, meta } = context
    const opened = openSweepBlock(block, context, 'chart-syntax', KNOWN)
    if (!opened) return null
    const { entries, of, source, fail } = opened
    const known = source.quantities.map((q) => q.name)
    const names = (entries.get('series')?.value ?? '').split(',').map((s) => s.trim()).filter(Boolean)
    if (names.length === 0 || names.length > 4) return fail('expected `series:` with one to four swept quantities', entries.get('series')?.valuePlace)
    for (const name of names) {
      if (!known.includes(name)) {
        reportError(file, 'unknown-quantity', messages['unknown-quantity'](name, `${of.value} sweep`, known), entries.get('series')!.valuePlace)
        return null
      }
    }
    const xName = entries.get('x')?.value ?? 'crank angle'
    const isAngle = xName === 'crank angle' || xName === 'input angle' || xName === 'angle'
    if (!isAngle && xName !== 'time' && !known.includes(xName)) {
      reportError(file, 'unknown-quantity', messages['unknown-quantity'](xName, `x axis of ${of.value}`, [source.angleLabel, 'time', ...known]), entries.get('x')!.valuePlace)
      return null
    }
    const samplesText = entries.get('samples')?.value
    const samples = samplesText === undefined ? 361 : Number(samplesText)
    if (!Number.isInteger(samples) || samples < 11 || samples > 5001) return fail('expected `samples:` as a whole number from 11 to 5001', entries.get('samples')?.valuePlace)

    // The core's own sweep across the linkage's range.
    const { angles, columns } = source.sample(samples)
    const quantity = (name: string) => source.quantities.find((q) => q.name === name)!
    const convert = (values: Float64Array, kind: QuantityKind): Float64Array => {
      const unit = displayUnit(kind, meta.units)
      return values.map((v) => fromSI(v, kind, unit))
    }
    const angleUnit = displayUnit('angle', meta.units)
    const xAxis = isAngle
      ? { name: 'angle', label: source.angleLabel, unit: unitLabel(angleUnit), kind: 'angle' as QuantityKind, values: convert(angles, 'angle') }
      : (() => {
          const q = xName === 'time' ? { name: 'time', label: 'time', kind: 'time' as QuantityKind } : quantity(xName)
          return { name: q.name, label: q.label, unit: unitLabel(displayUnit(q.kind, meta.units)), kind: q.kind, values: convert(columns[q.name]!, q.kind) }
        })()
    const series: ChartSeries[] = names.map((name) => {
      const q = quantity(name)
      return { name, label: q.label, kind: q.kind, unit: unitLabel(displayUnit(q.kind, meta.units)), values: convert(columns[name]!, q.kind) }
    })
    const layoutText = entries.get('layout')?.value
    if (layoutText !== undefined && layoutText !== 'stacked' && layoutText !== 'overlaid') {
      reportError(file, 'invalid-choice', messages['invalid-choice']('layout', layoutText, ['stacked', 'overlaid']), entries.get('layout')!.valuePlace)
      return null
    }
    const sameKind = series.every((s) => s.kind === series[0]!.kind)
    if (layoutText === 'overlaid' && !sameKind) return fail('`layout: overlaid` needs series of one kind (one unit); use `stacked`', entries.get('layout')!.valuePlace)
    const layout = layoutText ?? (sameKind ? 'overlaid' : 'stacked')

    // A limit drawn on the series of its kind, with the stretch that breaks it.
    let limit: ChartOutcome['limit'] = null
    for (const sense of ['at_least', 'at_most'] as const) {
      const entry = entries.get(sense)
      if (!entry) continue
      if (limit) return fail('give either `at_least` or `at_most`, not both', entry.namePlace)
      // A leading ± draws the limit on both sides of zero (e.g. an acceleration limit).
      const symmetric = /^(±|\+\/-)/.test(entry.value)
      const evaluated = evaluateText(entry.value.replace(/^(±|\+\/-)\s*/, ''), context.scope, {}, context.blockIds)
      const target = series.find((s) => evaluated.ok && readQuantity(evaluated.value, s.kind).ok)
      if (!evaluated.ok || !target) return fail(`\`${sense}\` must be a quantity of the kind of one of the series`, entry.valuePlace)
      const si = (readQuantity(evaluated.value, target.kind) as { si: number }).si
      const value = fromSI(si, target.kind, displayUnit(target.kind, meta.units))
      limit = { sense: sense === 'at_least' ? 'at least' : 'at most', value, symmetric, series: target.name, source: entry.source }
    }
    const size = readSize(entries.get('size')?.value)
    if (size === null) return fail('expected `size:` as width x height in pixels, e.g. `640 x 220`', entries.get('size')?.valuePlace)
    const xRange = readRange(entries.get('x_range')?.value, xAxis.kind, context)
    const yRange = readRange(entries.get('y_range')?.value, series[0]!.kind, context)
    if (xRange === undefined) return fail('expected `x_range:` as two quantities, e.g. `0 deg, 360 deg`', entries.get('x_range')?.valuePlace)
    if (yRange === undefined) return fail('expected `y_range:` as two quantities of the first series’ kind', entries.get('y_range')?.valuePlace)
    const markers = isAngle || xName === 'time' ? chartMarkers(source, xName === 'time', columns, angles, meta.units) : []
    // The analysis's exact extremes, placed on this chart's axes.
    const peaks = names.flatMap((name) => {
      const peak = source.peaks[name]
      if (!peak) return []
      const at = source.at(Float64Array.of(peak.theta))
      const q = quantity(name)
      const x = isAngle
        ? fromSI(peak.theta, 'angle', angleUnit)
        : fromSI(at[xAxis.name]![0]!, xAxis.kind, displayUnit(xAxis.kind, meta.units))
      return [{ series: name, x, y: fromSI(peak.value, q.kind, displayUnit(q.kind, meta.units)), label: peak.label }]
    })
    const chart: ChartOutcome = {
      of: of.value,
      title: block.title,
      x: xAxis,
      series,
      layout,
      markers,
      limit,
      peaks,
      width: size[0],
      height: size[1],
      xRange: xRange ?? (isAngle ? [xAxis.values[0]!, xAxis.values[xAxis.values.length - 1]!] : null),
      yRange,
      equalAspect: !isAngle && xAxis.kind === 'length' && series.length === 1 && series[0]!.kind === 'length',
      samples,
    }
    return outcome(block, 'Chart', { chart })
  },
}

function readSize(text: string | undefined): [number, number] | null {
  if (text === undefined) return [640, 220]
  const match = /^(\d+)\s*[x×]\s*(\d+)$/.exec(text.trim())
  if (!match) return null
  const [w, h] = [Number(match[1]), Number(match[2])]
  return w >= 120 && w <= 2000 && h >= 80 && h <= 2000 ? [w, h] : null
}

/** Two quantities in display units, null when absent, undefined when wrong. */
function readRange(text: string | undefined, kind: QuantityKind, context: Parameters<BlockKind['evaluate']>[1]): [number, number] | null | undefined {
  if (text === undefined) return null
  const parts = text.split(',').map((p) => p.trim())
  if (parts.length !== 2) return undefined
  const values: number[] = []
  for (const part of parts) {
    const evaluated = evaluateText(part, context.scope, {}, context.blockIds)
    const reading = evaluated.ok ? readQuantity(evaluated.value, kind) : null
    if (!reading?.ok) return undefined
    values.push(fromSI(reading.si, kind, displayUnit(kind, context.meta.units)))
  }
  return values[0]! < values[1]! ? [values[0]!, values[1]!] : undefined
}

function chartMarkers(
  source: SweepSource,
  byTime: boolean,
  columns: Record<string, Float64Array>,
  angles: Float64Array,
  units: Parameters<typeof displayUnit>[1],
): ChartOutcome['markers'] {
  const unit = displayUnit(byTime ? 'time' : 'angle', units)
  return source.markers.map((marker) => {
    const theta = intoRange(marker.theta, source.start)
    if (!byTime) return { label: marker.label, x: fromSI(theta, 'angle', unit) }
    // Time at the marker: interpolate the swept time column.
    const time = columns.time!
    let i = 0
    while (i < angles.length - 2 && angles[i + 1]! < theta) i++
    const f = (theta - angles[i]!) / (angles[i + 1]! - angles[i]!)
    return { label: marker.label, x: fromSI(time[i]! + f * (time[i + 1]! - time[i]!), 'time', unit) }
  })
}
