/**
 * `column` blocks: a connecting rod (or coupler, or any strut) as a column
 * under the largest compression a forces block finds (`of: <id>`) or a stated
 * load: section properties, slenderness in and out of the plane of motion with
 * their own end conditions, Euler's and Johnson's critical loads, which governs,
 * and the factor of safety.
 */
import { column, type ColumnPlane, type ColumnResult, type ColumnSection } from '../../linkage/index.js'
import { showQuantity } from '../display.js'
import { messages } from '../messages.js'
import { reportError, reportWarning } from '../report.js'
import type { MethodStep, NamedValue } from '../types.js'
import { toDisplay } from './angles.js'
import { readInputs, ofAndReferences, type InputSpec } from './inputs.js'
import { outcome, type BlockKind, type EvaluationContext } from './kind.js'
import { withLinkage } from './linkage-common.js'
import { asNamed } from './slider-crank-outcome.js'
import { publish, quantity, tex, texBare, word } from './values.js'

/** Dimensions each section takes. */
const SECTION_INPUTS: Readonly<Record<ColumnSection['kind'], readonly string[]>> = {
  round: ['diameter'],
  tube: ['diameter', 'bore_diameter'],
  rectangle: ['width', 'depth'],
  'i-section': ['height', 'flange_width', 'flange_thickness', 'web_thickness'],
}

const specs: readonly InputSpec[] = [
  { name: 'load', label: 'compressive load (instead of a forces block)', symbol: 'P', kind: 'force' },
  { name: 'section', label: 'cross-section', symbol: null, kind: 'choice', choices: ['round', 'tube', 'rectangle', 'i-section'], required: true },
  { name: 'diameter', label: 'outside diameter', symbol: 'd', kind: 'length' },
  { name: 'bore_diameter', label: 'inside diameter of the tube', symbol: 'd_i', kind: 'length' },
  { name: 'width', label: 'width in the plane of motion', symbol: 'w', kind: 'length' },
  { name: 'depth', label: 'depth along the pin axis', symbol: 'h', kind: 'length' },
  { name: 'height', label: 'I-section height (in the plane of motion)', symbol: 'H', kind: 'length' },
  { name: 'flange_width', label: 'I-section flange width (along the pin axis)', symbol: 'B', kind: 'length' },
  { name: 'flange_thickness', label: 'I-section flange thickness', symbol: 't_f', kind: 'length' },
  { name: 'web_thickness', label: 'I-section web thickness', symbol: 't_w', kind: 'length' },
  { name: 'length', label: 'column length (pin centres)', symbol: 'l', kind: 'length' },
  { name: 'end_in_plane', label: 'end-condition constant for bending in the plane of motion', symbol: 'C_{in}', kind: 'ratio', default: '1' },
  { name: 'end_out_of_plane', label: 'end-condition constant for bending out of the plane', symbol: 'C_{out}', kind: 'ratio', default: '1' },
  { name: 'modulus', label: 'Young’s modulus', symbol: 'E', kind: 'pressure', required: true },
  { name: 'yield_strength', label: 'yield strength', symbol: 'S_y', kind: 'pressure', required: true },
]

