/**
 * A chart outcome as a vega-lite spec: one layered panel per series (stacked)
 * or one panel for all (overlaid), with rules at the dead centres, the peaks
 * labelled, a limit line and the stretch that breaks it shaded. The style is
 * ours: muted ink, one accent, dashes as well as colours so that the chart reads
 * in black-and-white print and for colour-blind readers.
 */
import type { ChartOutcome, ChartSeries } from '../notes/block-kinds/kind.js'

/** Series colours and dash patterns, in order. */
export const SERIES_STYLE: readonly { readonly color: string; readonly dash: readonly number[] }[] = [
  { color: '#0b5563', dash: [1, 0] },
  { color: '#b5471b', dash: [7, 3] },
  { color: '#5b3f8c', dash: [2, 2.5] },
  { color: '#5f6b00', dash: [9, 3, 2, 3] },
]

const FONT = 'DejaVu Sans, Liberation Sans, Arial, sans-serif'
const LIMIT_COLOR = '#a11d21'
const MARKER_COLOR = '#4d5962'

/** The style every chart shares. */
export const CHART_CONFIG = {
  // The figure carries one text alternative; the marks inside stay out of the accessibility tree.
  aria: false,
  font: FONT,
  background: 'white',
  padding: 6,
  view: { stroke: '#9aa5ad', strokeWidth: 0.75 },
  axis: {
    labelFontSize: 10,
    titleFontSize: 10.5,
    titleFontWeight: 'normal',
    labelColor: '#1c2226',
    titleColor: '#1c2226',
    gridColor: '#e3e7ea',
    gridWidth: 0.6,
    domainColor: '#4d5962',
    tickColor: '#4d5962',
  },
  legend: { orient: 'bottom', labelFontSize: 10, labelLimit: 420, title: null, symbolStrokeWidth: 2, symbolSize: 260, symbolType: 'stroke' },
  line: { strokeWidth: 1.6 },
} as const

type Spec = Record<string, unknown>

const title = (label: string, unit: string): string => (unit ? `${label} (${unit})` : label)
/** An axis or legend title: the quantity without its sign-convention words (the caption keeps them), and its unit. */
const short = (label: string, unit: string): string => title(label.replace(/\s*\([^)]*\)\s*$/, ''), unit)

/** The vega-lite spec of a chart, with its data inline. */
export function chartSpec(chart: ChartOutcome): Spec {
  const panels =
    chart.layout === 'overlaid'
      ? [panel(chart, chart.series, true)]
      : chart.series.map((s, i) => panel(chart, [s], i === chart.series.length - 1, i))
  const description = `${chart.title ?? 'Chart'}: ${chart.series.map((s) => title(s.label, s.unit)).join(', ')} against ${title(chart.x.label, chart.x.unit)} for #${chart.of}`
  const base: Spec = {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    description,
    config: CHART_CONFIG,
  }
  // The block's heading carries the title: the chart does not print it again.
  return panels.length === 1
    ? { ...base, ...panels[0] }
    : { ...base, vconcat: panels, spacing: 10, resolve: { scale: { color: 'independent', strokeDash: 'independent' } } }
}

