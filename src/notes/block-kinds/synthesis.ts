/**
 * `slider-crank-synthesis` blocks: crank, rod and offset of a slider-crank for a
 * required stroke and time ratio. Offset drive (Q > 1): one free choice — the
 * offset, the crank or the rod, or the best least transmission angle of the
 * family (charted); in-line (Q = 1): the rod from its ratio to the crank or the
 * shortest within a peak-acceleration limit. Other blocks use the answer as
 * `id.crank`, `id.rod` and `id.offset`.
 */
import type { Position } from 'unist'
import { bestTransmissionSliderCrank, inlineSliderCrank, sliderCrankAtOffset, sliderCrankFamily, sliderCrankWith, synthesiseSliderCrank } from '../../linkage/index.js'
import { messages } from '../messages.js'
import { reportError } from '../report.js'
import type { CalcBlock, MethodStep } from '../types.js'
import { designChart } from './design-chart.js'
import { displayUnit, texUnit } from '../display.js'
import { fromSI } from '../quantity.js'
import { inputDependencies, readInputs, type InputSpec, type ReadInputs } from './inputs.js'
import { outcome, type BlockKind, type BlockOutcome, type EvaluationContext } from './kind.js'
import { withLinkage } from './linkage-common.js'
import { asNamed } from './slider-crank-outcome.js'
import { publish, quantity, tex, texBare } from './values.js'

const specs: readonly InputSpec[] = [
  { name: 'stroke', label: 'required stroke', symbol: 'S', kind: 'length', required: true },
  { name: 'time_ratio', label: 'required quick-return time ratio (slower / faster stroke)', symbol: 'Q', kind: 'ratio', required: true },
  { name: 'offset', label: 'chosen offset of the slider path', symbol: 'e', kind: 'length' },
  { name: 'crank', label: 'chosen crank radius', symbol: 'a', kind: 'length' },
  { name: 'rod', label: 'chosen connecting-rod length', symbol: 'b', kind: 'length' },
  { name: 'choose', label: 'what decides the free choice', symbol: null, kind: 'choice', choices: ['given', 'best-transmission'], default: 'given' },
  { name: 'rod_ratio', label: 'rod-to-crank ratio b/a (in-line)', symbol: 'n', kind: 'ratio' },
  { name: 'acceleration_limit', label: 'largest slider acceleration allowed (in-line)', symbol: 'A_{\\max}', kind: 'acceleration' },
  { name: 'speed', label: 'crank speed, for the acceleration limit', symbol: 'n', kind: 'rotational-speed' },
]

