/**
 * `forces` blocks: the kinetostatics of a linkage block (`of: <id>`) under a
 * process load and the masses of its links — rod, pin and bearing forces, guide
 * thrust, crank torque, power and work per cycle, the reciprocating inertia force
 * with its primary and secondary parts, the shaking force with a counterweight,
 * and the motor power for a service factor. Works on a slider-crank (straight or
 * arc path, crank- or slider-driven), an eccentric drive and a four-bar.
 */
import type { Position } from 'unist'
import {
  analyseFourBarForces,
  analyseSliderCrankForces,
  arcSliderForceInput,
  type FourBarAnalysis,
  type FourBarForceInput,
  type SliderCrankAnalysis,
  type SliderCrankForceInput,
} from '../../linkage/index.js'
import type { BodyEntry } from '../body.js'
import { messages } from '../messages.js'
import { reportError } from '../report.js'
import type { CalcBlock } from '../types.js'
import { readInputs, type InputSpec, type ReadInputs } from './inputs.js'
import type { BlockKind, BlockOutcome, EvaluationContext } from './kind.js'
import { withLinkage } from './linkage-common.js'
import { readLoad, type LoadReading } from './load-input.js'
import { fourBarForcesOutcome, sliderCrankForcesOutcome } from './forces-outcome.js'
import { fourBarForceView, sliderCrankForceView } from './forces-view.js'

/** Standard gravity, m/s² (the CGPM's conventional value). */
export const STANDARD_GRAVITY = 9.80665

const loadSpecs = (choices: readonly string[]): InputSpec[] => [
  { name: 'load_acts', label: 'which way the load acts', symbol: null, kind: 'choice', choices, default: 'against-motion' },
]
const driveSpecs: InputSpec[] = [
  { name: 'gravity', label: 'direction of gravity in the linkage’s frame', symbol: null, kind: 'choice', choices: ['none', '-y', '+y', '-x', '+x'], default: 'none' },
  { name: 'service_factor', label: 'service factor on the motor', symbol: 'K_s', kind: 'ratio', default: '1' },
  { name: 'drive_efficiency', label: 'efficiency of the drive from motor to crank', symbol: '\\eta', kind: 'ratio', default: '1' },
]

/** Inputs of forces on a slider-crank or an eccentric drive. */
export const SLIDER_CRANK_FORCE_SPECS: readonly InputSpec[] = [
  { name: 'load_against', label: 'what the load table is against', symbol: null, kind: 'choice', choices: ['travel', 'position', 'crank-angle'], default: 'travel' },
  ...loadSpecs(['against-motion', 'towards-crank', 'away-from-crank']),
  { name: 'load_during', label: 'stroke the load acts on', symbol: null, kind: 'choice', choices: ['both', 'outstroke', 'instroke'], default: 'both' },
  { name: 'area', label: 'piston (plunger) area, for a pressure load', symbol: 'A_p', kind: 'area' },
  { name: 'bore', label: 'piston (plunger) diameter, for a pressure load', symbol: 'D', kind: 'length' },
  { name: 'slider_mass', label: 'reciprocating mass: slider and all that moves with it', symbol: 'm_s', kind: 'mass', default: '0 kg', nonNegative: true },
  { name: 'rod_mass', label: 'connecting-rod mass', symbol: 'm_r', kind: 'mass', default: '0 kg', nonNegative: true },
  { name: 'rod_centre', label: 'rod centre of mass from the crank pin', symbol: 'g', kind: 'length' },
  { name: 'rod_inertia', label: 'rod moment of inertia about its centre of mass', symbol: 'I_r', kind: 'inertia' },
  { name: 'crank_mass', label: 'crank mass', symbol: 'm_c', kind: 'mass', default: '0 kg', nonNegative: true },
  { name: 'crank_centre', label: 'radius of the crank’s centre of mass', symbol: 'r_c', kind: 'length', default: '0 mm', nonNegative: true },
  { name: 'crank_inertia', label: 'moment of inertia about the crank axis of all that turns with the crank', symbol: 'I_c', kind: 'inertia', default: '0 kg*m^2', nonNegative: true },
  { name: 'counterweight_mass', label: 'counterweight mass', symbol: 'm_w', kind: 'mass', default: '0 kg', nonNegative: true },
  { name: 'counterweight_radius', label: 'radius of the counterweight’s centre of mass', symbol: 'r_w', kind: 'length', default: '0 mm', nonNegative: true },
  { name: 'counterweight_phase', label: 'counterweight angle from the crank', symbol: '\\psi_w', kind: 'angle', default: '180 deg' },
  { name: 'friction', label: 'guide friction coefficient (Coulomb)', symbol: '\\mu_g', kind: 'ratio', default: '0', nonNegative: true },
  ...driveSpecs,
]

