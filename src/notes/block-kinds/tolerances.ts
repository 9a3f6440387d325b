/**
 * `tolerances` blocks: what the shop's tolerances on a linkage block's lengths
 * (`of: <id>`) do to its stroke, dead-centre positions, time ratio and
 * transmission angle (slider-crank), or to its swing, time ratio and transmission
 * angle (crank-rocker): worst case (the true extremes over the tolerance box),
 * RSS, a seeded Monte Carlo with percentiles and a histogram, the sensitivity of
 * each result to each length with its share of the variance, pin clearance, and
 * the spread against a required tolerance.
 *
 *     of: pusher
 *     crank: ± 0.05 mm ; [dwg] item 3
 *     rod: +0.1 mm / -0.05 mm
 *     offset: class m ; ISO 2768-1 general tolerances
 *     clearance: 0.02 mm ; per joint
 *     required: stroke ± 0.5 mm ; [spec] §2.1
 */
import type { Position } from 'unist'
import {
  CRANK_ROCKER_RESPONSE,
  SLIDER_CRANK_RESPONSE,
  clearanceEffect,
  monteCarlo,
  sampleStatistics,
  spread,
  type Response,
  type ResultSpread,
  type Toleranced,
} from '../../linkage/index.js'
import type { BodyEntry } from '../body.js'
import { columnDecimals, displayUnit, formatFixed, formatNumber, showQuantity, unitLabel } from '../display.js'
import { evaluateText } from '../expressions.js'
import { messages } from '../messages.js'
import { fromSI, readQuantity, type QuantityKind } from '../quantity.js'
import { reportError } from '../report.js'
import type { MethodStep, NamedValue } from '../types.js'
import { designChart } from './design-chart.js'
import { linkageOf } from './forces.js'
import { citeSources, ofAndReferences } from './inputs.js'
import { MAX_NOTE_SAMPLES, outcome, type BlockKind, type DataTable, type EvaluationContext } from './kind.js'
import { withLinkage } from './linkage-common.js'
import { flag, publish, quantity, tex, texBare } from './values.js'

/** ISO 2768-1 general tolerances for linear dimensions (±, mm) by class and nominal size range (mm). */
export const ISO_2768_RANGES: readonly (readonly [number, number])[] = [
  [0.5, 3],
  [3, 6],
  [6, 30],
  [30, 120],
  [120, 400],
  [400, 1000],
  [1000, 2000],
  [2000, 4000],
]
export const ISO_2768_CLASSES: Readonly<Record<string, readonly (number | null)[]>> = {
  f: [0.05, 0.05, 0.1, 0.15, 0.2, 0.3, 0.5, null],
  m: [0.1, 0.1, 0.2, 0.3, 0.5, 0.8, 1.2, 2],
  c: [0.2, 0.3, 0.5, 0.8, 1.2, 2, 3, 4],
  v: [null, 0.5, 1, 1.5, 2.5, 4, 6, 8],
}
export const ISO_2768_SOURCE =
  'ISO 2768-1:1989, General tolerances, Part 1, Table 1, permissible deviations for linear dimensions: class m over 6 up to 400 mm and class f over 30 up to 400 mm confirmed in a published copy of the DIN ISO 2768-1 table; the other entries from memory.'

const LENGTHS: Readonly<Record<'slider-crank' | 'four-bar', readonly { name: string; label: string }[]>> = {
  'slider-crank': [
    { name: 'crank', label: 'crank radius' },
    { name: 'rod', label: 'connecting-rod length' },
    { name: 'offset', label: 'offset' },
  ],
  'four-bar': [
    { name: 'ground', label: 'ground link' },
    { name: 'input', label: 'input link' },
    { name: 'coupler', label: 'coupler' },
    { name: 'output', label: 'output link' },
  ],
}

const RESULT_INFO: Readonly<Record<string, { label: string; kind: QuantityKind }>> = {
  stroke: { label: 'stroke', kind: 'length' },
  outer_dead_centre_position: { label: 'slider position at outer dead centre', kind: 'length' },
  inner_dead_centre_position: { label: 'slider position at inner dead centre', kind: 'length' },
  time_ratio: { label: 'time ratio', kind: 'ratio' },
  transmission_angle_min: { label: 'least transmission angle', kind: 'angle' },
  output_swing: { label: 'output swing', kind: 'angle' },
  transmission_angle_worst: { label: 'worst transmission angle', kind: 'angle' },
}