export const synthesisKind: BlockKind = {
  name: 'slider-crank-synthesis',
  label: 'Slider-crank synthesis',
  needsId: true,
  dependencies: (block, ids) => inputDependencies(block, specs, ids),
  evaluate(block, context) {
    const inputs = readInputs(block, specs, 'slider-crank-synthesis', context)
    if (!inputs) return null
    const { si, words } = inputs
    const stroke = si.stroke!
    const q = si.time_ratio!
    const place = (name: string) => block.body.entries.find((e) => e.name === name)?.valuePlace ?? block.place
    const from = block.id ?? 'synthesis'
    if (q === 1) return inline(block, context, inputs, stroke, place, from)
    const chosen = ['offset', 'crank', 'rod'].filter((n) => si[n] !== undefined)
    const best = words.choose === 'best-transmission'
    if (chosen.length + (best ? 1 : 0) !== 1) {
      const detail = 'give one free choice: `offset`, `crank` or `rod`, or `choose: best-transmission`'
      if (chosen.length + (best ? 1 : 0) === 0) reportError(context.file, 'missing-input', messages['missing-input']('offset', detail, 'slider-crank-synthesis'), block.place)
      else reportError(context.file, 'duplicate-input', messages['duplicate-input'](`${chosen[chosen.length - 1] ?? 'choose'}\` beside \`${best ? 'choose' : chosen[0]}`), place(chosen[chosen.length - 1] ?? 'choose'))
      return null
    }
    const design = withLinkage(block, context, () => {
      if (best) return bestTransmissionSliderCrank(stroke, q)
      if (si.crank !== undefined) return sliderCrankWith(stroke, q, { crank: si.crank })
      if (si.rod !== undefined) return sliderCrankWith(stroke, q, { rod: si.rod })
      return sliderCrankAtOffset(stroke, q, si.offset!)
    })
    if (!design) return null
    // The synthesis itself (limits and angle), for the method.
    const core = withLinkage(block, context, () => synthesiseSliderCrank(stroke, q, design.offset))
    if (!core) return null
    const { meta } = context
    const L = (value: number) => texBare(meta, value, 'length')
    const lengthUnit = displayUnit('length', meta.units)
    const h = design.offset
    const product = (h * stroke) / Math.sin(core.alpha)
    const results = [
      quantity('crank', 'crank radius', 'a', 'length', design.crank),
      quantity('rod', 'connecting-rod length', 'b', 'length', design.rod),
      quantity('offset', 'offset of the slider path', 'e', 'length', design.offset),
      quantity('rod_ratio', 'crank-to-rod ratio a/b', '\\lambda', 'ratio', design.crank / design.rod),
      quantity('excess_angle', 'crank travel of the slower stroke beyond 180°', '\\Delta', 'angle', core.alpha),
      quantity('transmission_angle_min', 'least transmission angle, arccos((a + e)/b)', '\\mu_{\\min}', 'angle', design.transmissionMin),
      quantity('full_turn_margin', 'margin to a crank that cannot turn, b − a − |e|', null, 'length', design.fullTurnMargin),
      quantity('offset_limit', 'largest offset with a full turn, S·cot Δ', null, 'length', core.offsetLimit),
    ]
    publish(context, block.id, [...asNamed(inputs.values), ...results])
    const method: MethodStep[] = [
      {
        label: 'Dead-centre angle from the time ratio',
        formula: '\\Delta = 180^\\circ\\,\\frac{Q - 1}{Q + 1}',
        substituted: `\\Delta = 180^\\circ \\cdot \\frac{${texBare(meta, q, 'ratio')} - 1}{${texBare(meta, q, 'ratio')} + 1}`,
        result: `\\Delta = ${tex(meta, core.alpha, 'angle')}`,
        note: 'Δ is the crank travel of the slower stroke beyond 180°, between the two dead centres.',
      },
    ]
    if (si.crank !== undefined || si.rod !== undefined) {
      const crankGiven = si.crank !== undefined
      method.push({
        label: crankGiven ? 'Rod and offset for the chosen crank' : 'Crank and offset for the chosen rod',
        formula: crankGiven
          ? 'b^2 = \\frac{S^2 - 2a^2(1 + \\cos\\Delta)}{2(1 - \\cos\\Delta)},\\qquad e = \\frac{(b^2 - a^2)\\sin\\Delta}{S}'
          : 'a^2 = \\frac{S^2 - 2b^2(1 - \\cos\\Delta)}{2(1 + \\cos\\Delta)},\\qquad e = \\frac{(b^2 - a^2)\\sin\\Delta}{S}',
        substituted: crankGiven ? `a = ${tex(meta, design.crank, 'length')},\\ S = ${tex(meta, stroke, 'length')}` : `b = ${tex(meta, design.rod, 'length')},\\ S = ${tex(meta, stroke, 'length')}`,
        result: `a = ${tex(meta, design.crank, 'length')},\\ b = ${tex(meta, design.rod, 'length')},\\ e = ${tex(meta, design.offset, 'length')}`,
        note: 'From the two dead-centre triangles: S² = L1² + L2² − 2L1L2 cos Δ and e·S = L1L2 sin Δ, with L1 = b − a, L2 = b + a, so L1L2 = b² − a² and L1² + L2² = 2a² + 2b².',
      })
    } else {
      method.push(
        {
          label: 'The two dead-centre triangles',
          formula: 'S^2 = L_1^2 + L_2^2 - 2L_1L_2\\cos\\Delta,\\qquad e\\,S = L_1L_2\\sin\\Delta,\\qquad L_1 = b - a,\\ L_2 = b + a',
          substituted: `L_1L_2 = \\frac{${L(h)} \\cdot ${L(stroke)}}{\\sin ${texBare(meta, core.alpha, 'angle')}}`,
          result: `L_1L_2 = ${texBare(meta, product * fromSI(1, 'length', lengthUnit) ** 2, 'ratio')}\\,\\mathrm{${texUnit(lengthUnit)}^2}`,
          note: `Law of cosines between the slider positions at the two dead centres, and twice the area of the triangle they make with the crank axis (base S, height e, the offset).${best ? ' The offset is the one with the largest least transmission angle of the family (below).' : ''}`,
        },
        {
          label: 'Crank and rod',
          formula: 'a = \\tfrac{1}{2}\\sqrt{S^2 - 2L_1L_2(1 - \\cos\\Delta)},\\qquad b = \\tfrac{1}{2}\\sqrt{S^2 + 2L_1L_2(1 + \\cos\\Delta)}',
          substituted: null,
          result: `a = ${tex(meta, design.crank, 'length')},\\ b = ${tex(meta, design.rod, 'length')}`,
        },
      )
    }
    if (best) {
      method.push({
        label: 'Best least transmission angle over the family',
        formula: '\\max_{0 < e < S\\cot\\Delta}\\ \\mu_{\\min}(e),\\qquad \\mu_{\\min} = \\arccos\\frac{a(e) + e}{b(e)}',
        substituted: null,
        result: `e = ${tex(meta, design.offset, 'length')},\\ \\mu_{\\min} = ${tex(meta, design.transmissionMin, 'angle')}`,
        note: 'Each offset gives one slider-crank with the stroke and time ratio; μmin is scanned over 200 offsets and refined by golden-section search. The chart shows the family.',
      })
    }
    method.push({
      label: 'The crank turns fully',
      formula: '|e| < S\\cot\\Delta \\iff b - a - |e| > 0',
      substituted: `${L(h)} < ${L(core.offsetLimit)}`,
      result: `b - a - |e| = ${tex(meta, design.fullTurnMargin, 'length')}`,
      note: 'Past S·cot Δ the triangle would put the crank axis over the stroke. Which stroke is the slow one follows from the sign of the offset and the sense of rotation: analyse the chosen lengths in a slider-crank block.',
    })
    let chart = null
    if (best || si.crank !== undefined || si.rod !== undefined) {
      const family = sliderCrankFamily(stroke, q, 120).filter((d) => d.fullTurnMargin > 0)
      chart = designChart(meta, block.id ?? 'synthesis', block.title ? `${block.title}: the family of solutions` : 'The family of solutions for the stroke and time ratio', { name: 'offset', label: 'offset e', kind: 'length', values: family.map((d) => d.offset) }, [
        { name: 'transmission_angle_min', label: 'least transmission angle', kind: 'angle', values: family.map((d) => d.transmissionMin) },
        { name: 'crank', label: 'crank a', kind: 'length', values: family.map((d) => d.crank) },
        { name: 'rod', label: 'rod b', kind: 'length', values: family.map((d) => d.rod) },
      ], { source: `${family.length} slider-cranks of the family with the stroke and time ratio, over the offsets where the crank turns fully`, marks: [{ label: 'the design chosen', short: 'chosen', x: design.offset }], height: 150 })
    }
    return outcome(block, 'Slider-crank synthesis', {
      covers: ['synthesis'],
      inputs: inputs.values,
      results,
      method,
      summary: ['crank', 'rod', 'offset', 'transmission_angle_min'],
      chart,
      assumptions: [
        { text: 'The synthesis places both dead centres on one side of the crank axis (a crank that turns fully); lengths are exact and are then rounded to what can be made.', verify: false, from },
      ],
    })
  },
}

