/**
 * What a block kind is: how it finds the blocks it depends on, and how it
 * evaluates into an outcome the package renders. One file per kind.
 */
import type { VFile } from 'vfile'
import type { Scope } from '../expressions.js'
import type { QuantityKind } from '../quantity.js'
import type { CalcBlock, InputValue, MethodStep, NamedValue, NoteMeta } from '../types.js'

/** Shared state while a note's blocks are evaluated in dependency order. */
export interface EvaluationContext {
  readonly file: VFile
  readonly meta: NoteMeta
  readonly scope: Scope
  /** Every block id of the note. */
  readonly blockIds: ReadonlySet<string>
  /** Outcomes of the blocks evaluated so far, by id. */
  readonly outcomes: Map<string, BlockOutcome>
  /** Reference keys cited, with where (ordered into document order later). */
  readonly citations: Citation[]
}

/** A reference key cited at a place in the note. */
export interface Citation {
  readonly key: string
  readonly line: number
  readonly column: number
}

/** A quantity a linkage can sweep over its crank (input) angle. */
export interface SweptQuantity {
  readonly name: string
  readonly label: string
  readonly kind: QuantityKind
}

/** A marked angle: a dead centre, a toggle, a limit. */
export interface AngleMarker {
  readonly name: string
  readonly label: string
  /** rad in [0, 2π) */
  readonly theta: number
}

/** Swept values of a linkage block, for tables and charts (columns in SI). */
export interface SweepSource {
  /** 'crank angle' or 'input angle'. */
  readonly angleLabel: string
  /** Start and end of the crank-angle range, rad. */
  readonly start: number
  readonly end: number
  readonly fullTurn: boolean
  readonly quantities: readonly SweptQuantity[]
  readonly markers: readonly AngleMarker[]
  /** Values at the given angles, one Float64Array per quantity name. */
  at(angles: Float64Array): Record<string, Float64Array>
}

/** A check's outcome. */
export interface CheckOutcome {
  readonly label: string
  readonly condition: string
  readonly passed: boolean
  readonly actual: string
  readonly limit: string
  /** How far inside (+) or outside (−) the limit, displayed. */
  readonly margin: string
  readonly source: string | null
  readonly line: number
  /** The compared quantities in SI, for results.json. */
  readonly actualSI: number
  readonly limitSI: number
  readonly unit: string
  /** The comparison, e.g. '>=' or '±'. */
  readonly operator: string
  readonly blockId: string | null
}

/** A table's outcome: header and rows already in display form. */
export interface TableOutcome {
  readonly of: string
  readonly columns: readonly { readonly label: string; readonly unit: string }[]
  readonly rows: readonly { readonly cells: readonly string[]; readonly marker: string | null }[]
}

/** An assumption with its origin. */
export interface Assumption {
  readonly text: string
  /** True when it must still be verified as the design proceeds. */
  readonly verify: boolean
  /** Block id or kind it came from, or null for the note's own. */
  readonly from: string | null
}

/** What evaluating one block gave. */
export interface BlockOutcome {
  readonly block: CalcBlock
  readonly kindLabel: string
  readonly inputs: readonly InputValue[]
  readonly results: readonly NamedValue[]
  readonly method: readonly MethodStep[]
  /** Engineering cautions in plain words. */
  readonly warnings: readonly string[]
  readonly assumptions: readonly Assumption[]
  /** Names of the results that go into the package summary. */
  readonly summary: readonly string[]
  readonly sweep: SweepSource | null
  readonly checks: readonly CheckOutcome[]
  readonly table: TableOutcome | null
}

/** A block kind. */
export interface BlockKind {
  readonly name: string
  /** Heading word, e.g. "Slider-crank". */
  readonly label: string
  /** Whether the block must have an id. */
  readonly needsId: boolean
  /** Ids of other blocks this block uses. */
  dependencies(block: CalcBlock, blockIds: ReadonlySet<string>): Set<string>
  /** Evaluate, reporting problems on the file; null when the block has errors. */
  evaluate(block: CalcBlock, context: EvaluationContext): BlockOutcome | null
}

/** An outcome with nothing but the block and the given parts. */
export function outcome(block: CalcBlock, kindLabel: string, parts: Partial<BlockOutcome>): BlockOutcome {
  return {
    block,
    kindLabel,
    inputs: [],
    results: [],
    method: [],
    warnings: [],
    assumptions: [],
    summary: [],
    sweep: null,
    checks: [],
    table: null,
    ...parts,
  }
}