const OPTIONS = ['of', 'clearance', 'joints', 'distribution', 'samples', 'seed', 'percentiles', 'required', 'histogram']

export const tolerancesKind: BlockKind = {
  name: 'tolerances',
  label: 'Tolerances',
  needsId: true,
  dependencies: ofAndReferences,
  evaluate(block, context) {
    const found = linkageOf(block, context, 'tolerances', 'a slider-crank or four-bar block')
    if (!found) return null
    const { of, linkage } = found
    const core = linkage.core
    const { file, meta } = context
    const fail = (rule: Parameters<typeof reportError>[1], reason: string, place: Position): null => {
      reportError(file, rule, reason, place)
      return null
    }
    if (!core || core.type === 'forces' || (core.type === 'slider-crank' && (core.analysis.linkage.equivalentFourBar !== null || !core.analysis.fullRotation)) || (core.type === 'four-bar' && core.analysis.grashof.className !== 'crank-rocker')) {
      return fail('wrong-block', messages['wrong-block'](of.value, 'a straight-path slider-crank whose crank turns fully, or a Grashof crank-rocker'), of.valuePlace)
    }
    const kind = core.type
    const lengths = LENGTHS[kind]
    const nominal: Record<string, number> =
      core.type === 'slider-crank'
        ? { crank: core.analysis.linkage.crank, rod: core.analysis.linkage.rod, offset: core.analysis.linkage.offset }
        : { ground: core.analysis.linkage.ground, input: core.analysis.linkage.input, coupler: core.analysis.linkage.coupler, output: core.analysis.linkage.output }
    const entries = new Map<string, BodyEntry>()
    for (const entry of block.body.entries) {
      if (!OPTIONS.includes(entry.name) && !lengths.some((l) => l.name === entry.name)) {
        return fail('unknown-input', messages['unknown-input'](entry.name, 'tolerances', [...OPTIONS, ...lengths.map((l) => l.name)]), entry.namePlace)
      }
      if (entries.has(entry.name)) return fail('duplicate-input', messages['duplicate-input'](entry.name), entry.namePlace)
      entries.set(entry.name, entry)
      citeSources(entry.source, entry.sourcePlace ?? entry.valuePlace, context)
    }
    // Each length: ± t, +u / −l, or an ISO 2768-1 class; untoleranced lengths are exact.
    const inputs: Toleranced[] = []
    const written: { name: string; label: string; text: string; source: string | null; lower: number; upper: number; byClass: string | null }[] = []
    let usesClass = false
    for (const length of lengths) {
      const entry = entries.get(length.name)
      const value = nominal[length.name]!
      if (!entry) {
        inputs.push({ name: length.name, nominal: value, lower: 0, upper: 0 })
        continue
      }
      const read = readTolerance(entry, Math.abs(value), context)
      if (!read) return null
      if (read.byClass) usesClass = true
      inputs.push({ name: length.name, nominal: value, lower: read.lower, upper: read.upper })
      written.push({ name: length.name, label: length.label, text: entry.value, source: entry.source, lower: read.lower, upper: read.upper, byClass: read.byClass })
    }
    if (written.length === 0) return fail('missing-input', messages['missing-input'](lengths[0]!.name, `a tolerance on at least one length (${lengths.map((l) => l.name).join(', ')})`, 'tolerances'), block.place)
    const words = (name: string, allowed: readonly string[], fallback: string): string | null => {
      const e = entries.get(name)
      if (!e) return fallback
      if (!allowed.includes(e.value)) return fail('invalid-choice', messages['invalid-choice'](name, e.value, allowed), e.valuePlace)
      return e.value
    }
    const distribution = words('distribution', ['uniform', 'normal'], 'normal') as 'uniform' | 'normal' | null
    if (!distribution) return null
    const integer = (name: string, fallback: number, min: number, max: number): number | null => {
      const e = entries.get(name)
      if (!e) return fallback
      const v = Number(e.value)
      if (!Number.isInteger(v) || v < min || v > max) return fail('invalid-choice', messages['invalid-choice'](name, e.value, [`a whole number from ${min} to ${max}`]), e.valuePlace)
      return v
    }
    const samples = integer('samples', 100000, 100, 2000000)
    const seed = integer('seed', 1, 0, 2 ** 31 - 1)
    if (samples === null || seed === null) return null
    const percentilesEntry = entries.get('percentiles')
    const percentiles = (percentilesEntry?.value ?? '0.135, 50, 99.865').split(',').map((p) => Number(p.trim()))
    if (percentiles.some((p) => !(p >= 0 && p <= 100))) return fail('invalid-choice', messages['invalid-choice']('percentiles', percentilesEntry!.value, ['numbers from 0 to 100, e.g. `0.135, 50, 99.865`']), percentilesEntry!.valuePlace)
    // Clearance per joint (three on a slider-crank: main bearing, crank pin, wrist pin; four on a four-bar).
    let clearance = 0
    const clearanceEntry = entries.get('clearance')
    if (clearanceEntry) {
      const e = evaluateText(clearanceEntry.value, context.scope, {}, context.blockIds)
      const r = e.ok ? readQuantity(e.value, 'length') : null
      if (!r?.ok || r.si < 0) return fail('dimension-mismatch', messages['dimension-mismatch']('clearance', 'radial clearance at each joint', r && !r.ok ? r.reason : 'expected a length of zero or more'), clearanceEntry.valuePlace)
      clearance = r.si
    }
    const joints = kind === 'slider-crank' ? 3 : 4
    const response: Response = kind === 'slider-crank' ? SLIDER_CRANK_RESPONSE : CRANK_ROCKER_RESPONSE
    const figures = withLinkage(block, context, () => spread(response, inputs, distribution))
    if (!figures) return null
    if (context.budget.samples + samples > MAX_NOTE_SAMPLES) {
      return fail('invalid-choice', messages['invalid-choice']('samples', String(samples), [`at most ${MAX_NOTE_SAMPLES - context.budget.samples} more: a note draws at most ${MAX_NOTE_SAMPLES} Monte Carlo samples in all (studies included)`]), entries.get('samples')?.valuePlace ?? block.place)
    }
    context.budget.samples += samples
    const run = withLinkage(block, context, () => monteCarlo(response, inputs, samples, seed, distribution))
    if (!run) return null
    const stats = figures.map((_, r) => sampleStatistics(run.samples[r]!, percentiles))
    const play = clearanceEffect(new Array<number>(joints).fill(clearance))
    // Results, named by the result they spread.
    const results: NamedValue[] = []
    const statNames = ['nominal', 'worst_min', 'worst_max', 'linear_worst', 'rss', 'mean', 'std', ...percentiles.map((p) => `p${String(p).replace('.', '_')}`)]
    const statLabels = [
      'nominal',
      'least over the tolerance box',
      'greatest over the tolerance box',
      'linear worst case ± Σ|s·t|',
      'root-sum-square ± √Σ(s·t)²',
      'Monte Carlo mean',
      'Monte Carlo standard deviation',
      ...percentiles.map((p) => `${String(p)} % of the samples below`),
    ]
    const statValues = figures.map((f, r) => [f.nominal, f.min.value, f.max.value, f.linearWorst, f.rss, stats[r]!.mean, stats[r]!.std, ...stats[r]!.percentiles])
    figures.forEach((f, r) => {
      const info = RESULT_INFO[f.name]!
      const k = info.kind
      // Shown in the block's spread table, one column per result; listed: false keeps them out of the results table.
      const values = statValues[r]!
      statNames.forEach((stat, i) => {
        results.push({ ...quantity(`${f.name}_${stat}`, `${info.label}, ${statLabels[i]}`, null, k, values[i]!), listed: false })
      })
    })
    if (kind === 'slider-crank') {
      const stroke = figures[0]!
      results.push(
        quantity('clearance_dead_centre_shift', 'dead-centre position: added play from the joint clearances ± Σc', null, 'length', play.deadCentreShift),
        quantity('stroke_worst_min_with_clearance', 'stroke, least with tolerances and clearances', null, 'length', stroke.min.value - play.strokeChange),
        quantity('stroke_worst_max_with_clearance', 'stroke, greatest with tolerances and clearances', null, 'length', stroke.max.value + play.strokeChange),
      )
    }
    results.push(quantity('samples_failed', 'Monte Carlo samples that did not assemble', null, 'count', run.failed))
    // The spread against a required tolerance: `required: stroke ± 0.5 mm` (about the nominal) or `stroke = 80 mm ± 0.5 mm`.
    const warnings: string[] = []
    const requiredEntry = entries.get('required')
    let required: { name: string; lower: number; upper: number } | null = null
    if (requiredEntry) {
      const match = /^([a-z_]+)\s*(?:=\s*(.+?)\s*)?±\s*(.+)$/.exec(requiredEntry.value)
      const target = match ? figures.find((f) => f.name === match[1]) : undefined
      if (!match || !target) return fail('invalid-choice', messages['invalid-choice']('required', requiredEntry.value, figures.map((f) => `${f.name} ± tolerance`)), requiredEntry.valuePlace)
      const k = RESULT_INFO[target.name]!.kind
      const parse = (text: string): number | null => {
        const e = evaluateText(text, context.scope, {}, context.blockIds)
        const r = e.ok ? readQuantity(e.value, k) : null
        return r?.ok ? r.si : null
      }
      const centre = match[2] ? parse(match[2]) : target.nominal
      const band = parse(match[3]!)
      if (centre === null || band === null || band < 0) return fail('dimension-mismatch', messages['dimension-mismatch']('required', 'required tolerance of a result', `expected \`${target.name} ± ${k === 'length' ? '0.5 mm' : k === 'angle' ? '1 deg' : '0.01'}\``), requiredEntry.valuePlace)
      required = { name: target.name, lower: centre - band, upper: centre + band }
      const low = target.name === 'stroke' ? target.min.value - play.strokeChange : target.min.value
      const high = target.name === 'stroke' ? target.max.value + play.strokeChange : target.max.value
      const within = low >= required.lower - 1e-12 && high <= required.upper + 1e-12
      results.push(flag('worst_case_within_required', `worst case of the ${RESULT_INFO[target.name]!.label} within the required tolerance`, within))
      const inside = Array.from(run.samples[figures.indexOf(target)]!).filter((v) => v >= required!.lower && v <= required!.upper).length / (run.count - run.failed)
      results.push(quantity('share_within_required', `share of the Monte Carlo samples within the required tolerance`, null, 'ratio', inside))
      if (!within) {
        const text = `The worst case of the ${RESULT_INFO[target.name]!.label} (${showQuantity(low, k, meta.units, meta.digits)} to ${showQuantity(high, k, meta.units, meta.digits)}) leaves the required ${showQuantity(required.lower, k, meta.units, meta.digits)} to ${showQuantity(required.upper, k, meta.units, meta.digits)}`
        warnings.push(text)
      }
    }
    publish(context, block.id, results)
    // Tables: the tolerances as read, the sensitivities with their shares.
    const lengthUnit = displayUnit('length', meta.units)
    const toShow = (si: number) => fromSI(si, 'length', lengthUnit)
    const dev = columnDecimals(written.flatMap((w) => [toShow(w.lower), toShow(w.upper)]), 3)
    const data: DataTable[] = [
      {
        caption: 'Tolerances of the lengths',
        columns: [{ label: 'length', unit: '' }, { label: 'nominal', unit: unitLabel(lengthUnit) }, { label: 'lower deviation', unit: unitLabel(lengthUnit) }, { label: 'upper deviation', unit: unitLabel(lengthUnit) }, { label: 'as written', unit: '' }],
        rows: written.map((w) => [w.label, formatFixed(toShow(nominal[w.name]!), columnDecimals(written.map((x) => toShow(nominal[x.name]!)), meta.digits)), formatFixed(toShow(w.lower), dev), formatFixed(toShow(w.upper), dev), w.byClass ? `class ${w.byClass}` : w.text]),
        source: written.map((w) => w.source).filter(Boolean).join('; ') || null,
      },
      spreadTable(figures, statNames, statLabels, statValues, meta),
      sensitivityTable(figures, written.map((w) => w.name), lengths, meta),
    ]
    if (usesClass) {
      data.push({
        caption: 'ISO 2768-1 general tolerances for linear dimensions, ± mm',
        columns: [{ label: 'class', unit: '' }, ...ISO_2768_RANGES.map(([a, b]) => ({ label: `over ${a} up to ${b}`, unit: 'mm' }))],
        rows: Object.entries(ISO_2768_CLASSES).map(([c, values]) => [c, ...values.map((v) => (v === null ? '—' : formatFixed(v, 2)))]),
        source: ISO_2768_SOURCE,
      })
    }
    // Histogram of the chosen result (the first by default).
    const histogramName = entries.get('histogram')?.value ?? figures[0]!.name
    const hIndex = figures.findIndex((f) => f.name === histogramName)
    if (hIndex < 0) return fail('invalid-choice', messages['invalid-choice']('histogram', histogramName, figures.map((f) => f.name)), entries.get('histogram')!.valuePlace)
    const h = stats[hIndex]!.histogram
    const centres = Float64Array.from({ length: h.counts.length }, (_, i) => (h.edges[i]! + h.edges[i + 1]!) / 2)
    const info = RESULT_INFO[figures[hIndex]!.name]!
    const chart = designChart(meta, block.id ?? 'tolerances', block.title ? `${block.title}: Monte Carlo histogram` : `Monte Carlo histogram of the ${info.label}`, { name: figures[hIndex]!.name, label: info.label, kind: info.kind, values: centres }, [{ name: 'count', label: 'samples in each of 40 bins', kind: 'count', values: h.counts }], {
      source: `${run.count - run.failed} Monte Carlo samples (seed ${seed}, ${distribution})`,
      marks: [
        { label: 'least over the tolerance box', short: 'worst min', x: figures[hIndex]!.min.value },
        { label: 'greatest over the tolerance box', short: 'worst max', x: figures[hIndex]!.max.value },
        ...(required && required.name === figures[hIndex]!.name ? [{ label: 'the band the requirement allows', short: 'required', x: required.lower }, { label: 'the band the requirement allows', short: 'required', x: required.upper }] : []),
      ],
      height: 160,
      peaks: false,
    })
    const from = block.id ?? 'tolerances'
    const method = toleranceMethod(figures, inputs, distribution, samples, seed, clearance, joints, play, stats[0]!.mean, stats[0]!.std, context)
    return outcome(block, 'Tolerances', {
      covers: ['tolerances', ...(clearance > 0 ? (['clearances'] as const) : [])],
      results,
      method,
      warnings,
      data,
      chart,
      summary: [
        ...(kind === 'slider-crank' && clearance > 0 ? ['stroke_worst_min_with_clearance', 'stroke_worst_max_with_clearance'] : [`${figures[0]!.name}_worst_min`, `${figures[0]!.name}_worst_max`]),
        `${figures[0]!.name}_rss`,
        ...(required ? ['worst_case_within_required'] : []),
      ],
      assumptions: [
        {
          text: distribution === 'normal'
            ? 'In the Monte Carlo each length is normal about the middle of its tolerance with the half-width as three standard deviations, clipped at the tolerance (a draw outside it is set on its limit, so about 0.27 % of the draws sit on a limit), and the lengths are independent.'
            : 'In the Monte Carlo each length is uniform over its tolerance, and the lengths are independent.',
          verify: true,
          from,
        },
        ...(clearance > 0
          ? [{ text: `Pin clearance: a radial play of ${showQuantity(clearance, 'length', meta.units, meta.digits)} at each of the ${joints} joints, taken up along the links at the dead centres (the effective-link-length model), so a dead-centre position moves by up to the sum of the plays and the stroke by up to twice it; wear, elastic deflection and the load's direction are not modelled.`, verify: true, from }]
          : []),
      ],
    })
  },
}

