/**
 * A process load as a note writes it: a constant (`load: 4.2 kN`), a table in
 * the block (`load: table` and one `x, value` row per line below it), or a CSV
 * file in the design repository (`load_file: data/push.csv`, header
 * `travel (mm), force (N)`). A table is against crank angle, slider position or
 * travel from the outer dead centre, and may give pressures (times the piston
 * area). Every problem is a message at the row or cell it is in.
 */
import type { Position } from 'unist'
import { constantLoad, loadTable, type Load, type LoadAbscissa, type LoadSense, type LoadStroke } from '../../linkage/index.js'
import type { BodyEntry } from '../body.js'
import { columnDecimals, displayUnit, formatFixed, showQuantity, unitLabel } from '../display.js'
import { evaluateText } from '../expressions.js'
import { messages } from '../messages.js'
import { fromSI, math, readQuantity, type QuantityKind } from '../quantity.js'
import { reportError } from '../report.js'
import type { InputValue } from '../types.js'
import { citeSources } from './inputs.js'
import type { DataTable, EvaluationContext } from './kind.js'

/** What the load's table is against, as the note writes it. */
export const LOAD_ABSCISSAE = ['travel', 'position', 'crank-angle'] as const

/** Share of the motion a table may fall short of at an end, holding its end value there. */
export const COVER_TOLERANCE = 1e-3

/** The load read: the core's load, its inputs-table line and the table to print. */
export interface LoadReading {
  readonly load: Load
  /** 'force', 'pressure' (times the area) or 'torque'. */
  readonly kind: QuantityKind
  readonly input: InputValue
  readonly table: DataTable | null
  /** Rows in SI (abscissa in rad or m, value in N, Pa or N·m), for the method. */
  readonly rows: readonly (readonly [number, number])[]
}

/** What the block allows and needs. */
export interface LoadOptions {
  /** The value kinds a load may be (force and pressure on a slider; torque on a four-bar's output). */
  readonly kinds: readonly QuantityKind[]
  readonly abscissa: LoadAbscissa
  readonly sense: LoadSense
  readonly stroke: LoadStroke
  /** Piston area for a pressure load, m², or null when none is given. */
  readonly area: number | null
  /** For an angle table: the core angle of the display zero and its sense. */
  readonly angleOrigin: number
  readonly angleSense: 1 | -1
  /** The abscissa range the table must cover (SI), and its words for a message. */
  readonly cover: { readonly from: number; readonly to: number; readonly words: string }
  /** Label in the inputs table. */
  readonly label: string
}

const ABSCISSA_KIND: Readonly<Record<LoadAbscissa, QuantityKind>> = { angle: 'angle', position: 'length', travel: 'length' }
const ABSCISSA_WORDS: Readonly<Record<LoadAbscissa, string>> = {
  angle: 'crank angle',
  position: 'slider position',
  travel: 'travel from outer dead centre',
}

