/**
 * `eccentric` blocks: an eccentric sheave and strap driving a slider, analysed
 * as its equivalent slider-crank, with the check that the sheave encloses the shaft.
 */
import { analyseSliderCrank, eccentric } from '../../linkage/index.js'
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
import { publish, quantity, tex, texBare } from './values.js'

const specs: readonly InputSpec[] = [
  { name: 'eccentricity', label: 'eccentricity (sheave centre to shaft axis): the equivalent crank radius', symbol: 'a', kind: 'length', required: true },
  { name: 'strap', label: 'strap and rod length (sheave centre to pin): the equivalent rod', symbol: 'b', kind: 'length', required: true },
  { name: 'sheave_diameter', label: 'sheave outside diameter', symbol: 'D', kind: 'length', required: true },
  { name: 'shaft_diameter', label: 'shaft diameter', symbol: 'd', kind: 'length', required: true },
  { name: 'minimum_wall', label: 'least sheave wall to leave round the shaft', symbol: 'w_{\\min}', kind: 'length', default: '0 mm' },
  { name: 'offset', label: 'offset of the slider path from the shaft axis', symbol: 'e', kind: 'length', default: '0 mm' },
  ...motionInputs,
  { name: 'slider_side', label: 'side of the shaft the slider works on', symbol: null, kind: 'choice', choices: ['right', 'left'], default: 'right' },
  { name: 'driver', label: 'driving link', symbol: null, kind: 'choice', choices: ['crank', 'slider'], default: 'crank' },
  anglesFromInput,
]

export const eccentricKind: BlockKind = {
  name: 'eccentric',
  label: 'Eccentric drive',
  needsId: true,
  dependencies: (block, ids) => inputDependencies(block, specs, ids),
  evaluate(block, context) {
    const inputs = readInputs(block, specs, 'eccentric', context)
    if (!inputs) return null
    const { si, words } = inputs
    const built = withLinkage(block, context, () => {
      const drive = eccentric({
        eccentricity: si.eccentricity!,
        strapLength: si.strap!,
        sheaveDiameter: si.sheave_diameter!,
        shaftDiameter: si.shaft_diameter!,
        minimumWall: si.minimum_wall ?? 0,
        offset: si.offset ?? 0,
        sliderSide: words.slider_side === 'left' ? -1 : 1,
        rotation: rotationSign(words.rotation),
        driver: words.driver === 'slider' ? 'slider' : 'crank',
      })
      return { drive, analysis: analyseSliderCrank(drive.equivalent, { speed: si.speed!, angularAcceleration: si.angular_acceleration ?? 0 }) }
    })
    if (!built) return null
    const { drive, analysis } = built
    const { meta } = context
    const view = sliderCrankView(analysis, words.angles_from)
    const results = [quantity('sheave_wall', 'thinnest sheave wall round the shaft', 'w', 'length', drive.wall), ...sliderCrankResults(view)]
    const extremes = sliderCrankExtremes(view)
    publish(context, block.id, [...asNamed(inputs.values), ...results, ...extremesValues(extremes)])
    const wallStep = {
      label: 'Sheave encloses the shaft',
      formula: 'w = \\frac{D}{2} - a - \\frac{d}{2} \\ \\ge\\ w_{\\min}',
      substituted: `w = \\frac{${texBare(meta, drive.sheaveDiameter, 'length')}}{2} - ${texBare(meta, drive.eccentricity, 'length')} - \\frac{${texBare(meta, drive.shaftDiameter, 'length')}}{2}`,
      result: `w = ${tex(meta, drive.wall, 'length')} \\ \\ge\\ ${tex(meta, drive.minimumWall, 'length')}`,
      note: 'The eccentric acts as a crank whose radius is its eccentricity a, and the strap as a rod of length b: the slider-crank relations below apply unchanged. A wall equal to the minimum (within 1e-12 of the sheave diameter) meets it.',
    }
    const from = block.id ?? 'eccentric'
    return outcome(block, 'Eccentric drive', {
      covers: ['kinematics'],
      inputs: inputs.values,
      results,
      method: [wallStep, ...sliderCrankMethod(view, context)],
      warnings: sliderCrankWarnings(view, block, context),
      assumptions: [
        { text: 'The eccentric sheave acts as a crank of radius equal to its eccentricity; friction between strap and sheave is not included.', verify: false, from },
        ...sliderCrankAssumptions(analysis, from),
      ],
      summary: ['sheave_wall', ...summaryNames(analysis)],
      extremes,
      sweep: view.source,
      core: { type: 'slider-crank', analysis },
    })
  },
}
