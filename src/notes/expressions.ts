/**
 * Expressions over quantities and over other blocks' values (`pusher.stroke`):
 * which blocks an expression uses, and evaluating it with the restricted parser,
 * with problems turned into the engineer's words.
 */
import type { MathNode } from 'mathjs'
import type { Position } from 'unist'
import { evaluateExpression, hasUnboundedPower, isComplexValue, parseQuantityExpression } from './quantity.js'
import { messages, type RuleId } from './messages.js'
import { RENAMED_RESULTS } from './block-kinds/extremes.js'

/** Values of the evaluated blocks by id, and why some values are missing. */
export interface Scope {
  readonly values: Map<string, Record<string, unknown>>
  /** Values a block has no number for, with the reason (e.g. the time ratio of a crank that rocks). */
  readonly unavailable: Map<string, Map<string, string>>
  /** Values whose own lines have errors (already reported there). */
  readonly broken: Map<string, Map<string, string>>
  /** Where each published input was written, by `id.name`. */
  readonly places: Map<string, Position>
}

/** A new, empty scope. */
export function createScope(): Scope {
  return { values: new Map(), unavailable: new Map(), broken: new Map(), places: new Map() }
}

/** The `id.name` an expression is, when it is nothing but a reference to another block's value. */
export function plainReference(text: string): string | null {
  const match = /^\s*([A-Za-z][A-Za-z0-9_]*)\.([A-Za-z][A-Za-z0-9_]*)\s*$/.exec(text)
  return match ? `${match[1]}.${match[2]}` : null
}

/** Parse without reporting: null when the text is not an expression. */
export function tryParse(text: string): MathNode | null {
  try {
    return parseQuantityExpression(text)
  } catch {
    return null
  }
}

/** Names of symbols an expression uses (block ids, local inputs, units, functions). */
export function symbolsOf(node: MathNode): Set<string> {
  const names = new Set<string>()
  node.traverse((child) => {
    if (child.type === 'SymbolNode') names.add((child as unknown as { name: string }).name)
  })
  return names
}

/** Outcome of evaluating an expression. */
export type Evaluated =
  | { readonly ok: true; readonly value: unknown }
  | { readonly ok: false; readonly ruleId: RuleId; readonly reason: string }

/**
 * Evaluate an expression of the note.
 * @param local this block's own values, visible without a prefix
 * @param blockIds every block id of the note (evaluated or not)
 */
export function evaluateText(
  text: string,
  scope: Scope,
  local: Readonly<Record<string, unknown>>,
  blockIds: ReadonlySet<string>,
): Evaluated {
  let node: MathNode
  try {
    node = parseQuantityExpression(text)
  } catch (error) {
    return { ok: false, ruleId: 'invalid-expression', reason: messages['invalid-expression'](text, plain(error)) }
  }
  // Name problems first, in the note's words rather than the parser's.
  let problem: Evaluated | null = null
  node.traverse((child) => {
    if (problem) return
    if (child.type !== 'AccessorNode') return
    const accessor = child as unknown as { object: MathNode; index: { dimensions: MathNode[] } }
    if (accessor.object.type !== 'SymbolNode') return
    const id = (accessor.object as unknown as { name: string }).name
    if (id in local || !blockIds.has(id)) return
    const name = String((accessor.index.dimensions[0] as unknown as { value?: unknown }).value ?? '')
    const values = scope.values.get(id)
    if (!values) return
    if (!(name in values)) {
      const broken = scope.broken.get(id)?.get(name)
      if (broken) {
        problem = { ok: false, ruleId: 'depends-on-error', reason: messages['invalid-expression'](text, `\`${id}.${name}\` has no value: ${broken}`) }
        return
      }
      const renamed = RENAMED_RESULTS.get(name)
      if (renamed) {
        problem = { ok: false, ruleId: 'renamed-result', reason: messages['renamed-result'](`${id}.${name}`, renamed) }
        return
      }
      const why = scope.unavailable.get(id)?.get(name)
      problem = {
        ok: false,
        ruleId: why ? 'invalid-expression' : 'unknown-result',
        reason: why
          ? messages['invalid-expression'](text, `\`${id}.${name}\` has no value: ${why}`)
          : messages['unknown-result'](id, name, Object.keys(values)),
      }
    }
  })
  if (problem) return problem
  const symbols = new Map<string, unknown>(Object.entries(local))
  for (const [id, values] of scope.values) if (!symbols.has(id)) symbols.set(id, values)
  try {
    const value = evaluateExpression(node, Object.fromEntries(symbols))
    if (hasUnboundedPower(value)) {
      return { ok: false, ruleId: 'invalid-expression', reason: messages['invalid-expression'](text, 'a unit is raised to a power that is not a finite number') }
    }
    if (isComplexValue(value)) {
      return { ok: false, ruleId: 'invalid-expression', reason: messages['invalid-expression'](text, 'it gives a complex number (an imaginary part, or the root of a negative number); a design quantity is real') }
    }
    return { ok: true, value }
  } catch (error) {
    const text_ = plain(error)
    const undefinedSymbol = /Undefined symbol (\w+)/.exec(text_)
    if (undefinedSymbol) {
      const name = undefinedSymbol[1]!
      if (blockIds.has(name) && !scope.values.has(name)) {
        return { ok: false, ruleId: 'depends-on-error', reason: messages['invalid-expression'](text, `block \`${name}\` has errors, so its values are not available`) }
      }
      return blockIds.has(name)
        ? { ok: false, ruleId: 'invalid-expression', reason: messages['invalid-expression'](text, `\`${name}\` is a block, refer to one of its values as \`${name}.name\``) }
        : { ok: false, ruleId: 'unknown-block', reason: messages['invalid-expression'](text, `\`${name}\` is neither a unit, a function, an input of this block nor a block id`) }
    }
    return { ok: false, ruleId: 'invalid-expression', reason: messages['invalid-expression'](text, text_) }
  }
}

/** An error's message without the parser's internal detail. */
function plain(error: unknown): string {
  const message = error instanceof Error ? error.message : String(error)
  return message.replace(/\s*\(char \d+\)/, '').replace(/^Error: /, '')
}