export const columnKind: BlockKind = {
  name: 'column',
  label: 'Rod as a column',
  needsId: false,
  dependencies: ofAndReferences,
  evaluate(block, context) {
    const { file } = context
    const ofEntry = block.body.entries.find((e) => e.name === 'of')
    const own = { ...block, body: { ...block.body, entries: block.body.entries.filter((e) => e.name !== 'of') } }
    const inputs = readInputs(own, specs, 'column', context)
    if (!inputs) return null
    const { si, words } = inputs
    const place = (name: string) => block.body.entries.find((e) => e.name === name)?.valuePlace ?? block.place
    let cycle = null
    if (ofEntry) {
      const forces = context.outcomes.get(ofEntry.value)
      if (!forces) {
        if (!context.blockIds.has(ofEntry.value)) reportError(file, 'unknown-block', messages['unknown-block'](ofEntry.value), ofEntry.valuePlace)
        return null
      }
      if (forces.core?.type !== 'forces') {
        reportError(file, 'wrong-block', messages['wrong-block'](ofEntry.value, 'a forces block (the column takes its largest rod compression)'), ofEntry.valuePlace)
        return null
      }
      cycle = forces.core.cycle
      if (si.load !== undefined) {
        reportError(file, 'duplicate-input', messages['duplicate-input']('load` beside `of'), place('load'))
        return null
      }
    } else if (si.load === undefined) {
      reportError(file, 'missing-input', messages['missing-input']('of', 'a forces block, or a `load`', 'column'), block.place)
      return null
    }
    const kind = words.section as ColumnSection['kind']
    const needed = SECTION_INPUTS[kind]
    const missing = needed.filter((n) => si[n] === undefined)
    if (missing.length > 0) {
      reportError(file, 'missing-input', messages['missing-input'](missing[0]!, specs.find((s) => s.name === missing[0])!.label, `column (${kind} section)`), place('section'))
      return null
    }
    const extra = Object.values(SECTION_INPUTS).flat().filter((n) => !needed.includes(n) && si[n] !== undefined)
    if (extra.length > 0) {
      reportError(file, 'unknown-input', messages['unknown-input'](extra[0]!, `column with a ${kind} section`, needed), place(extra[0]!))
      return null
    }
    const section: ColumnSection =
      kind === 'round'
        ? { kind, diameter: si.diameter! }
        : kind === 'tube'
          ? { kind, outer: si.diameter!, inner: si.bore_diameter! }
          : kind === 'rectangle'
            ? { kind, width: si.width!, depth: si.depth! }
            : { kind, height: si.height!, flangeWidth: si.flange_width!, flange: si.flange_thickness!, web: si.web_thickness! }
    const length = si.length ?? cycle?.rodLength
    if (length === undefined) {
      reportError(file, 'missing-input', messages['missing-input']('length', 'column length (pin centres)', 'column'), block.place)
      return null
    }
    const load = si.load ?? cycle?.rodCompression?.value ?? 0
    const result = withLinkage(block, context, () => column(section, length, si.end_in_plane ?? 1, si.end_out_of_plane ?? 1, si.modulus!, si.yield_strength!, load))
    if (!result) return null
    const at = cycle?.rodCompression && ofEntry ? context.outcomes.get(ofEntry.value)!.sweep : null
    const results: NamedValue[] = [
      quantity('compression', cycle ? 'largest compression from the forces' : 'compressive load', 'P', 'force', load),
      ...(at && cycle?.rodCompression ? [quantity('compression_at', `${at.convention.label} at the largest compression`, null, 'angle', toDisplay(at, cycle.rodCompression.theta))] : []),
      quantity('area', 'cross-section area', 'A', 'area', result.section.area),
      quantity('slenderness_in_plane', 'slenderness ratio in the plane of motion', '(l/k)_{in}', 'ratio', result.inPlane.slenderness),
      quantity('slenderness_out_of_plane', 'slenderness ratio out of the plane', '(l/k)_{out}', 'ratio', result.outOfPlane.slenderness),
      quantity('transition_in_plane', 'transition slenderness (Euler meets Johnson) in the plane', '(l/k)_{1,in}', 'ratio', result.inPlane.transition),
      quantity('transition_out_of_plane', 'transition slenderness out of the plane', '(l/k)_{1,out}', 'ratio', result.outOfPlane.transition),
      quantity('critical_load_in_plane', `critical load in the plane (${result.inPlane.formula === 'euler' ? 'Euler' : 'Johnson'})`, 'P_{cr,in}', 'force', result.inPlane.criticalLoad),
      quantity('critical_load_out_of_plane', `critical load out of the plane (${result.outOfPlane.formula === 'euler' ? 'Euler' : 'Johnson'})`, 'P_{cr,out}', 'force', result.outOfPlane.criticalLoad),
      quantity('critical_load', 'critical load (the lesser)', 'P_{cr}', 'force', result.criticalLoad),
      word('governing_plane', 'plane that governs', result.governing === 'in-plane' ? 'in the plane of motion' : 'out of the plane'),
      word('governing_formula', 'formula that governs', (result.governing === 'in-plane' ? result.inPlane : result.outOfPlane).formula === 'euler' ? 'Euler' : 'Johnson'),
      quantity('safety_factor', 'factor of safety against buckling P_cr/P', 'n', 'ratio', result.safetyFactor, 'no compressive load'),
      quantity('direct_stress', 'direct compressive stress P/A', '\\sigma', 'pressure', load / result.section.area),
    ]
    publish(context, block.id, [...asNamed(inputs.values), ...results])
    const warnings: string[] = []
    for (const [words_, p] of [['in the plane of motion', result.inPlane], ['out of the plane', result.outOfPlane]] as const) {
      const at_ = place(si.length !== undefined ? 'length' : 'section')
      const value = p.slenderness.toFixed(1)
      if (p.slenderness < 10) {
        const text = `The slenderness ${words_} is ${value}, below 10: a short compression member, which the column formulas do not describe; check the direct stress P/A against S_y and the pin joints instead (common practice, no source)`
        warnings.push(text)
        reportWarning(file, 'column-slenderness', messages['column-slenderness'](text), at_)
      } else if (p.slenderness > 200) {
        const text = `The slenderness ${words_} is ${value}, above 200: a very slender strut, whose buckling load depends strongly on end fixity and crookedness; stiffen the section (common practice, no source)`
        warnings.push(text)
        reportWarning(file, 'column-slenderness', messages['column-slenderness'](text), at_)
      }
    }
    const from = block.id ?? 'column'
    return outcome(block, 'Rod as a column', {
      covers: ['buckling'],
      inputs: inputs.values,
      results,
      method: columnMethod(result, length, load, context),
      warnings,
      assumptions: [
        { text: 'The column is straight and loaded along its pin-centre line; bending from the rod’s own inertia (whip) and from pin friction is not included.', verify: true, from },
        { text: 'The end-condition constants C describe how the pins restrain the rod in and out of the plane of motion (C = 1: pinned at both ends).', verify: true, from },
      ],
      summary: ['safety_factor', 'governing_formula'],
    })
  },
}