/** Inputs of forces on a four-bar. */
export const FOUR_BAR_FORCE_SPECS: readonly InputSpec[] = [
  ...loadSpecs(['against-motion', 'counter-clockwise', 'clockwise']),
  { name: 'input_mass', label: 'input link mass', symbol: 'm_2', kind: 'mass', default: '0 kg', nonNegative: true },
  { name: 'input_centre', label: 'radius of the input link’s centre of mass', symbol: 'r_2', kind: 'length', default: '0 mm', nonNegative: true },
  { name: 'input_inertia', label: 'moment of inertia about O2 of all that turns with the input', symbol: 'I_2', kind: 'inertia', default: '0 kg*m^2', nonNegative: true },
  { name: 'coupler_mass', label: 'coupler mass', symbol: 'm_3', kind: 'mass', default: '0 kg', nonNegative: true },
  { name: 'coupler_centre', label: 'coupler centre of mass: distance from pin A', symbol: 'r_3', kind: 'length', default: '0 mm', nonNegative: true },
  { name: 'coupler_centre_angle', label: 'coupler centre of mass: angle from the line A→B', symbol: '\\delta_3', kind: 'angle', default: '0 deg' },
  { name: 'coupler_inertia', label: 'coupler moment of inertia about its centre of mass', symbol: 'I_3', kind: 'inertia', default: '0 kg*m^2', nonNegative: true },
  { name: 'output_mass', label: 'output link mass', symbol: 'm_4', kind: 'mass', default: '0 kg', nonNegative: true },
  { name: 'output_centre', label: 'radius of the output link’s centre of mass', symbol: 'r_4', kind: 'length', default: '0 mm', nonNegative: true },
  { name: 'output_inertia', label: 'output link moment of inertia about O4', symbol: 'I_4', kind: 'inertia', default: '0 kg*m^2', nonNegative: true },
  ...driveSpecs,
]

const OWN = new Set(['of', 'load', 'load_file'])

/** Block ids a forces block uses: its linkage, and any used in its inputs. */
function dependencies(block: CalcBlock, ids: ReadonlySet<string>): Set<string> {
  const found = new Set<string>()
  for (const entry of block.body.entries) {
    if (entry.name === 'of' && ids.has(entry.value)) found.add(entry.value)
    const texts = [entry.value, ...entry.rows.map((r) => r.text)]
    for (const text of texts) for (const m of text.matchAll(/([A-Za-z_][A-Za-z0-9_]*)\./g)) if (ids.has(m[1]!)) found.add(m[1]!)
  }
  return found
}

/** The block's `of` entry and the linkage outcome it names, or null after reporting. */
export function linkageOf(block: CalcBlock, context: EvaluationContext, kindName: string, expected: string): { of: BodyEntry; linkage: BlockOutcome } | null {
  const of = block.body.entries.find((e) => e.name === 'of')
  if (!of) {
    reportError(context.file, 'missing-input', messages['missing-input']('of', `the id of ${expected}`, kindName), block.place)
    return null
  }
  const linkage = context.outcomes.get(of.value)
  if (!linkage) {
    if (!context.blockIds.has(of.value)) reportError(context.file, 'unknown-block', messages['unknown-block'](of.value), of.valuePlace)
    return null
  }
  return { of, linkage }
}

/** The block with its own entries (of, load, load_file) taken out, for readInputs. */
function withoutOwn(block: CalcBlock): CalcBlock {
  return { ...block, body: { ...block.body, entries: block.body.entries.filter((e) => !OWN.has(e.name)) } }
}

export const forcesKind: BlockKind = {
  name: 'forces',
  label: 'Forces and torque',
  needsId: true,
  dependencies,
  evaluate(block, context) {
    const found = linkageOf(block, context, 'forces', 'a slider-crank, eccentric or four-bar block')
    if (!found) return null
    const { of, linkage } = found
    const core = linkage.core
    if (!core || core.type === 'forces') {
      reportError(context.file, 'wrong-block', messages['wrong-block'](of.value, 'a slider-crank, eccentric or four-bar block'), of.valuePlace)
      return null
    }
    const entries = new Map(block.body.entries.map((e) => [e.name, e]))
    if (core.type === 'slider-crank') return sliderCrankForces(block, context, of.value, linkage, core.analysis, entries)
    return fourBarForces(block, context, of.value, linkage, core.analysis, entries)
  },
}

function gravityVector(word: string | undefined): [number, number] {
  const g = STANDARD_GRAVITY
  switch (word) {
    case '-y':
      return [0, -g]
    case '+y':
      return [0, g]
    case '-x':
      return [-g, 0]
    case '+x':
      return [g, 0]
    default:
      return [0, 0]
  }
}

