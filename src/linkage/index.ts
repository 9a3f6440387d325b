/**
 * The linkage core: pure kinematics in SI units (m, rad, s). No I/O.
 */
export { LinkageError, type LinkageErrorCode, type LinkageWarning, type LinkageWarningCode } from './errors.js'
export * from './types.js'
export { TAU, DEG, GEOMETRY_TOLERANCE, wrapTurn, wrapHalfTurn, includedAngle } from './math.js'
export {
  sliderCrank,
  sliderCrankState,
  sliderCrankForceKinematics,
  ROD_COS,
  ROD_SIN,
  CRANK_COS,
  CRANK_SIN,
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
export {
  synthesiseSliderCrank,
  sliderCrankAtOffset,
  sliderCrankFamily,
  bestTransmissionSliderCrank,
  sliderCrankRange,
  sliderCrankWith,
  inlineSliderCrank,
  excessAngle,
  type SliderCrankSynthesis,
  type SliderCrankDesign,
  type FeasibleInterval,
  type InlineDesign,
} from './synthesis.js'
export { crankRockerAt, bestCrankRocker, unitTimeRatioCrankRocker, functionGenerator, chebyshevPoints, type CrankRockerDesign, type FunctionGenerator } from './four-bar-synthesis.js'
export { constantLoad, interpolate, loadTable, sliderLoadForce, NO_LOAD, type Load, type LoadAbscissa, type LoadSense, type LoadStroke } from './loads.js'
export {
  F,
  FORCE_STATE,
  MASSLESS,
  SliderCrankForceSweep,
  checkMasses,
  sliderCrankForceState,
  type SliderCrankForceInput,
  type SliderCrankMasses,
  type StrokeTiming,
} from './slider-crank-forces.js'
export { analyseSliderCrankForces, SLIDER_CRANK_FORCE_MEASURES, type SliderCrankForceAnalysis, type ForceMeasure } from './slider-crank-force-analysis.js'
export { FB, FOUR_BAR_FORCE_STATE, FourBarForceSweep, checkFourBarMasses, fourBarForceState, type FourBarForceInput, type FourBarMasses } from './four-bar-forces.js'
export { analyseFourBarForces, FOUR_BAR_FORCE_MEASURES, type FourBarForceAnalysis, type FourBarForceMeasure } from './four-bar-force-analysis.js'
export { energyFluctuation, flywheelDesign, flywheelInertia, speedFluctuation, type EnergyFluctuation, type FlywheelDesign, type FlywheelForm } from './flywheel.js'
export { column, sectionProperties, type ColumnPlane, type ColumnResult, type ColumnSection, type SectionProperties } from './column.js'
export { bearingPressure, slidingSpeed } from './bearing.js'
export { harmonic, integrate, mean, rms } from './cycle.js'
export { arcSliderForceInput } from './arc-slider-forces.js'
export { SLIDER_CRANK_RESPONSE, CRANK_ROCKER_RESPONSE, spread, monteCarlo, sampleStatistics, clearanceEffect, type Toleranced, type Response, type ResultSpread, type MonteCarlo } from './tolerance.js'
export { crankRockerToggles } from './four-bar-synthesis.js'
