/**
 * Input and result shapes of the linkage core. All lengths in metres, angles in
 * radians, times in seconds. Angles are measured counter-clockwise from +x.
 */

/** Sense of crank rotation: +1 counter-clockwise, -1 clockwise. */
export type Rotation = 1 | -1

/**
 * Assembly branch of a slider-crank: +1 puts the slider on the +x side of the
 * crank pin (the usual drawing, slider to the right), -1 on the -x side.
 */
export type SliderSide = 1 | -1

/** Four-bar circuit: the quadrilateral O2-A-B-O4 is either not self-crossing (open) or crossed. */
export type Circuit = 'open' | 'crossed'

/** A crank angle and the value of a quantity there. */
export interface AngleValue {
  /** Crank (input) angle, rad, in [0, 2π). */
  readonly theta: number
  /** The value, in SI units. */
  readonly value: number
}

/** A dead-centre (toggle) position of a slider-crank. */
export interface DeadCentre {
  /** Crank angle, rad, in [0, 2π). */
  readonly theta: number
  /** Slider position along its path, m. */
  readonly position: number
}

/** Angular interval [start, end] in rad, end > start; a full turn is [θ0, θ0 + 2π]. */
export interface AngleRange {
  readonly start: number
  readonly end: number
}