/** One length's tolerance: `± t`, `+u / −l` (either order), or `class m`. */
function readTolerance(entry: BodyEntry, size: number, context: EvaluationContext): { lower: number; upper: number; byClass: string | null } | null {
  const text = entry.value.trim()
  const bad = (detail: string): null => {
    reportError(context.file, 'dimension-mismatch', messages['dimension-mismatch'](entry.name, 'tolerance', detail), entry.valuePlace)
    return null
  }
  const length = (part: string): number | null => {
    const e = evaluateText(part.trim(), context.scope, {}, context.blockIds)
    const r = e.ok ? readQuantity(e.value, 'length') : null
    return r?.ok ? r.si : null
  }
  const cls = /^class\s+([fmcv])$/.exec(text)
  if (cls) {
    const mm = size * 1000
    const i = ISO_2768_RANGES.findIndex(([a, b]) => mm > a && mm <= b)
    const t = i >= 0 ? ISO_2768_CLASSES[cls[1]!]![i] : null
    if (t === null || t === undefined) return bad(`ISO 2768-1 class ${cls[1]} gives no tolerance for a nominal size of ${formatNumber(mm, 4)} mm`)
    return { lower: -t / 1000, upper: t / 1000, byClass: cls[1]! }
  }
  const symmetric = /^(?:±|\+\/-)\s*(.+)$/.exec(text)
  if (symmetric) {
    const t = length(symmetric[1]!)
    if (t === null || t < 0) return bad('expected `± 0.05 mm`, `+0.1 mm / -0.05 mm` or `class m`')
    return { lower: -t, upper: t, byClass: null }
  }
  const pair = /^([+-−][^/]+)\/\s*([+-−].+)$/.exec(text)
  if (pair) {
    const p = length(pair[1]!.replace('−', '-'))
    const q = length(pair[2]!.replace('−', '-'))
    if (p === null || q === null) return bad('expected `+0.1 mm / -0.05 mm`')
    return { lower: Math.min(p, q), upper: Math.max(p, q), byClass: null }
  }
  return bad('expected `± 0.05 mm`, `+0.1 mm / -0.05 mm` or `class m`')
}

