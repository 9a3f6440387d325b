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
import { messages } from '../messages.js'
import { describeValue, isUnit, kindOfUnit } from '../quantity.js'
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

export const checksKind: BlockKind = {
  name: 'checks',
  label: 'Acceptance checks',
  needsId: false,
  dependencies(block, ids) {
    const found = new Set<string>()
    for (const entry of block.body.entries) {
      const condition = parseCondition(entry.value)
      if (!condition) continue
      for (const part of [condition.left, condition.right, condition.tolerance]) {
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
    let ok = true
    for (const entry of block.body.entries) {
      citeSources(entry.source, entry.valuePlace, context)
      const result = evaluateCheck(entry.name, entry.value, entry.source, entry.valuePlace, context, block.id)
      if (result) checks.push(result)
      else ok = false
    }
    if (!ok && checks.length === 0) return null
    return outcome(block, 'Acceptance checks', { checks })
  },
}

function evaluateCheck(
  label: string,
  text: string,
  source: string | null,
  place: Position,
  context: EvaluationContext,
  blockId: string | null,
): CheckOutcome | null {
  const { file } = context
  const condition = parseCondition(text)
  if (!condition) {
    reportError(file, 'check-syntax', messages['check-syntax'](text), place)
    return null
  }
  const sides: Evaluated[] = [condition.left, condition.right, ...(condition.tolerance ? [condition.tolerance] : [])].map((part) =>
    evaluateText(part, context.scope, {}, context.blockIds),
  )
  for (const side of sides) {
    if (!side.ok) {
      reportError(file, side.ruleId, side.reason, place)
      return null
    }
  }
  const [left, right, tolerance] = sides.map((s) => (s as { value: unknown }).value)
  const numbers = [left, right, ...(condition.tolerance ? [tolerance] : [])].map(siOf)
  const compared = [left, right, ...(condition.tolerance ? [tolerance] : [])]
  if (numbers.some((n) => n === null) || !compared.every((v) => sameDimension(v, left))) {
    const detail = `it compares ${[left, right, ...(condition.tolerance ? [tolerance] : [])].map(describeValue).join(' with ')}`
    reportError(file, 'check-not-evaluable', messages['check-not-evaluable'](text, detail), place)
    return null
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
  const limitText = condition.operator === '±' ? `${shown(limit!, right)} ± ${shown(band!, tolerance)}` : `${condition.operator.replace('>=', '≥').replace('<=', '≤')} ${shown(limit!, right)}`
  return {
    label,
    condition: text,
    passed,
    actual: shown(actual!, left),
    limit: limitText,
    margin: shown(margin, left),
    source,
    line: place.start.line,
    actualSI: actual!,
    limitSI: limit!,
    unit: isUnit(left) ? (kindOfUnit(left) ?? left.formatUnits()) : '',
    operator: condition.operator,
    blockId,
  }
}

function siOf(value: unknown): number | null {
  if (typeof value === 'number' && Number.isFinite(value)) return value
  if (isUnit(value) && value.value !== null && Number.isFinite(value.value)) return value.value
  return null
}

function sameDimension(a: unknown, b: unknown): boolean {
  if (typeof a === 'number' && typeof b === 'number') return true
  return isUnit(a) && isUnit(b) && a.equalBase(b)
}

/** A displayable value of the same kind as `like`, holding an SI number. */
function valueLike(si: number, like: unknown): Value {
  if (isUnit(like)) {
    const kind = kindOfUnit(like)
    if (kind) return { type: 'quantity', kind, si }
    const unit = like.formatUnits()
    const scale = like.toNumber(unit) / (like.value ?? 1)
    return { type: 'other', si, unit, shown: si * (Number.isFinite(scale) ? scale : 1) }
  }
  return { type: 'quantity', kind: 'ratio', si }
}
