/**
 * Eccentric drive: a sheave keyed off-centre on a shaft, a strap round the
 * sheave and a rod to the slider pin. Kinematically the eccentricity is the
 * crank and the strap-to-pin length is the rod, so it is analysed as the
 * equivalent slider-crank; what is its own is the check that the sheave
 * encloses the shaft.
 */

import { LinkageError, mm, requireLength } from './errors.js'
import { GEOMETRY_TOLERANCE } from './math.js'
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
  // A wall equal to the minimum meets it: rounding in the units conversion is not a shortfall.
  if (wall < minimumWall - GEOMETRY_TOLERANCE * sheaveDiameter) {
    const needed = 2 * (eccentricity + shaftDiameter / 2 + minimumWall)
    const [neededText, givenText] = distinct(needed, sheaveDiameter)
    const [wallText, minimumText] = distinct(wall, minimumWall)
    throw new LinkageError(
      'sheave-does-not-enclose-shaft',
      `The sheave (${givenText} diameter) leaves too thin a wall round the shaft (${mm(shaftDiameter)}) at ${mm(eccentricity)} eccentricity: the thinnest wall is ${wallText}, below the ${minimumText} minimum; a sheave of at least ${neededText} is needed`,
      { wall, minimumWall, needed },
    )
  }
  const { eccentricity: _e, strapLength: _s, sheaveDiameter: _d, shaftDiameter: _f, minimumWall: _w, ...rest } = options
  const equivalent = sliderCrank({ ...rest, crank: eccentricity, rod: strapLength })
  return { eccentricity, strapLength, sheaveDiameter, shaftDiameter, minimumWall, wall, equivalent }
}

/** Two lengths printed in mm with as many digits as it takes for the texts to differ (up to 12). */
function distinct(a: number, b: number): [string, string] {
  for (let digits = 6; digits <= 12; digits++) {
    // Rounding dust (a wall of 1e-15 mm) is a wall of 0 mm.
    const [p, q] = [a, b].map((v) => `${String(Number((Math.abs(v * 1000) < 1e-9 ? 0 : v * 1000).toPrecision(digits)))} mm`)
    if (p !== q) return [p!, q!]
  }
  return [mm(a), mm(b)]
}
