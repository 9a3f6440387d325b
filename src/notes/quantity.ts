/**
 * Quantities with units: a restricted mathjs instance (units, arithmetic, the
 * usual functions) and the dimension kinds a note's inputs and results use.
 * Everything leaves this module as plain SI numbers; units stay at the boundary.
 */

import { all, create, type MathJsInstance, type MathNode, type Unit } from 'mathjs'
import type { Value } from './types.js'

/** A mathjs instance of our own, so `rpm` and the restrictions do not leak. */
export const math: MathJsInstance = create(all!, { number: 'number', precision: 64 })
math.createUnit('rpm', { definition: '1 cycle/min', aliases: ['rev_per_min'] })
math.createUnit('rev', { definition: '1 cycle', aliases: ['revs', 'revolution', 'revolutions'] })
// A press or pump stroke per crank turn: "strokes per minute" is the crank speed.
math.createUnit('stroke', { definition: '1 cycle', aliases: ['strokes'] })
math.createUnit('spm', { definition: '1 cycle/min' })

const parseExpression = math.parse
const isUnitValue = math.isUnit

// Refuse what a note must never do: define functions or units, import, reach the
// parser or compiler, or build large matrices (mathjs's own security advice).
const refused = (name: string) => () => {
  throw new Error(`"${name}" is not available in a design note`)
}
const closed = [
  'import',
  'createUnit',
  'evaluate',
  'parse',
  'compile',
  'simplify',
  'simplifyConstant',
  'simplifyCore',
  'derivative',
  'resolve',
  'rationalize',
  'reviver',
  'replacer',
  'help',
  'parser',
  'chain',
  'matrix',
  'sparse',
  'zeros',
  'ones',
  'identity',
  'range',
  'random',
  'randomInt',
  'pickRandom',
]
math.import(Object.fromEntries(closed.map((name) => [name, refused(name)])), { override: true })

/** Most characters an expression may have: plenty for an engineering formula. */
export const MAX_EXPRESSION_LENGTH = 400

/** Node types a note's expression may use; assignments and function definitions are refused. */
const ALLOWED_NODES = new Set([
  'ConstantNode',
  'SymbolNode',
  'OperatorNode',
  'ParenthesisNode',
  'FunctionNode',
  'AccessorNode',
  'IndexNode',
  'ConditionalNode',
])

/**
 * Functions a note may call: each works on scalars and quantities in a time
 * that does not depend on its arguments, so no expression of a note can run
 * long or take much memory. (mathjs's bignumber, fraction, formatting,
 * combinatorics, matrix and string functions are left out for that reason.)
 */
export const ALLOWED_FUNCTIONS: ReadonlySet<string> = new Set([
  'abs', 'sqrt', 'cbrt', 'square', 'cube', 'exp', 'expm1', 'log', 'log10', 'log2', 'log1p', 'pow', 'hypot',
  'sin', 'cos', 'tan', 'sec', 'csc', 'cot', 'asin', 'acos', 'atan', 'atan2', 'sinh', 'cosh', 'tanh', 'asinh', 'acosh', 'atanh',
  'min', 'max', 'mean', 'sign', 'round', 'floor', 'ceil', 'fix', 'mod', 'to', 'number', 'unit',
])

const REFUSED_NODE_WORDS: Readonly<Record<string, string>> = {
  AssignmentNode: 'assignments',
  FunctionAssignmentNode: 'function definitions',
  ArrayNode: 'lists [ ]',
  ObjectNode: 'objects { }',
  RangeNode: 'ranges a:b',
  BlockNode: 'several statements',
  RelationalNode: 'chained comparisons',
}

const parsed = new Map<string, MathNode>()
const PARSED_LIMIT = 10_000

/** Parse an expression of a note, refusing anything outside arithmetic on quantities. Cached by text. */
export function parseQuantityExpression(text: string): MathNode {
  const known = parsed.get(text)
  if (known) return known
  const node = parseChecked(text)
  if (parsed.size >= PARSED_LIMIT) parsed.clear()
  parsed.set(text, node)
  return node
}

/**
 * The engineer's spellings mathjs does not read: `120 1/min` (a number, then a
 * reciprocal unit) and `/min` (mathjs takes `min` for the function; the unit is
 * `minute`). Only `min` not followed by `(` is a unit.
 */
