/**
 * Inputs of a block: each `name: value ; source` line checked against the
 * kind's input list, evaluated in dependency order within the block, and read
 * as a quantity of the expected dimension.
 */
import type { Position } from 'unist'
import { evaluateText, plainReference, symbolsOf, tryParse } from '../expressions.js'
import { messages } from '../messages.js'
import { readQuantity, type QuantityKind } from '../quantity.js'
import { reportError } from '../report.js'
import type { CalcBlock, InputValue } from '../types.js'
import type { EvaluationContext } from './kind.js'

/** One input a kind takes. */
export interface InputSpec {
  readonly name: string
  readonly label: string
  /** TeX symbol, or null. */
  readonly symbol: string | null
  readonly kind: QuantityKind | 'choice'
  readonly choices?: readonly string[]
  readonly required?: boolean
  /** Expression or word used when the input is not written. */
  readonly default?: string
  /** A word accepted instead of a quantity (e.g. `straight` for a path radius). */
  readonly word?: string
  /** Refuse a negative value (a mass, an inertia), at the place it is written. */
  readonly nonNegative?: boolean
}

/** Inputs read: as shown, as SI numbers, and as words. */
export interface ReadInputs {
  readonly values: readonly InputValue[]
  readonly si: Readonly<Record<string, number>>
  readonly words: Readonly<Record<string, string>>
}

/** Block ids the inputs of a block use. */
export function inputDependencies(block: CalcBlock, specs: readonly InputSpec[], blockIds: ReadonlySet<string>): Set<string> {
  const local = new Set(specs.map((s) => s.name))
  const bySpec = new Map(specs.map((s) => [s.name, s]))
  const ids = new Set<string>()
  for (const entry of block.body.entries) {
    // A choice word (`best-transmission`) is not an expression, unless it is a reference to another block's word.
    const spec = bySpec.get(entry.name)
    if (spec?.kind === 'choice' && (spec.choices ?? []).includes(entry.value)) continue
    const node = tryParse(entry.value)
    if (!node) continue
    for (const name of symbolsOf(node)) if (blockIds.has(name) && !local.has(name)) ids.add(name)
  }
  return ids
}

/** Cite the `[key]` references a source text names; an unknown key is an error at that key. */
export function citeSources(text: string | null, place: Position | undefined, context: EvaluationContext): boolean {
  if (!text) return true
  let ok = true
  for (const match of text.matchAll(/\[([A-Za-z0-9][A-Za-z0-9_.:-]*)\]/g)) {
    const key = match[1]!
    if (context.meta.references.has(key)) {
      context.citations.push({ key, line: place?.start.line ?? 0, column: place?.start.column ?? 0 })
    } else {
      // At the key itself when the source sits on one line.
      const column = (place?.start.column ?? 1) + match.index!
      const at = place && place.start.line === place.end.line ? { start: { line: place.start.line, column }, end: { line: place.start.line, column: column + match[0].length } } : place
      reportError(context.file, 'unknown-reference', messages['unknown-reference'](key), at)
      ok = false
    }
  }
  return ok
}

/**
 * Read and evaluate a block's inputs. Reports every problem; returns null when
 * any input is wrong, so the block is not analysed on bad numbers.
 */
