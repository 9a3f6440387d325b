/**
 * Build one note into its package: read and evaluate (notes layer), render
 * (render layer), and the results document. No file I/O here: the CLI reads
 * and writes.
 */
import type { ElementContent } from 'hast'
import type { VFile } from 'vfile'
import { readNote, type NoteModel, type Tool } from './notes/note.js'
import { hasErrors } from './notes/report.js'
import { resultsDocument } from './notes/results-json.js'
import { renderPackage } from './render/package.js'

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
  /** Extra markup after a block (charts and drawings), given the model. */
  readonly figures?: ((model: NoteModel) => (index: number) => ElementContent[]) | null
}

/** A built note: the model, and the HTML and results unless the note has errors. */
export interface BuiltNote {
  readonly model: NoteModel
  readonly html: string | null
  readonly results: unknown
  readonly ok: boolean
  readonly date: string | null
}

/** Evaluate and render a note. Never throws on a bad note: problems are messages on `file`. */
export function buildNote(file: VFile, options: BuildNoteOptions): BuiltNote {
  const { tree, model } = readNote(file, options.tool)
  const date = model.meta.date === 'git' ? (options.gitDate?.() ?? null) : model.meta.date
  if (model.meta.date === 'git' && date === null) {
    file.message('Cannot find the note’s last commit date for `date: git`: the note is not committed, or git is not available', {
      place: { line: 1, column: 1 },
      ruleId: 'front-matter-field',
      source: 'linkwright',
    })
  }
  const results = resultsDocument(model, file, options.notePath, date)
  if (hasErrors(file)) return { model, html: null, results, ok: false, date }
  const figures = options.figures?.(model)
  const html = renderPackage(tree, model, file, {
    template: options.template,
    notePath: options.notePath,
    date,
    commit: options.commit,
    ...(figures ? { afterBlock: figures } : {}),
  })
  return { model, html, results, ok: !hasErrors(file), date }
}
