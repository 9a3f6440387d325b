/**
 * A chart a design block draws of its own numbers (a synthesis family, a
 * structural error, a parameter study, a tolerance histogram), in the note's
 * display units, with the chosen design marked.
 */
import { displayUnit, formatNumber, unitLabel } from '../display.js'
import { fromSI, type QuantityKind } from '../quantity.js'
import type { NoteMeta } from '../types.js'
import type { ChartOutcome } from './kind.js'

/** One axis or series: SI values of a kind. */
export interface DesignAxis {
  readonly name: string
  readonly label: string
  readonly kind: QuantityKind
  readonly values: ArrayLike<number>
}

/** A chart of design data; `marks` are x positions (SI) drawn as rules, e.g. the chosen design. */
export function designChart(
  meta: NoteMeta,
  of: string,
  title: string | null,
  x: DesignAxis,
  series: readonly DesignAxis[],
  options: { readonly source: string; readonly marks?: readonly { readonly label: string; readonly short: string; readonly x: number }[]; readonly limit?: ChartOutcome['limit']; readonly height?: number; readonly peaks?: boolean },
): ChartOutcome {
  const convert = (values: ArrayLike<number>, kind: QuantityKind): Float64Array => {
    const unit = displayUnit(kind, meta.units)
    return Float64Array.from(values, (v) => fromSI(v, kind, unit))
  }
  const xs = convert(x.values, x.kind)
  const shown = series.map((s) => ({ name: s.name, label: s.label, kind: s.kind, unit: unitLabel(displayUnit(s.kind, meta.units)), values: convert(s.values, s.kind) }))
  const peaks: ChartOutcome['peaks'][number][] = []
  if (options.peaks !== false) {
    for (const s of shown) {
      let best = -1
      for (let i = 0; i < s.values.length; i++) if (Number.isFinite(s.values[i]!) && (best < 0 || s.values[i]! > s.values[best]!)) best = i
      if (best >= 0) peaks.push({ series: s.name, x: xs[best]!, y: s.values[best]!, side: 'above', text: `greatest ${formatNumber(s.values[best]!, meta.digits)}${s.unit === '°' ? '°' : ` ${s.unit}`}` })
    }
  }
  const xUnit = displayUnit(x.kind, meta.units)
  return {
    of,
    title,
    x: { name: x.name, label: x.label, unit: unitLabel(xUnit), kind: x.kind, values: xs },
    series: shown,
    layout: shown.every((s) => s.kind === shown[0]!.kind) ? 'overlaid' : 'stacked',
    markers: (options.marks ?? []).map((m) => ({ label: m.label, short: m.short, x: fromSI(m.x, x.kind, xUnit) })),
    limit: options.limit ?? null,
    peaks,
    unbounded: [],
    means: [],
    angles: null,
    width: 640,
    height: options.height ?? 180,
    xRange: null,
    yRange: null,
    equalAspect: false,
    samples: xs.length,
    source: options.source,
  }
}
