/**
 * Crank-angle conventions: the core measures θ counter-clockwise from +x; a
 * block may show its angles that way or from the outer dead centre in the sense
 * of rotation (so that angles grow with time, as an engineer reads a cycle).
 * Results, tables, charts and the drawing of a block all use its one convention.
 */
import type { AngleConvention, SweepSource } from './kind.js'

const TURN = 2 * Math.PI

/** The words a block's `angles_from` input takes. */
export const ANGLE_ORIGINS = ['x-axis', 'outer-dead-centre'] as const

/**
 * A block's convention.
 * @param what "crank" or "input"
 * @param outer core angle of the outer dead centre (extended toggle), or null when there is none in range
 */
export function angleConvention(choice: string | undefined, what: 'crank' | 'input', rotation: 1 | -1, outer: number | null): AngleConvention {
  const sense = rotation === 1 ? 'counter-clockwise' : 'clockwise'
  if (choice === 'outer-dead-centre' && outer !== null) {
    return {
      label: `${what} angle from outer dead centre`,
      words: `measured from the outer dead centre in the sense of rotation (${sense}), so that it grows with time`,
      origin: outer,
      sense: rotation,
      reference: 'outer-dead-centre',
    }
  }
  return {
    label: `${what} angle`,
    words: `measured counter-clockwise from +x (the ${what} turns ${sense})`,
    origin: 0,
    sense: 1,
    reference: what === 'input' ? 'ground-line' : 'x-axis',
  }
}

/** Display angles of a core range, ascending: [start, end]. */
export function displayRange(convention: AngleConvention, start: number, end: number, full: boolean, turns: 1 | 2): [number, number] {
  if (full) {
    const d0 = convention.sense === 1 ? start - convention.origin : 0
    const first = convention.reference === 'outer-dead-centre' ? 0 : wrapInto(d0, 0, TURN)
    return [first, first + TURN * turns]
  }
  const a = convention.sense * (start - convention.origin)
  const b = convention.sense * (end - convention.origin)
  return a <= b ? [a, b] : [b, a]
}

/** A core angle in a source's display convention (wrapped into its display range). */
export function toDisplay(source: Pick<SweepSource, 'convention' | 'displayStart' | 'displayEnd' | 'fullTurn' | 'periodTurns'>, theta: number): number {
  const d = source.convention.sense * (theta - source.convention.origin)
  if (source.fullTurn) return wrapInto(d, source.displayStart, TURN * source.periodTurns)
  // A limited range: the nearest whole-turn shift into it.
  const shifted = d + TURN * Math.round((source.displayStart + source.displayEnd) / 2 / TURN - d / TURN)
  return shifted
}

/** A display angle back to the core's angle. */
export function toCore(source: Pick<SweepSource, 'convention'>, display: number): number {
  return source.convention.origin + source.convention.sense * display
}

/** How far into the cycle a core angle is, in the sense of rotation from the time origin, rad: rows sort by it. */
export function travel(source: Pick<SweepSource, 'rotation' | 'timeOrigin' | 'fullTurn' | 'periodTurns' | 'start'>, theta: number): number {
  if (!source.fullTurn) return source.rotation * (theta - source.start)
  return wrapInto(source.rotation * (theta - source.timeOrigin), 0, TURN * source.periodTurns)
}

/** value reduced into [from, from + period), with values within 1e-9 of the top taken as the bottom. */
function wrapInto(value: number, from: number, period: number): number {
  const offset = (((value - from) % period) + period) % period
  return from + (offset > period - 1e-9 ? 0 : offset)
}
