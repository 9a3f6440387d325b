/**
 * The core at and just past the edges of its domain (fast-check, seeded): rod
 * exactly crank + |offset|, a hair shorter or longer, near-toggle four-bars and
 * change-point (Grashof-equal) ones, tiny and huge length ratios. The core
 * either refuses with a typed LinkageError or returns finite key results
 * whose positions close the loop; never a NaN stroke or an untyped throw.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { LinkageError, analyseFourBar, analyseSliderCrank, fourBar, sliderCrank } from '../../src/linkage/index.js'

const runs = { numRuns: 1500, seed: 20261203 }
const sign = fc.constantFrom(1 as const, -1 as const)
/** Relative nudges around an exact edge: exactly on it, within rounding, and a little either side. */
const nudge = fc.constantFrom(0, 1e-15, -1e-15, 1e-12, -1e-12, 1e-9, -1e-9, 1e-6, -1e-6, 1e-3, -1e-3)
/** Scales from a watch part to a ship engine, and ratios far from 1. */
const scale = fc.constantFrom(1e-4, 1e-2, 1, 10, 1e3)

/** Either a typed refusal or the value; anything else fails the test. */
function attempt<T>(fn: () => T): T | LinkageError {
  try {
    return fn()
  } catch (error) {
    expect(error, String(error)).toBeInstanceOf(LinkageError)
    return error as LinkageError
  }
}

const finiteOrNull = (value: number | null) => value === null || Number.isFinite(value)

describe('slider-crank at the edge of assembly', () => {
  it('should refuse or give a finite stroke, time ratio and transmission angle, with the loop closed at the dead centres', () => {
    fc.assert(
      fc.property(scale, fc.double({ min: 0, max: 2, noNaN: true }), nudge, sign, sign, (a, offsetRatio, eps, side, rotation) => {
        const offset = side * offsetRatio * a
        const rod = (a + Math.abs(offset)) * (1 + eps)
        const result = attempt(() => {
          const linkage = sliderCrank({ crank: a, rod, offset, rotation })
          return { linkage, analysis: analyseSliderCrank(linkage, { speed: 10 }) }
        })
        if (result instanceof LinkageError) {
          expect(result.code).toBeTruthy()
          return
        }
        const { analysis } = result
        expect(Number.isFinite(analysis.stroke), `stroke ${analysis.stroke}`).toBe(true)
        expect(analysis.stroke).toBeGreaterThanOrEqual(0)
        expect(finiteOrNull(analysis.timeRatio)).toBe(true)
        expect(Number.isFinite(analysis.transmissionMin.value) || analysis.transmissionMin.value === Number.POSITIVE_INFINITY).toBe(true)
        // Stroke within the bounds of geometry: at least 2a for a full turn, never more than 2(a + b).
        if (analysis.fullRotation) expect(analysis.stroke).toBeGreaterThanOrEqual(2 * a * (1 - 1e-9))
        expect(analysis.stroke).toBeLessThanOrEqual(2 * (a + rod) * (1 + 1e-9))
        for (const dc of [analysis.outerDeadCentre, analysis.innerDeadCentre]) {
          if (!dc) continue
          const x = dc.position
          expect(Number.isFinite(x), `dead-centre position ${x}`).toBe(true)
          // The loop closes: the rod spans crank pin to slider.
          const px = a * Math.cos(dc.theta)
          const py = a * Math.sin(dc.theta)
          expect(Math.hypot(x - px, offset - py) / rod).toBeCloseTo(1, 6)
        }
      }),
      runs,
    )
  })

  it('should refuse a rod shorter than crank + |offset| by more than rounding as a crank that cannot turn, never as NaN', () => {
    const linkage = attempt(() => sliderCrank({ crank: 0.05, rod: 0.06, offset: 0.02 }))
    if (linkage instanceof LinkageError) return
    const analysis = analyseSliderCrank(linkage, { speed: 1 })
    expect(analysis.fullRotation).toBe(false)
    expect(Number.isFinite(analysis.stroke)).toBe(true)
  })
})

describe('four-bar at toggles and change points', () => {
  it('should refuse or give finite ranges and transmission angles at Grashof equality and near it', () => {
    fc.assert(
      fc.property(
        scale,
        fc.double({ min: 0.05, max: 20, noNaN: true }),
        fc.double({ min: 0.05, max: 20, noNaN: true }),
        fc.double({ min: 0.05, max: 20, noNaN: true }),
        nudge,
        (unit, r1, r2, r3, eps) => {
          // Four lengths with s + l = p + q exactly, then nudged: the change point and its neighbours.
          const [s, p, q] = [r1, r2, r3].sort((x, y) => x - y) as [number, number, number]
          const l = (p + q - s) * (1 + eps)
          const lengths = [s, p, q, l].map((x) => x * unit)
          const result = attempt(() => {
            const linkage = fourBar({ ground: lengths[3]!, input: lengths[0]!, coupler: lengths[1]!, output: lengths[2]! })
            return analyseFourBar(linkage, { speed: 1 })
          })
          if (result instanceof LinkageError) return
          const analysis = result as unknown as Record<string, unknown>
          for (const [key, value] of Object.entries(analysis)) {
            if (typeof value === 'number') expect(Number.isNaN(value), `${key} is NaN`).toBe(false)
          }
        },
      ),
      runs,
    )
  })
})

describe('the isosceles slider-crank (rod equal to the crank, no offset)', () => {
  it('should warn of its change points, and not for a rod a little longer', () => {
    // With b = a and e = 0, x = a cos θ + a |cos θ|: the slider rests at the crank centre from 90° to 270°
    // (the closed form written out here), and the rod folds onto the crank at both ends of that dwell.
    const equal = analyseSliderCrank(sliderCrank({ crank: 0.1, rod: 0.1 }), { speed: 1 })
    expect(equal.warnings.map((w) => w.code)).toContain('change-point-linkage')
    expect(equal.stroke).toBeCloseTo(0.2, 12)
    const longer = analyseSliderCrank(sliderCrank({ crank: 0.1, rod: 0.101 }), { speed: 1 })
    expect(longer.warnings.map((w) => w.code)).not.toContain('change-point-linkage')
  })
})
