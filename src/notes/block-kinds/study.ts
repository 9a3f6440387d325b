/**
 * `study` blocks: one input of another block (`of: <id>`) varied over a list or a
 * range, the block evaluated afresh at each value, chosen results tabulated and
 * charted, and checks written in the study judged at every value.
 *
 *     of: pusher
 *     vary: offset
 *     values: 20 mm, 25 mm, 30 mm      (or from: 20 mm, to: 40 mm, steps: 9)
 *     show: stroke, time_ratio, transmission_angle_min
 *     quick return: pusher.time_ratio >= 1.15 ; [spec] §2.4
 *
 * Each value is evaluated in a scratch copy of the scope, so the note's own
 * results are untouched; a value at which the block cannot be built is a row
 * that says why, not an error of the note.
 */
import { VFile } from 'vfile'
import type { BodyEntry } from '../body.js'
import { columnDecimals, displayUnit, formatFixed, unitLabel } from '../display.js'
import { evaluateText } from '../expressions.js'
import { messages } from '../messages.js'
import { fromSI, readQuantity, type QuantityKind } from '../quantity.js'
import { reportError } from '../report.js'
import type { CalcBlock, NamedValue } from '../types.js'
import { evaluateCheck } from './checks.js'
import { designChart } from './design-chart.js'
import { citeSources, ofAndReferences } from './inputs.js'
import { outcome, type BlockKind, type BlockOutcome, type CheckOutcome, type DataTable, type EvaluationContext } from './kind.js'
import { flag, publish, quantity } from './values.js'
// The registry, read at evaluation time (the cycle with index.js is resolved by then).
import { blockKinds } from './index.js'

const OPTIONS = ['of', 'vary', 'values', 'from', 'to', 'steps', 'show', 'and_vary', 'and_values']
const MAX_SECOND = 4
const MAX_VALUES = 61

