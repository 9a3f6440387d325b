/**
 * Evaluate a note's blocks in dependency order across the whole note. A block
 * whose dependency failed is reported and skipped; the others go on.
 */
import type { VFile } from 'vfile'
import { blockKinds, type BlockOutcome, type EvaluationContext } from './block-kinds/index.js'
import type { DataReader } from './block-kinds/kind.js'
import { createScope } from './expressions.js'
import { messages } from './messages.js'
import { dependencyOrder } from './order.js'
import { reportError } from './report.js'
import type { CalcBlock, NoteMeta } from './types.js'

/** Outcomes by block index (null for a block with errors), and the context they were made in. */
export interface Evaluation {
  readonly outcomes: readonly (BlockOutcome | null)[]
  readonly context: EvaluationContext
}

/** Evaluate blocks (in document order as given) for a note's settings. */
/** Most calculation blocks a note may have: a design note, not a data set (each block may sweep, chart or sample). */
export const MAX_BLOCKS = 400

export function evaluateBlocks(allBlocks: readonly CalcBlock[], meta: NoteMeta, file: VFile, readData: DataReader | null = null): Evaluation {
  const blocks = allBlocks.slice(0, MAX_BLOCKS)
  if (allBlocks.length > MAX_BLOCKS) {
    reportError(file, 'block-syntax', messages['block-syntax'](`the note has ${allBlocks.length} calculation blocks; at most ${MAX_BLOCKS} are evaluated: split it into several notes`), allBlocks[MAX_BLOCKS]!.place)
  }
  const context: EvaluationContext = {
    file,
    meta,
    scope: createScope(),
    blockIds: new Set(blocks.flatMap((b) => (b.id ? [b.id] : []))),
    outcomes: new Map(),
    citations: [],
    readData,
    dataFiles: [],
    budget: { samples: 0 },
  }
  // Blocks without an id still take part: give them a key no expression can name.
  const keyOf = (block: CalcBlock): string => block.id ?? `#${block.index}`
  const keys = blocks.map(keyOf)
  const needs = new Map<string, Set<string>>()
  for (const block of blocks) {
    needs.set(keyOf(block), blockKinds.get(block.kind)!.dependencies(block, context.blockIds))
  }
  const { order, cycles } = dependencyOrder(keys, needs)
  const byKey = new Map(blocks.map((b) => [keyOf(b), b]))
  const outcomes: (BlockOutcome | null)[] = allBlocks.map(() => null)
  const failed = new Set<string>()
  for (const cycle of cycles) {
    for (const key of new Set(cycle)) {
      reportError(file, 'dependency-cycle', messages['dependency-cycle'](cycle), byKey.get(key)!.place)
      failed.add(key)
    }
  }
  for (const key of keys) if (!order.includes(key)) failed.add(key)
  for (const key of order) {
    const block = byKey.get(key)!
    const kind = blockKinds.get(block.kind)!
    const broken = [...needs.get(key)!].find((dep) => failed.has(dep))
    if (broken && !kind.toleratesFailedDependencies) {
      reportError(file, 'depends-on-error', messages['depends-on-error'](broken), block.place)
      failed.add(key)
      continue
    }
    // A body that is not valid YAML was reported already; its entries would only add noise.
    if (block.body.problems.length > 0) {
      failed.add(key)
      continue
    }
    // A block that gives an outcome despite a bad line (a design input, a check) is not failed:
    // its bad lines are marked, and blocks that use them say so without a second error.
    const result = kind.evaluate(block, context)
    outcomes[block.index] = result
    if (result === null) failed.add(key)
    if (result && block.id) context.outcomes.set(block.id, result)
  }
  return { outcomes, context }
}
