/**
 * `checks` blocks: acceptance criteria as comparisons over results, each with
 * its source, evaluated to PASS or FAIL with the margin.
 *
 *     least transmission angle: drive.transmission_angle_min >= 40 deg ; [alt]
 *     stroke: drive.stroke = 80 mm ± 0.5 mm ; [spec] 3.2
 */
import type { Position } from 'unist'
import { displayValue } from '../display.js'
import { evaluateText, symbolsOf, tryParse, type Evaluated } from '../expressions.js'
import { messages, type RuleId } from '../messages.js'
import { describeValue, isUnit, valueOf } from '../quantity.js'
import { reportError } from '../report.js'
import type { Value } from '../types.js'
import { citeSources } from './inputs.js'
import { outcome, type BlockKind, type CheckOutcome, type EvaluationContext } from './kind.js'

/** A condition split at its comparison. */
export interface Condition {
  readonly left: string
  readonly operator: '>=' | '<=' | '>' | '<' | '±'
  readonly right: string
  readonly tolerance: string | null
}

const OPERATORS: readonly [string, Condition['operator'] | '='][] = [
  ['>=', '>='],
  ['<=', '<='],
  ['≥', '>='],
  ['≤', '<='],
  ['==', '='],
  ['>', '>'],
  ['<', '<'],
  ['=', '='],
]

/** Split `a >= b` or `a = b ± t` at its top-level comparison; null when it is not one. */
export function parseCondition(text: string): Condition | null {
  let depth = 0
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!
    if (c === '(') depth++
    else if (c === ')') depth--
    if (depth !== 0) continue
    for (const [token, operator] of OPERATORS) {
      if (!text.startsWith(token, i)) continue
      const left = text.slice(0, i).trim()
      const rest = text.slice(i + token.length).trim()
      if (left === '' || rest === '') return null
      if (operator === '=') {
        const band = /^(.*?)(?:±|\+\/-)(.*)$/.exec(rest)
        if (!band || band[1]!.trim() === '' || band[2]!.trim() === '') return null
        return { left, operator: '±', right: band[1]!.trim(), tolerance: band[2]!.trim() }
      }
      return { left, operator, right: rest, tolerance: null }
    }
  }
  return null
}

/** A trailing mark that makes a check informative: shown and counted apart, never failing the gate. */
const INFORMATIVE = /\s*\((?:informative|for information)\)\s*$/i

export const checksKind: BlockKind = {
  name: 'checks',
  label: 'Acceptance checks',
  needsId: false,
  // A check on a block with errors is shown as not evaluated, and counted.
  toleratesFailedDependencies: true,
  dependencies(block, ids) {
    const found = new Set<string>()
    for (const entry of block.body.entries) {
      const text = entry.value.replace(INFORMATIVE, '')
      const condition = parseCondition(text)
      for (const part of condition ? [condition.left, condition.right, condition.tolerance] : [text]) {
        const node = part ? tryParse(part) : null
        if (node) for (const name of symbolsOf(node)) if (ids.has(name)) found.add(name)
      }
    }
    return found
  },
  evaluate(block, context) {
    if (block.body.items.length > 0) {
      reportError(context.file, 'block-syntax', messages['block-syntax']('expected `label: condition ; source` lines'), block.place)
      return null
    }
    const checks: CheckOutcome[] = []
    for (const entry of block.body.entries) {
      citeSources(entry.source, entry.sourcePlace ?? entry.valuePlace, context)
      const informative = INFORMATIVE.test(entry.value)
      const text = entry.value.replace(INFORMATIVE, '')
      const common = { label: entry.name, condition: text, informative, source: entry.source, line: entry.valuePlace.start.line, blockId: block.id }
      checks.push(evaluateCheck(text, entry.valuePlace, context, common))
    }
    return outcome(block, 'Acceptance checks', { checks })
  },
}

export type Common = Pick<CheckOutcome, 'label' | 'condition' | 'informative' | 'source' | 'line' | 'blockId'>

/** A check that could not be evaluated: counted and shown, with why. */
function notEvaluated(common: Common, reason: string): CheckOutcome {
  return { ...common, status: 'not-evaluated', reason, actual: '—', limit: '—', margin: '—', actualSI: null, limitSI: null, unit: '', operator: '' }
}

