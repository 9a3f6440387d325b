/**
 * Values and citations in prose, written as generic directives (CommonMark
 * directive proposal, parsed by remark-directive):
 *
 *     … the stroke is :value[pusher.stroke]{unit=in digits=3} …
 *     … after the usual criterion :cite[alt] …
 *
 * Other directives are put back as the text they were written as.
 */
import type { Parent, PhrasingContent, Root, RootContent } from 'mdast'
import type { ContainerDirective, LeafDirective, TextDirective } from 'mdast-util-directive'
import { toString } from 'mdast-util-to-string'
import type { Position } from 'unist'
import { SKIP, visit } from 'unist-util-visit'
import { displayValue } from './display.js'
import { evaluateText } from './expressions.js'
import { messages } from './messages.js'
import { unitFitsKind, valueOf } from './quantity.js'
import { reportError } from './report.js'
import type { EvaluationContext } from './block-kinds/index.js'

/** A printed value in prose. */
export interface ValueNode {
  type: 'lwValue'
  /** The displayed text, e.g. "81.90 mm". */
  text: string
  /** The expression it came from (shown as a tooltip). */
  expression: string
  position?: Position
}

/** A citation in prose. */
export interface CiteNode {
  type: 'lwCite'
  key: string
  position?: Position
}

declare module 'mdast' {
  interface PhrasingContentMap {
    lwValue: ValueNode
    lwCite: CiteNode
  }
  interface RootContentMap {
    lwValue: ValueNode
    lwCite: CiteNode
  }
}

/** Replace value and cite directives; restore the rest as text. Cites are recorded on the context. */
export function resolveProse(tree: Root, context: EvaluationContext): void {
  const { file, meta } = context
  visit(tree, (node, index, parent) => {
    if (parent === undefined || index === undefined) return
    if (node.type === 'textDirective') {
      const directive = node as TextDirective
      const replacement = resolveText(directive)
      ;(parent as Parent).children.splice(index, 1, ...(replacement as RootContent[]))
      return [SKIP, index + replacement.length]
    }
    if (node.type === 'leafDirective' || node.type === 'containerDirective') {
      const directive = node as LeafDirective | ContainerDirective
      const replacement: RootContent[] =
        directive.type === 'leafDirective'
          ? [{ type: 'paragraph', children: [{ type: 'text', value: `::${directive.name}` }, ...directive.children] }]
          : (directive.children as RootContent[])
      ;(parent as Parent).children.splice(index, 1, ...replacement)
      return [SKIP, index]
    }
    return undefined
  })

  function resolveText(directive: TextDirective): PhrasingContent[] {
    const text = toString(directive).trim()
    const place = directive.position
    if (directive.name === 'cite') {
      if (meta.references.has(text)) {
        context.citations.push({ key: text, line: place?.start.line ?? 0, column: place?.start.column ?? 0 })
        return [{ type: 'lwCite', key: text, ...(place ? { position: place } : {}) }]
      }
      reportError(file, 'unknown-reference', messages['unknown-reference'](text), place)
      return [{ type: 'text', value: `[${text}?]` }]
    }
    if (directive.name === 'value') {
      const shown = printValue(text, directive.attributes ?? {}, place)
      return [{ type: 'lwValue', text: shown, expression: text, ...(place ? { position: place } : {}) }]
    }
    const label = directive.children.length > 0 ? [{ type: 'text' as const, value: '[' }, ...directive.children, { type: 'text' as const, value: ']' }] : []
    return [{ type: 'text', value: `:${directive.name}` }, ...label]
  }

  function printValue(text: string, attributes: Record<string, string | null | undefined>, place: Position | undefined): string {
    const fail = (detail: string): string => {
      reportError(file, 'invalid-value-reference', messages['invalid-value-reference'](text, detail), place)
      return `⟨${text}?⟩`
    }
    const evaluated = evaluateText(text, context.scope, {}, context.blockIds)
    if (!evaluated.ok) return fail(evaluated.reason)
    const digitsText = attributes.digits
    const digits = digitsText ? Number(digitsText) : meta.digits
    if (!Number.isInteger(digits) || digits < 1 || digits > 12) return fail('`digits` must be a whole number from 1 to 12')
    const value = valueOf(evaluated.value)
    if (value === null) return fail('it is not a value')
    const unit = attributes.unit ?? null
    if (unit !== null) {
      if (value.type !== 'quantity' || !unitFitsKind(unit, value.kind)) return fail(`\`${unit}\` is not a unit for this value`)
    }
    return displayValue(value, meta.units, digits, unit).text
  }
}