/** In-line (Q = 1): the crank is half the stroke; the rod from its ratio, or the shortest one within an acceleration limit. */
function inline(block: CalcBlock, context: EvaluationContext, inputs: ReadInputs, stroke: number, place: (name: string) => Position, from: string): BlockOutcome | null {
  const { si } = inputs
  const { meta } = context
  const byRatio = si.rod_ratio !== undefined
  if (byRatio === (si.acceleration_limit !== undefined)) {
    reportError(context.file, byRatio ? 'duplicate-input' : 'missing-input', byRatio ? messages['duplicate-input']('acceleration_limit` beside `rod_ratio') : messages['missing-input']('rod_ratio', 'rod-to-crank ratio, or `acceleration_limit` with `speed`, for an in-line drive (time ratio 1)', 'slider-crank-synthesis'), byRatio ? place('acceleration_limit') : block.place)
    return null
  }
  if (!byRatio && si.speed === undefined) {
    reportError(context.file, 'missing-input', messages['missing-input']('speed', 'crank speed, for the acceleration limit', 'slider-crank-synthesis'), place('acceleration_limit'))
    return null
  }
  const design = withLinkage(block, context, () => (byRatio ? inlineSliderCrank(stroke, { rodRatio: si.rod_ratio! }) : inlineSliderCrank(stroke, { accelerationLimit: si.acceleration_limit!, speed: si.speed! })))
  if (!design) return null
  const results = [
    quantity('crank', 'crank radius', 'a', 'length', design.crank),
    quantity('rod', 'connecting-rod length', 'b', 'length', design.rod),
    quantity('offset', 'offset of the slider path', 'e', 'length', 0),
    quantity('rod_ratio', 'crank-to-rod ratio a/b', '\\lambda', 'ratio', design.crank / design.rod),
    quantity('transmission_angle_min', 'least transmission angle, arccos(a/b)', '\\mu_{\\min}', 'angle', Math.acos(design.crank / design.rod)),
    quantity('acceleration_abs_max', 'largest slider acceleration a·ω²·(1 + a/b)', null, 'acceleration', design.accelerationMax, 'no crank speed given'),
  ]
  publish(context, block.id, [...asNamed(inputs.values), ...results])
  const method: MethodStep[] = [
    { label: 'Crank of an in-line drive', formula: 'a = S/2', substituted: `a = ${tex(meta, stroke, 'length')}/2`, result: `a = ${tex(meta, design.crank, 'length')}`, note: 'With the slider path through the crank axis the strokes are equal (Q = 1) and the stroke is twice the crank.' },
    byRatio
      ? { label: 'Rod from its ratio to the crank', formula: 'b = n\\,a', substituted: `b = ${texBare(meta, si.rod_ratio!, 'ratio')} \\times ${tex(meta, design.crank, 'length')}`, result: `b = ${tex(meta, design.rod, 'length')}` }
      : {
          label: 'Shortest rod within the acceleration limit',
          formula: 'a\\,\\omega^2\\left(1 + \\frac{a}{b}\\right) = A_{\\max}\\ \\Rightarrow\\ b = \\frac{a}{A_{\\max}/(a\\,\\omega^2) - 1}',
          substituted: `a\\,\\omega^2 = ${tex(meta, design.crank, 'length')} \\times (${tex(meta, si.speed!, 'angular-velocity')})^2 = ${tex(meta, design.crank * si.speed! * si.speed!, 'acceleration')}`,
          result: `b = ${tex(meta, design.rod, 'length')}`,
          note: 'The largest slider acceleration of an in-line drive is a·ω²·(1 + a/b), at the outer dead centre; a longer rod lowers it towards a·ω².',
        },
  ]
  return outcome(block, 'Slider-crank synthesis', {
    covers: ['synthesis'],
    inputs: inputs.values,
    results,
    method,
    summary: ['crank', 'rod', 'transmission_angle_min'],
    assumptions: [{ text: 'The crank turns at the stated speed; lengths are exact and are then rounded to what can be made.', verify: false, from }],
  })
}
