/**
 * What table, chart and drawing blocks share: their options as `name: value`
 * lines, and `of:` naming the linkage block whose sweep they show.
 */
import type { Position } from 'unist'
import type { BodyEntry } from '../body.js'
import { messages } from '../messages.js'
import { reportError } from '../report.js'
import type { CalcBlock } from '../types.js'
import type { BlockOutcome, EvaluationContext, SweepSource } from './kind.js'

/** An opened table, chart or drawing block. */
export interface SweepBlock {
  readonly entries: ReadonlyMap<string, BodyEntry>
  readonly of: BodyEntry
  readonly linkage: BlockOutcome
  readonly source: SweepSource
  /** Report a problem of this block (its own rule) and give null. */
  readonly fail: (detail: string, place?: Position) => null
}

/** Block ids a sweep block uses: the one named by `of`. */
export function sweepDependencies(block: CalcBlock, ids: ReadonlySet<string>): Set<string> {
  const of = block.body.entries.find((e) => e.name === 'of')?.value
  return new Set(of && ids.has(of) ? [of] : [])
}

/** Check the options against `known` and find the linkage named by `of`; null after reporting. */
export function openSweepBlock(
  block: CalcBlock,
  context: EvaluationContext,
  rule: 'table-syntax' | 'chart-syntax' | 'drawing-syntax',
  known: readonly string[],
): SweepBlock | null {
  const { file } = context
  const fail = (detail: string, place: Position = block.place): null => {
    reportError(file, rule, messages[rule](detail), place)
    return null
  }
  for (const entry of block.body.entries) {
    if (!known.includes(entry.name)) return fail(`unexpected \`${entry.name}\`, expected ${known.map((k) => `\`${k}\``).join(', ')}`, entry.namePlace)
  }
  const entries = new Map(block.body.entries.map((e) => [e.name, e]))
  const of = entries.get('of')
  if (!of) return fail('missing `of: <linkage block id>`')
  const linkage = context.outcomes.get(of.value)
  if (!linkage?.sweep) {
    if (!context.blockIds.has(of.value)) {
      reportError(file, 'unknown-block', messages['unknown-block'](of.value), of.valuePlace)
      return null
    }
    return fail(`\`${of.value}\` is not a linkage block with swept quantities`, of.valuePlace)
  }
  return { entries, of, linkage, source: linkage.sweep, fail }
}

/** A marker's angle (given in [0, 2π)) moved into the sweep's range [start, start + 2π). */
export function intoRange(theta: number, start: number): number {
  const turn = 2 * Math.PI
  const offset = (((theta - start) % turn) + turn) % turn
  return start + (offset > turn - 1e-9 ? 0 : offset)
}