/** One condition judged in a context's scope (a study judges its checks in a scratch copy). */
export function evaluateCheck(text: string, place: Position, context: EvaluationContext, common: Common): CheckOutcome {
  const { file } = context
  const fail = (ruleId: RuleId, reason: string): CheckOutcome => {
    reportError(file, ruleId, reason, place)
    return notEvaluated(common, reason)
  }
  const condition = parseCondition(text)
  if (!condition) {
    // No comparison: a yes/no result (`engine.self_starting`, `not drive.needs_stored_energy`).
    const flag = evaluateText(text, context.scope, {}, context.blockIds)
    if (flag.ok && typeof flag.value === 'boolean') {
      return { ...common, status: flag.value ? 'pass' : 'fail', reason: null, actual: flag.value ? 'yes' : 'no', limit: 'yes', margin: '—', actualSI: flag.value ? 1 : 0, limitSI: 1, unit: '', operator: 'is' }
    }
    if (!flag.ok && flag.ruleId === 'depends-on-error') return fail(flag.ruleId, flag.reason)
    return fail('check-syntax', messages['check-syntax'](text))
  }
  const parts = [condition.left, condition.right, ...(condition.tolerance ? [condition.tolerance] : [])]
  const sides: Evaluated[] = parts.map((part) => evaluateText(part, context.scope, {}, context.blockIds))
  for (const side of sides) if (!side.ok) return fail(side.ruleId, side.reason)
  const compared = sides.map((side) => (side as { value: unknown }).value)
  const left = compared[0]
  const numbers = compared.map(siOf)
  if (numbers.some((n) => n === null) || !compared.every((v) => sameDimension(v, left))) {
    const detail = `it compares ${compared.map(describeValue).join(' with ')}`
    return fail('check-not-evaluable', messages['check-not-evaluable'](text, detail))
  }
  const [actual, limit, band] = numbers as number[]
  let passed: boolean
  let margin: number
  switch (condition.operator) {
    case '>=':
      passed = actual! >= limit!
      margin = actual! - limit!
      break
    case '>':
      passed = actual! > limit!
      margin = actual! - limit!
      break
    case '<=':
      passed = actual! <= limit!
      margin = limit! - actual!
      break
    case '<':
      passed = actual! < limit!
      margin = limit! - actual!
      break
    case '±':
      passed = Math.abs(actual! - limit!) <= band!
      margin = band! - Math.abs(actual! - limit!)
      break
  }
  const shown = (si: number, like: unknown): string => displayValue(valueLike(si, like), context.meta.units, context.meta.digits).text
  const right = compared[1]
  const limitText =
    condition.operator === '±'
      ? `${shown(limit!, right)} ± ${shown(band!, compared[2])}`
      : `${condition.operator.replace('>=', '≥').replace('<=', '≤')} ${shown(limit!, right)}`
  const kind = valueOf(left)
  return {
    ...common,
    status: passed ? 'pass' : 'fail',
    reason: null,
    actual: shown(actual!, left),
    limit: limitText,
    margin: shown(margin, left),
    actualSI: actual!,
    limitSI: limit!,
    unit: kind?.type === 'quantity' ? kind.kind : kind?.type === 'other' ? kind.siUnit : '',
    operator: condition.operator,
  }
}

function siOf(value: unknown): number | null {
  const v = valueOf(value)
  return v && (v.type === 'quantity' || v.type === 'other') && Number.isFinite(v.si) ? v.si : null
}

function sameDimension(a: unknown, b: unknown): boolean {
  if (typeof a === 'number' && typeof b === 'number') return true
  return isUnit(a) && isUnit(b) && a.equalBase(b)
}

/** A displayable value of the same kind as `like`, holding an SI number. */
function valueLike(si: number, like: unknown): Value {
  const v = valueOf(like)
  if (v?.type === 'quantity') return { ...v, si }
  if (v?.type === 'other') return { ...v, si, shown: v.si === 0 ? si : si * (v.shown / v.si) }
  return { type: 'quantity', kind: 'ratio', si }
}
