/**
 * Eccentric drive: a sheave keyed off-centre on a shaft, a strap round the
 * sheave and a rod to the slider pin. Kinematically the eccentricity is the
 * crank and the strap-to-pin length is the rod, so it is analysed as the
 * equivalent slider-crank; what is its own is the check that the sheave
 * encloses the shaft.
 */

import { LinkageError, mm, requireLength } from './errors.js'
import { sliderCrank, type SliderCrankInput, type SliderCrankLinkage } from './slider-crank.js'

/** Options for {@link eccentric}. */
export interface EccentricInput extends Omit<SliderCrankInput, 'crank' | 'rod'> {
  /** Offset of the sheave centre from the shaft axis, m. */
  readonly eccentricity: number
  /** Length from the sheave centre to the slider pin (strap and rod), m. */
  readonly strapLength: number
  /** Outside diameter of the sheave, m. */
  readonly sheaveDiameter: number
  /** Diameter of the shaft (or its bore in the sheave), m. */
  readonly shaftDiameter: number
  /** Least radial wall of sheave metal to leave round the shaft, m. Default 0. */
  readonly minimumWall?: number | null
}

/** A checked eccentric and its equivalent slider-crank. */
export interface EccentricLinkage {
  readonly eccentricity: number
  readonly strapLength: number
  readonly sheaveDiameter: number
  readonly shaftDiameter: number
  readonly minimumWall: number
  /** Thinnest radial wall between the shaft and the sheave rim, R_sheave − e − r_shaft, m. */
  readonly wall: number
  readonly equivalent: SliderCrankLinkage
}

/**
 * Check an eccentric and build its equivalent slider-crank.
 * Throws {@link LinkageError} `sheave-does-not-enclose-shaft` when the thinnest wall is below the minimum.
 */
export function eccentric(options: EccentricInput): EccentricLinkage {
  requireLength('eccentricity', options.eccentricity)
  requireLength('strap (sheave centre to pin)', options.strapLength)
  requireLength('sheave diameter', options.sheaveDiameter)
  requireLength('shaft diameter', options.shaftDiameter)
  const minimumWall = options.minimumWall ?? 0
  if (!(minimumWall >= 0) || !Number.isFinite(minimumWall)) {
    throw new LinkageError('invalid-length', `The minimum wall round the shaft must be zero or more, got ${mm(minimumWall)}`)
  }
  const { eccentricity, strapLength, sheaveDiameter, shaftDiameter } = options
  const wall = sheaveDiameter / 2 - eccentricity - shaftDiameter / 2
  if (wall < minimumWall) {
    const needed = 2 * (eccentricity + shaftDiameter / 2 + minimumWall)
    throw new LinkageError(
      'sheave-does-not-enclose-shaft',
      `The sheave (${mm(sheaveDiameter)} diameter) does not enclose the shaft (${mm(shaftDiameter)}) at ${mm(eccentricity)} eccentricity with ${mm(minimumWall)} wall: the thinnest wall is ${mm(wall)}; a sheave of at least ${mm(needed)} is needed`,
      { wall, minimumWall, needed },
    )
  }
  const { eccentricity: _e, strapLength: _s, sheaveDiameter: _d, shaftDiameter: _f, minimumWall: _w, ...rest } = options
  const equivalent = sliderCrank({ ...rest, crank: eccentricity, rod: strapLength })
  return { eccentricity, strapLength, sheaveDiameter, shaftDiameter, minimumWall, wall, equivalent }
}