/** One column per result (one unit, fixed decimals each), one row per statistic; the decimals resolve the spreads to three digits. */
function spreadTable(figures: readonly ResultSpread[], statNames: readonly string[], statLabels: readonly string[], statValues: readonly (readonly number[])[], meta: EvaluationContext['meta']): DataTable {
  const shown = figures.map((f, r) => {
    const kind = RESULT_INFO[f.name]!.kind
    const unit = kind === 'ratio' ? '' : displayUnit(kind, meta.units)
    const values = statValues[r]!.map((v) => (kind === 'ratio' ? v : fromSI(v, kind, unit)))
    // The spreads (linear worst, RSS, standard deviation) set the resolution of the whole column.
    const decimals = columnDecimals([values[3]!, values[4]!, values[6]!], 3)
    return { label: RESULT_INFO[f.name]!.label, unit: kind === 'ratio' ? '' : unitLabel(unit), cells: values.map((v) => formatFixed(v, decimals)) }
  })
  return {
    caption: `Spread of each result over the tolerances; each value is usable by name as <result>_<statistic>, e.g. ${figures[0]!.name}_worst_max`,
    columns: [{ label: 'statistic', unit: '' }, { label: 'name ends', unit: '' }, ...shown.map((c) => ({ label: c.label, unit: c.unit }))],
    rows: statNames.map((stat, i) => [statLabels[i]!, `_${stat}`, ...shown.map((c) => c.cells[i]!)]),
    source: `computed by this block from the nominal dimensions and the tolerances above; result names ${figures.map((f) => f.name).join(', ')}`,
  }
}

