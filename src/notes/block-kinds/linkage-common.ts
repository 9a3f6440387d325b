/**
 * Inputs every linkage kind shares (crank motion and sense of rotation), and the
 * step from a core error to a positioned message.
 */
import { LinkageError } from '../../linkage/index.js'
import { inNoteUnits } from '../display.js'
import { messages } from '../messages.js'
import { reportError } from '../report.js'
import type { CalcBlock } from '../types.js'
import type { Assumption, EvaluationContext } from './kind.js'
import type { InputSpec } from './inputs.js'
import { ANGLE_ORIGINS } from './angles.js'

/** Speed, angular acceleration and sense of rotation of the driving crank. */
export const motionInputs: readonly InputSpec[] = [
  { name: 'speed', label: 'crank speed', symbol: 'n', kind: 'rotational-speed', required: true },
  { name: 'angular_acceleration', label: 'crank angular acceleration', symbol: '\\alpha', kind: 'angular-acceleration', default: '0 rad/s^2' },
  { name: 'rotation', label: 'sense of crank rotation', symbol: null, kind: 'choice', choices: ['ccw', 'cw'], default: 'ccw' },
]

/** How the block's crank angles are measured: from +x (the default) or from the outer dead centre in the sense of rotation. */
export const anglesFromInput: InputSpec = {
  name: 'angles_from',
  label: 'crank angles measured from',
  symbol: null,
  kind: 'choice',
  choices: ANGLE_ORIGINS,
  default: 'x-axis',
}

/** Sense of rotation as the core's sign. */
export function rotationSign(word: string | undefined): 1 | -1 {
  return word === 'cw' ? -1 : 1
}

/**
 * Run a core call; a LinkageError becomes a positioned message on the block
 * (rule `linkage-error`), anything else is re-thrown as a bug.
 */
export function withLinkage<T>(block: CalcBlock, context: EvaluationContext, run: () => T): T | null {
  try {
    return run()
  } catch (error) {
    if (error instanceof LinkageError) {
      reportError(context.file, 'linkage-error', messages['linkage-error'](`${inNoteUnits(error.message, context.meta.units)} (${error.code})`), block.place, error)
      return null
    }
    throw error
  }
}

/**
 * The assumptions every kinematic analysis makes.
 * @param link the driving link in words ("crank" or "input")
 * @param joints what has no clearance ("pin joints and the slider guide")
 */
export function kinematicAssumptions(from: string, link: 'crank' | 'input', joints: string): Assumption[] {
  return [
    { text: `Links are rigid; ${joints} have no clearance; the motion is planar.`, verify: false, from },
    {
      text: `Velocities and accelerations are for the stated ${link} speed and ${link} angular acceleration applied at every ${link} angle (with zero angular acceleration: constant ${link} speed).`,
      verify: false,
      from,
    },
    { text: 'Kinematics only: forces, friction, elastic deflection, clearances and manufacturing tolerances are not included.', verify: false, from, droppedWith: 'forces' },
  ]
}
