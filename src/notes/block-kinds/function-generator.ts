/**
 * `function-generator` blocks: a four-bar whose output angle follows a function
 * y = f(x) over a range, exact at three Chebyshev-spaced precision points
 * (Freudenstein's equation), with the structural error over the range charted.
 *
 *     function: log10(x)          (an expression in x, no units)
 *     x_start: 1
 *     x_end: 10
 *     input_start: 45 deg ; input_span: 90 deg
 *     output_start: 240 deg ; output_span: 60 deg
 *     ground: 100 mm
 */
import { functionGenerator } from '../../linkage/index.js'
import { columnDecimals, formatFixed } from '../display.js'
import { messages } from '../messages.js'
import { evaluateExpression, parseQuantityExpression } from '../quantity.js'
import { reportError } from '../report.js'
import type { MethodStep } from '../types.js'
import { designChart } from './design-chart.js'
import { citeSources, inputDependencies, readInputs, type InputSpec } from './inputs.js'
import { outcome, type BlockKind } from './kind.js'
import { withLinkage } from './linkage-common.js'
import { asNamed } from './slider-crank-outcome.js'
import { publish, quantity, tex, texBare, word } from './values.js'

const specs: readonly InputSpec[] = [
  { name: 'x_start', label: 'start of the function’s range', symbol: 'x_0', kind: 'ratio', required: true },
  { name: 'x_end', label: 'end of the function’s range', symbol: 'x_f', kind: 'ratio', required: true },
  { name: 'input_start', label: 'input angle at the start of the range (from the ground line)', symbol: '\\theta_{2s}', kind: 'angle', required: true },
  { name: 'input_span', label: 'input angle travelled over the range', symbol: '\\Delta\\theta_2', kind: 'angle', required: true },
  { name: 'output_start', label: 'output angle at the start of the range (from the ground line)', symbol: '\\theta_{4s}', kind: 'angle', required: true },
  { name: 'output_span', label: 'output angle travelled over the range', symbol: '\\Delta\\theta_4', kind: 'angle', required: true },
  { name: 'ground', label: 'ground link (pivot to pivot)', symbol: 'd', kind: 'length', required: true },
]