function sensitivityTable(figures: readonly ResultSpread[], toleranced: readonly string[], lengths: readonly { name: string; label: string }[], meta: EvaluationContext['meta']): DataTable {
  const indices = lengths.map((l, i) => (toleranced.includes(l.name) ? i : -1)).filter((i) => i >= 0)
  const lengthUnit = displayUnit('length', meta.units)
  const columns = [{ label: 'result', unit: '' }, { label: 'per unit of', unit: '' }]
  const rows: string[][] = []
  for (const f of figures) {
    const info = RESULT_INFO[f.name]!
    const unit = info.kind === 'ratio' ? '' : unitLabel(displayUnit(info.kind, meta.units))
    const per = `${unit || '1'} per ${unitLabel(lengthUnit)}`
    const values = indices.map((i) => sensitivityShown(f, i, meta))
    const decimals = columnDecimals(values, meta.digits)
    rows.push([info.label, per, ...indices.flatMap((i, j) => [formatFixed(values[j]!, decimals), formatFixed(100 * f.shares[i]!, 1)])])
  }
  return {
    caption: 'Sensitivity of each result to each toleranced length (central differences), and the length’s share of the result’s variance',
    columns: [...columns, ...indices.flatMap((i) => [{ label: `∂/∂ ${lengths[i]!.label}`, unit: '' }, { label: 'share', unit: '%' }])],
    rows,
    source: 'computed by this block: central differences of the closed forms at the middle of each tolerance',
  }
}

