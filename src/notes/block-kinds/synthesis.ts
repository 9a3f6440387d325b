/**
 * `slider-crank-synthesis` blocks: crank and rod of an offset slider-crank for a
 * required stroke and quick-return time ratio with a chosen offset. Other blocks
 * use the answer as `id.crank` and `id.rod`.
 */
import { synthesiseSliderCrank } from '../../linkage/index.js'
import { displayUnit, texUnit } from '../display.js'
import { fromSI } from '../quantity.js'
import { inputDependencies, readInputs, type InputSpec } from './inputs.js'
import { outcome, type BlockKind } from './kind.js'
import { withLinkage } from './linkage-common.js'
import { asNamed } from './slider-crank-outcome.js'
import { publish, quantity, tex, texBare } from './values.js'

const specs: readonly InputSpec[] = [
  { name: 'stroke', label: 'required stroke', symbol: 'S', kind: 'length', required: true },
  { name: 'time_ratio', label: 'required quick-return time ratio (slower / faster stroke)', symbol: 'Q', kind: 'ratio', required: true },
  { name: 'offset', label: 'chosen offset of the slider path', symbol: 'e', kind: 'length', required: true },
]

export const synthesisKind: BlockKind = {
  name: 'slider-crank-synthesis',
  label: 'Slider-crank synthesis',
  needsId: true,
  dependencies: (block, ids) => inputDependencies(block, specs, ids),
  evaluate(block, context) {
    const inputs = readInputs(block, specs, 'slider-crank-synthesis', context)
    if (!inputs) return null
    const { stroke, time_ratio: q, offset } = inputs.si as { stroke: number; time_ratio: number; offset: number }
    const design = withLinkage(block, context, () => synthesiseSliderCrank(stroke, q, offset))
    if (!design) return null
    const { meta } = context
    const L = (si: number) => texBare(meta, si, 'length')
    const lengthUnit = displayUnit('length', meta.units)
    const h = Math.abs(offset)
    const product = (h * stroke) / Math.sin(design.alpha)
    const results = [
      quantity('crank', 'crank radius', 'a', 'length', design.crank),
      quantity('rod', 'connecting-rod length', 'b', 'length', design.rod),
      quantity('rod_ratio', 'crank-to-rod ratio a/b', '\\lambda', 'ratio', design.crank / design.rod),
      quantity('excess_angle', 'crank travel of the slower stroke beyond 180°', '\\Delta', 'angle', design.alpha),
      quantity('full_turn_margin', 'margin to a crank that cannot turn, b − a − |e|', null, 'length', design.fullTurnMargin),
      quantity('offset_limit', 'largest offset with a full turn, S·cot Δ', null, 'length', design.offsetLimit),
    ]
    publish(context, block.id, [...asNamed(inputs.values), ...results])
    const method = [
      {
        label: 'Dead-centre angle from the time ratio',
        formula: '\\Delta = 180^\\circ\\,\\frac{Q - 1}{Q + 1}',
        substituted: `\\Delta = 180^\\circ \\cdot \\frac{${texBare(meta, q, 'ratio')} - 1}{${texBare(meta, q, 'ratio')} + 1}`,
        result: `\\Delta = ${tex(meta, design.alpha, 'angle')}`,
        note: 'Δ is the crank travel of the slower stroke beyond 180°, between the two dead centres.',
      },
      {
        label: 'The two dead-centre triangles',
        formula: 'S^2 = L_1^2 + L_2^2 - 2L_1L_2\\cos\\Delta,\\qquad e\\,S = L_1L_2\\sin\\Delta,\\qquad L_1 = b - a,\\ L_2 = b + a',
        substituted: `L_1L_2 = \\frac{${L(h)} \\cdot ${L(stroke)}}{\\sin ${texBare(meta, design.alpha, 'angle')}}`,
        result: `L_1L_2 = ${texBare(meta, product * fromSI(1, 'length', lengthUnit) ** 2, 'ratio')}\\,\\mathrm{${texUnit(lengthUnit)}^2}`,
        note: 'Law of cosines between the slider positions at the two dead centres, and twice the area of the triangle they make with the crank axis (base S, height e, the offset).',
      },
      {
        label: 'Crank and rod',
        formula: 'a = \\tfrac{1}{2}\\sqrt{S^2 - 2L_1L_2(1 - \\cos\\Delta)},\\qquad b = \\tfrac{1}{2}\\sqrt{S^2 + 2L_1L_2(1 + \\cos\\Delta)}',
        substituted: null,
        result: `a = ${tex(meta, design.crank, 'length')},\\ b = ${tex(meta, design.rod, 'length')}`,
      },
      {
        label: 'The crank turns fully',
        formula: '|e| < S\\cot\\Delta \\iff b - a - |e| > 0',
        substituted: `${L(h)} < ${L(design.offsetLimit)}`,
        result: `b - a - |e| = ${tex(meta, design.fullTurnMargin, 'length')}`,
        note: 'Past S·cot Δ the triangle would put the crank axis over the stroke. Which stroke is the slow one follows from the sign of the offset and the sense of rotation: analyse the chosen lengths in a slider-crank block.',
      },
    ]
    return outcome(block, 'Slider-crank synthesis', {
      covers: ['synthesis'],
      inputs: inputs.values,
      results,
      method,
      summary: ['crank', 'rod'],
      assumptions: [
        { text: 'The synthesis places both dead centres on one side of the crank axis (a crank that turns fully); lengths are exact and are then rounded to what can be made.', verify: false, from: block.id ?? 'synthesis' },
      ],
    })
  },
}