function columnMethod(result: ColumnResult, length: number, load: number, context: EvaluationContext): MethodStep[] {
  const { meta } = context
  const N = (si: number): string => tex(meta, si, 'force')
  const plane = (p: ColumnPlane, words: string, second: number): MethodStep => ({
    label: `Buckling ${words}`,
    formula:
      p.formula === 'euler'
        ? '\\begin{gathered}k = \\sqrt{I/A},\\quad (l/k)_1 = \\sqrt{\\frac{2\\pi^2 C E}{S_y}}\\\\ P_{cr} = \\frac{C\\pi^2 E A}{(l/k)^2}\\quad \\text{(Euler, } l/k \\ge (l/k)_1)\\end{gathered}'
        : '\\begin{gathered}k = \\sqrt{I/A},\\quad (l/k)_1 = \\sqrt{\\frac{2\\pi^2 C E}{S_y}}\\\\ P_{cr} = A\\left(S_y - \\frac{1}{C E}\\left(\\frac{S_y\\,l}{2\\pi k}\\right)^2\\right)\\quad \\text{(Johnson, } l/k < (l/k)_1)\\end{gathered}',
    substituted: `\\begin{gathered}I = ${tex(meta, second, 'second-moment')},\\quad k = ${tex(meta, p.radiusOfGyration, 'length')},\\quad l/k = \\frac{${tex(meta, length, 'length')}}{${tex(meta, p.radiusOfGyration, 'length')}} = ${texBare(meta, p.slenderness, 'ratio')}\\\\ C = ${texBare(meta, p.endConstant, 'ratio')},\\quad (l/k)_1 = ${texBare(meta, p.transition, 'ratio')}\\end{gathered}`,
    result: `P_{cr} = ${N(p.criticalLoad)}`,
    cites: ['lw-column'],
  })
  const steps: MethodStep[] = [
    plane(result.inPlane, 'in the plane of motion', result.section.inPlane),
    plane(result.outOfPlane, 'out of the plane of motion', result.section.outOfPlane),
  ]
  steps.push({
    label: 'Factor of safety against buckling',
    formula: 'n = \\frac{\\min(P_{cr,in},\\ P_{cr,out})}{P}',
    substituted: load > 0 ? `n = \\frac{${N(result.criticalLoad)}}{${N(load)}}` : null,
    result: result.safetyFactor === null ? '\\text{no compressive load}' : `n = ${texBare(meta, result.safetyFactor, 'ratio')}`,
    note: `The section’s area A = ${showQuantity(result.section.area, 'area', meta.units, meta.digits)}. The two formulas meet tangentially at S_y/2 at the transition slenderness.`,
  })
  return steps
}