function sliderCrankForces(
  block: CalcBlock,
  context: EvaluationContext,
  id: string,
  linkage: BlockOutcome,
  analysis: SliderCrankAnalysis,
  entries: ReadonlyMap<string, BodyEntry>,
): BlockOutcome | null {
  const inputs = readInputs(withoutOwn(block), SLIDER_CRANK_FORCE_SPECS, 'forces', context)
  if (!inputs) return null
  const { si, words } = inputs
  const source = linkage.sweep!
  const place = (name: string): Position => entries.get(name)?.valuePlace ?? block.place
  const fail = (rule: 'invalid-choice' | 'duplicate-input' | 'dimension-mismatch', reason: string, at: Position): null => {
    reportError(context.file, rule, reason, at)
    return null
  }
  const abscissa = words.load_against === 'position' ? 'position' : words.load_against === 'crank-angle' ? 'angle' : 'travel'
  const timed = analysis.fullRotation && analysis.outerDeadCentre !== null && analysis.innerDeadCentre !== null
  if (!timed && abscissa === 'travel' && entries.has('load') && entries.get('load')!.value === 'table') {
    return fail('invalid-choice', `${messages['invalid-choice']('load_against', 'travel', ['position', 'crank-angle'])}: travel is measured from the outer dead centre, and this crank only rocks`, place('load_against'))
  }
  if (!timed && words.load_during !== 'both') {
    return fail('invalid-choice', `${messages['invalid-choice']('load_during', words.load_during!, ['both'])}: the strokes run between dead centres, and this crank only rocks`, place('load_during'))
  }
  if (si.area !== undefined && si.bore !== undefined) return fail('duplicate-input', messages['duplicate-input']('bore` beside `area'), place('bore'))
  const area = si.area ?? (si.bore !== undefined ? (Math.PI * si.bore * si.bore) / 4 : null)
  const cover =
    abscissa === 'travel'
      ? { from: 0, to: analysis.stroke, words: 'the stroke from the outer dead centre' }
      : abscissa === 'position'
        ? { from: analysis.positionMin.value, to: analysis.positionMax.value, words: 'every slider position' }
        : { from: source.displayStart, to: source.displayEnd, words: `the ${source.convention.label} over the ${source.fullTurn ? 'turn' : 'crank’s range'}` }
  const load = readLoad(entries.get('load'), entries.get('load_file'), block.place, {
    kinds: ['force', 'pressure'],
    abscissa,
    sense: words.load_acts === 'towards-crank' ? 'towards-crank' : words.load_acts === 'away-from-crank' ? 'away-from-crank' : 'against-motion',
    stroke: words.load_during === 'outstroke' ? 'outstroke' : words.load_during === 'instroke' ? 'instroke' : 'both',
    area,
    angleOrigin: source.convention.origin,
    angleSense: source.convention.sense,
    cover,
    label: 'process load on the slider',
  }, context)
  if (!load) return null
  const rodLength = analysis.linkage.rod
  const rodCentreGiven = si.rod_centre !== undefined
  const rodCentre = si.rod_centre ?? rodLength / 2
  const rodMass = si.rod_mass ?? 0
  // Without an inertia, the rod is two masses at its pins: I = m·g·(b − g) about its centre.
  const rodInertia = si.rod_inertia ?? rodMass * rodCentre * (rodLength - rodCentre)
  const input: SliderCrankForceInput = {
    masses: {
      slider: si.slider_mass ?? 0,
      rod: rodMass,
      rodCentre,
      rodInertia,
      crank: si.crank_mass ?? 0,
      crankCentre: si.crank_centre ?? 0,
      crankInertia: si.crank_inertia ?? 0,
      counterweight: si.counterweight_mass ?? 0,
      counterweightRadius: si.counterweight_radius ?? 0,
      counterweightPhase: si.counterweight_phase ?? Math.PI,
    },
    load: load.load,
    friction: si.friction ?? 0,
    gravity: gravityVector(words.gravity),
  }
  if (!checkDrive(inputs, block, context, place)) return null
  const straight = analysis.linkage.equivalentFourBar === null
  const result = withLinkage(block, context, () => {
    if (straight) return { type: 'straight' as const, forces: analyseSliderCrankForces(analysis, input) }
    const fb = analysis.linkage.equivalentFourBar!
    const timing = timed ? { innerAngle: analysis.innerDeadCentre!.theta, outstrokeAngle: analysis.outstrokeAngle!, outerPosition: analysis.outerDeadCentre!.position } : null
    const fbInput = arcSliderForceInput(analysis.linkage, input, timing)
    const candidates = [analysis.outerDeadCentre?.theta, analysis.innerDeadCentre?.theta].filter((t): t is number => t !== undefined)
    return {
      type: 'arc' as const,
      forces: analyseFourBarForces(fb, fbInput, { range: analysis.range, speed: analysis.speed, angularAcceleration: analysis.angularAcceleration, fullTurn: analysis.fullRotation }, { candidates }),
    }
  })
  if (!result) return null
  const view = result.type === 'straight' ? sliderCrankForceView(result.forces, input.friction > 0) : fourBarForceView(result.forces, 'arc-slider', analysis.linkage.driver === 'slider')
  return sliderCrankForcesOutcome({
    block,
    context,
    id,
    linkage,
    analysis,
    inputs,
    load,
    input,
    view,
    straight: result.type === 'straight' ? result.forces : null,
    assumed: { rodCentre: !rodCentreGiven && rodMass > 0, rodInertia: si.rod_inertia === undefined && rodMass > 0 },
  })
}

