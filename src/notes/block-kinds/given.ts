/**
 * `given` blocks: named design inputs (a required stroke, a motor speed, a
 * supplier's datum) with units and sources, for other blocks and checks to use.
 */
import { evaluateText, symbolsOf, tryParse } from '../expressions.js'
import { messages } from '../messages.js'
import { isUnit, kindOfUnit } from '../quantity.js'
import { reportError } from '../report.js'
import type { InputValue } from '../types.js'
import { citeSources } from './inputs.js'
import { outcome, type BlockKind } from './kind.js'
import { publish } from './values.js'

const NAME = /^[A-Za-z][A-Za-z0-9_]*$/

export const givenKind: BlockKind = {
  name: 'given',
  label: 'Design inputs',
  needsId: true,
  dependencies(block, ids) {
    const local = new Set(block.body.entries.map((e) => e.name))
    const found = new Set<string>()
    for (const entry of block.body.entries) {
      const node = tryParse(entry.value)
      if (node) for (const name of symbolsOf(node)) if (ids.has(name) && !local.has(name)) found.add(name)
    }
    return found
  },
  evaluate(block, context) {
    const { file } = context
    let ok = true
    const local: Record<string, unknown> = {}
    const inputs: InputValue[] = []
    if (block.body.items.length > 0) {
      reportError(file, 'block-syntax', messages['block-syntax']('expected `name: value ; source` lines'), block.place)
      return null
    }
    // In the order written: a value may use those above it.
    for (const entry of block.body.entries) {
      if (!NAME.test(entry.name)) {
        reportError(file, 'invalid-expression', messages['invalid-expression'](entry.name, 'a name must start with a letter and hold only letters, digits and _'), entry.namePlace)
        ok = false
        continue
      }
      if (!citeSources(entry.source, entry.valuePlace, context)) ok = false
      const evaluated = evaluateText(entry.value, context.scope, local, context.blockIds)
      if (!evaluated.ok) {
        reportError(file, evaluated.ruleId, evaluated.reason, entry.valuePlace)
        ok = false
        continue
      }
      const value = evaluated.value
      const label = entry.name.replace(/_/g, ' ')
      const base = { name: entry.name, label, symbol: null, expression: entry.value, source: entry.source, place: entry.valuePlace, given: true }
      if (typeof value === 'number' && Number.isFinite(value)) {
        inputs.push({ ...base, value: { type: 'quantity', kind: 'ratio', si: value } })
      } else if (isUnit(value)) {
        const kind = kindOfUnit(value)
        if (kind) inputs.push({ ...base, value: { type: 'quantity', kind, si: value.value ?? Number.NaN } })
        else {
          const unit = value.formatUnits()
          inputs.push({ ...base, value: { type: 'other', si: value.value ?? Number.NaN, unit, shown: value.toNumber(unit) } })
        }
      } else if (typeof value === 'boolean') {
        inputs.push({ ...base, value: { type: 'flag', flag: value } })
      } else {
        reportError(file, 'invalid-expression', messages['invalid-expression'](entry.value, 'expected a number or a quantity with a unit'), entry.valuePlace)
        ok = false
        continue
      }
      local[entry.name] = value
    }
    if (!ok) return null
    publish(context, block.id, inputs)
    return outcome(block, 'Design inputs', { inputs })
  },
}
