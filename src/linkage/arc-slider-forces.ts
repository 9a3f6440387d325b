/**
 * Forces of a slider on a circular-arc path through its equivalent four-bar:
 * the slider is a point mass at the tip of a massless rocker pivoted at the arc
 * centre, and its load acts along the arc. The rocker's pivot force is the
 * guide's normal force. Guide friction and a counterweight are not modelled here.
 */
import { LinkageError } from './errors.js'
import type { FourBarForceInput } from './four-bar-forces.js'
import { NO_LOAD, sliderLoadForce } from './loads.js'
import { wrapTurn } from './math.js'
import { DX, POSITION, SLIDER_CRANK_STATE, sliderCrankState, type SliderCrankLinkage } from './slider-crank.js'
import type { SliderCrankForceInput, StrokeTiming } from './slider-crank-forces.js'

/** The four-bar force input that stands for an arc-path slider-crank's. */
export function arcSliderForceInput(linkage: SliderCrankLinkage, input: SliderCrankForceInput, timing: StrokeTiming | null): FourBarForceInput {
  const fb = linkage.equivalentFourBar
  if (!fb) throw new LinkageError('invalid-choice', 'A straight-path slider-crank takes its forces in closed form (slider-crank-forces.ts)')
  if (input.friction > 0) throw new LinkageError('invalid-choice', 'Guide friction on an arc path is not modelled: give friction 0 or a straight path')
  if (input.masses.counterweight > 0) throw new LinkageError('invalid-choice', 'A counterweight on an arc-path slider-crank is not modelled: add its effect to the crank')
  const m = input.masses
  const kin = new Float64Array(SLIDER_CRANK_STATE)
  const radius = linkage.pathRadius
  return {
    masses: {
      input: m.crank,
      inputCentre: m.crankCentre,
      inputInertia: m.crankInertia,
      coupler: m.rod,
      couplerCentre: m.rodCentre,
      couplerCentreAngle: 0,
      couplerInertia: m.rodInertia,
      // The slider as a point at the rocker's tip B.
      output: m.slider,
      outputCentre: fb.output,
      outputInertia: m.slider * fb.output * fb.output,
    },
    outputLoad: NO_LOAD,
    outputLoadSense: 1,
    gravity: input.gravity,
    // The load along the arc (+s), turned into a force along the rocker's counter-clockwise tangent.
    tangentialForce(theta2: number): number {
      if (!sliderCrankState(linkage, theta2, kin)) return Number.NaN
      const outstroke = timing
        ? wrapTurn(linkage.rotation * (theta2 - timing.innerAngle)) <= timing.outstrokeAngle + 1e-12
        : kin[DX]! * linkage.rotation * linkage.sliderSide > 0
      const travel = timing ? Math.abs(timing.outerPosition - kin[POSITION]!) : 0
      return Math.sign(radius) * sliderLoadForce(input.load, theta2, kin[POSITION]!, travel, outstroke, linkage.sliderSide)
    },
  }
}
