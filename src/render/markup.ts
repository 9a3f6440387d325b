/**
 * Small hast builders shared by the package sections: tables with header rows,
 * source text with citation links, status words.
 */
import type { Element, ElementContent } from 'hast'
import { h } from 'hastscript'
import type { CheckOutcome } from '../notes/block-kinds/kind.js'
import type { NumberedReference } from '../notes/note.js'

/** Lookup of reference numbers by key. */
export type ReferenceNumbers = ReadonlyMap<string, NumberedReference>

/** Text in which `[key]` becomes a numbered link to the reference list. */
export function withCitations(text: string, references: ReferenceNumbers): ElementContent[] {
  const out: ElementContent[] = []
  let last = 0
  for (const match of text.matchAll(/\[([A-Za-z0-9][A-Za-z0-9_.:-]*)\]/g)) {
    const ref = references.get(match[1]!)
    if (!ref) continue
    if (match.index! > last) out.push({ type: 'text', value: text.slice(last, match.index) })
    out.push(citation(ref))
    last = match.index! + match[0].length
  }
  if (last < text.length) out.push({ type: 'text', value: text.slice(last) })
  return out
}

/** A citation mark linking to its reference. */
export function citation(ref: NumberedReference): Element {
  return h('a.lw-cite', { href: `#ref-${ref.key}`, title: ref.citation }, `[${ref.number}]`)
}

/** A table with a caption, one header row (repeated on every printed page) and body rows. */
export function table(
  className: string,
  caption: string | null,
  header: readonly (string | ElementContent)[],
  rows: readonly (readonly (string | ElementContent | ElementContent[])[])[],
  rowClass?: (index: number) => string | null,
): Element {
  // Up to a dozen rows fit anywhere on a page: kept whole.
  return h(`table.lw-table.${className}${rows.length <= 12 ? '.lw-short' : ''}`, [
    caption ? h('caption', caption) : null,
    h('thead', h('tr', header.map((cell) => h('th', { scope: 'col' }, cell)))),
    h(
      'tbody',
      rows.map((cells, i) => {
        const cls = rowClass?.(i)
        return h(`tr${cls ? `.${cls}` : ''}`, cells.map((cell) => h('td', Array.isArray(cell) ? cell : [cell])))
      }),
    ),
  ])
}

/** PASS, FAIL or NOT EVALUATED in words and style; an informative check says so. */
export function verdict(check: Pick<CheckOutcome, 'status' | 'informative'>): Element {
  const mark =
    check.status === 'pass' ? h('strong.lw-pass', '✔ PASS') : check.status === 'fail' ? h('strong.lw-fail', '✖ FAIL') : h('strong.lw-not-evaluated', '? NOT EVALUATED')
  return check.informative ? h('span', [mark, h('br'), h('span.lw-informative', 'informative')]) : mark
}

/** Row class of a check: its status. */
export function checkRowClass(check: Pick<CheckOutcome, 'status' | 'informative'>): string {
  return check.informative ? 'lw-row-informative' : check.status === 'pass' ? 'lw-row-pass' : check.status === 'fail' ? 'lw-row-fail' : 'lw-row-not-evaluated'
}
