/**
 * `pin-bearing` blocks: the crank pin or the wrist pin of a forces block
 * (`of: <id>`) as a plain bearing: projected pressure p = F/(d·L) at the largest
 * pin force, sliding speed at the pin surface from the relative rotation of the
 * links it joins, and pV, each against an allowable the note gives with its source.
 */
import { bearingPressure, slidingSpeed } from '../../linkage/index.js'
import { showQuantity } from '../display.js'
import { messages } from '../messages.js'
import { reportError, reportWarning } from '../report.js'
import type { NamedValue } from '../types.js'
import { toDisplay } from './angles.js'
import { linkageOf } from './forces.js'
import { readInputs, type InputSpec } from './inputs.js'
import { outcome, type BlockKind } from './kind.js'
import { withLinkage } from './linkage-common.js'
import { asNamed } from './slider-crank-outcome.js'
import { flag, publish, quantity, tex, texBare } from './values.js'

const specs: readonly InputSpec[] = [
  { name: 'pin', label: 'which pin', symbol: null, kind: 'choice', choices: ['crank-pin', 'wrist-pin'], required: true },
  { name: 'diameter', label: 'pin diameter', symbol: 'd', kind: 'length', required: true },
  { name: 'length', label: 'bearing length', symbol: 'L', kind: 'length', required: true },
  { name: 'pressure_limit', label: 'allowable projected pressure', symbol: 'p_{allow}', kind: 'pressure' },
  { name: 'speed_limit', label: 'allowable sliding speed', symbol: 'V_{allow}', kind: 'velocity' },
  { name: 'pv_limit', label: 'allowable pV', symbol: '(pV)_{allow}', kind: 'pressure-velocity' },
]

/** Points over the cycle for the largest sliding speed and pV. */
const SAMPLES = 3600

