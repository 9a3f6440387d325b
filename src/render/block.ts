/**
 * A calculation block in the package: inputs table, method (equation, numbers,
 * result), results table and warnings; checks, tables and assumptions in place.
 */
import type { Element, ElementContent } from 'hast'
import { h } from 'hastscript'
import type { BlockOutcome } from '../notes/block-kinds/kind.js'
import { displayValue, formatNumber, unitLabel } from '../notes/display.js'
import type { NoteModel } from '../notes/note.js'
import type { CalcBlock, InputValue, NamedValue } from '../notes/types.js'
import { tableCsvPath } from './csv.js'
import { animationSvg, drawingSvg } from './drawing-svg.js'
import { texNode } from './equation.js'
import { checkRowClass, table, verdict, withCitations, type ReferenceNumbers } from './markup.js'

/** Shared lookups while rendering one package. */
export interface RenderContext {
  readonly model: NoteModel
  readonly references: ReferenceNumbers
  /** Assumption text → its number (A1, A2 …). */
  readonly assumptionNumbers: ReadonlyMap<string, string>
  /** Rendered chart SVG by block index, and where its spec was written. */
  readonly charts: ReadonlyMap<number, { readonly svg: string; readonly specFile: string }>
  /** `block.name` of the inputs and results that changed since the revision compared with (change marks). */
  readonly changed: ReadonlySet<string>
}

/** Render one block's outcome; a block with errors shows its source and a note. */
export function renderBlock(block: CalcBlock, outcome: BlockOutcome | null, context: RenderContext): Element {
  const heading = blockHeading(block, outcome?.kindLabel ?? block.kind)
  if (!outcome) {
    return h(`section.lw-block.lw-block-error`, { id: blockAnchor(block), ariaLabel: `${block.kind} block with errors` }, [
      heading,
      h('p.lw-error', 'This block has errors (see the build messages); its results are not shown and nothing that depends on it was evaluated.'),
    ])
  }
  const parts: (Element | null)[] = [heading]
  if (outcome.inputs.length > 0) parts.push(inputsTable(outcome.inputs, context, 'Inputs', block.id))
  for (const data of outcome.data) parts.push(dataTable(data, context))
  if (outcome.method.length > 0) parts.push(methodList(outcome, context))
  const listed = outcome.results.filter((r) => r.listed !== false)
  if (listed.length > 0) parts.push(resultsTable(listed, context, block.id))
  if (outcome.extremes.length > 0) parts.push(extremesTable(outcome, context))
  if (outcome.warnings.length > 0) {
    parts.push(
      h('div.lw-warnings', { role: 'note', ariaLabel: 'Warnings' }, [
        h('p.lw-warnings-title', 'Warnings'),
        h('ul', outcome.warnings.map((w) => h('li', w))),
      ]),
    )
  }
  if (outcome.checks.length > 0) parts.push(checksTable(outcome, context))
  if (outcome.table) parts.push(sweepTable(block, outcome, context))
  if (outcome.chart) parts.push(chartFigure(block, outcome, context))
  if (outcome.drawing) parts.push(drawingFigure(block, outcome))
  // The note's own assumptions and conclusions are printed once, in their sections; here, where to find them.
  if (outcome.gathered === 'assumptions') {
    const numbers = outcome.assumptions.map((a) => context.assumptionNumbers.get(a.text) ?? '').filter(Boolean)
    parts.push(h('p.lw-pointer', [`The note’s assumptions ${numbers.length > 1 ? `${numbers[0]}–${numbers[numbers.length - 1]}` : (numbers[0] ?? '')} are listed, with those of the methods, under `, h('a', { href: '#assumptions' }, 'Assumptions'), '.']))
  }
  if (outcome.gathered === 'conclusions') {
    parts.push(h('p.lw-pointer', ['The note’s conclusions are gathered, with what the checks show and the open items, under ', h('a', { href: '#conclusions' }, 'Conclusions'), '.']))
  }
  return h(`section.lw-block.lw-kind-${block.kind}`, { id: blockAnchor(block) }, parts)
}

/** Anchor id of a block. */
export function blockAnchor(block: CalcBlock): string {
  return block.id ? `block-${block.id}` : `block-${block.index + 1}`
}

function blockHeading(block: CalcBlock, label: string): Element {
  return h('div.lw-block-heading', [
    h('span.lw-block-kind', label),
    block.id ? h('code.lw-block-id', `#${block.id}`) : null,
    block.title ? h('span.lw-block-title', block.title) : null,
  ])
}

