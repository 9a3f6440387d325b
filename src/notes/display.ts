/**
 * Display of values: the note's display unit for each kind, a fixed number of
 * significant digits, and unit labels as an engineer writes them. Formatting is
 * deterministic: the same number always prints the same way.
 */
import { KINDS, fromSI, type QuantityKind } from './quantity.js'
import type { DisplayUnits, Value } from './types.js'

/** The display unit (mathjs syntax) of a kind under the note's settings. */
export function displayUnit(kind: QuantityKind, units: DisplayUnits): string {
  return units.overrides[kind] ?? KINDS[kind][units.system]
}

const LABELS: Readonly<Record<string, string>> = {
  deg: '°',
  'rad/s^2': 'rad/s²',
  'm/s^2': 'm/s²',
  'ft/s^2': 'ft/s²',
  'in/s^2': 'in/s²',
  'mm/s^2': 'mm/s²',
  'deg/s^2': '°/s²',
  'deg/s': '°/s',
}

/** A unit as printed: `deg` → `°`, `m/s^2` → `m/s²`. */
export function unitLabel(unit: string): string {
  return LABELS[unit] ?? unit.replace(/\^2/g, '²').replace(/\^3/g, '³').replace(/\*/g, '·')
}

const SUPERSCRIPT: Readonly<Record<string, string>> = {
  '-': '⁻',
  '0': '⁰',
  '1': '¹',
  '2': '²',
  '3': '³',
  '4': '⁴',
  '5': '⁵',
  '6': '⁶',
  '7': '⁷',
  '8': '⁸',
  '9': '⁹',
}

/**
 * A number to `digits` significant digits, trailing zeros kept (they are
 * significant); plain notation between 1e-4 and 1e9, otherwise a × 10ⁿ.
 */
export function formatNumber(value: number, digits: number): string {
  if (Number.isNaN(value)) return 'n/a'
  if (!Number.isFinite(value)) return value > 0 ? '∞' : '−∞'
  if (value === 0 || Math.abs(value) < 1e-300) return '0'
  const abs = Math.abs(value)
  const sign = value < 0 ? '−' : ''
  if (abs >= 1e-4 && abs < 1e9) {
    const exponent = Math.floor(Math.log10(abs))
    const decimals = Math.max(0, digits - 1 - exponent)
    let text = abs.toFixed(Math.min(decimals, 20))
    // toFixed can round up a digit (9.9996 → 10.000); re-trim to the same significance.
    const rounded = Number(text)
    if (Math.floor(Math.log10(rounded)) > exponent) text = rounded.toFixed(Math.max(0, decimals - 1))
    return text === '0' || /^0(\.0+)?$/.test(text) ? '0' : sign + text
  }
  const [mantissa, exponent] = abs.toExponential(digits - 1).split('e')
  const power = String(Number(exponent)).split('').map((c) => SUPERSCRIPT[c] ?? c).join('')
  return `${sign}${mantissa} × 10${power}`
}

/** The same number in TeX (a minus sign and \times 10^{n}). */
export function texNumber(value: number, digits: number): string {
  return formatNumber(value, digits)
    .replace('−', '-')
    .replace(/ × 10([⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+)/, (_, p: string) => {
      const plain = p
        .split('')
        .map((c) => Object.entries(SUPERSCRIPT).find(([, s]) => s === c)?.[0] ?? c)
        .join('')
      return `\\times 10^{${plain}}`
    })
}

/** A displayed value: the number text, the unit label, and both together. */
export interface Displayed {
  readonly number: string
  /** Display unit in mathjs syntax ('' for plain numbers and words). */
  readonly unit: string
  readonly label: string
  readonly text: string
  /** The number in the display unit, unrounded (for charts and results.json). */
  readonly value: number | null
}

/** Display a value under the note's settings. */
export function displayValue(value: Value, units: DisplayUnits, digits: number, unitOverride?: string | null): Displayed {
  switch (value.type) {
    case 'quantity': {
      if (value.kind === 'count') {
        const n = String(Math.round(value.si))
        return { number: n, unit: '', label: '', text: n, value: value.si }
      }
      const unit = unitOverride ?? displayUnit(value.kind, units)
      const shown = fromSI(value.si, value.kind, unit)
      const number = formatNumber(shown, digits)
      const label = unitLabel(unit)
      const text = label === '' ? number : label === '°' ? `${number}°` : `${number} ${label}`
      return { number, unit, label, text, value: shown }
    }
    case 'other': {
      const number = formatNumber(value.shown, digits)
      const label = unitLabel(value.unit)
      return { number, unit: value.unit, label, text: label ? `${number} ${label}` : number, value: value.shown }
    }
    case 'text':
      return { number: value.text, unit: '', label: '', text: value.text, value: null }
    case 'flag':
      return { number: value.flag ? 'yes' : 'no', unit: '', label: '', text: value.flag ? 'yes' : 'no', value: null }
    case 'none':
      return { number: '—', unit: '', label: '', text: `— (${value.reason})`, value: null }
  }
}

/** A quantity in TeX with its unit, e.g. `248.19\,\mathrm{mm}`. */
export function texQuantity(si: number, kind: QuantityKind, units: DisplayUnits, digits: number): string {
  if (kind === 'ratio' || kind === 'count') return texNumber(si, digits)
  const unit = displayUnit(kind, units)
  const number = texNumber(fromSI(si, kind, unit), digits)
  if (unit === 'deg') return `${number}^\\circ`
  return `${number}\\,\\mathrm{${texUnit(unit)}}`
}

/** A unit in TeX: `rad/s^2` → `rad/s^{2}`. */
export function texUnit(unit: string): string {
  return unit.replace(/\^(\d)/g, '^{$1}').replace(/\*/g, '\\cdot ')
}

/** An SI quantity as printed in the note's display unit, e.g. "80.007 mm" or "49.17°". */
export function showQuantity(si: number, kind: QuantityKind, units: DisplayUnits, digits: number): string {
  return displayValue({ type: 'quantity', kind, si }, units, digits).text
}

/** A number with a fixed count of decimals (a table column's), with a true minus sign; −0 prints as 0. */
export function formatFixed(value: number, decimals: number): string {
  if (Number.isNaN(value)) return 'n/a'
  if (!Number.isFinite(value)) return value > 0 ? '∞' : '−∞'
  const text = Math.abs(value).toFixed(decimals)
  return value < 0 && Number(text) !== 0 ? `−${text}` : text
}

/**
 * Decimals for a column of numbers: enough for `digits` significant digits on the
 * column's largest magnitude, the same for every row (so that the column reads down).
 */
export function columnDecimals(values: ArrayLike<number>, digits: number): number {
  let largest = 0
  for (let i = 0; i < values.length; i++) {
    const v = Math.abs(values[i]!)
    if (Number.isFinite(v)) largest = Math.max(largest, v)
  }
  if (largest === 0) return 0
  return Math.min(10, Math.max(0, digits - 1 - Math.floor(Math.log10(largest))))
}

/**
 * A message of the linkage core in the note's units: the core writes lengths in
 * millimetres (its messages carry the SI numbers in their details); a note shown
 * in other length units reads them in its own.
 */
export function inNoteUnits(text: string, units: DisplayUnits): string {
  const unit = displayUnit('length', units)
  if (unit === 'mm') return text
  const label = unitLabel(unit)
  return text.replace(/(-?\d+(?:\.\d+)?(?:e[-+]?\d+)?) mm\b/g, (_, n: string) => `${Number(fromSI(Number(n) / 1000, 'length', unit).toPrecision(6))} ${label}`)
}
