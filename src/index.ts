/**
 * linkwright: Markdown design notes in, linkage design-calculation packages out.
 * The public library API: the linkage core, the note reader, the renderer and
 * the one-call build of a note.
 */
export * from './linkage/index.js'
export { readNote, fingerprint, type NoteModel, type Tool, type NumberedReference } from './notes/note.js'
export { resultsDocument, RESULTS_SCHEMA } from './notes/results-json.js'
export { messages, type RuleId } from './notes/messages.js'
export type { NoteMeta, Value, NamedValue, InputValue, MethodStep, CalcBlock } from './notes/types.js'
export type { BlockOutcome, CheckOutcome, SweepSource } from './notes/block-kinds/kind.js'
export { renderPackage, type RenderOptions } from './render/package.js'
export { buildNote, type BuildNoteOptions, type BuiltNote } from './build.js'
export { TOOL } from './version.js'
