/**
 * The block kinds, by the name written in a fence's info string. Adding a kind
 * means adding its file and one line here (see DEVELOPERS.md).
 */
import { assumptionsKind } from './assumptions.js'
import { chartKind } from './chart.js'
import { conclusionsKind } from './conclusions.js'
import { drawingKind } from './drawing.js'
import { checksKind } from './checks.js'
import { eccentricKind } from './eccentric.js'
import { columnKind } from './column.js'
import { crankRockerSynthesisKind } from './crank-rocker-synthesis.js'
import { functionGeneratorKind } from './function-generator.js'
import { flywheelKind } from './flywheel.js'
import { forcesKind } from './forces.js'
import { pinBearingKind } from './pin-bearing.js'
import { fourBarKind } from './four-bar.js'
import { designInputsKind } from './design-inputs.js'
import type { BlockKind } from './kind.js'
import { sliderCrankKind } from './slider-crank.js'
import { synthesisKind } from './synthesis.js'
import { tableKind } from './table.js'
import { tolerancesKind } from './tolerances.js'
import { studyKind } from './study.js'

/** Every block kind by name. */
export const blockKinds: ReadonlyMap<string, BlockKind> = new Map(
  [designInputsKind, synthesisKind, crankRockerSynthesisKind, functionGeneratorKind, sliderCrankKind, eccentricKind, fourBarKind, forcesKind, flywheelKind, columnKind, pinBearingKind, tolerancesKind, studyKind, checksKind, tableKind, chartKind, drawingKind, assumptionsKind, conclusionsKind].map((k) => [k.name, k]),
)

export type { BlockKind, BlockOutcome, EvaluationContext } from './kind.js'
