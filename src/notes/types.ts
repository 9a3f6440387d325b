/**
 * Shapes shared by the note layer and the render layer: a note's metadata, its
 * calculation blocks and what evaluating them gave.
 */
import type { Position } from 'unist'
import type { Body } from './body.js'
import type { QuantityKind } from './quantity.js'

/** Status of a calculation package. */
export type NoteStatus = 'draft' | 'for review' | 'approved'

/** A person in a role, with the date they signed (or null). */
export interface Person {
  readonly name: string
  readonly date: string | null
}

/** One line of the revision history. */
export interface Revision {
  readonly revision: string
  readonly date: string
  readonly description: string
}

/** Unit system and per-kind display-unit overrides. */
export interface DisplayUnits {
  readonly system: 'SI' | 'US'
  readonly overrides: Readonly<Partial<Record<QuantityKind, string>>>
}

/** The front matter, checked. */
export interface NoteMeta {
  readonly title: string
  readonly number: string
  readonly revision: string
  readonly project: string | null
  readonly purpose: string | null
  /** What the calculation covers, in the note's words (added to the package's own statement). */
  readonly scope: string | null
  /** What it leaves out, in the note's words (added to the package's own list). */
  readonly exclusions: readonly string[]
  readonly status: NoteStatus
  /** Date of the package (YYYY-MM-DD), or 'git' for the note's last commit date. */
  readonly date: string | null
  readonly paper: 'A4' | 'Letter'
  readonly units: DisplayUnits
  /** Significant digits of printed results. */
  readonly digits: number
  readonly people: {
    readonly prepared: Person | null
    readonly checked: Person | null
    readonly approved: Person | null
  }
  readonly revisions: readonly Revision[]
  /** Reference key → full citation, in the order written. */
  readonly references: ReadonlyMap<string, string>
}

/** A value a block has: a quantity in SI, a word, a yes/no, or nothing (with the reason). */
export type Value =
  | { readonly type: 'quantity'; readonly kind: QuantityKind; readonly si: number }
  | { readonly type: 'other'; readonly si: number; readonly siUnit: string; readonly unit: string; readonly shown: number }
  | { readonly type: 'text'; readonly text: string }
  | { readonly type: 'flag'; readonly flag: boolean }
  | { readonly type: 'none'; readonly reason: string }

/** A named input or result of a block. */
export interface NamedValue {
  readonly name: string
  /** The quantity in words, e.g. "crank radius". */
  readonly label: string
  /** TeX symbol, e.g. "a" or "\\theta_o". */
  readonly symbol: string | null
  readonly value: Value
  /** A word that says how the value was found (e.g. "closed form", "sweep and bisection"). */
  readonly how?: string
  /** False when a block's own table shows the value (the results table leaves it out; it stays in results.json and usable by name). */
  readonly listed?: boolean
}

/** An input as written in the note. */
export interface InputValue extends NamedValue {
  /** The expression or word written, or the default's text. */
  readonly expression: string
  readonly source: string | null
  readonly place: Position | null
  /** False when the default was taken. */
  readonly given: boolean
  /** How the written value was read, when that is not obvious (e.g. a frequency read as turns per second). */
  readonly note?: string
}

/** One step of a block's method: the governing equation, the same with numbers, the result. */
export interface MethodStep {
  readonly label: string
  /** Governing equation in TeX. */
  readonly formula: string
  /** The equation with the input values substituted, in TeX, or null. */
  readonly substituted: string | null
  /** The result in TeX (value and unit). */
  readonly result: string
  /** Plain words on how it was found or what it means. */
  readonly note?: string
  /** Keys of built-in references the step rests on. */
  readonly cites?: readonly string[]
}

/** A calculation block as found in the note. */
export interface CalcBlock {
  readonly kind: string
  readonly id: string | null
  readonly title: string | null
  /** Index among the note's calculation blocks. */
  readonly index: number
  /** Position of the whole fenced block. */
  readonly place: Position
  readonly body: Body
}