export const studyKind: BlockKind = {
  name: 'study',
  label: 'Parameter study',
  needsId: true,
  dependencies: ofAndReferences,
  evaluate(block, context) {
    const { file, meta } = context
    const fail = (rule: Parameters<typeof reportError>[1], reason: string, place: BodyEntry['valuePlace']): null => {
      reportError(file, rule, reason, place)
      return null
    }
    const entries = new Map<string, BodyEntry>()
    const checks: BodyEntry[] = []
    for (const entry of block.body.entries) {
      if (entries.has(entry.name) || checks.some((c) => c.name === entry.name)) return fail('duplicate-input', messages['duplicate-input'](entry.name), entry.namePlace)
      if (OPTIONS.includes(entry.name)) entries.set(entry.name, entry)
      else checks.push(entry)
    }
    const of = entries.get('of')
    if (!of) return fail('missing-input', messages['missing-input']('of', 'the block whose input is varied', 'study'), block.place)
    const target = context.outcomes.get(of.value)
    if (!target) return fail('wrong-block', messages['wrong-block'](of.value, 'the id of a block above this one'), of.valuePlace)
    const kind = blockKinds.get(target.block.kind)
    if (!kind || target.block.kind === 'study' || target.block.kind === 'checks') return fail('wrong-block', messages['wrong-block'](of.value, 'a calculation block (a linkage, synthesis, forces or other block with results)'), of.valuePlace)
    const vary = entries.get('vary')
    if (!vary) return fail('missing-input', messages['missing-input']('vary', 'the input to vary', 'study'), block.place)
    const input = target.inputs.find((i) => i.name === vary.value)
    if (input?.value.type !== 'quantity') {
      const names = target.inputs.filter((i) => i.value.type === 'quantity').map((i) => i.name)
      return fail('invalid-choice', messages['invalid-choice']('vary', vary.value, names), vary.valuePlace)
    }
    const varyKind = input.value.kind
    // The values: a list, or from / to / steps.
    const valuesEntry = entries.get('values')
    let texts: { text: string; place: BodyEntry['valuePlace'] }[] = []
    if (valuesEntry) {
      texts = valuesEntry.value.split(',').map((t) => ({ text: t.trim(), place: valuesEntry.valuePlace }))
    } else {
      const from = entries.get('from')
      const to = entries.get('to')
      if (!from || !to) return fail('missing-input', messages['missing-input']('values', 'a list of values, or `from`, `to` and `steps`', 'study'), block.place)
      const stepsEntry = entries.get('steps')
      const steps = stepsEntry ? Number(stepsEntry.value) : 5
      if (!Number.isInteger(steps) || steps < 2 || steps > MAX_VALUES) return fail('invalid-choice', messages['invalid-choice']('steps', stepsEntry!.value, [`a whole number from 2 to ${MAX_VALUES}`]), stepsEntry!.valuePlace)
      const read = (e: BodyEntry): number | null => {
        const v = evaluateText(e.value, context.scope, {}, context.blockIds)
        const r = v.ok ? readQuantity(v.value, varyKind) : null
        if (!r?.ok) {
          reportError(file, 'dimension-mismatch', messages['dimension-mismatch'](e.name, `a value of \`${vary.value}\``, r && !r.ok ? r.reason : `expected the same kind of quantity as \`${vary.value}\``), e.valuePlace)
          return null
        }
        return r.si
      }
      const a = read(from)
      const b = read(to)
      if (a === null || b === null) return null
      const unit = displayUnit(varyKind, meta.units)
      for (let i = 0; i < steps; i++) {
        const si = a + ((b - a) * i) / (steps - 1)
        texts.push({ text: `${Number(fromSI(si, varyKind, unit).toPrecision(12))} ${unit}`.trim(), place: from.valuePlace })
      }
    }
    if (texts.length < 1 || texts.length > MAX_VALUES) return fail('invalid-choice', messages['invalid-choice']('values', valuesEntry?.value ?? '', [`from 1 to ${MAX_VALUES} values`]), valuesEntry!.valuePlace)
    // Each value read in the note's scope, so a unit or a name of another block is allowed.
    const values: number[] = []
    for (const t of texts) {
      const v = evaluateText(t.text, context.scope, {}, context.blockIds)
      const r = v.ok ? readQuantity(v.value, varyKind) : null
      if (!r?.ok) return fail('dimension-mismatch', messages['dimension-mismatch']('values', `values of \`${vary.value}\``, `\`${t.text}\`: ${r && !r.ok ? r.reason : v.ok ? 'not a quantity' : v.reason}`), t.place)
      values.push(r.si)
    }
    // An optional second input, over a short list: the study covers every pair.
    const andVary = entries.get('and_vary')
    const andValues = entries.get('and_values')
    let second: { name: string; label: string; kind: QuantityKind; texts: string[]; values: number[] } | null = null
    if (andVary || andValues) {
      if (!andVary || !andValues) return fail('missing-input', messages['missing-input'](andVary ? 'and_values' : 'and_vary', 'the second input and its list of values', 'study'), block.place)
      const other = target.inputs.find((i) => i.name === andVary.value)
      if (other?.value.type !== 'quantity' || andVary.value === vary.value) {
        return fail('invalid-choice', messages['invalid-choice']('and_vary', andVary.value, target.inputs.filter((i) => i.value.type === 'quantity' && i.name !== vary.value).map((i) => i.name)), andVary.valuePlace)
      }
      const kind2 = other.value.kind
      const list = andValues.value.split(',').map((t) => t.trim())
      if (list.length < 1 || list.length > MAX_SECOND) return fail('invalid-choice', messages['invalid-choice']('and_values', andValues.value, [`from 1 to ${MAX_SECOND} values`]), andValues.valuePlace)
      const si: number[] = []
      for (const t of list) {
        const v = evaluateText(t, context.scope, {}, context.blockIds)
        const r = v.ok ? readQuantity(v.value, kind2) : null
        if (!r?.ok) return fail('dimension-mismatch', messages['dimension-mismatch']('and_values', `values of \`${andVary.value}\``, `\`${t}\`: ${r && !r.ok ? r.reason : v.ok ? 'not a quantity' : v.reason}`), andValues.valuePlace)
        si.push(r.si)
      }
      second = { name: andVary.value, label: other.label, kind: kind2, texts: list, values: si }
    }
    // What to show: results of the block, or the extremes of its swept quantities.
    const showEntry = entries.get('show')
    const shownNames = (showEntry?.value ?? target.summary?.join(', ') ?? '').split(',').map((s) => s.trim()).filter(Boolean)
    const known = new Map<string, NamedValue>()
    for (const r of allResults(target)) known.set(r.name, r)
    for (const name of shownNames) {
      const r = known.get(name)
      if (r?.value.type !== 'quantity') return fail('invalid-choice', messages['invalid-choice']('show', name, [...known.values()].filter((v) => v.value.type === 'quantity').map((v) => v.name).slice(0, 24)), showEntry?.valuePlace ?? block.place)
    }
    if (shownNames.length === 0) return fail('missing-input', messages['missing-input']('show', 'the results to tabulate', 'study'), block.place)
    // Checks may use the varied block and blocks above it only: blocks below it would not be evaluated again.
    for (const c of checks) {
      citeSources(c.source, c.sourcePlace ?? c.valuePlace, context)
      for (const m of c.value.matchAll(/([A-Za-z_][A-Za-z0-9_]*)\./g)) {
        const used = context.outcomes.get(m[1]!)
        if (used && used.block.id !== target.block.id && used.block.index > target.block.index) {
          return fail('wrong-block', messages['wrong-block'](m[1]!, `\`${of.value}\` or a block above it: a study evaluates only \`${of.value}\` again`), c.valuePlace)
        }
      }
    }
    // Evaluate the block at each value.
    const rows: { value: number; second: number | null; results: Map<string, NamedValue> | null; reason: string | null; checks: CheckOutcome[] }[] = []
    const pairs = (second ? second.values.map((_, j) => j) : [-1]).flatMap((j) => values.map((_, i) => [i, j] as const))
    for (const [i, j] of pairs) {
      const once = withEntry(target.block, vary.value, texts[i]!.text, vary.valuePlace)
      const changed = second && j >= 0 ? withEntry(once, second.name, second.texts[j]!, andVary!.valuePlace) : once
      const scratch: EvaluationContext = {
        ...context,
        file: new VFile({ path: file.path, value: String(file.value) }),
        scope: { values: new Map(context.scope.values), unavailable: new Map(context.scope.unavailable), broken: new Map(context.scope.broken), places: new Map(context.scope.places) },
        outcomes: new Map(context.outcomes),
        citations: [],
        dataFiles: [],
      }
      let got: BlockOutcome | null = null
      try {
        got = kind.evaluate(changed, scratch)
      } catch (error) {
        got = null
        scratch.file.message(error instanceof Error ? error.message : String(error))
      }
      const problem = scratch.file.messages.find((m) => m.fatal === true)
      if (!got || problem) {
        rows.push({ value: values[i]!, second: j >= 0 ? second!.values[j]! : null, results: null, reason: problem?.reason ?? 'the block gives no results at this value', checks: [] })
        continue
      }
      const results = new Map(allResults(got).map((r) => [r.name, r]))
      const rowChecks = checks.map((c) => evaluateCheck(c.value, c.valuePlace, scratch, { label: c.name, condition: c.value, informative: false, source: c.source, line: c.valuePlace.start.line, blockId: block.id }))
      rows.push({ value: values[i]!, second: j >= 0 ? second!.values[j]! : null, results, reason: null, checks: rowChecks })
    }
    // The table: the varied value, each shown result, each check.
    const varyUnit = displayUnit(varyKind, meta.units)
    const varyShown = rows.map((r) => fromSI(r.value, varyKind, varyUnit))
    const varyDecimals = Math.max(decimalsOf(texts.map((t) => t.text)), columnDecimals(varyShown, 4))
    const columns: DataTable['columns'][number][] = [{ label: input.label, unit: unitLabel(varyUnit) }]
    const cells: string[][] = rows.map((_, i) => [formatFixed(varyShown[i]!, varyDecimals)])
    if (second) {
      const unit2 = displayUnit(second.kind, meta.units)
      const shown2 = rows.map((r) => fromSI(r.second!, second!.kind, unit2))
      const d2 = Math.max(decimalsOf(second.texts), columnDecimals(shown2, 4))
      columns.push({ label: second.label, unit: unitLabel(unit2) })
      rows.forEach((_, i) => {
        cells[i]!.push(formatFixed(shown2[i]!, d2))
      })
    }
    const series: { name: string; label: string; kind: QuantityKind; values: Float64Array }[] = []
    for (const name of shownNames) {
      const like = known.get(name)!
      const k = like.value.type === 'quantity' ? like.value.kind : 'ratio'
      const unit = displayUnit(k, meta.units)
      const si = Float64Array.from(rows, (r) => {
        const v = r.results?.get(name)?.value
        return v && v.type === 'quantity' ? v.si : Number.NaN
      })
      const shown = Array.from(si, (v) => fromSI(v, k, unit))
      const decimals = columnDecimals(shown, meta.digits)
      columns.push({ label: like.label === name ? name : `${like.label} (${name})`, unit: k === 'ratio' ? '' : unitLabel(unit) })
      rows.forEach((r, i) => {
        cells[i]!.push(r.results ? (Number.isFinite(shown[i]!) ? formatFixed(shown[i]!, decimals) : '—') : '')
      })
      series.push({ name, label: like.label, kind: k, values: si })
    }
    for (const c of checks) columns.push({ label: c.name, unit: '' })
    rows.forEach((r, i) => {
      if (!r.results) {
        cells[i]!.push(`not built: ${r.reason}`)
        return
      }
      for (const c of r.checks) cells[i]!.push(c.status === 'pass' ? 'PASS' : c.status === 'fail' ? 'FAIL' : 'not evaluated')
    })
    const built = rows.filter((r) => r.results).length
    const passing = rows.filter((r) => r.results && r.checks.every((c) => c.status === 'pass')).length
    const results: NamedValue[] = [
      quantity('values_studied', 'values studied', null, 'count', rows.length),
      quantity('values_built', 'values at which the block could be built', null, 'count', built),
      ...(checks.length > 0
        ? [quantity('values_passing', 'values at which every check of the study passes', null, 'count', passing), flag('all_pass', 'every check passes at every value studied', passing === rows.length)]
        : []),
    ]
    for (const [j, name] of shownNames.entries()) {
      const finite = Array.from(series[j]!.values).filter(Number.isFinite)
      if (finite.length === 0) continue
      const k = series[j]!.kind
      results.push(quantity(`${name}_least`, `${series[j]!.label}, least over the study`, null, k, Math.min(...finite)), quantity(`${name}_greatest`, `${series[j]!.label}, greatest over the study`, null, k, Math.max(...finite)))
    }
    publish(context, block.id, results)
    const caption = `${target.kindLabel} #${of.value} evaluated afresh at each value of \`${vary.value}\`${checks.length > 0 ? '; the checks are the study’s own, judged at each value' : ''}`
    const data: DataTable[] = [{ caption, columns, rows: cells, source: `computed by this block; every other input of #${of.value} as written` }]
    // One line a result; with a second input, the first result once for each of its values.
    const n = values.length
    const lines = second
      ? second.values.map((_, j) => ({ ...series[0]!, name: `${series[0]!.name}_${j}`, label: `${series[0]!.label}, ${second!.name} = ${second!.texts[j]}`, values: series[0]!.values.slice(j * n, (j + 1) * n) }))
      : series.slice(0, 4)
    const chart =
      n >= 3
        ? designChart(meta, block.id ?? 'study', block.title ? `${block.title}` : `${shownNames.join(', ')} against ${input.label}`, { name: vary.value, label: input.label, kind: varyKind, values: Float64Array.from(values) }, lines, {
            source: `${rows.length} evaluations of #${of.value}: ${n} values of ${vary.value}${second ? ` at each of ${second.values.length} values of ${second.name}` : ''}`,
            marks: [{ label: `${input.label} as written in #${of.value}`, short: 'as written', x: input.value.si }],
            height: second ? 140 : 180,
          })
        : null
    return outcome(block, 'Parameter study', {
      results,
      data,
      chart,
      summary: checks.length > 0 ? ['values_passing'] : ['values_built'],
      warnings: built < rows.length ? [`${rows.length - built} of the ${rows.length} values could not be built; the table says why`] : [],
    })
  },
}

/** Results and the extremes of swept quantities, as one list by name. */
function allResults(o: BlockOutcome): NamedValue[] {
  return [...o.results, ...o.extremes.flatMap((row) => [row.min, row.max, row.absMax])]
}

/** The block with one entry's value replaced (or added when it took its default). */
function withEntry(block: CalcBlock, name: string, value: string, place: BodyEntry['valuePlace']): CalcBlock {
  const entries = block.body.entries
  const found = entries.some((e) => e.name === name)
  const changed: BodyEntry[] = found
    ? entries.map((e) => (e.name === name ? { ...e, value, source: null, sourcePlace: null } : e))
    : [...entries, { name, namePlace: place, value, valuePlace: place, source: null, sourcePlace: null, rows: [] }]
  return { ...block, body: { ...block.body, entries: changed } }
}

/** The most decimals written in a list of values like `22.5 mm`. */
function decimalsOf(texts: readonly string[]): number {
  let most = 0
  for (const t of texts) {
    const m = /^-?\d*\.(\d+)/.exec(t.trim())
    if (m) most = Math.max(most, m[1]!.length)
  }
  return Math.min(most, 6)
}