function fourBarForces(
  block: CalcBlock,
  context: EvaluationContext,
  id: string,
  linkage: BlockOutcome,
  analysis: FourBarAnalysis,
  entries: ReadonlyMap<string, BodyEntry>,
): BlockOutcome | null {
  const inputs = readInputs(withoutOwn(block), FOUR_BAR_FORCE_SPECS, 'forces', context)
  if (!inputs) return null
  const { si, words } = inputs
  const place = (name: string): Position => entries.get(name)?.valuePlace ?? block.place
  if (analysis.linkage.driver === 'output') {
    reportError(context.file, 'wrong-block', messages['wrong-block'](id, 'a four-bar driven at its input: the forces block takes the input’s motion as given and the load on the output'), entries.get('of')!.valuePlace)
    return null
  }
  const source = linkage.sweep!
  const load: LoadReading | null = readLoad(entries.get('load'), entries.get('load_file'), block.place, {
    kinds: ['torque'],
    abscissa: 'angle',
    sense: 'against-motion',
    stroke: 'both',
    area: null,
    angleOrigin: source.convention.origin,
    angleSense: source.convention.sense,
    cover: { from: source.displayStart, to: source.displayEnd, words: `the ${source.convention.label} over the ${source.fullTurn ? 'turn' : 'input’s range'}` },
    label: 'load torque on the output link',
  }, context)
  if (!load) return null
  if (!checkDrive(inputs, block, context, place)) return null
  // A fixed sense: the core's load is its magnitude, applied counter-clockwise or clockwise.
  const fixed = words.load_acts === 'counter-clockwise' ? 1 : words.load_acts === 'clockwise' ? -1 : 0
  const coreLoad = fixed === 0 ? load.load : { ...load.load, sense: 'towards-crank' as const }
  const input: FourBarForceInput = {
    masses: {
      input: si.input_mass ?? 0,
      inputCentre: si.input_centre ?? 0,
      inputInertia: si.input_inertia ?? 0,
      coupler: si.coupler_mass ?? 0,
      couplerCentre: si.coupler_centre ?? 0,
      couplerCentreAngle: si.coupler_centre_angle ?? 0,
      couplerInertia: si.coupler_inertia ?? 0,
      output: si.output_mass ?? 0,
      outputCentre: si.output_centre ?? 0,
      outputInertia: si.output_inertia ?? 0,
    },
    outputLoad: coreLoad,
    outputLoadSense: fixed === -1 ? -1 : 1,
    gravity: gravityVector(words.gravity),
  }
  const candidates = analysis.toggles.map((t) => t.theta)
  const forces = withLinkage(block, context, () =>
    analyseFourBarForces(analysis.linkage, input, { range: analysis.range, speed: analysis.speed, angularAcceleration: analysis.angularAcceleration, fullTurn: analysis.inputTurnsFully && analysis.periodTurns === 1 }, { candidates }),
  )
  if (!forces) return null
  const view = fourBarForceView(forces, 'four-bar', false)
  return fourBarForcesOutcome({ block, context, id, linkage, analysis, inputs, load, input, view, forces })
}

/** Service factor ≥ 1 is usual but not required; efficiency in (0, 1]. */
function checkDrive(inputs: ReadInputs, _block: CalcBlock, context: EvaluationContext, place: (name: string) => Position): boolean {
  const eta = inputs.si.drive_efficiency ?? 1
  if (!(eta > 0 && eta <= 1)) {
    reportError(context.file, 'dimension-mismatch', messages['dimension-mismatch']('drive_efficiency', 'efficiency of the drive', `expected a number above 0 and at most 1, got ${eta}`), place('drive_efficiency'))
    return false
  }
  const k = inputs.si.service_factor ?? 1
  if (!(k > 0)) {
    reportError(context.file, 'dimension-mismatch', messages['dimension-mismatch']('service_factor', 'service factor', `expected a positive number, got ${k}`), place('service_factor'))
    return false
  }
  return true
}