export const pinBearingKind: BlockKind = {
  name: 'pin-bearing',
  label: 'Pin bearing',
  needsId: false,
  dependencies(block, ids) {
    const of = block.body.entries.find((e) => e.name === 'of')?.value
    const found = new Set<string>(of && ids.has(of) ? [of] : [])
    for (const e of block.body.entries) for (const m of e.value.matchAll(/([A-Za-z_][A-Za-z0-9_]*)\./g)) if (ids.has(m[1]!)) found.add(m[1]!)
    return found
  },
  evaluate(block, context) {
    const found = linkageOf(block, context, 'pin-bearing', 'a forces block')
    if (!found) return null
    const { of, linkage: forces } = found
    if (forces.core?.type !== 'forces') {
      reportError(context.file, 'wrong-block', messages['wrong-block'](of.value, 'a forces block (the bearing takes its pin force over the cycle)'), of.valuePlace)
      return null
    }
    const cycle = forces.core.cycle
    const source = forces.sweep!
    const own = { ...block, body: { ...block.body, entries: block.body.entries.filter((e) => e.name !== 'of') } }
    const inputs = readInputs(own, specs, 'pin-bearing', context)
    if (!inputs) return null
    const { si, words } = inputs
    const pin = words.pin === 'wrist-pin' ? 'wrist-pin' : 'crank-pin'
    const d = si.diameter!
    const L = si.length!
    const peak = cycle.pinForceMax[pin]
    const pressure = withLinkage(block, context, () => bearingPressure(peak.value, d, L))
    if (pressure === null) return null
    // Sliding speed and pV over the cycle, sampled evenly (the largest of each, and pV's mean).
    let vMax = 0
    let pvMax = 0
    let pvAt = cycle.start
    let pvSum = 0
    for (let i = 0; i < SAMPLES; i++) {
      const theta = cycle.start + (i / SAMPLES) * cycle.period
      const { force, relativeSpeed } = cycle.pin(pin, theta)
      if (!Number.isFinite(force) || !Number.isFinite(relativeSpeed)) continue
      const v = slidingSpeed(relativeSpeed, d)
      const pv = (Math.abs(force) / (d * L)) * v
      pvSum += pv
      if (v > vMax) vMax = v
      if (pv > pvMax) { pvMax = pv; pvAt = theta }
    }
    const pinWords = cycle.linkageKind === 'four-bar' ? (pin === 'crank-pin' ? 'input pin A' : 'output pin B') : pin === 'crank-pin' ? 'crank pin' : 'wrist pin'
    const angle = (theta: number): number => toDisplay(source, theta)
    const results: NamedValue[] = [
      quantity('pin_force_max', `largest force on the ${pinWords}`, 'F_{\\max}', 'force', peak.value),
      quantity('pin_force_max_at', `${source.convention.label} at the largest force`, null, 'angle', angle(peak.theta)),
      quantity('pressure_max', 'projected bearing pressure at the largest force F/(d·L)', 'p_{\\max}', 'pressure', pressure),
      quantity('sliding_speed_max', 'largest sliding speed at the pin surface', 'V_{\\max}', 'velocity', vMax),
      quantity('pv_max', 'largest pV over the cycle (p and V at the same crank angle)', '(pV)_{\\max}', 'pressure-velocity', pvMax),
      quantity('pv_max_at', `${source.convention.label} at the largest pV`, null, 'angle', angle(pvAt)),
      quantity('pv_mean', 'mean pV over the cycle', '(pV)_m', 'pressure-velocity', pvSum / SAMPLES),
    ]
    const limits: [string, string, number | undefined, number, string][] = [
      ['pressure_within_limit', 'bearing pressure within the allowable', si.pressure_limit, pressure, 'pressure'],
      ['speed_within_limit', 'sliding speed within the allowable', si.speed_limit, vMax, 'velocity'],
      ['pv_within_limit', 'pV within the allowable', si.pv_limit, pvMax, 'pressure-velocity'],
    ]
    const warnings: string[] = []
    for (const [name, label, limit, value, kind] of limits) {
      if (limit === undefined) continue
      const ok = value <= limit * (1 + 1e-9)
      results.push(flag(name, label, ok))
      if (!ok) {
        const show = (v: number): string => showQuantity(v, kind as 'pressure', context.meta.units, context.meta.digits)
        const text = `The ${pinWords}: ${label.replace(' within the allowable', '')} ${show(value)} exceeds the allowable ${show(limit)}`
        warnings.push(text)
        reportWarning(context.file, 'dynamics-warning', messages['dynamics-warning'](text), block.place)
      }
    }
    publish(context, block.id, [...asNamed(inputs.values), ...results])
    const { meta } = context
    const from = block.id ?? 'pin-bearing'
    return outcome(block, 'Pin bearing', {
      covers: ['bearings'],
      inputs: inputs.values,
      results,
      method: [
        {
          label: `Projected bearing pressure at the largest ${pinWords} force`,
          formula: 'p = \\frac{F}{d\\,L}',
          substituted: `p = \\frac{${tex(meta, peak.value, 'force')}}{${tex(meta, d, 'length')} \\times ${tex(meta, L, 'length')}}`,
          result: `p = ${tex(meta, pressure, 'pressure')}`,
          note: `F from the forces block #${of.value} at ${source.convention.label} ${showQuantity(angle(peak.theta), 'angle', meta.units, meta.digits)}.`,
        },
        {
          label: 'Sliding speed and pV',
          formula: 'V = |\\omega_{rel}|\\,\\frac{d}{2},\\qquad pV = \\frac{F}{d\\,L}\\,V',
          substituted: `d = ${tex(meta, d, 'length')}`,
          result: `V_{\\max} = ${tex(meta, vMax, 'velocity')},\\quad (pV)_{\\max} = ${tex(meta, pvMax, 'pressure-velocity')}`,
          note: `ω_rel is the angular velocity of one link the pin joins relative to the other (${pin === 'crank-pin' ? 'crank against rod' : 'rod against slider'}). Largest of ${SAMPLES} crank angles evenly spread over the cycle; the mean pV is ${showQuantity(pvSum / SAMPLES, 'pressure-velocity', meta.units, meta.digits)} (${texBare(meta, pvSum / SAMPLES / Math.max(pvMax, 1e-300), 'ratio')} of the largest).`,
        },
      ],
      warnings,
      assumptions: [{ text: 'The pin load is spread evenly over the projected area d·L; edge loading from pin bending and misalignment is not included.', verify: true, from }],
      summary: ['pressure_max', 'pv_max'],
    })
  },
}