function symbolCell(symbol: string | null): ElementContent[] {
  return symbol ? [texNode(symbol, false) as unknown as ElementContent] : []
}

/** The change mark of a row whose value changed since the revision compared with. */
function changeMark(context: RenderContext, id: string | null, name: string): ElementContent[] {
  return id !== null && context.changed.has(`${id}.${name}`) ? [h('span.lw-change-mark', { title: 'changed since the revision compared with' }, 'Δ '), text('')] : []
}

function changedRow(context: RenderContext, id: string | null, names: readonly string[]): (i: number) => string | null {
  return (i) => (id !== null && context.changed.has(`${id}.${names[i]}`) ? 'lw-changed' : null)
}

function inputsTable(inputs: readonly InputValue[], context: RenderContext, caption: string, id: string | null): Element {
  const { meta } = context.model
  return table(
    'lw-inputs',
    caption,
    ['Symbol', 'Quantity', 'Value', 'Unit', 'Source'],
    inputs.map((input) => {
      const shown = displayValue(input.value, meta.units, meta.digits)
      const written = input.expression
      const from = blocksUsed(written, context)
      const source: ElementContent[] = !input.given
        ? [h('span.lw-default', 'default')]
        : input.source
          ? withCitations(input.source, context.references)
          : from.length > 0
            ? [text('from '), ...from.flatMap((b, i) => [...(i > 0 ? [text(', ')] : []), h('a', { href: `#${blockAnchor(b)}` }, `#${b.id}`)])]
            : input.value.type === 'text'
              ? [h('span.lw-default', 'as chosen')]
              : [h('span.lw-missing-source', 'no source given')]
      // A value written as a number and a unit is shown as written; anything else as computed, with what was written.
      const literal = input.value.type === 'text' ? null : literalOf(written)
      if (literal === null && input.value.type !== 'text') source.push(h('span.lw-written', [' — written ', h('code', written)]))
      // A word or a sentence (a table's description) wraps; a number stays on one line.
      let value: ElementContent[] = [input.value.type === 'text' ? h('span.lw-word', shown.number) : h('span.lw-number', shown.number)]
      let unit = shown.label
      if (literal) {
        value = [h('span.lw-number', literal.number.replace(/^-/, '−'))]
        unit = unitLabel(literal.unit)
        // Where the written unit is not the package's, the converted value too.
        if (literal.unit !== shown.unit && input.value.type === 'quantity' && !['ratio', 'count'].includes(input.value.kind)) {
          value.push(h('br'), h('span.lw-converted', `= ${shown.text}`))
        }
      }
      if (input.note) value.push(h('br'), h('span.lw-converted', input.note))
      return [symbolCell(input.symbol), [...changeMark(context, id, input.name), text(input.label)], value, unit, source]
    }),
    changedRow(context, id, inputs.map((i) => i.name)),
  )
}

/** A table of data the block read (a load table), with its source. */
function dataTable(data: BlockOutcome['data'][number], context: RenderContext): Element {
  return h('div.lw-data', [
    table(
      'lw-data-table',
      data.caption,
      data.columns.map((c) => (c.unit ? `${c.label} (${c.unit})` : c.label)),
      data.rows.map((row) => row.map((cell) => h('span.lw-number', cell.replace(/^-/, '−')))),
    ),
    h('p.lw-step-note', ['Source: ', ...(data.source ? withCitations(data.source, context.references) : [h('span.lw-missing-source', 'no source given')])]),
  ])
}

function text(value: string): ElementContent {
  return { type: 'text', value }
}

/** A value written as a plain number with an optional unit (`96 rpm`, `37.8 mm`, `1.15`): its parts, else null. */
function literalOf(written: string): { number: string; unit: string } | null {
  const match = /^\s*(-?\d+(?:\.\d+)?(?:e[-+]?\d+)?)\s*([A-Za-z][A-Za-z0-9_]*(?:\s*[*/^]\s*[A-Za-z0-9_]+)*)?\s*$/i.exec(written)
  if (!match) return null
  return { number: match[1]!, unit: (match[2] ?? '').replace(/\s+/g, '') }
}

/** The blocks an input's expression refers to, in document order. */
function blocksUsed(expression: string, context: RenderContext): CalcBlock[] {
  return context.model.blocks.filter((b) => b.id !== null && new RegExp(`(^|[^A-Za-z0-9_.])${b.id}\\.`).test(expression))
}