function panel(chart: ChartOutcome, series: readonly ChartSeries[], showXTitle: boolean, offset = 0): Spec {
  const top = offset === 0
  // Long form, one row per point; `i` keeps the sweep order (a path's x is not monotonic).
  // A gap (no value: no linkage there) starts a new piece of line rather than a bridge across it.
  const rows: { x: number; y: number; series: string; i: number; piece: number }[] = []
  for (const s of series) {
    let piece = 0
    let gap = false
    for (let i = 0; i < chart.x.values.length; i++) {
      const x = chart.x.values[i]!
      const y = s.values[i]!
      if (Number.isFinite(x) && Number.isFinite(y)) {
        if (gap) piece++
        gap = false
        rows.push({ x: round(x), y: round(y), series: short(s.label, s.unit), i, piece })
      } else gap = true
    }
  }
  const names = series.map((s) => short(s.label, s.unit))
  const styles = series.map((_, i) => SERIES_STYLE[(offset + i) % SERIES_STYLE.length]!)
  const xScale: Spec = { zero: false, nice: chart.xRange === null }
  if (chart.xRange) xScale.domain = [...chart.xRange]
  // A path to scale keeps exact domains: rounding them out would change one axis's scale.
  const yScale: Spec = { zero: false, nice: !chart.equalAspect }
  if (chart.equalAspect) xScale.nice = false
  if (chart.yRange) yScale.domain = [...chart.yRange]
  else if (!chart.equalAspect) yScale.domain = roomyDomain(chart, series)
  const angleAxis = chart.x.kind === 'angle' && chart.x.unit === '°'
  const xAxis: Spec = { title: showXTitle ? short(chart.x.label, chart.x.unit) : null, labels: true }
  if (angleAxis && chart.xRange) xAxis.values = ticks(chart.xRange[0], chart.xRange[1])
  const line: Spec = {
    data: { values: rows },
    mark: { type: 'line', strokeWidth: 1.6, clip: true },
    encoding: {
      x: { field: 'x', type: 'quantitative', scale: xScale, axis: xAxis },
      y: {
        field: 'y',
        type: 'quantitative',
        scale: yScale,
        axis: { title: series.length === 1 ? names[0] : series[0]!.unit ? `(${series[0]!.unit})` : null },
      },
      color: { field: 'series', type: 'nominal', scale: { domain: names, range: styles.map((s) => s.color) }, legend: series.length > 1 ? {} : null },
      strokeDash: { field: 'series', type: 'nominal', scale: { domain: names, range: styles.map((s) => [...s.dash]) }, legend: series.length > 1 ? {} : null },
      order: { field: 'i', type: 'quantitative' },
      detail: { field: 'piece', type: 'nominal' },
    },
  }
  const layers: Spec[] = []
  // The failing stretch first, under the lines.
  const limit = chart.limit && series.some((s) => s.name === chart.limit!.series) ? chart.limit : null
  if (limit) {
    const target = series.find((s) => s.name === limit.series)!
    const spans = failingSpans(chart.x.values, limit.symmetric ? target.values.map(Math.abs) : target.values, limit.sense, limit.value)
    if (spans.length > 0) {
      layers.push({
        data: { values: spans.map(([x, x2]) => ({ x: round(x), x2: round(x2) })) },
        mark: { type: 'rect', color: LIMIT_COLOR, opacity: 0.12 },
        encoding: { x: { field: 'x', type: 'quantitative' }, x2: { field: 'x2' } },
      })
    }
  }
  layers.push(line)
  if (chart.markers.length > 0) {
    const markers = chart.markers.map((m) => ({ x: round(m.x), label: m.short }))
    layers.push({
      data: { values: markers },
      mark: { type: 'rule', color: MARKER_COLOR, strokeDash: [3, 3], strokeWidth: 0.9 },
      encoding: { x: { field: 'x', type: 'quantitative' } },
    })
    // Their tags sit above the frame, clear of the curves (the top panel only; the caption spells them out).
    if (top) {
      layers.push({
        data: { values: markers },
        mark: { type: 'text', align: 'center', baseline: 'bottom', dy: -3, fontSize: 8.5, color: MARKER_COLOR, font: FONT, clip: false },
        encoding: { x: { field: 'x', type: 'quantitative' }, y: { value: 0 }, text: { field: 'label' } },
      })
    }
  }
  // The analysis's exact extremes: a point, its words above a greatest value and below a least one,
  // turned inwards near the sides so that no label runs off the plot.
  const [x0, x1] = chart.xRange ?? extent(chart.x.values)
  const peaks = chart.peaks
    .filter((p) => series.some((s) => s.name === p.series) && Number.isFinite(p.x) && Number.isFinite(p.y))
    .map((p) => ({ x: round(p.x), y: round(p.y), text: p.text, side: p.side, right: (p.x - x0) / (x1 - x0 || 1) > 0.55 }))
  layers.push({
    data: { values: peaks },
    mark: { type: 'point', filled: true, size: 28, color: '#1c2226' },
    encoding: { x: { field: 'x', type: 'quantitative' }, y: { field: 'y', type: 'quantitative' } },
  })
  // Labels that would overprint one another (two curves with near peaks) are stacked a line apart.
  const domain = (yScale.domain as [number, number] | undefined) ?? extent(series[0]!.values)
  const levels = stackLabels(peaks, [x0, x1], domain, chart.width, chart.height)
  for (const side of ['above', 'below'] as const) {
    for (const right of [false, true]) {
      for (const level of [...new Set(levels)].sort((a, b) => a - b)) {
        const group = peaks.filter((p, i) => p.side === side && p.right === right && levels[i] === level)
        if (group.length === 0) continue
        const dy = (side === 'above' ? -5 : 5) + (side === 'above' ? -11 : 11) * level
        layers.push({
          data: { values: group },
          mark: { type: 'text', align: right ? 'right' : 'left', baseline: side === 'above' ? 'bottom' : 'top', dx: right ? -4 : 4, dy, fontSize: 9, color: '#1c2226', font: FONT },
          encoding: { x: { field: 'x', type: 'quantitative' }, y: { field: 'y', type: 'quantitative' }, text: { field: 'text' } },
        })
      }
    }
  }
  if (limit) {
    const levels = limit.symmetric ? [limit.value, -limit.value] : [limit.value]
    layers.push({
      data: { values: levels.map((y) => ({ y: round(y) })) },
      mark: { type: 'rule', color: LIMIT_COLOR, strokeDash: [6, 3], strokeWidth: 1.2 },
      encoding: { y: { field: 'y', type: 'quantitative' } },
    })
  }
  const means = chart.means.filter((m) => series.some((s) => s.name === m.series))
  if (means.length > 0) {
    const rows = means.map((m) => ({ y: round(m.value), text: m.text }))
    layers.push({
      data: { values: rows },
      mark: { type: 'rule', color: MARKER_COLOR, strokeDash: [2, 2], strokeWidth: 1 },
      encoding: { y: { field: 'y', type: 'quantitative' } },
    })
    layers.push({
      data: { values: rows.map((r) => ({ ...r, x: round(x0) })) },
      mark: { type: 'text', align: 'left', baseline: 'bottom', dx: 4, dy: -3, fontSize: 9, color: MARKER_COLOR, font: FONT },
      encoding: { x: { field: 'x', type: 'quantitative' }, y: { field: 'y', type: 'quantitative' }, text: { field: 'text' } },
    })
  }
  let width = chart.width
  let height = chart.height
  if (chart.equalAspect) {
    // Same scale both ways: fit the data's box into the size asked for.
    const [xs, ys] = [extent(chart.x.values), extent(series[0]!.values)]
    const scale = Math.min(chart.width / (xs[1] - xs[0] || 1), chart.height / (ys[1] - ys[0] || 1))
    width = Math.max(120, Math.round((xs[1] - xs[0]) * scale))
    height = Math.max(80, Math.round((ys[1] - ys[0]) * scale))
  }
  return { width, height, layer: layers }
}

