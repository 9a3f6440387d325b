/**
 * `design-inputs` blocks: named design inputs (a required stroke, a motor
 * speed, a supplier's datum) with units and sources, for other blocks and
 * checks to use. A bad line is reported at that line; the others still count.
 */
import { evaluateText, symbolsOf, tryParse } from '../expressions.js'
import { messages } from '../messages.js'
import { valueOf } from '../quantity.js'
import { reportError } from '../report.js'
import type { InputValue } from '../types.js'
import { citeSources } from './inputs.js'
import { outcome, type BlockKind } from './kind.js'
import { publish } from './values.js'

const NAME = /^[A-Za-z][A-Za-z0-9_]*$/

/** The block kind's name, and the older name still read (with a warning) for one release. */
export const DESIGN_INPUTS = 'design-inputs'
export const DESIGN_INPUTS_OLD_NAME = 'given'

export const designInputsKind: BlockKind = {
  name: DESIGN_INPUTS,
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
    const local: Record<string, unknown> = {}
    const inputs: InputValue[] = []
    const broken = new Map<string, string>()
    if (block.body.items.length > 0) {
      reportError(file, 'block-syntax', messages['block-syntax']('expected `name: value ; source` lines'), block.place)
      return null
    }
    // In the order written: a value may use those above it.
    for (const entry of block.body.entries) {
      if (!NAME.test(entry.name)) {
        reportError(file, 'invalid-expression', messages['invalid-expression'](entry.name, 'a name must start with a letter and hold only letters, digits and _'), entry.namePlace)
        continue
      }
      // A bad citation is its own error; the value still counts.
      citeSources(entry.source, entry.sourcePlace ?? entry.valuePlace, context)
      const evaluated = evaluateText(entry.value, context.scope, local, context.blockIds)
      if (!evaluated.ok) {
        reportError(file, evaluated.ruleId, evaluated.reason, entry.valuePlace)
        broken.set(entry.name, `its value at line ${entry.valuePlace.start.line} has errors`)
        continue
      }
      const value = valueOf(evaluated.value)
      if (value === null || value.type === 'text') {
        reportError(file, 'invalid-expression', messages['invalid-expression'](entry.value, 'expected a number or a quantity with a unit'), entry.valuePlace)
        broken.set(entry.name, `its value at line ${entry.valuePlace.start.line} has errors`)
        continue
      }
      inputs.push({
        name: entry.name,
        label: entry.name.replace(/_/g, ' '),
        symbol: null,
        expression: entry.value,
        source: entry.source,
        place: entry.valuePlace,
        given: true,
        value,
      })
      local[entry.name] = evaluated.value
    }
    publish(context, block.id, inputs, broken)
    return outcome(block, 'Design inputs', { inputs })
  },
}