function resultsTable(results: readonly NamedValue[], context: RenderContext, id: string | null): Element {
  const { meta } = context.model
  return table(
    'lw-results',
    'Results',
    ['Symbol', 'Result', 'Value', 'Unit', 'Name'],
    results.map((r) => {
      const shown = displayValue(r.value, meta.units, meta.digits)
      const value = r.value.type === 'none' ? h('span.lw-none', { title: r.value.reason }, `— ${r.value.reason}`) : h('span.lw-number', shown.number)
      return [symbolCell(r.symbol), [...changeMark(context, id, r.name), text(r.label)], value, shown.label, h('code', r.name)]
    }),
    changedRow(context, id, results.map((r) => r.name)),
  )
}

/** One row a swept quantity: its least and greatest values and its largest magnitude, each with its angle. */
function extremesTable(outcome: BlockOutcome, context: RenderContext): Element {
  const { meta } = context.model
  const cell = (v: NamedValue): ElementContent =>
    v.value.type === 'none' ? h('span.lw-none', { title: v.value.reason }, 'unbounded') : h('span.lw-number', displayValue(v.value, meta.units, meta.digits).number)
  const angleLabel = outcome.sweep?.convention.label ?? 'crank angle'
  return h('div.lw-extremes', [
    table(
      'lw-extremes-table',
      `Extremes over the ${outcome.sweep?.fullTurn === false ? 'range' : 'cycle'}`,
      ['Quantity', 'Unit', 'Least', 'at', 'Greatest', 'at', 'Largest magnitude', 'at'],
      outcome.extremes.map((row) => [
        [h('span', row.quantity.label), h('br'), h('code.lw-name', `${row.quantity.name}_min, _max, _abs_max`)],
        displayValue(row.max.value.type === 'none' ? row.min.value : row.max.value, meta.units, meta.digits).label,
        cell(row.min),
        cell(row.minAt),
        cell(row.max),
        cell(row.maxAt),
        cell(row.absMax),
        cell(row.absMaxAt),
      ]),
    ),
    h('p.lw-step-note', `Signed values: least and greatest; the largest magnitude is never negative. Each “at” is the ${angleLabel} (°) where it occurs; add _at to a name for it (e.g. ${outcome.extremes[0]!.quantity.name}_abs_max_at). Extremes are bracketed by a sweep and refined by bisection on the slope; unbounded values grow without limit at a limit angle.`),
  ])
}

function methodList(outcome: BlockOutcome, context: RenderContext): Element {
  return h('div.lw-method', [
    h('p.lw-part-title', 'Method'),
    h(
      'ol.lw-steps',
      outcome.method.map((step) =>
        h('li.lw-step', [
          h('p.lw-step-label', [
            step.label,
            ...(step.cites ?? []).flatMap((key) => {
              const ref = context.references.get(key)
              return ref ? [' ', h('a.lw-cite', { href: `#ref-${key}`, title: ref.citation }, `[${ref.number}]`)] : []
            }),
          ]),
          h('div.lw-eq.lw-eq-formula', { title: 'governing equation' }, [texNode(step.formula, true) as unknown as ElementContent]),
          step.substituted ? h('div.lw-eq.lw-eq-numbers', { title: 'with the input values' }, [texNode(step.substituted, true) as unknown as ElementContent]) : null,
          h('div.lw-eq.lw-eq-result', { title: 'result' }, [texNode(step.result, true) as unknown as ElementContent]),
          step.note ? h('p.lw-step-note', step.note) : null,
        ]),
      ),
    ),
  ])
}

function checksTable(outcome: BlockOutcome, context: RenderContext): Element {
  return table(
    'lw-checks',
    'Acceptance checks',
    ['Result', 'Check', 'Value', 'Limit', 'Margin', 'Source'],
    outcome.checks.map((c) => [
      verdict(c),
      [h('span', c.label), h('br'), h('code.lw-condition', c.condition), ...(c.reason ? [h('br'), h('span.lw-error', c.reason)] : [])],
      h('span.lw-number', c.actual),
      h('span.lw-limit', c.limit),
      h('span.lw-number', c.margin),
      c.source ? withCitations(c.source, context.references) : [h('span.lw-missing-source', 'no source given')],
    ]),
    (i) => checkRowClass(outcome.checks[i]!),
  )
}