/**
 * A stacking level for each peak label: 0 where it is clear, 1, 2 … where its box
 * (estimated at 5.3 px a character, 11 px a line) would overprint a label placed before it.
 */
export function stackLabels(
  peaks: readonly { x: number; y: number; text: string; side: 'above' | 'below'; right: boolean }[],
  xDomain: readonly [number, number],
  yDomain: readonly [number, number],
  width: number,
  height: number,
): number[] {
  const boxes: { x0: number; x1: number; y0: number; y1: number }[] = []
  return peaks.map((p) => {
    const px = ((p.x - xDomain[0]) / (xDomain[1] - xDomain[0] || 1)) * width
    const py = height - ((p.y - yDomain[0]) / (yDomain[1] - yDomain[0] || 1)) * height
    const w = 5.3 * p.text.length
    const [x0, x1] = p.right ? [px - 4 - w, px - 4] : [px + 4, px + 4 + w]
    for (let level = 0; level < 6; level++) {
      const shift = (p.side === 'above' ? -1 : 1) * (5 + 11 * level)
      const [y0, y1] = p.side === 'above' ? [py + shift - 11, py + shift] : [py + shift, py + shift + 11]
      const clash = boxes.some((b) => x0 < b.x1 && b.x0 < x1 && y0 < b.y1 && b.y0 < y1)
      if (!clash || level === 5) {
        boxes.push({ x0, x1, y0, y1 })
        return level
      }
    }
    return 0
  })
}