export const functionGeneratorKind: BlockKind = {
  name: 'function-generator',
  label: 'Function generator',
  needsId: true,
  dependencies: (block, ids) => inputDependencies({ ...block, body: { ...block.body, entries: block.body.entries.filter((e) => e.name !== 'function') } }, specs, ids),
  evaluate(block, context) {
    const entry = block.body.entries.find((e) => e.name === 'function')
    const own = { ...block, body: { ...block.body, entries: block.body.entries.filter((e) => e.name !== 'function') } }
    const inputs = readInputs(own, specs, 'function-generator', context)
    if (!entry) {
      reportError(context.file, 'missing-input', messages['missing-input']('function', 'the function y = f(x), an expression in x', 'function-generator'), block.place)
      return null
    }
    citeSources(entry.source, entry.sourcePlace ?? entry.valuePlace, context)
    if (!inputs) return null
    // The function: an expression in x over plain numbers (the restricted evaluator).
    let f: (x: number) => number
    try {
      const node = parseQuantityExpression(entry.value)
      const probe = evaluateExpression(node, { x: (inputs.si.x_start! + inputs.si.x_end!) / 2 })
      if (typeof probe !== 'number') throw new Error('it must give a plain number for a plain x')
      f = (x: number) => {
        const v = evaluateExpression(node, { x })
        return typeof v === 'number' ? v : Number.NaN
      }
    } catch (error) {
      reportError(context.file, 'invalid-expression', messages['invalid-expression'](entry.value, error instanceof Error ? error.message : String(error)), entry.valuePlace)
      return null
    }
    const { si } = inputs
    const { meta } = context
    const design = withLinkage(block, context, () =>
      functionGenerator(f, { x0: si.x_start!, xf: si.x_end! }, { start: si.input_start!, span: si.input_span! }, { start: si.output_start!, span: si.output_span! }, si.ground!),
    )
    if (!design) return null
    const span = Math.abs(f(si.x_end!) - f(si.x_start!))
    const results = [
      quantity('ground', 'ground link (pivot to pivot)', 'd', 'length', design.ground),
      quantity('input', 'input link', 'a', 'length', design.input),
      quantity('coupler', 'coupler', 'b', 'length', design.coupler),
      quantity('output', 'output link', 'c', 'length', design.output),
      word('circuit', 'assembly circuit through the three precision points', design.circuit),
      quantity('structural_error_max', 'largest structural error |y − f(x)| over the range', '\\varepsilon_{\\max}', 'ratio', design.errorMax),
      quantity('structural_error_share', 'largest structural error as a share of the function’s span', null, 'ratio', design.errorMax / span),
      quantity('structural_error_at', 'x where the structural error is largest', null, 'ratio', design.errorMaxAt),
      quantity('output_angle_error_max', 'largest structural error in output angle', null, 'angle', design.angleErrorMax),
    ]
    publish(context, block.id, [...asNamed(inputs.values), ...results])
    const method: MethodStep[] = [
      {
        label: 'Precision points by Chebyshev spacing',
        formula: 'x_j = \\frac{x_0 + x_f}{2} - \\frac{x_f - x_0}{2}\\cos\\frac{(2j - 1)\\pi}{6},\\quad j = 1, 2, 3',
        substituted: null,
        result: design.points.map((p, j) => `x_${j + 1} = ${texBare(meta, p.x, 'ratio')}`).join(',\\ '),
        note: 'θ2 is linear in x and θ4 linear in y = f(x) over their spans; the angles are measured from the ground line O2→O4. Chebyshev spacing after R. S. Hartenberg and J. Denavit, Kinematic Synthesis of Linkages (1964).',
      },
      {
        label: 'Freudenstein’s equation at the three points',
        formula: 'K_1\\cos\\theta_4 - K_2\\cos\\theta_2 + K_3 = \\cos(\\theta_2 - \\theta_4),\\quad K_1 = \\frac{d}{a},\\ K_2 = \\frac{d}{c},\\ K_3 = \\frac{a^2 - b^2 + c^2 + d^2}{2ac}',
        substituted: `K_1 = ${texBare(meta, design.k[0], 'ratio')},\\ K_2 = ${texBare(meta, design.k[1], 'ratio')},\\ K_3 = ${texBare(meta, design.k[2], 'ratio')}`,
        result: `a = ${tex(meta, design.input, 'length')},\\ b = ${tex(meta, design.coupler, 'length')},\\ c = ${tex(meta, design.output, 'length')}`,
        note: `A linear system of three equations in K1, K2, K3 (F. Freudenstein, 1955); b² = a² + c² + d² − 2ac·K3. The ${design.circuit} circuit passes through all three points.`,
      },
      {
        label: 'Structural error over the range',
        formula: '\\varepsilon(x) = y_{generated}(x) - f(x)',
        substituted: null,
        result: `\\varepsilon_{\\max} = ${texBare(meta, design.errorMax, 'ratio')}\\ \\text{at}\\ x = ${texBare(meta, design.errorMaxAt, 'ratio')}`,
        note: 'The linkage’s output angle at 401 points over the range, read back as y; zero at the precision points.',
      },
    ]
    const xs = design.points.map((p) => p.x)
    const dx = columnDecimals(xs, meta.digits)
    const deg = 180 / Math.PI
    const data = [
      {
        caption: 'The three precision points',
        columns: [{ label: 'x', unit: '' }, { label: 'y = f(x)', unit: '' }, { label: 'input angle θ2', unit: '°' }, { label: 'output angle θ4', unit: '°' }],
        rows: design.points.map((p) => [formatFixed(p.x, dx), formatFixed(p.y, columnDecimals(design.points.map((q) => q.y), meta.digits)), formatFixed(p.input * deg, 3), formatFixed(p.output * deg, 3)]),
        source: entry.source,
      },
    ]
    const chart = designChart(meta, block.id ?? 'function-generator', block.title ? `${block.title}: structural error` : 'Structural error over the range', { name: 'x', label: 'x', kind: 'ratio', values: design.errorCurve.x }, [{ name: 'structural_error', label: 'structural error y − f(x)', kind: 'ratio', values: design.errorCurve.error }], {
      source: `${design.errorCurve.x.length} points over the range, the linkage's output read back as y`,
      marks: design.points.map((p, j) => ({ label: `precision point ${j + 1}`, short: `x${j + 1}`, x: p.x })),
      height: 160,
    })
    const from = block.id ?? 'function-generator'
    return outcome(block, 'Function generator', {
      covers: ['synthesis'],
      inputs: inputs.values,
      results,
      method,
      data,
      chart,
      summary: ['input', 'coupler', 'output', 'structural_error_max'],
      assumptions: [{ text: 'The function is generated only over the stated range; outside it, and on the other circuit, the linkage follows no requirement.', verify: false, from }],
    })
  },
}