export function normaliseUnits(text: string): string {
  return text.replace(/(\d)\s+1\s*\/\s*(?=[A-Za-z])/g, '$1 / ').replace(/(^|[^A-Za-z0-9_.])min\b(?!\s*\()/g, '$1minute')
}

function parseChecked(text: string): MathNode {
  if (text.length > MAX_EXPRESSION_LENGTH) {
    throw new Error(`the expression is longer than ${MAX_EXPRESSION_LENGTH} characters`)
  }
  const node = parseExpression(normaliseUnits(text))
  node.traverse((child) => {
    if (!ALLOWED_NODES.has(child.type)) {
      const what = REFUSED_NODE_WORDS[child.type] ?? child.type
      throw new Error(`${what} are not allowed in a design note; write a value or a formula`)
    }
    if (child.type === 'FunctionNode') {
      const fn = (child as unknown as { fn: MathNode }).fn
      const name = fn.type === 'SymbolNode' ? (fn as unknown as { name: string }).name : null
      if (name === null || !ALLOWED_FUNCTIONS.has(name)) {
        throw new Error(`${name === null ? 'only a named function can be called' : `the function \`${name}\` is not available`}; a design note may call ${[...ALLOWED_FUNCTIONS].join(', ')}`)
      }
    }
    if (child.type === 'IndexNode' && !(child as unknown as { dotNotation: boolean }).dotNotation) {
      throw new Error('indexing with [ ] is not allowed; refer to results as block.result')
    }
  })
  return node
}

const compiled = new WeakMap<MathNode, { evaluate(scope: Map<string, unknown>): unknown }>()

/** Evaluate a parsed expression against a scope of block objects and quantities. */
export function evaluateExpression(node: MathNode, scope: Readonly<Record<string, unknown>>): unknown {
  let code = compiled.get(node)
  if (!code) {
    code = node.compile()
    compiled.set(node, code)
  }
  // A Map scope keeps mathjs from writing into our objects.
  return code.evaluate(new Map(Object.entries(scope)))
}

/** True for a unit raised to a power that is not a finite number (`s^Infinity`). */
export function hasUnboundedPower(value: unknown): boolean {
  if (!isUnitValue(value)) return false
  const unit = value as unknown as { dimensions: number[]; units: { power: number }[] }
  return unit.dimensions.some((d) => !Number.isFinite(d)) || unit.units.some((u) => !Number.isFinite(u.power))
}

/** True for a complex number, or a quantity whose number is complex. */
export function isComplexValue(value: unknown): boolean {
  if (math.isComplex(value)) return true
  return isUnitValue(value) && math.isComplex((value as unknown as { value: unknown }).value)
}

/** True for a mathjs unit value. */
export function isUnit(value: unknown): value is Unit {
  return isUnitValue(value)
}

/** Dimension kinds of the quantities a note uses. */
export type QuantityKind =
  | 'length'
  | 'angle'
  | 'rotational-speed'
  | 'angular-velocity'
  | 'angular-acceleration'
  | 'velocity'
  | 'acceleration'
  | 'time'
  | 'frequency'
  | 'force'
  | 'torque'
  | 'energy'
  | 'power'
  | 'mass'
  | 'inertia'
  | 'pressure'
  | 'density'
  | 'area'
  | 'second-moment'
  | 'mass-radius'
  | 'pressure-velocity'
  | 'ratio'
  | 'count'

interface KindInfo {
  /** SI unit of the plain numbers the core takes. */
  readonly si: string
  /** Display unit per unit system. */
  readonly SI: string
  readonly US: string
  /** Words for messages: "a length". */
  readonly words: string
  /** Examples for messages. */
  readonly examples: string
}

/** The kinds, their SI unit and default display units. */
export const KINDS: Readonly<Record<QuantityKind, KindInfo>> = {
  length: { si: 'm', SI: 'mm', US: 'in', words: 'a length', examples: '45 mm, 1.75 in' },
  angle: { si: 'rad', SI: 'deg', US: 'deg', words: 'an angle', examples: '12 deg, 0.2 rad' },
  'rotational-speed': { si: 'rad/s', SI: 'rpm', US: 'rpm', words: 'a rotational speed', examples: '96 rpm, 120 1/min, 10 rad/s, 1.6 Hz' },
  'angular-velocity': { si: 'rad/s', SI: 'rad/s', US: 'rad/s', words: 'an angular velocity', examples: '10 rad/s, 96 rpm' },
  'angular-acceleration': { si: 'rad/s^2', SI: 'rad/s^2', US: 'rad/s^2', words: 'an angular acceleration', examples: '5 rad/s^2' },
  velocity: { si: 'm/s', SI: 'm/s', US: 'ft/s', words: 'a velocity', examples: '1.2 m/s, 4 ft/s' },
  acceleration: { si: 'm/s^2', SI: 'm/s^2', US: 'ft/s^2', words: 'an acceleration', examples: '9.81 m/s^2' },
  time: { si: 's', SI: 's', US: 's', words: 'a time', examples: '0.6 s, 250 ms' },
  frequency: { si: 'Hz', SI: 'Hz', US: 'Hz', words: 'a frequency', examples: '2 Hz' },
  force: { si: 'N', SI: 'N', US: 'lbf', words: 'a force', examples: '4.2 kN, 900 lbf' },
  torque: { si: 'N*m', SI: 'N*m', US: 'lbf*ft', words: 'a torque', examples: '150 N*m, 110 lbf*ft' },
  energy: { si: 'J', SI: 'J', US: 'ft*lbf', words: 'an energy', examples: '250 J, 1.2 kJ' },
  power: { si: 'W', SI: 'kW', US: 'hp', words: 'a power', examples: '2.2 kW, 3 hp' },
  mass: { si: 'kg', SI: 'kg', US: 'lb', words: 'a mass', examples: '1.2 kg, 3 lb' },
  inertia: { si: 'kg*m^2', SI: 'kg*m^2', US: 'lb*ft^2', words: 'a moment of inertia', examples: '0.02 kg*m^2' },
  pressure: { si: 'Pa', SI: 'MPa', US: 'psi', words: 'a pressure or stress', examples: '6 bar, 210 MPa, 3000 psi' },
  density: { si: 'kg/m^3', SI: 'kg/m^3', US: 'lb/in^3', words: 'a density', examples: '7850 kg/m^3' },
  area: { si: 'm^2', SI: 'mm^2', US: 'in^2', words: 'an area', examples: '1960 mm^2, 3 in^2' },
  'second-moment': { si: 'm^4', SI: 'mm^4', US: 'in^4', words: 'a second moment of area', examples: '12000 mm^4' },
  'mass-radius': { si: 'kg*m', SI: 'kg*mm', US: 'lb*in', words: 'a mass times a radius', examples: '0.9 kg*mm' },
  'pressure-velocity': { si: 'Pa*m/s', SI: 'MPa*m/s', US: 'psi*ft/minute', words: 'a pressure times a speed (pV)', examples: '1.5 MPa*m/s' },
  ratio: { si: '', SI: '', US: '', words: 'a plain number', examples: '1.15' },
  count: { si: '', SI: '', US: '', words: 'a whole number', examples: '361' },
}

const referenceUnits = new Map<QuantityKind, Unit>()
function referenceUnit(kind: QuantityKind): Unit | null {
  const si = KINDS[kind].si
  if (si === '') return null
  let unit = referenceUnits.get(kind)
  if (!unit) {
    unit = math.unit(`1 ${si}`)
    referenceUnits.set(kind, unit)
  }
  return unit
}

/** Kinds tried in order when a written value's kind is not known from its use (torque before energy). */
const RECOGNISED: readonly QuantityKind[] = [
  'length',
  'angle',
  'angular-velocity',
  'angular-acceleration',
  'velocity',
  'acceleration',
  'time',
  'frequency',
  'force',
  'torque',
  'power',
  'mass',
  'inertia',
  'pressure',
  'density',
  'area',
  'second-moment',
  'mass-radius',
  'pressure-velocity',
]

/** Which kind a unit value has, among those with an SI unit, or null. */
export function kindOfUnit(value: Unit): QuantityKind | null {
  const written = value.formatUnits()
  // A speed written in turns per time is a rotational speed (shown in rpm), not an angular velocity.
  if (value.equalBase(referenceUnit('rotational-speed')!) && /rpm|cycle|rev|stroke|spm/.test(written)) return 'rotational-speed'
  // Torque and energy share a dimension: joules (and their kin) say energy, N·m says torque.
  if (value.equalBase(referenceUnit('energy')!) && /(^|[^a-z])(k|M|m)?(J|Wh|cal|BTU|erg)\b/.test(written)) return 'energy'
  for (const kind of RECOGNISED) {
    if (value.equalBase(referenceUnit(kind)!)) return kind
  }
  return null
}

/** A written value as a Value: a quantity of a known kind, or another dimension with its SI value and SI unit. */
export function valueOf(value: unknown): Value | null {
  if (typeof value === 'number') return Number.isFinite(value) ? { type: 'quantity', kind: 'ratio', si: value } : null
  if (typeof value === 'boolean') return { type: 'flag', flag: value }
  if (typeof value === 'string') return { type: 'text', text: value }
  if (!isUnit(value)) return null
  const kind = kindOfUnit(value)
  if (kind) return { type: 'quantity', kind, si: value.toNumber(KINDS[kind].si) }
  if (value.equalBase(math.unit('1'))) return { type: 'quantity', kind: 'ratio', si: value.toNumber('') }
  try {
    const unit = value.formatUnits()
    const si = value.toSI()
    return { type: 'other', si: si.toNumber(si.formatUnits()), siUnit: si.formatUnits(), unit, shown: value.toNumber(unit) }
  } catch {
    // A unit mathjs cannot write back (a power that is not a finite number).
    return null
  }
}

/** Result of reading a value as a quantity of a kind. */
export type QuantityReading =
  | { readonly ok: true; readonly si: number; readonly note?: string }
  | { readonly ok: false; readonly reason: string; readonly actualKind: string }

/** Read an evaluated value as a quantity of `kind`, giving SI as a plain number. */
export function readQuantity(value: unknown, kind: QuantityKind): QuantityReading {
  const info = KINDS[kind]
  if (kind === 'ratio' || kind === 'count') {
    if (typeof value === 'number' && Number.isFinite(value)) {
      if (kind === 'count' && !Number.isInteger(value)) {
        return { ok: false, reason: `expected ${info.words}, got ${value}`, actualKind: 'a fraction' }
      }
      return { ok: true, si: value }
    }
    if (isUnit(value) && value.equalBase(math.unit('1'))) return { ok: true, si: value.toNumber('') }
    return { ok: false, reason: `expected ${info.words} (${info.examples})`, actualKind: describeValue(value) }
  }
  if (typeof value === 'number') {
    return {
      ok: false,
      reason: `expected ${info.words} with a unit (e.g. ${info.examples}), got the bare number ${value}`,
      actualKind: 'a bare number',
    }
  }
  if (!isUnit(value)) {
    return { ok: false, reason: `expected ${info.words} (${info.examples})`, actualKind: describeValue(value) }
  }
  // A crank speed written as a frequency (2 Hz, 120 1/min) counts turns per unit time.
  if (kind === 'rotational-speed' && value.equalBase(referenceUnit('frequency')!)) {
    const si = value.toNumber('Hz') * 2 * Math.PI
    if (Number.isFinite(si)) return { ok: true, si, note: 'read as turns per unit time' }
  }
  if (!value.equalBase(referenceUnit(kind)!)) {
    return {
      ok: false,
      reason: `expected ${info.words} (${info.examples}), got ${describeValue(value)}`,
      actualKind: describeValue(value),
    }
  }
  const si = value.toNumber(info.si)
  if (!Number.isFinite(si)) return { ok: false, reason: `expected a finite value, got ${si}`, actualKind: 'not finite' }
  return { ok: true, si }
}

/** Words for what a value is, for messages: "a force (12 N)". */
export function describeValue(value: unknown): string {
  if (isUnit(value)) {
    const kind = kindOfUnit(value)
    const text = value.format({ precision: 6 })
    if (kind) return `${KINDS[kind].words} (${text})`
    return `a quantity in ${value.formatUnits() || 'no unit'} (${text})`
  }
  if (typeof value === 'number') return `the number ${value}`
  if (typeof value === 'boolean') return `the truth value ${value}`
  if (typeof value === 'string') return `the word "${value}"`
  return 'a value that is not a quantity'
}

/** A mathjs unit value from an SI number of a kind (ratios stay numbers). */
export function toUnit(si: number, kind: QuantityKind): Unit | number {
  const unit = KINDS[kind].si
  return unit === '' ? si : math.unit(si, unit)
}

const factors = new Map<string, number>()

/**
 * Convert an SI number of a kind into a display unit (e.g. 0.04 m → 40 for "mm").
 * Every unit of our kinds is a plain multiple of its SI unit, so the factor is
 * found once by mathjs and then reused: charts convert thousands of values.
 */
export function fromSI(si: number, kind: QuantityKind, unit: string): number {
  const base = KINDS[kind].si
  if (base === '' || unit === base) return si
  const key = `${base}>${unit}`
  let factor = factors.get(key)
  if (factor === undefined) {
    factor = math.unit(1, base).toNumber(unit)
    factors.set(key, factor)
  }
  return si * factor
}

/** True when `unit` is a unit of the kind (used to check display-unit overrides). */
export function unitFitsKind(unit: string, kind: QuantityKind): boolean {
  const reference = referenceUnit(kind)
  if (!reference) return unit === ''
  try {
    return math.unit(`1 ${unit}`).equalBase(reference)
  } catch {
    return false
  }
}