/** Read the load of a block from its `load` or `load_file` entry; null after reporting. */
export function readLoad(load: BodyEntry | undefined, file: BodyEntry | undefined, blockPlace: Position, options: LoadOptions, context: EvaluationContext): LoadReading | null {
  const fail = (rule: 'load-table' | 'data-file' | 'missing-input' | 'duplicate-input' | 'dimension-mismatch', reason: string, place: Position): null => {
    reportError(context.file, rule, reason, place)
    return null
  }
  if (load && file) return fail('duplicate-input', messages['duplicate-input']('load_file` beside `load'), file.namePlace)
  if (!load && !file) return fail('missing-input', messages['missing-input']('load', `${options.label}: a value, \`table\` with rows below it, or \`load_file\``, 'forces'), blockPlace)
  const entry = (load ?? file)!
  citeSources(entry.source, entry.sourcePlace ?? entry.valuePlace, context)
  let cells: Cell[][]
  let fromFile: string | null = null
  if (file) {
    fromFile = file.value
    const read = readCsv(file, context)
    if (!read) return null
    cells = read
  } else if (load!.value === 'table') {
    if (load!.rows.length < 2) return fail('load-table', messages['load-table']('write at least two rows below `load: table`, each `x, value` (e.g. `20 mm, 1.5 kN`)'), load!.valuePlace)
    cells = []
    for (const row of load!.rows) {
      const parts = splitRow(row.text)
      if (parts.length !== 2) return fail('load-table', messages['load-table'](`a row is two values separated by a comma, e.g. \`20 mm, 1.5 kN\`; got \`${row.text}\``), row.place)
      cells.push(parts.map((p) => ({ text: p.text, place: cellPlace(row.place, p.start, p.text.length) })))
    }
  } else {
    // A constant.
    const evaluated = evaluateText(load!.value, context.scope, {}, context.blockIds)
    if (!evaluated.ok) return fail('dimension-mismatch', evaluated.reason, load!.valuePlace)
    const found = readOne(evaluated.value, options.kinds)
    if (!found) return fail('dimension-mismatch', messages['dimension-mismatch']('load', options.label, expectedWords(options.kinds, evaluated.value)), load!.valuePlace)
    if (found.kind === 'pressure' && options.area === null) return fail('missing-input', messages['missing-input']('area', 'piston area (or `bore`) for a pressure load', 'forces'), load!.valuePlace)
    const scale = found.kind === 'pressure' ? options.area! : 1
    return {
      load: constantLoad(found.si, options.sense, options.stroke, scale),
      kind: found.kind,
      input: { name: 'load', label: options.label, symbol: 'P', value: { type: 'quantity', kind: found.kind, si: found.si }, expression: load!.value, source: load!.source, place: load!.valuePlace, given: true },
      table: null,
      rows: [],
    }
  }
  // A table: every row x, value, both with units; x of the abscissa's kind, values all of one kind.
  const xKind = ABSCISSA_KIND[options.abscissa]
  const rows: [number, number][] = []
  let valueKind: QuantityKind | null = null
  for (const row of cells) {
    const [x, y] = row as [Cell, Cell]
    const xv = evaluateText(x.text, context.scope, {}, context.blockIds)
    if (!xv.ok) return fail('load-table', messages['load-table'](xv.reason), x.place)
    const xr = readQuantity(xv.value, xKind)
    if (!xr.ok) return fail('load-table', messages['load-table'](`the first column is the ${ABSCISSA_WORDS[options.abscissa]} (\`load_against: ${options.abscissa === 'angle' ? 'crank-angle' : options.abscissa}\`): ${xr.reason}`), x.place)
    const yv = evaluateText(y.text, context.scope, {}, context.blockIds)
    if (!yv.ok) return fail('load-table', messages['load-table'](yv.reason), y.place)
    const found = readOne(yv.value, valueKind ? [valueKind] : options.kinds)
    if (!found) return fail('load-table', messages['load-table'](`the second column is ${expectedWords(valueKind ? [valueKind] : options.kinds, yv.value)}${valueKind ? ', as in the rows above' : ''}`), y.place)
    valueKind = found.kind
    // Travel from the outer dead centre, position along the path, angles in the block's convention.
    const xs = xr.si
    if (rows.length > 0 && !(xs > rows[rows.length - 1]![0])) {
      return fail('load-table', messages['load-table'](`the first column must rise from row to row; \`${x.text}\` does not come after the row above`), x.place)
    }
    rows.push([xs, found.si])
  }
  if (valueKind === 'pressure' && options.area === null) return fail('missing-input', messages['missing-input']('area', 'piston area (or `bore`) for a pressure table', 'forces'), entry.valuePlace)
  // The table must cover the motion: no value is made up beyond its ends, but a table
  // written to the round stroke (80 mm for 80.008 mm) holds its end value over the last 0.1 %.
  const tol = COVER_TOLERANCE * Math.abs(options.cover.to - options.cover.from) + 1e-12
  const first = rows[0]![0]
  const last = rows[rows.length - 1]![0]
  if (first > options.cover.from + tol || last < options.cover.to - tol) {
    const show = (v: number): string => showQuantity(v, xKind, context.meta.units, context.meta.digits)
    const where = fromFile ? entry.valuePlace : (cells[first > options.cover.from + tol ? 0 : cells.length - 1]![0]!.place)
    return fail('load-table', messages['load-table'](`it runs from ${show(first)} to ${show(last)} but must cover ${options.cover.words}, ${show(options.cover.from)} to ${show(options.cover.to)}: add rows so that no value is extrapolated (a table may fall short by 0.1 % of the motion)`), where)
  }
  let core: Load
  try {
    core = loadTable(rows.map((r) => r[0]), rows.map((r) => r[1]), {
      abscissa: options.abscissa,
      sense: options.sense,
      stroke: options.stroke,
      angleOrigin: options.angleOrigin,
      angleSense: options.angleSense,
      scale: valueKind === 'pressure' ? options.area! : 1,
    })
  } catch (error) {
    return fail('load-table', messages['load-table'](error instanceof Error ? error.message : String(error)), entry.valuePlace)
  }
  const table = dataTable(rows, xKind, valueKind!, options, entry.source, fromFile, context)
  return {
    load: core,
    kind: valueKind!,
    input: {
      name: 'load',
      label: options.label,
      symbol: 'P',
      value: { type: 'text', text: `table of ${rows.length} rows against ${ABSCISSA_WORDS[options.abscissa]}${fromFile ? `, from ${fromFile}` : ''} (printed below)` },
      expression: fromFile ?? 'table',
      source: entry.source,
      place: entry.valuePlace,
      given: true,
    },
    table,
    rows,
  }
}

interface Cell {
  readonly text: string
  readonly place: Position
}

/** A value of one of the kinds, or null. */
function readOne(value: unknown, kinds: readonly QuantityKind[]): { kind: QuantityKind; si: number } | null {
  for (const kind of kinds) {
    const r = readQuantity(value, kind)
    if (r.ok) return { kind, si: r.si }
  }
  return null
}

