/**
 * Build one note into its package: read and evaluate (notes layer), render the
 * charts (vega, cached by content) and the package (render layer), and the
 * results document. No file I/O here: the CLI reads and writes.
 */
import type { VFile } from 'vfile'
import type { DataReader } from './notes/block-kinds/kind.js'
import { readNote, type NoteModel, type Tool } from './notes/note.js'
import { hasErrors } from './notes/report.js'
import { resultsDocument } from './notes/results-json.js'
import type { ChartCache } from './render/chart-svg.js'
import { renderCharts } from './render/charts.js'
import { tableCsv, tableCsvPath } from './render/csv.js'
import { renderPackage, type ChangesSince } from './render/package.js'

/** Options for {@link buildNote}. */
export interface BuildNoteOptions {
  readonly tool: Tool
  /** The note's path as shown in the package. */
  readonly notePath: string
  /** templates/package.html */
  readonly template: string
  readonly commit: string
  /** Date of the note's last commit, asked for only when the front matter says `date: git`. */
  readonly gitDate?: (() => string | null) | null
  /** Reads the data files the note names (load tables). */
  readonly readData?: DataReader | null
  /** Where rendered charts are kept between builds. */
  readonly chartCache?: ChartCache | null
  /** What moved since a revision, shown in the package with change marks. */
  readonly changes?: ChangesSince | null
}

/** A built note: the model, and the HTML, results and chart specs unless the note has errors. */
export interface BuiltNote {
  readonly model: NoteModel
  readonly html: string | null
  readonly results: unknown
  /** Extra files of the package by relative path (the charts' vega-lite specs). */
  readonly files: ReadonlyMap<string, string>
  readonly ok: boolean
  readonly date: string | null
  /** How many charts were rendered, and how many came from the cache. */
  readonly charts: { readonly rendered: number; readonly cached: number }
}

/** Evaluate and render a note. Never throws on a bad note: problems are messages on `file`. */
export async function buildNote(file: VFile, options: BuildNoteOptions): Promise<BuiltNote> {
  // 1. Read and evaluate (the notes layer).
  const { tree, model } = readNote(file, options.tool, { gitDate: options.gitDate ?? null, readData: options.readData ?? null })
  const date = model.date
  const results = resultsDocument(model, file, options.notePath, date)
  if (hasErrors(file)) return { model, html: null, results, files: new Map(), ok: false, date, charts: { rendered: 0, cached: 0 } }
  // 2. Charts: specs from the core's sweeps, SVG from vega (depends on 1).
  const { charts, files, cached } = await renderCharts(model, options.chartCache)
  // 3. The package (depends on 1 and 2).
  const html = renderPackage(tree, model, file, { template: options.template, notePath: options.notePath, date, commit: options.commit, charts, changes: options.changes ?? null })
  // Each table block also as CSV, for the spreadsheet a reviewer checks it in.
  for (const o of model.outcomes) if (o?.table) files.set(tableCsvPath(o.block.id, o.block.index), tableCsv(o.table))
  const sorted = new Map([...files].sort(([a], [b]) => a.localeCompare(b)))
  return { model, html, results, files: sorted, ok: !hasErrors(file), date, charts: { rendered: charts.size, cached } }
}
