/**
 * `slider-crank` blocks: in-line, offset or arc-path slider-crank, crank- or
 * slider-driven.
 */
import { analyseSliderCrank, sliderCrank } from '../../linkage/index.js'
import { inputDependencies, readInputs, type InputSpec } from './inputs.js'
import { outcome, type BlockKind } from './kind.js'
import { anglesFromInput, motionInputs, rotationSign, withLinkage } from './linkage-common.js'
import { extremesValues } from './extremes.js'
import {
  asNamed,
  sliderCrankAssumptions,
  sliderCrankExtremes,
  sliderCrankMethod,
  sliderCrankResults,
  sliderCrankView,
  sliderCrankWarnings,
  summaryNames,
} from './slider-crank-outcome.js'
import { publish } from './values.js'

const specs: readonly InputSpec[] = [
  { name: 'crank', label: 'crank radius', symbol: 'a', kind: 'length', required: true },
  { name: 'rod', label: 'connecting-rod length (pin centres)', symbol: 'b', kind: 'length', required: true },
  { name: 'offset', label: 'offset of the slider path from the crank axis', symbol: 'e', kind: 'length', default: '0 mm' },
  ...motionInputs,
  { name: 'slider_side', label: 'side of the crank axis the slider works on', symbol: null, kind: 'choice', choices: ['right', 'left'], default: 'right' },
  { name: 'driver', label: 'driving link', symbol: null, kind: 'choice', choices: ['crank', 'slider'], default: 'crank' },
  { name: 'path_radius', label: 'radius of an arc slider path', symbol: 'R', kind: 'length', word: 'straight', default: 'straight' },
  { name: 'path_tangent', label: 'x of the point where the arc path touches the offset line', symbol: 'x_t', kind: 'length' },
  anglesFromInput,
]

export const sliderCrankKind: BlockKind = {
  name: 'slider-crank',
  label: 'Slider-crank',
  needsId: true,
  dependencies: (block, ids) => inputDependencies(block, specs, ids),
  evaluate(block, context) {
    const inputs = readInputs(block, specs, 'slider-crank', context)
    if (!inputs) return null
    const { si, words } = inputs
    const analysis = withLinkage(block, context, () => {
      const linkage = sliderCrank({
        crank: si.crank!,
        rod: si.rod!,
        offset: si.offset ?? 0,
        sliderSide: words.slider_side === 'left' ? -1 : 1,
        rotation: rotationSign(words.rotation),
        driver: words.driver === 'slider' ? 'slider' : 'crank',
        pathRadius: si.path_radius ?? null,
        pathTangentX: si.path_tangent ?? null,
      })
      return analyseSliderCrank(linkage, { speed: si.speed!, angularAcceleration: si.angular_acceleration ?? 0 })
    })
    if (!analysis) return null
    const view = sliderCrankView(analysis, words.angles_from)
    const results = sliderCrankResults(view)
    const extremes = sliderCrankExtremes(view)
    publish(context, block.id, [...asNamed(inputs.values), ...results, ...extremesValues(extremes)])
    return outcome(block, 'Slider-crank', {
      covers: ['kinematics'],
      inputs: inputs.values,
      results,
      extremes,
      method: sliderCrankMethod(view, context),
      warnings: sliderCrankWarnings(view, block, context),
      assumptions: sliderCrankAssumptions(analysis, block.id ?? 'slider-crank'),
      summary: summaryNames(analysis),
      sweep: view.source,
      core: { type: 'slider-crank', analysis },
    })
  },
}