/** Intervals of x where the values break the limit (linear interpolation at the crossings). */
export function failingSpans(xs: Float64Array, ys: Float64Array, sense: 'at least' | 'at most', limit: number): [number, number][] {
  const bad = (y: number) => (sense === 'at least' ? y < limit : y > limit)
  const spans: [number, number][] = []
  let start: number | null = null
  for (let i = 0; i < xs.length; i++) {
    const y = ys[i]!
    if (!Number.isFinite(y)) continue
    if (bad(y) && start === null) start = i === 0 ? xs[0]! : cross(xs[i - 1]!, ys[i - 1]!, xs[i]!, y, limit)
    if (!bad(y) && start !== null) {
      spans.push([start, cross(xs[i - 1]!, ys[i - 1]!, xs[i]!, y, limit)])
      start = null
    }
  }
  if (start !== null) spans.push([start, xs[xs.length - 1]!])
  return spans
}

function cross(x0: number, y0: number, x1: number, y1: number, level: number): number {
  return y1 === y0 ? x0 : x0 + ((level - y0) * (x1 - x0)) / (y1 - y0)
}

/**
 * The y domain: the data's extent (the interior only for a series that grows
 * without bound at a limit angle), the limit lines, and room above and below for
 * the extremes' labels.
 */
function roomyDomain(chart: ChartOutcome, series: readonly ChartSeries[]): [number, number] {
  let lo = Number.POSITIVE_INFINITY
  let hi = Number.NEGATIVE_INFINITY
  for (const s of series) {
    const n = s.values.length
    const cut = chart.unbounded.includes(s.name) ? Math.ceil(0.04 * n) : 0
    for (let i = cut; i < n - cut; i++) {
      const v = s.values[i]!
      if (Number.isFinite(v)) { lo = Math.min(lo, v); hi = Math.max(hi, v) }
    }
  }
  const limit = chart.limit && series.some((s) => s.name === chart.limit!.series) ? chart.limit : null
  if (limit) {
    for (const v of limit.symmetric ? [limit.value, -limit.value] : [limit.value]) { lo = Math.min(lo, v); hi = Math.max(hi, v) }
  }
  if (!(hi > lo)) return [lo - 1, hi + 1]
  const room = 0.16 * (hi - lo)
  return [lo - room, hi + room]
}

function extent(values: Float64Array): [number, number] {
  let lo = Number.POSITIVE_INFINITY
  let hi = Number.NEGATIVE_INFINITY
  for (const v of values) if (Number.isFinite(v)) { lo = Math.min(lo, v); hi = Math.max(hi, v) }
  return [lo, hi]
}

/** Ticks every 30°, 45° or 60° across an angle range. */
function ticks(lo: number, hi: number): number[] {
  const span = hi - lo
  // Whole multiples of 60° past a turn, so a long range never gives more than about 24 ticks.
  const step = span > 1440 ? 60 * Math.ceil(span / 1440) : span > 300 ? 60 : span > 150 ? 30 : span > 60 ? 15 : 5
  const out: number[] = []
  for (let t = Math.ceil(lo / step) * step; t <= hi + 1e-9; t += step) out.push(t)
  return out
}

/** Nine significant digits in the spec: plenty for a chart, stable text. */
function round(value: number): number {
  return Number(value.toPrecision(9))
}

/**
 * The spec as text for its file: indented, but each data row on one line, so a
 * reviewer can read it and a diff shows the points that changed.
 */
export function specText(spec: unknown): string {
  const rows: string[][] = []
  const text = JSON.stringify(
    spec,
    (key, value: unknown) => {
      if (key !== 'values' || !Array.isArray(value)) return value
      rows.push(value.map((row) => JSON.stringify(row)))
      return `@@rows ${rows.length - 1}@@`
    },
    2,
  )
  return `${text.replace(/^( *)"values": "@@rows (\d+)@@"/gm, (_, indent: string, index: string) => {
    const lines = rows[Number(index)]!
    return lines.length === 0 ? `${indent}"values": []` : `${indent}"values": [\n${lines.map((l) => `${indent}  ${l}`).join(',\n')}\n${indent}]`
  })}\n`
}
