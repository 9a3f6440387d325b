/**
 * `assumptions` blocks: the note's own assumptions as `- text` items; an item
 * ending in "(to verify)" or written `{text: …, verify: yes}` is flagged as
 * awaiting verification as the design proceeds.
 */
import { messages } from '../messages.js'
import { reportError } from '../report.js'
import { citeSources } from './inputs.js'
import { outcome, type Assumption, type BlockKind } from './kind.js'

const TO_VERIFY = /\s*\((?:to verify|to be verified)\)\s*$/i

export const assumptionsKind: BlockKind = {
  name: 'assumptions',
  label: 'Assumptions',
  needsId: false,
  dependencies: () => new Set(),
  evaluate(block, context) {
    if (block.body.entries.length > 0 || block.body.items.length === 0) {
      reportError(context.file, 'block-syntax', messages['block-syntax']('expected `- assumption` items, one per line'), block.place)
      return null
    }
    const assumptions: Assumption[] = []
    for (const item of block.body.items) {
      citeSources(item.text, item.place, context)
      const flagged = TO_VERIFY.test(item.text) || /^(yes|true)$/i.test(item.fields.verify ?? '')
      assumptions.push({ text: item.text.replace(TO_VERIFY, ''), verify: flagged, from: null })
    }
    return outcome(block, 'Assumptions', { assumptions, gathered: 'assumptions' })
  },
}