function expectedWords(kinds: readonly QuantityKind[], value: unknown): string {
  const words: Record<string, string> = { force: 'a force (e.g. 1.5 kN)', pressure: 'a pressure (e.g. 0.6 MPa)', torque: 'a torque (e.g. 40 N*m)' }
  const got = readQuantity(value, kinds[0]!)
  return `expected ${kinds.map((k) => words[k] ?? k).join(' or ')}${got.ok ? '' : `, got ${got.actualKind}`}`
}

/** Split a row at its top-level comma (commas inside parentheses belong to a function call). */
function splitRow(text: string): { text: string; start: number }[] {
  const parts: { text: string; start: number }[] = []
  let depth = 0
  let begin = 0
  for (let i = 0; i <= text.length; i++) {
    const c = text[i]
    if (c === '(') depth++
    else if (c === ')') depth--
    else if ((c === ',' && depth === 0) || i === text.length) {
      const raw = text.slice(begin, i)
      const lead = raw.length - raw.trimStart().length
      parts.push({ text: raw.trim(), start: begin + lead })
      begin = i + 1
    }
  }
  return parts
}

function cellPlace(row: Position, start: number, length: number): Position {
  const column = row.start.column + start
  return { start: { line: row.start.line, column }, end: { line: row.start.line, column: column + Math.max(1, length) } }
}

/**
 * A CSV load table: a header `name (unit), name (unit)` and rows of two numbers.
 * Problems are reported at the `load_file` line, naming the file's own line.
 */
function readCsv(entry: BodyEntry, context: EvaluationContext): Cell[][] | null {
  const path = entry.value
  const fail = (detail: string): null => {
    reportError(context.file, 'data-file', messages['data-file'](path, detail), entry.valuePlace)
    return null
  }
  if (!context.readData) return fail('this build reads no data files (give the note to the command line tool, which reads them beside the note)')
  const read = context.readData(path)
  if (!read.ok) return fail(read.reason)
  if (!context.dataFiles.some((f) => f.path === path)) context.dataFiles.push({ path, sha256: read.sha256 })
  const lines = read.text.split(/\r?\n/)
  const content = lines.map((text, i) => ({ text: text.trim(), line: i + 1 })).filter((l) => l.text !== '' && !l.text.startsWith('#'))
  if (content.length < 3) return fail('it needs a header `name (unit), name (unit)` and at least two rows')
  const header = content[0]!
  const units = header.text.split(',').map((c) => /[([]\s*([^)\]]+?)\s*[)\]]\s*$/.exec(c.trim())?.[1] ?? null)
  if (units.length !== 2 || units.some((u) => u === null)) {
    return fail(`line ${header.line}: the header must name two columns with their units in brackets, e.g. \`travel (mm), force (N)\`; got \`${header.text}\``)
  }
  for (const u of units) {
    try {
      math.unit(`1 ${u}`)
    } catch {
      return fail(`line ${header.line}: \`${u}\` is not a unit`)
    }
  }
  const cells: Cell[][] = []
  for (const row of content.slice(1)) {
    const parts = row.text.split(',').map((p) => p.trim())
    if (parts.length !== 2 || parts.some((p) => !/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(p))) {
      return fail(`line ${row.line}: a row is two plain numbers separated by a comma (the units are in the header); got \`${row.text}\``)
    }
    // Each cell carries its unit from the header; a problem in it is reported at the load_file line.
    cells.push(parts.map((p, i) => ({ text: `${p} ${units[i]}`, place: entry.valuePlace })))
  }
  return cells
}

/** The load table as printed: display units per column, one count of decimals per column. */
function dataTable(
  rows: readonly (readonly [number, number])[],
  xKind: QuantityKind,
  yKind: QuantityKind,
  options: LoadOptions,
  source: string | null,
  fromFile: string | null,
  context: EvaluationContext,
): DataTable {
  const { units, digits } = context.meta
  const xUnit = displayUnit(xKind, units)
  const yUnit = displayUnit(yKind, units)
  const xs = rows.map((r) => fromSI(r[0], xKind, xUnit))
  const ys = rows.map((r) => fromSI(r[1], yKind, yUnit))
  const dx = columnDecimals(xs, digits)
  const dy = columnDecimals(ys, digits)
  const words = yKind === 'pressure' ? 'pressure' : yKind === 'torque' ? 'torque on the output' : 'load'
  return {
    caption: `Load table${fromFile ? ` (${fromFile})` : ''}: ${words} against ${ABSCISSA_WORDS[options.abscissa]}, interpolated linearly between rows`,
    columns: [
      { label: ABSCISSA_WORDS[options.abscissa], unit: unitLabel(xUnit) },
      { label: words, unit: unitLabel(yUnit) },
    ],
    rows: rows.map((_, i) => [formatFixed(xs[i]!, dx), formatFixed(ys[i]!, dy)]),
    source,
  }
}
