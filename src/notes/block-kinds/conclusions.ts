/**
 * `conclusions` blocks: the note's own conclusions and recommendation as
 * `- text` items, gathered into the package's Conclusions section (with what the
 * checks show and the open items), printed there once.
 */
import { messages } from '../messages.js'
import { reportError } from '../report.js'
import { citeSources } from './inputs.js'
import { outcome, type BlockKind } from './kind.js'

export const conclusionsKind: BlockKind = {
  name: 'conclusions',
  label: 'Conclusions',
  needsId: false,
  dependencies: () => new Set(),
  evaluate(block, context) {
    if (block.body.entries.length > 0 || block.body.items.length === 0) {
      reportError(context.file, 'block-syntax', messages['block-syntax']('expected `- conclusion` items, one per line'), block.place)
      return null
    }
    for (const item of block.body.items) citeSources(item.text, item.place, context)
    return outcome(block, 'Conclusions', { conclusions: block.body.items.map((item) => item.text), gathered: 'conclusions' })
  },
}
