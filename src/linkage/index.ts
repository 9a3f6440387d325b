/**
 * The linkage core: pure kinematics in SI units (m, rad, s). No I/O.
 */
export { LinkageError, type LinkageErrorCode, type LinkageWarning, type LinkageWarningCode } from './errors.js'
export * from './types.js'
export { TAU, DEG, GEOMETRY_TOLERANCE, wrapTurn, wrapHalfTurn, includedAngle } from './math.js'
export {
  sliderCrank,
  sliderCrankState,
  sliderPosition,
  sliderVelocityCoefficient,
  sliderAccelerationCoefficient,
  sliderVelocity,
  sliderAcceleration,
  rodAngle,
  rodObliquity,
  POSITION,
  DX,
  DDX,
  ROD_ANGLE,
  DPHI,
  DDPHI,
  TRANSMISSION,
  SLIDER_CRANK_STATE,
  type SliderCrankInput,
  type SliderCrankLinkage,
  type SliderCrankDriver,
} from './slider-crank.js'
export { analyseSliderCrank, crankRange, type SliderCrankAnalysis, type SliderCrankExtremes, type AnalysisOptions } from './slider-crank-analysis.js'
export { SliderCrankSweep, type CrankMotion } from './slider-crank-sweep.js'
export {
  fourBar,
  grashof,
  solveFourBar,
  fourBarState,
  branchSign,
  fourBarRange,
  fourBarToggles,
  THETA3,
  THETA4,
  H3,
  H4,
  H3P,
  H4P,
  FOUR_BAR_STATE,
  type FourBarBranch,
  type FourBarInput,
  type FourBarLinkage,
  type FourBarRange,
  type FourBarToggle,
  type GrashofClass,
  type GrashofResult,
} from './four-bar.js'
export { analyseFourBar, type FourBarAnalysis, type FourBarExtremes } from './four-bar-analysis.js'
export { FourBarSweep } from './four-bar-sweep.js'
export { eccentric, type EccentricInput, type EccentricLinkage } from './eccentric.js'
export { findExtreme, extremesOf, inRange, type Extremes } from './extremes.js'
export { synthesiseSliderCrank, type SliderCrankSynthesis } from './synthesis.js'