function sweepTable(block: CalcBlock, outcome: BlockOutcome, context: RenderContext): Element {
  const t = outcome.table!
  const anchor = context.model.blocks.find((b) => b.id === t.of)
  const csv = tableCsvPath(block.id, block.index)
  return h('div.lw-sweep-table', [
    h('p.lw-part-title', [
      'Values over the cycle of ',
      anchor ? h('a', { href: `#${blockAnchor(anchor)}` }, `#${t.of}`) : `#${t.of}`,
      '; marked rows are the dead centres, toggles and limits. Also as CSV: ',
      h('a', { href: csv }, h('code', csv)),
      '.',
    ]),
    table(
      'lw-sweep',
      null,
      t.columns.map((c) => (c.unit ? `${c.label} (${c.unit})` : c.label)),
      t.rows.map((row) => [
        row.marker ? [h('span.lw-number', row.cells[0]!), h('span.lw-marker', ` ${row.marker}`)] : h('span.lw-number', row.cells[0]!),
        ...row.cells.slice(1).map((cell) => h('span.lw-number', cell)),
      ]),
      (i) => (t.rows[i]!.marker ? 'lw-row-marker' : null),
    ),
  ])
}

function raw(value: string): ElementContent {
  return { type: 'raw', value } as unknown as ElementContent
}

function chartFigure(block: CalcBlock, outcome: BlockOutcome, context: RenderContext): Element {
  const chart = outcome.chart!
  const { meta } = context.model
  const rendered = context.charts.get(block.index)
  const what = `${chart.series.map((s) => s.label).join(', ')} against ${chart.x.label} for #${chart.of}`
  const limitSeries = chart.limit ? chart.series.find((s) => s.name === chart.limit!.series) : undefined
  const limitText = chart.limit && limitSeries ? `${chart.limit.sense} ${chart.limit.symmetric ? '±' : ''}${formatNumber(chart.limit.value, meta.digits)}${limitSeries.unit === '°' ? '°' : ` ${limitSeries.unit}`}` : ''
  const label = `Chart: ${chart.title ? `${chart.title}: ` : ''}${what}${limitText ? `; limit ${limitText}` : ''}`
  // Marker tags on the chart, spelt out once.
  const tags = [...new Map(chart.markers.map((m) => [m.short, m.label])).entries()].map(([short, words]) => (short === words ? words : `${short} ${words}`))
  const caption: (string | Element)[] = [`${what}; ${chart.source ?? `${chart.samples} points of the core’s sweep`}`]
  if (chart.angles) caption.push(`; crank angle ${chart.angles}`)
  if (tags.length > 0) caption.push(`; dashed rules: ${tags.join(', ')}`)
  if (chart.peaks.length > 0) caption.push(chart.source ? '; points mark the greatest values plotted' : '; points mark the exact greatest and least values found by the analysis')
  if (limitText) caption.push(`; red dashed line: the limit, ${limitText}${chart.limit!.symmetric ? ' (both signs)' : ''}${chart.limit!.source ? ` (${chart.limit!.source})` : ''}, with any stretch that breaks it shaded`)
  if (chart.unbounded.length > 0) caption.push('; the value axis is cut: the rates grow without bound at the limit angles')
  if (rendered) caption.push('. Vega-lite spec: ', h('a', { href: rendered.specFile }, h('code', rendered.specFile)))
  return h('figure.lw-figure.lw-chart', [
    rendered ? raw(rendered.svg.replace(/^<svg /, `<svg role="img" aria-label="${escapeAttribute(label)}" `)) : h('p.lw-error', 'Chart not rendered.'),
    h('figcaption', caption),
  ])
}

function drawingFigure(block: CalcBlock, outcome: BlockOutcome): Element {
  const drawing = outcome.drawing!
  const id = `drawing-${block.id ?? block.index + 1}`
  const animation = animationSvg(drawing, `${id}-animation`)
  return h('figure.lw-figure.lw-drawing', [
    raw(drawingSvg(drawing, id)),
    animation ? h('div.lw-animation', [h('p.lw-step-note', 'Animation over one cycle (screen only):'), raw(animation)]) : null,
    h('figcaption', `${drawing.description}. Drawn to scale from the core’s joint positions; the scale bar gives the scale.`),
  ])
}

function escapeAttribute(value: string): string {
  return value.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;')
}
