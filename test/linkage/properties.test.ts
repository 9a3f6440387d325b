/**
 * Invariants over thousands of random valid linkages (fast-check): loop closure,
 * derivatives against central differences, sweep extremes against the dead
 * centres, stroke and time-ratio bounds, and the long-output four-bar converging
 * on the straight-path slider-crank.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { expectClose } from '../helpers/close.js'
import {
  DDX,
  DX,
  FOUR_BAR_STATE,
  H3,
  H3P,
  H4,
  H4P,
  POSITION,
  TRANSMISSION,
  SLIDER_CRANK_STATE,
  SliderCrankSweep,
  THETA3,
  THETA4,
  analyseFourBar,
  analyseSliderCrank,
  fourBar,
  fourBarRange,
  grashof,
  sliderCrank,
  sliderCrankState,
  sliderPosition,
  solveFourBar,
} from '../../src/linkage/index.js'

const runs = { numRuns: 2000, seed: 20261202 }

/** A slider-crank whose crank turns fully with some margin (b ≥ (a + |h|)(1 + 2 %)). */
const fullTurnSliderCrank = fc
  .record({
    crank: fc.double({ min: 1e-3, max: 1, noNaN: true }),
    offsetRatio: fc.double({ min: -0.9, max: 0.9, noNaN: true }),
    rodRatio: fc.double({ min: 1.02, max: 12, noNaN: true }),
    side: fc.constantFrom(1 as const, -1 as const),
    rotation: fc.constantFrom(1 as const, -1 as const),
  })
  .map(({ crank, offsetRatio, rodRatio, side, rotation }) => {
    const offset = offsetRatio * crank
    return { crank, offset, rod: rodRatio * (crank + Math.abs(offset)), sliderSide: side, rotation }
  })

const angle = fc.double({ min: 0, max: 2 * Math.PI, noNaN: true })

describe('slider-crank invariants', () => {
  it('should close the loop: |B − A| = rod with B on the path', () => {
    fc.assert(
      fc.property(fullTurnSliderCrank, angle, (input, theta) => {
        const x = sliderPosition(input.crank, input.rod, input.offset, input.sliderSide, theta)
        const residual = Math.hypot(x - input.crank * Math.cos(theta), input.offset - input.crank * Math.sin(theta)) - input.rod
        expect(Math.abs(residual)).toBeLessThanOrEqual(1e-9 * input.rod)
      }),
      runs,
    )
  })

  it('should have velocity and acceleration coefficients equal to central differences of position', () => {
    fc.assert(
      fc.property(fullTurnSliderCrank, angle, (input, theta) => {
        const linkage = sliderCrank(input)
        const state = new Float64Array(SLIDER_CRANK_STATE)
        const h = 1e-4
        const x = (t: number): number => sliderPosition(input.crank, input.rod, input.offset, input.sliderSide, t)
        sliderCrankState(linkage, theta, state)
        const dx = (x(theta + h) - x(theta - h)) / (2 * h)
        const ddx = (x(theta + h) - 2 * x(theta) + x(theta - h)) / (h * h)
        // Truncation error ~h²·x‴ and rounding ~ε·x/h²; both scale with the crank and
        // grow as the rod nears its shortest (1/(b − a − |h|)³ terms), hence the margin.
        const scale = input.crank * (1 + (input.crank / (input.rod - input.crank - Math.abs(input.offset))) ** 3)
        expect(Math.abs(state[DX]! - dx)).toBeLessThanOrEqual(1e-6 * scale)
        expect(Math.abs(state[DDX]! - ddx)).toBeLessThanOrEqual(1e-4 * scale)
      }),
      runs,
    )
  })

  it('should put the swept extremes at the dead-centre positions', () => {
    fc.assert(
      fc.property(fullTurnSliderCrank, (input) => {
        const linkage = sliderCrank(input)
        const result = analyseSliderCrank(linkage, { speed: 1 })
        const count = 721
        const sweep = new SliderCrankSweep(linkage, count).update({ start: 0, end: 2 * Math.PI }, { speed: 1 })
        const outer = result.outerDeadCentre!.position
        const inner = result.innerDeadCentre!.position
        const [far, near] = input.sliderSide === 1 ? [Math.max(...sweep.position), Math.min(...sweep.position)] : [Math.min(...sweep.position), Math.max(...sweep.position)]
        // No sample passes a dead centre; the nearest sample is within a step's sag.
        const step = (2 * Math.PI) / (count - 1)
        const sag = 4 * input.crank * (1 + input.crank / (input.rod - input.crank - Math.abs(input.offset))) * step * step
        const tol = 1e-12 * (input.crank + input.rod)
        expect(input.sliderSide * (far - outer)).toBeLessThanOrEqual(tol)
        expect(input.sliderSide * (outer - far)).toBeLessThanOrEqual(sag)
        expect(input.sliderSide * (inner - near)).toBeLessThanOrEqual(tol)
        expect(input.sliderSide * (near - inner)).toBeLessThanOrEqual(sag)
        // And the positions reported at the dead centres are the positions there.
        expect(Math.abs(sliderPosition(input.crank, input.rod, input.offset, input.sliderSide, result.outerDeadCentre!.theta) - outer)).toBeLessThanOrEqual(tol)
      }),
      { ...runs, numRuns: 500 },
    )
  })

  it('should give a stroke of at least twice the crank, the closed-form stroke, and a time ratio ≥ 1', () => {
    fc.assert(
      fc.property(fullTurnSliderCrank, (input) => {
        const result = analyseSliderCrank(sliderCrank(input), { speed: 1 })
        const { crank: a, rod: b, offset: h } = input
        const closed = Math.sqrt((a + b) ** 2 - h * h) - Math.sqrt((b - a) ** 2 - h * h)
        expect(result.stroke).toBeGreaterThanOrEqual(2 * a * (1 - 1e-12))
        expect(Math.abs(result.stroke - closed)).toBeLessThanOrEqual(1e-12 * (a + b))
        expect(result.timeRatio!).toBeGreaterThanOrEqual(1)
        expect(Math.abs(result.instrokeAngle! + result.outstrokeAngle! - 2 * Math.PI)).toBeLessThan(1e-12)
      }),
      { ...runs, numRuns: 500 },
    )
  })
})

