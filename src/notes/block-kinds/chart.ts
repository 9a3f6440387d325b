/**
 * `chart` blocks: swept quantities of a linkage block against crank angle, time
 * or another swept quantity (velocity against position, the coupler-point path),
 * with the dead centres, the exact extremes and a limit marked. The values are
 * the core's own sweep, converted to the note's display units; the render layer
 * draws them.
 *
 *     of: pusher
 *     series: velocity, acceleration
 *     at_most: ±6 m/s^2        (a limit on the series of that kind; ± for both signs)
 *     mean: yes                (each series' mean over the cycle as a line: a torque's mean)
 */
import { displayUnit, formatNumber, unitLabel } from '../display.js'
import { evaluateText } from '../expressions.js'
import { messages } from '../messages.js'
import { fromSI, readQuantity, type QuantityKind } from '../quantity.js'
import { reportError } from '../report.js'
import { toCore, toDisplay } from './angles.js'
import { openSweepBlock, sweepDependencies } from './sweep-block.js'
import { outcome, type BlockKind, type ChartOutcome, type ChartSeries, type SweepSource } from './kind.js'

const KNOWN = ['of', 'series', 'x', 'layout', 'at_least', 'at_most', 'size', 'x_range', 'y_range', 'samples', 'mean']

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
      reportError(file, 'unknown-quantity', messages['unknown-quantity'](xName, `x axis of ${of.value}`, ['crank angle', 'time', ...known]), entries.get('x')!.valuePlace)
      return null
    }
    const samplesText = entries.get('samples')?.value
    const samples = samplesText === undefined ? 361 : Number(samplesText)
    if (!Number.isInteger(samples) || samples < 11 || samples > 5001) return fail('expected `samples:` as a whole number from 11 to 5001', entries.get('samples')?.valuePlace)

    // The core's own values at evenly spaced display angles across the range.
    const span = source.displayEnd - source.displayStart
    const displays = new Float64Array(samples)
    for (let i = 0; i < samples; i++) displays[i] = i === samples - 1 ? source.displayEnd : source.displayStart + (span * i) / (samples - 1)
    const columns = source.at(displays.map((d) => toCore(source, d)))
    // Time along the cycle, continuous from its start (the wrapped column repeats 0 at the end of a turn).
    const speed = source.speed
    const forward = source.convention.sense === source.rotation
    columns.time = displays.map((d) => (speed > 0 ? (forward ? d - source.displayStart : source.displayEnd - d) / speed : Number.NaN))
    const quantity = (name: string) => source.quantities.find((q) => q.name === name)!
    const convert = (values: Float64Array, kind: QuantityKind): Float64Array => {
      const unit = displayUnit(kind, meta.units)
      return values.map((v) => fromSI(v, kind, unit))
    }
    const angleUnit = displayUnit('angle', meta.units)
    const xAxis = isAngle
      ? { name: 'angle', label: source.convention.label, unit: unitLabel(angleUnit), kind: 'angle' as QuantityKind, values: convert(displays, 'angle') }
      : (() => {
          const q = xName === 'time' ? { name: 'time', label: 'time from the start of the cycle', kind: 'time' as QuantityKind } : quantity(xName)
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
    if (xRange === undefined) return fail('expected `x_range:` as two quantities, the first the smaller, e.g. `0 deg, 360 deg` (an angle range of at most ten turns)', entries.get('x_range')?.valuePlace)
    if (yRange === undefined) return fail('expected `y_range:` as two quantities of the first series’ kind', entries.get('y_range')?.valuePlace)
    const meanEntry = entries.get('mean')
    if (meanEntry && meanEntry.value !== 'yes' && meanEntry.value !== 'no') {
      reportError(file, 'invalid-choice', messages['invalid-choice']('mean', meanEntry.value, ['yes', 'no']), meanEntry.valuePlace)
      return null
    }
    if (meanEntry?.value === 'yes' && !(isAngle && source.fullTurn)) return fail('`mean: yes` needs the crank angle as x over a full turn', meanEntry.valuePlace)
    // Evenly spaced over whole turns: the mean of all samples but the last (which repeats the first).
    const means =
      meanEntry?.value === 'yes'
        ? series.map((s) => {
            let sum = 0
            for (let i = 0; i < s.values.length - 1; i++) sum += s.values[i]!
            const value = sum / (s.values.length - 1)
            return { series: s.name, value, text: `mean ${formatNumber(value, meta.digits)}${s.unit === '°' ? '°' : ` ${s.unit}`}` }
          })
        : []
    const markers = isAngle || xName === 'time' ? chartMarkers(source, xName === 'time', speed, meta.units) : []
    const peaks = isAngle || xName === 'time' || xAxis.kind === 'length' ? chartPeaks(source, names, isAngle, xAxis, speed, meta.units, meta.digits) : []
    const chart: ChartOutcome = {
      of: of.value,
      title: block.title,
      x: xAxis,
      series,
      layout,
      markers,
      limit,
      peaks,
      unbounded: names.filter((n) => source.unboundedAtEnds.has(n)),
      means,
      angles: isAngle ? source.convention.words : null,
      width: size[0],
      height: size[1],
      xRange: xRange ?? (isAngle ? [xAxis.values[0]!, xAxis.values[xAxis.values.length - 1]!] : null),
      yRange,
      // A path drawn to scale, or a polar load diagram (force against force).
      equalAspect: !isAngle && (xAxis.kind === 'length' || xAxis.kind === 'force') && series.length === 1 && series[0]!.kind === xAxis.kind,
      samples,
    }
    return outcome(block, 'Chart', { chart })
  },
}