/** ∂result/∂length in the package's units (e.g. ° per mm), as the table and the method print it. */
function sensitivityShown(f: ResultSpread, i: number, meta: EvaluationContext['meta']): number {
  const kind = RESULT_INFO[f.name]!.kind
  return fromSI(f.sensitivities[i]!, kind, kind === 'ratio' ? '' : displayUnit(kind, meta.units)) / fromSI(1, 'length', displayUnit('length', meta.units))
}

function toleranceMethod(
  figures: readonly ResultSpread[],
  inputs: readonly Toleranced[],
  distribution: 'uniform' | 'normal',
  samples: number,
  seed: number,
  clearance: number,
  joints: number,
  play: { deadCentreShift: number; strokeChange: number },
  mcMean: number,
  mcStd: number,
  context: EvaluationContext,
): MethodStep[] {
  const { meta } = context
  const first = figures[0]!
  const info = RESULT_INFO[first.name]!
  const k = info.kind
  const kind = RESULT_INFO.stroke === info ? 'slider-crank' : 'crank-rocker'
  const per = `${k === 'ratio' ? '1' : unitLabel(displayUnit(k, meta.units))} per ${unitLabel(displayUnit('length', meta.units))}`
  const steps: MethodStep[] = [
    {
      label: `Sensitivities of the ${info.label}`,
      formula: 's_i = \\frac{\\partial R}{\\partial x_i} \\approx \\frac{R(x_i + h) - R(x_i - h)}{2h},\\quad h = 10^{-6}\\,x_i',
      substituted: null,
      result: `${first.sensitivities.map((_, i) => (inputs[i]!.upper === inputs[i]!.lower ? null : `s_{\\mathrm{${inputs[i]!.name.replace(/_/g, '\\_')}}} = ${texBare(meta, sensitivityShown(first, i, meta), 'ratio')}`)).filter(Boolean).join(',\\ ')}\\ \\text{(${per})}`,
      note: kind === 'slider-crank'
        ? 'At the middle of each tolerance, on the closed forms of the analysis: stroke S = √((b + a)² − e²) − √((b − a)² − e²), the dead-centre positions √((b ± a)² − e²), the time ratio from the dead-centre angles, μmin = arccos((a + |e|)/b).'
        : 'At the middle of each tolerance, on the closed forms of the crank-rocker’s toggles (the output angles where input and coupler are in line): the swing between them, the time ratio from the input angles at the toggles, and the transmission angle at its extremes θ2 = 0° and 180°.',
    },
    {
      label: 'Worst case and root-sum-square',
      formula: '\\Delta R_{wc} = \\sum |s_i|\\,t_i,\\qquad \\Delta R_{rss} = \\sqrt{\\textstyle\\sum (s_i\\,t_i)^2}',
      substituted: null,
      result: `\\Delta R_{wc} = ${tex(meta, first.linearWorst, k)},\\ \\Delta R_{rss} = ${tex(meta, first.rss, k)}`,
      note: 't_i is the half-width of each tolerance. The linear worst case is a model; the true extremes over the box (every corner, then a search inside it) are the worst-case results.',
    },
    {
      label: 'True extremes over the tolerance box',
      formula: 'R_{\\min} = \\min_{x \\in box} R(x),\\qquad R_{\\max} = \\max_{x \\in box} R(x)',
      substituted: null,
      result: `R_{\\min} = ${tex(meta, first.min.value, k)},\\ R_{\\max} = ${tex(meta, first.max.value, k)}`,
      note: `All ${2 ** inputs.length} corners, then a coordinate search inside the box from the best, which catches a result that peaks inside it.`,
    },
    {
      label: 'Monte Carlo',
      formula: distribution === 'normal' ? 'x_i \\sim N\\!\\left(m_i,\\ (t_i/3)^2\\right)\\ \\text{clipped at the tolerance}' : 'x_i \\sim U(x_i^{lo},\\ x_i^{hi})',
      substituted: `n = ${samples},\\ \\text{seed} = ${seed}`,
      result: `\\bar R = ${tex(meta, mcMean, k)},\\ \\sigma_R = ${tex(meta, mcStd, k)}`,
      note: 'Seeded xoroshiro128+ (pure-rand); normal deviates by the Box–Muller transform. The same seed gives the same package.',
    },
  ]
  if (clearance > 0) {
    steps.push({
      label: 'Pin clearance',
      formula: '\\Delta x_{dc} = \\sum_j c_j,\\qquad \\Delta S = 2\\sum_j c_j',
      substituted: `c = ${tex(meta, clearance, 'length')},\\ ${joints}\\ \\text{joints}`,
      result: `\\Delta x_{dc} = \\pm${tex(meta, play.deadCentreShift, 'length')},\\ \\Delta S = \\pm${tex(meta, play.strokeChange, 'length')}`,
      note: 'The effective-link-length model: at a dead centre all the joints lie on the line of the links, so their plays add along it.',
    })
  }
  return steps
}
