/**
 * Small builders for block outcomes: named results, their scope objects for
 * expressions, and TeX snippets with the note's display units.
 */
import { texQuantity } from '../display.js'
import { math, toUnit, type QuantityKind } from '../quantity.js'
import type { Position } from 'unist'
import type { NamedValue, NoteMeta } from '../types.js'
import type { EvaluationContext } from './kind.js'

/** A quantity result; a null or non-finite number becomes "no value" with the reason. */
export function quantity(
  name: string,
  label: string,
  symbol: string | null,
  kind: QuantityKind,
  si: number | null,
  missingReason = 'not defined for this linkage',
  how?: string,
): NamedValue {
  if (si === null || !Number.isFinite(si)) return { name, label, symbol, value: { type: 'none', reason: missingReason } }
  return { name, label, symbol, value: { type: 'quantity', kind, si }, ...(how ? { how } : {}) }
}

/** A word result (e.g. a Grashof class). */
export function word(name: string, label: string, text: string): NamedValue {
  return { name, label, symbol: null, value: { type: 'text', text } }
}

/** A yes/no result. */
export function flag(name: string, label: string, value: boolean): NamedValue {
  return { name, label, symbol: null, value: { type: 'flag', flag: value } }
}

/**
 * Publish a block's inputs and results so that other blocks can use them as
 * `id.name`, with the place each input was written (for messages at that place).
 * @param broken names whose lines have errors, with why (a use is not a second error)
 */
export function publish(context: EvaluationContext, id: string | null, values: readonly NamedValue[], broken?: ReadonlyMap<string, string>): void {
  if (id === null) return
  const object: Record<string, unknown> = {}
  const missing = new Map<string, string>()
  for (const v of values) {
    const place = (v as { place?: Position | null }).place
    if (place) context.scope.places.set(`${id}.${v.name}`, place)
    switch (v.value.type) {
      case 'quantity':
        object[v.name] = toUnit(v.value.si, v.value.kind)
        break
      case 'other':
        object[v.name] = math.unit(v.value.shown, v.value.unit)
        break
      case 'text':
        object[v.name] = v.value.text
        break
      case 'flag':
        object[v.name] = v.value.flag
        break
      case 'none':
        missing.set(v.name, v.value.reason)
        break
    }
  }
  context.scope.values.set(id, object)
  context.scope.unavailable.set(id, missing)
  context.scope.broken.set(id, new Map(broken ?? []))
}

/** TeX of an SI quantity in the note's display units. */
export function tex(meta: NoteMeta, si: number, kind: QuantityKind): string {
  return texQuantity(si, kind, meta.units, meta.digits)
}

/** TeX of a bare number in the display unit of a kind (for substituted equations). */
export function texBare(meta: NoteMeta, si: number, kind: QuantityKind): string {
  return texQuantity(si, kind, meta.units, meta.digits).replace(/\\,\\mathrm\{[^}]*\}$/, '').replace(/\^\\circ$/, '^\\circ')
}