/** The exact extremes of each series: greatest above, least below (the transmission angle: its least only). */
function chartPeaks(
  source: SweepSource,
  names: readonly string[],
  isAngle: boolean,
  xAxis: ChartOutcome['x'],
  speed: number,
  units: Parameters<typeof displayUnit>[1],
  digits: number,
): ChartOutcome['peaks'] {
  const angleUnit = displayUnit('angle', units)
  const forward = source.convention.sense === source.rotation
  const out: ChartOutcome['peaks'][number][] = []
  for (const name of names) {
    const extremes = source.extremes.get(name)
    if (!extremes) continue
    const q = source.quantities.find((s) => s.name === name)!
    const unit = displayUnit(q.kind, units)
    const which = name === 'transmission_angle' ? [['least', extremes.min, 'below'] as const] : ([['greatest', extremes.max, 'above'], ['least', extremes.min, 'below']] as const)
    for (const [words, point, side] of which) {
      if (!Number.isFinite(point.value)) continue
      const display = toDisplay(source, point.theta)
      let x: number
      if (isAngle) x = fromSI(display, 'angle', angleUnit)
      else if (xAxis.name === 'time') x = speed > 0 ? fromSI((forward ? display - source.displayStart : source.displayEnd - display) / speed, 'time', displayUnit('time', units)) : Number.NaN
      else x = fromSI(source.at(Float64Array.of(point.theta))[xAxis.name]![0]!, xAxis.kind, displayUnit(xAxis.kind, units))
      const y = fromSI(point.value, q.kind, unit)
      const label = unitLabel(unit)
      const angleText = `${formatNumber(fromSI(display, 'angle', angleUnit), digits)}${unitLabel(angleUnit) === '°' ? '°' : ` ${unitLabel(angleUnit)}`}`
      out.push({ series: name, x, y, side, text: `${words} ${formatNumber(y, digits)}${label === '°' ? '°' : ` ${label}`} at ${angleText}` })
    }
  }
  return out
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
  const si: number[] = []
  for (const part of parts) {
    const evaluated = evaluateText(part, context.scope, {}, context.blockIds)
    const reading = evaluated.ok ? readQuantity(evaluated.value, kind) : null
    if (!reading?.ok || !Number.isFinite(reading.si)) return undefined
    si.push(reading.si)
    values.push(fromSI(reading.si, kind, displayUnit(kind, context.meta.units)))
  }
  // An angle axis over more than ten turns draws nothing a reader can use.
  if (kind === 'angle' && si[1]! - si[0]! > 20 * Math.PI) return undefined
  return values[0]! < values[1]! ? [values[0]!, values[1]!] : undefined
}

function chartMarkers(source: SweepSource, byTime: boolean, speed: number, units: Parameters<typeof displayUnit>[1]): ChartOutcome['markers'] {
  const unit = displayUnit(byTime ? 'time' : 'angle', units)
  const forward = source.convention.sense === source.rotation
  return source.markers.map((marker) => {
    const display = toDisplay(source, marker.theta)
    if (!byTime) return { label: marker.label, short: marker.short, x: fromSI(display, 'angle', unit) }
    const travel = forward ? display - source.displayStart : source.displayEnd - display
    return { label: marker.label, short: marker.short, x: fromSI(speed > 0 ? travel / speed : Number.NaN, 'time', unit) }
  })
}
