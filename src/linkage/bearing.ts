/**
 * Pin bearings: projected bearing pressure p = F/(d·L), sliding speed at the pin
 * surface from the relative rotation of the two links, and their product pV.
 * Pure, SI.
 */
import { LinkageError } from './errors.js'

/** Projected pressure of a pin of diameter d and bearing length L under a radial load F (N): Pa. */
export function bearingPressure(force: number, diameter: number, length: number): number {
  if (!(diameter > 0) || !(length > 0)) throw new LinkageError('invalid-length', `A pin needs a positive diameter and bearing length, got ${diameter} m and ${length} m`)
  return Math.abs(force) / (diameter * length)
}

/** Sliding speed at a pin's surface for a relative angular velocity (rad/s) of the links it joins: m/s. */
export function slidingSpeed(relativeAngularVelocity: number, diameter: number): number {
  return (Math.abs(relativeAngularVelocity) * diameter) / 2
}
