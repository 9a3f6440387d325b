/**
 * Block bodies, read with their own line grammar (not YAML, so that a source
 * may hold any text):
 *
 *     name: value ; source          an entry: the value is an expression or a word,
 *                                   the source after the first `;` is free text
 *     - text                        an item (assumptions, conclusions)
 *     - {text: …, verify: yes}      an item with fields
 *     # …                           a comment line
 *
 * A line indented deeper than the entry or item above it continues it (under
 * `name: table ; source` such lines are the table's rows). Every part keeps its
 * place in the note.
 */
import type { Position } from 'unist'

/** Maps lines of a block body to places in the note. */
export interface BodyOrigin {
  /** Line of the first body line in the note (1-based). */
  readonly line: number
  /** Columns stripped from each body line (the fence's indent). */
  readonly indent: number
}

/** One `name: value ; source` line. */
export interface BodyEntry {
  readonly name: string
  readonly namePlace: Position
  /** The value before any `;`, trimmed: an expression or a word. */
  readonly value: string
  readonly valuePlace: Position
  /** The source after `;`, trimmed, or null. */
  readonly source: string | null
  readonly sourcePlace: Position | null
  /** The deeper-indented lines below it, one by one (a table written in the block), each with its place. */
  readonly rows: readonly { readonly text: string; readonly place: Position }[]
}

/** One `- text` list item (or `- {text: …, verify: yes}`). */
export interface BodyItem {
  readonly text: string
  readonly place: Position
  readonly fields: Readonly<Record<string, string>>
}

/** A read body: entries, or items, and any syntax problems. */
export interface Body {
  readonly entries: readonly BodyEntry[]
  readonly items: readonly BodyItem[]
  readonly problems: readonly { readonly reason: string; readonly place: Position }[]
}

interface Part {
  text: string
  line: number
  start: number
  end: number
}

interface OpenEntry {
  indent: number
  name: Part
  value: Part
  source: Part | null
  rows: Part[]
}

interface OpenItem {
  indent: number
  text: Part
}

/** Read a block body. An empty body gives no entries and no problems. */
export function readBody(text: string, origin: BodyOrigin): Body {
  const entries: BodyEntry[] = []
  const items: BodyItem[] = []
  const problems: { reason: string; place: Position }[] = []
  const place = (line: number, start: number, end: number): Position => ({
    start: { line: origin.line + line, column: origin.indent + start + 1 },
    end: { line: origin.line + line, column: origin.indent + Math.max(end, start + 1) + 1 },
  })
  const at = (part: Part): Position => place(part.line, part.start, part.end)
  let entry: OpenEntry | null = null
  let item: OpenItem | null = null
  const close = (): void => {
    if (entry) {
      entries.push({
        name: entry.name.text,
        namePlace: at(entry.name),
        value: entry.value.text,
        valuePlace: entry.value.text === '' ? at(entry.name) : at(entry.value),
        source: entry.source && entry.source.text !== '' ? entry.source.text : null,
        sourcePlace: entry.source && entry.source.text !== '' ? at(entry.source) : null,
        rows: entry.rows.map((row) => ({ text: row.text, place: at(row) })),
      })
    }
    if (item) {
      const { text: body, fields } = itemFields(item.text.text)
      items.push({ text: body, place: at(item.text), fields })
    }
    entry = null
    item = null
  }
  const lines = text.split(/\r?\n/)
  lines.forEach((raw, index) => {
    const line = raw.replace(/\s+$/, '')
    const indent = line.length - line.trimStart().length
    const content = line.trim()
    if (content === '' || content.startsWith('#')) return
    // A deeper-indented line continues the entry or item above it.
    const open: OpenEntry | OpenItem | null = entry ?? item
    if (open && indent > open.indent) {
      const part: Part = { text: content, line: index, start: indent, end: line.length }
      if (entry) {
        entry.rows.push({ ...part })
        // Below `name: table` the lines are the table's rows; elsewhere they continue a long value or source.
        if (entry.value.text !== 'table') extend(entry.source ?? entry.value, part)
      } else if (item) extend(item.text, part)
      return
    }
    close()
    if (content === '-' || content.startsWith('- ')) {
      if (entries.length > 0) {
        problems.push({ reason: 'expected `name: value` lines here, like the lines above, not a `- item`', place: place(index, indent, line.length) })
        return
      }
      const start = indent + 1 + (line.slice(indent + 1).length - line.slice(indent + 1).trimStart().length)
      item = { indent, text: { text: line.slice(start).trim(), line: index, start, end: line.length } }
      return
    }
    const colon = findColon(line, indent)
    if (colon < 0) {
      problems.push({ reason: 'expected `name: value ; source` (or `- item`)', place: place(index, indent, line.length) })
      return
    }
    if (items.length > 0) {
      problems.push({ reason: 'expected `- item` lines here, like the lines above, not `name: value`', place: place(index, indent, line.length) })
      return
    }
    const name = line.slice(indent, colon).trim()
    if (name === '') {
      problems.push({ reason: 'expected a name before `:`', place: place(index, indent, colon + 1) })
      return
    }
    const rest = line.slice(colon + 1)
    const cut = rest.indexOf(';')
    const valueText = cut < 0 ? rest : rest.slice(0, cut)
    const valueStart = colon + 1 + (valueText.length - valueText.trimStart().length)
    const value: Part = { text: valueText.trim(), line: index, start: valueStart, end: valueStart + valueText.trim().length }
    let source: Part | null = null
    if (cut >= 0) {
      const sourceText = rest.slice(cut + 1)
      const sourceStart = colon + 2 + cut + (sourceText.length - sourceText.trimStart().length)
      source = { text: sourceText.trim(), line: index, start: sourceStart, end: sourceStart + sourceText.trim().length }
    }
    entry = { indent, name: { text: name, line: index, start: indent, end: indent + name.length }, value, source, rows: [] }
  })
  close()
  return { entries, items, problems }
}

/** Index of the `:` that ends an entry's name: the first one outside brackets and quotes, or -1. */
function findColon(line: string, from: number): number {
  let depth = 0
  for (let i = from; i < line.length; i++) {
    const c = line[i]!
    if (c === '(' || c === '[' || c === '{') depth++
    else if (c === ')' || c === ']' || c === '}') depth--
    else if (c === ';' && depth === 0) return -1
    else if (c === ':' && depth === 0) return i
  }
  return -1
}

function extend(part: Part, more: Part): void {
  // A continuation line joins its part with a space; the place keeps the first line.
  part.text = part.text === '' ? more.text : `${part.text} ${more.text}`
  if (more.line === part.line) part.end = more.end
}

/** `{text: …, verify: yes}` → its fields; plain text stays text. */
function itemFields(text: string): { text: string; fields: Record<string, string> } {
  const braced = /^\{(.*)\}$/s.exec(text)
  if (!braced) return { text, fields: {} }
  const fields: Record<string, string> = {}
  // Known short fields at the end (`, verify: yes`), the rest is the text: a text may hold commas.
  let inner = braced[1]!.trim()
  for (;;) {
    const tail = /,\s*([a-z_]+)\s*:\s*([^,:]*)$/i.exec(inner)
    if (!tail || tail[1] === 'text') break
    fields[tail[1]!.toLowerCase()] = tail[2]!.trim()
    inner = inner.slice(0, tail.index).trim()
  }
  const head = /^text\s*:\s*(.*)$/is.exec(inner)
  const body = (head ? head[1]! : inner).trim().replace(/^"(.*)"$/s, '$1')
  fields.text = body
  return { text: body, fields }
}