export function readInputs(
  block: CalcBlock,
  specs: readonly InputSpec[],
  kindName: string,
  context: EvaluationContext,
): ReadInputs | null {
  const { file } = context
  const bySpec = new Map(specs.map((s) => [s.name, s]))
  const written = new Map<string, (typeof block.body.entries)[number]>()
  let ok = true
  // Each of these mistakes stays on its line: the line is left out (or its citation
  // dropped) and the block goes on, so one slip does not silence its dependents.
  for (const entry of block.body.entries) {
    if (!bySpec.has(entry.name)) {
      reportError(file, 'unknown-input', messages['unknown-input'](entry.name, kindName, specs.map((s) => s.name)), entry.namePlace)
    } else if (written.has(entry.name)) {
      reportError(file, 'duplicate-input', messages['duplicate-input'](entry.name), entry.namePlace)
    } else {
      written.set(entry.name, entry)
    }
    citeSources(entry.source, entry.sourcePlace ?? entry.valuePlace, context)
  }
  for (const spec of specs) {
    if (spec.required && !written.has(spec.name)) {
      reportError(file, 'missing-input', messages['missing-input'](spec.name, spec.label, kindName), block.place)
      ok = false
    }
  }
  if (!ok) return null

  // Order the quantity inputs so that one may use another of the same block.
  const pending = specs.filter((s) => written.has(s.name) || s.default !== undefined)
  const local: Record<string, unknown> = {}
  const si: Record<string, number> = {}
  const words: Record<string, string> = {}
  const values = new Map<string, InputValue>()
  const localNames = new Set(specs.map((s) => s.name))
  const needs = new Map<string, Set<string>>()
  for (const spec of pending) {
    const text = written.get(spec.name)?.value ?? spec.default!
    const node = spec.kind === 'choice' ? null : tryParse(text)
    needs.set(spec.name, new Set(node ? [...symbolsOf(node)].filter((n) => localNames.has(n) && n !== spec.name) : []))
  }
  const done = new Set<string>()
  let progress = true
  while (progress && done.size < pending.length) {
    progress = false
    for (const spec of pending) {
      if (done.has(spec.name)) continue
      if (![...needs.get(spec.name)!].every((n) => done.has(n) || !needs.has(n))) continue
      done.add(spec.name)
      progress = true
      const entry = written.get(spec.name)
      const text = entry?.value ?? spec.default!
      const place = entry?.valuePlace ?? null
      const base = { name: spec.name, label: spec.label, symbol: spec.symbol, expression: text, source: entry?.source ?? null, place, given: entry !== undefined }
      if (spec.kind === 'choice' || (spec.word !== undefined && text === spec.word)) {
        const allowed = spec.choices ?? [spec.word!]
        // A choice may be another block's word result (`circuit: design.circuit`).
        const reference = spec.kind === 'choice' && !allowed.includes(text) && plainReference(text) ? evaluateText(text, context.scope, local, context.blockIds) : null
        if (reference?.ok && typeof reference.value === 'string' && allowed.includes(reference.value)) {
          words[spec.name] = reference.value
          local[spec.name] = reference.value
          values.set(spec.name, { ...base, value: { type: 'text', text: reference.value } })
          continue
        }
        if (!allowed.includes(text)) {
          reportError(file, 'invalid-choice', messages['invalid-choice'](spec.name, text, allowed), place ?? block.place)
          ok = false
          continue
        }
        words[spec.name] = text
        local[spec.name] = text
        values.set(spec.name, { ...base, value: { type: 'text', text } })
        continue
      }
      const evaluated = evaluateText(text, context.scope, local, context.blockIds)
      if (!evaluated.ok) {
        reportError(file, evaluated.ruleId, evaluated.reason, place ?? block.place)
        ok = false
        continue
      }
      const reading = readQuantity(evaluated.value, spec.kind)
      if (!reading.ok) {
        // A plain reference to a written input: the mistake is where that value was written.
        const reference = plainReference(text)
        const origin = reference ? context.scope.places.get(reference) : undefined
        if (origin && place) {
          const use = `used at line ${place.start.line} as \`${spec.name}\` (${spec.label}) of ${block.id ? `#${block.id}` : `the ${kindName} block`}`
          reportError(file, 'dimension-mismatch', messages['dimension-mismatch'](reference!, use, reading.reason), origin)
        } else {
          reportError(file, 'dimension-mismatch', messages['dimension-mismatch'](spec.name, spec.label, reading.reason), place ?? block.place)
        }
        ok = false
        continue
      }
      if (spec.nonNegative && reading.si < 0) {
        reportError(file, 'dimension-mismatch', messages['dimension-mismatch'](spec.name, spec.label, `expected zero or more, got ${text}`), place ?? block.place)
        ok = false
        continue
      }
      si[spec.name] = reading.si
      local[spec.name] = evaluated.value
      values.set(spec.name, { ...base, value: { type: 'quantity', kind: spec.kind, si: reading.si }, ...(reading.note ? { note: reading.note } : {}) })
    }
  }
  const stuck = pending.filter((s) => !done.has(s.name))
  if (stuck.length > 0) {
    reportError(file, 'dependency-cycle', messages['dependency-cycle']([...stuck.map((s) => s.name), stuck[0]!.name]), block.place)
    ok = false
  }
  if (!ok) return null
  return { values: specs.flatMap((s) => (values.has(s.name) ? [values.get(s.name)!] : [])), si, words }
}

/** The block named by `of:` and every block an entry's value refers to as `id.name`. */
export function ofAndReferences(block: CalcBlock, ids: ReadonlySet<string>): Set<string> {
  const found = new Set<string>()
  for (const e of block.body.entries) {
    if (e.name === 'of' && ids.has(e.value)) found.add(e.value)
    for (const m of e.value.matchAll(/([A-Za-z_][A-Za-z0-9_]*)\./g)) if (ids.has(m[1]!)) found.add(m[1]!)
  }
  return found
}
