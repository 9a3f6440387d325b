/**
 * Block bodies: YAML-style `name: value ; source` lines (or `- item` lists),
 * read with the yaml package into entries that keep their place in the note.
 */
import type { Point, Position } from 'unist'
import { LineCounter, isMap, isScalar, isSeq, parseDocument, type Node as YamlNode } from 'yaml'

/** Maps offsets inside a block body to places in the note. */
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
  /** The whole value text, as written. */
  readonly raw: string
  /** The value before any `;`, trimmed: an expression or a word. */
  readonly value: string
  readonly valuePlace: Position
  /** The source after `;`, trimmed, or null. */
  readonly source: string | null
}

/** One `- text` list item (or `- {text: …, verify: yes}`). */
export interface BodyItem {
  readonly text: string
  readonly place: Position
  readonly fields: Readonly<Record<string, string>>
}

/** A read body: entries of a mapping, or items of a list, and any syntax problems. */
export interface Body {
  readonly entries: readonly BodyEntry[]
  readonly items: readonly BodyItem[]
  readonly problems: readonly { readonly reason: string; readonly place: Position }[]
}

/** Read a block body. An empty body gives no entries and no problems. */
export function readBody(text: string, origin: BodyOrigin): Body {
  const lineCounter = new LineCounter()
  const doc = parseDocument(text, { schema: 'failsafe', lineCounter, prettyErrors: false, uniqueKeys: false })
  const toPoint = (offset: number): Point => {
    const { line, col } = lineCounter.linePos(offset)
    return { line: origin.line + line - 1, column: col + origin.indent, offset: undefined as unknown as number }
  }
  const span = (range: readonly [number, number, number?] | null | undefined): Position => {
    const [start, end] = range ?? [0, 0]
    return { start: stripOffset(toPoint(start)), end: stripOffset(toPoint(end)) }
  }
  const problems = doc.errors.map((error) => ({
    // yaml reports body-relative lines; the place carries the note's line instead.
    reason: error.message.replace(/ at line \d+, column \d+:?[\s\S]*$/, ''),
    place: span([error.pos[0], error.pos[1]]),
  }))
  const entries: BodyEntry[] = []
  const items: BodyItem[] = []
  const contents = doc.contents as YamlNode | null
  if (problems.length > 0 || contents === null) return { entries, items, problems }
  if (isMap(contents)) {
    for (const pair of contents.items) {
      const key = pair.key as YamlNode | null
      const value = pair.value as YamlNode | null
      if (!isScalar(key)) {
        problems.push({ reason: 'expected `name: value` lines', place: span(key?.range) })
        continue
      }
      if (value !== null && !isScalar(value)) {
        problems.push({ reason: `expected one value after \`${String(key.value)}:\`, not a nested list or mapping`, place: span(value.range) })
        continue
      }
      const raw = value === null ? '' : String(value.value)
      const cut = raw.indexOf(';')
      const valueText = (cut < 0 ? raw : raw.slice(0, cut)).trim()
      const source = cut < 0 ? null : raw.slice(cut + 1).trim() || null
      // The place of the expression alone (a plain scalar starts at its range).
      const range = value?.range
      const valueRange: [number, number] | undefined = range
        ? [range[0], Math.min(range[1], range[0] + Math.max(1, valueText.length))]
        : undefined
      entries.push({
        name: String(key.value).trim(),
        namePlace: span(key.range),
        raw,
        value: valueText,
        valuePlace: span(valueRange ?? key.range),
        source,
      })
    }
  } else if (isSeq(contents)) {
    for (const item of contents.items as (YamlNode | null)[]) {
      if (isScalar(item)) {
        items.push({ text: String(item.value).trim(), place: span(item.range), fields: {} })
      } else if (isMap(item)) {
        const fields: Record<string, string> = {}
        for (const pair of item.items) {
          const k = pair.key as YamlNode | null
          const v = pair.value as YamlNode | null
          if (isScalar(k) && (v === null || isScalar(v))) fields[String(k.value)] = v === null ? '' : String(v.value)
        }
        items.push({ text: (fields.text ?? '').trim(), place: span(item.range), fields })
      } else {
        problems.push({ reason: 'expected `- text` items', place: span(item?.range) })
      }
    }
  } else if (isScalar(contents)) {
    problems.push({ reason: 'expected `name: value` lines or `- item` lines', place: span(contents.range) })
  }
  return { entries, items, problems }
}

function stripOffset(point: Point): Point {
  return { line: point.line, column: point.column }
}