/** A four-bar that can assemble: the longest link shorter than the other three. */
const fourBarLinks = fc
  .tuple(
    fc.double({ min: 0.05, max: 1, noNaN: true }),
    fc.double({ min: 0.05, max: 1, noNaN: true }),
    fc.double({ min: 0.05, max: 1, noNaN: true }),
    fc.double({ min: 0.05, max: 1, noNaN: true }),
    fc.constantFrom('open' as const, 'crossed' as const),
  )
  .filter(([d, a, b, c]) => {
    const longest = Math.max(d, a, b, c)
    return longest < 0.98 * (d + a + b + c - longest)
  })

describe('four-bar invariants', () => {
  it('should close the loop and match central differences wherever it assembles away from toggles', () => {
    fc.assert(
      fc.property(fourBarLinks, angle, ([d, a, b, c, circuit], theta) => {
        const linkage = fourBar({ ground: d, input: a, coupler: b, output: c, circuit })
        const state = new Float64Array(FOUR_BAR_STATE)
        const ok = solveFourBar(a, b, c, d, 0, linkage.circuitSign, theta, state)
        if (!ok || Math.abs(Math.sin(state[THETA3]! - state[THETA4]!)) < 0.05) return
        const bx = a * Math.cos(theta) + b * Math.cos(state[THETA3]!)
        const by = a * Math.sin(theta) + b * Math.sin(state[THETA3]!)
        expect(Math.abs(Math.hypot(bx - d, by) - c)).toBeLessThanOrEqual(1e-9 * c)
        const h = 1e-5
        const around = new Float64Array(FOUR_BAR_STATE)
        const plus = new Float64Array(FOUR_BAR_STATE)
        const minus = new Float64Array(FOUR_BAR_STATE)
        if (!solveFourBar(a, b, c, d, 0, linkage.circuitSign, theta + h, plus)) return
        if (!solveFourBar(a, b, c, d, 0, linkage.circuitSign, theta - h, minus)) return
        around.set(state)
        const diff = (i: number): number => Math.atan2(Math.sin(plus[i]! - minus[i]!), Math.cos(plus[i]! - minus[i]!)) / (2 * h)
        const scale = 1 + Math.abs(state[H3]!) + Math.abs(state[H4]!)
        expect(Math.abs(diff(THETA3) - around[H3]!)).toBeLessThanOrEqual(1e-5 * scale ** 3)
        expect(Math.abs(diff(THETA4) - around[H4]!)).toBeLessThanOrEqual(1e-5 * scale ** 3)
        expect(Math.abs((plus[H3]! - minus[H3]!) / (2 * h) - around[H3P]!)).toBeLessThanOrEqual(1e-4 * scale ** 5)
        expect(Math.abs((plus[H4]! - minus[H4]!) / (2 * h) - around[H4P]!)).toBeLessThanOrEqual(1e-4 * scale ** 5)
      }),
      runs,
    )
  })

  it('should agree with Grashof: the input turns fully exactly when it is shortest (or the ground is)', () => {
    fc.assert(
      fc.property(fourBarLinks, ([d, a, b, c, circuit]) => {
        const klass = grashof(d, a, b, c)
        if (klass.condition === 'change-point') return
        const range = fourBarRange(fourBar({ ground: d, input: a, coupler: b, output: c, circuit }))
        expect(range.full).toBe(klass.inputTurnsFully)
      }),
      runs,
    )
  })

  it('should have a crank-rocker time ratio ≥ 1 and transmission extremes within [0, 180°]', () => {
    fc.assert(
      fc.property(fourBarLinks, ([d, a, b, c, circuit]) => {
        if (grashof(d, a, b, c).className !== 'crank-rocker') return
        const result = analyseFourBar(fourBar({ ground: d, input: a, coupler: b, output: c, circuit }), { speed: 1 }, { samples: 181 })
        expect(result.timeRatio!).toBeGreaterThanOrEqual(1)
        expect(result.transmissionMin.value).toBeGreaterThanOrEqual(0)
        expect(result.transmissionMax.value).toBeLessThanOrEqual(Math.PI)
      }),
      { ...runs, numRuns: 300 },
    )
  })

  it('should converge on the straight-path slider-crank as the output link grows', () => {
    fc.assert(
      fc.property(fullTurnSliderCrank, angle, (input, theta) => {
        const { crank: a, rod: b, offset: h } = input
        const straight = sliderPosition(a, b, h, 1, theta)
        // Output pivot far above mid-stroke, output as long as the distance down to the path.
        const middle = (Math.sqrt((a + b) ** 2 - h * h) + Math.sqrt((b - a) ** 2 - h * h)) / 2
        const errors = [1e2, 1e4, 1e6].map((k) => {
          const R = k * (a + b)
          const state = new Float64Array(FOUR_BAR_STATE)
          solveFourBar(a, b, R, middle, h + R, -1, theta, state)
          const bx = a * Math.cos(theta) + b * Math.cos(state[THETA3]!)
          return { R, error: Math.abs(bx - straight) }
        })
        // The arc sags (x − x_mid)²/2R below the line; the slider shifts by about that
        // times the rod's slope, so the error falls as 1/R (plus rounding ~ε·R).
        for (const { R, error } of errors) {
          expect(error).toBeLessThanOrEqual((2 * (a + b) ** 2 * (a + b)) / (R * (b - a - Math.abs(h))) + 1e-15 * R)
        }
        expect(errors[2]!.error).toBeLessThanOrEqual(1e-5 * (a + b))
      }),
      runs,
    )
  })

  it('should give an arc-path slider-crank the straight-path answers as the radius grows', () => {
    fc.assert(
      fc.property(fullTurnSliderCrank, (input) => {
        const straight = analyseSliderCrank(sliderCrank(input), { speed: 1 }, { samples: 181 })
        const arc = analyseSliderCrank(sliderCrank({ ...input, pathRadius: 1e6 * (input.crank + input.rod) }), { speed: 1 }, { samples: 181 })
        const scale = input.crank + input.rod
        expect(Math.abs(arc.stroke - straight.stroke)).toBeLessThanOrEqual(1e-5 * scale)
        expect(Math.abs(arc.timeRatio! - straight.timeRatio!)).toBeLessThanOrEqual(1e-5)
        const state = new Float64Array(SLIDER_CRANK_STATE)
        sliderCrankState(sliderCrank({ ...input, pathRadius: 1e6 * scale }), 1, state)
        expect(Math.abs(state[POSITION]! - sliderPosition(input.crank, input.rod, input.offset, input.sliderSide, 1))).toBeLessThanOrEqual(1e-5 * scale)
        // The transmission angle too, against the straight path's closed form acos(|a sinθ − e|/b) (OSC-1's μ), never over 90°.
        for (const theta of [0.3, 1.9, 3.5, 5.1]) {
          sliderCrankState(sliderCrank({ ...input, pathRadius: 1e6 * scale }), theta, state)
          const closed = Math.acos(Math.min(1, Math.abs(input.crank * Math.sin(theta) - input.offset) / input.rod))
          expect(state[TRANSMISSION]!).toBeLessThanOrEqual(Math.PI / 2)
          expect(Math.abs(state[TRANSMISSION]! - closed)).toBeLessThanOrEqual(1e-4)
        }
        expect(Math.abs(arc.transmissionMin.value - straight.transmissionMin.value)).toBeLessThanOrEqual(1e-4)
      }),
      { ...runs, numRuns: 300 },
    )
  })

  it('should give the arc path of OSC-1 its least transmission angle, 90° minus the largest rod angle', () => {
    // r, l, e = 50, 200, 30 mm: μmin = 90° − asin((r + e)/l) = 66.4218215° (OSC-1, derived), on either side of the path.
    for (const side of [1, -1] as const) {
      for (const sign of [1, -1]) {
        const arc = analyseSliderCrank(sliderCrank({ crank: 0.05, rod: 0.2, offset: 0.03, sliderSide: side, pathRadius: sign * 1e4 }), { speed: 1 })
        expectClose((arc.transmissionMin.value * 180) / Math.PI, 66.4218215, { abs: 1e-4 })
      }
    }
  })
})
