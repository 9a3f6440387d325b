/**
 * Synthesis for every linkage kind: each answer analysed forward must give the
 * requirement back (round trip to 1e-9), the best-transmission searches must beat
 * an independent dense scan, impossible requirements must name the nearest
 * achievable, and the field-check methods (FB-6, FB-7, FB-8, SY-1) hold.
 */
import { lusolve } from 'mathjs'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  FOUR_BAR_STATE,
  LinkageError,
  THETA4,
  analyseFourBar,
  analyseSliderCrank,
  bestCrankRocker,
  bestTransmissionSliderCrank,
  chebyshevPoints,
  crankRockerAt,
  fourBar,
  fourBarState,
  functionGenerator,
  inlineSliderCrank,
  sliderCrank,
  sliderCrankAtOffset,
  sliderCrankRange,
  sliderCrankWith,
  unitTimeRatioCrankRocker,
} from '../../src/linkage/index.js'
import { expectClose } from '../helpers/close.js'

const D = Math.PI / 180

/** Forward analysis of an offset slider-crank: stroke, time ratio, least transmission angle. */
function forward(crank: number, rod: number, offset: number) {
  const a = analyseSliderCrank(sliderCrank({ crank, rod, offset }), { speed: 1 })
  return { stroke: a.stroke, timeRatio: a.timeRatio!, mu: a.transmissionMin.value }
}

describe('offset slider-crank with one free choice', () => {
  // SY-1 (field-checks.md §9): S = 100 mm, Q = 1.2, e = 40 mm → a = 47.0366178 mm, b = 128.102715 mm.
  it('should give back SY-1’s rod and offset from its crank, and its crank and offset from its rod', () => {
    const fromCrank = sliderCrankWith(0.1, 1.2, { crank: 0.0470366178 })
    expectClose([fromCrank.rod * 1000, fromCrank.offset * 1000], [128.102715, 40], { rel: 1e-8 })
    const fromRod = sliderCrankWith(0.1, 1.2, { rod: 0.128102715 })
    expectClose([fromRod.crank * 1000, fromRod.offset * 1000], [47.0366178, 40], { rel: 1e-7 })
  })

  it('should round-trip stroke and time ratio to 1e-9 over random requirements and choices', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.02, max: 0.5, noNaN: true }), fc.double({ min: 1.02, max: 1.8, noNaN: true }), fc.double({ min: 0.1, max: 0.9, noNaN: true }), (S, Q, share) => {
        const range = sliderCrankRange(S, Q, 'crank')
        const crank = range.min + share * (range.max - range.min)
        const design = sliderCrankWith(S, Q, { crank })
        const back = forward(design.crank, design.rod, design.offset)
        expectClose(back.stroke, S, { rel: 1e-9 })
        expectClose(back.timeRatio, Q, { rel: 1e-9 })
        expectClose(back.mu, design.transmissionMin, { abs: 1e-9 })
      }),
      { numRuns: 60, seed: 20261202 },
    )
  })

  it('should refuse a crank no offset drive can have, naming the range and the nearest achievable', () => {
    let error: unknown = null
    try {
      sliderCrankWith(0.1, 1.2, { crank: 0.06 })
    } catch (e) {
      error = e
    }
    expect(error).toBeInstanceOf(LinkageError)
    const details = (error as LinkageError).details as { min: number; max: number; nearest: number }
    // A crank longer than half the stroke cannot be: the offset only ever lengthens the stroke.
    expect(details.max).toBeLessThanOrEqual(0.05)
    expect(details.nearest).toBe(details.max)
    expect((error as Error).message).toMatch(/nearest achievable/)
  })

  it('should find the best least transmission angle, which no offset of a dense scan beats', () => {
    const best = bestTransmissionSliderCrank(0.1, 1.2)
    const limit = 0.1 / Math.tan((Math.PI * 0.2) / 2.2)
    let scanBest = 0
    for (let i = 1; i < 20000; i++) scanBest = Math.max(scanBest, sliderCrankAtOffset(0.1, 1.2, (limit * i) / 20000).transmissionMin)
    expect(best.transmissionMin).toBeGreaterThanOrEqual(scanBest - 1e-12)
    const back = forward(best.crank, best.rod, best.offset)
    expectClose([back.stroke, back.timeRatio, back.mu], [0.1, 1.2, best.transmissionMin], { rel: 1e-9 })
  })
})

describe('in-line slider-crank', () => {
  it('should take the crank as half the stroke and the rod from its ratio', () => {
    const d = inlineSliderCrank(0.08, { rodRatio: 4 })
    expect([d.crank, d.rod]).toEqual([0.04, 0.16])
    expectClose(forward(d.crank, d.rod, 0).stroke, 0.08, { rel: 1e-12 })
  })

  it('should give the shortest rod whose peak acceleration meets the limit, found again by the analysis', () => {
    // The peak acceleration of an in-line drive is a·ω²·(1 + a/b), at the outer dead centre (field-checks.md §10, fact 5).
    const w = 50
    const d = inlineSliderCrank(0.1, { accelerationLimit: 180, speed: w })
    const analysis = analyseSliderCrank(sliderCrank({ crank: d.crank, rod: d.rod }), { speed: w })
    expectClose(analysis.extremes.acceleration.absMax.value, 180, { rel: 1e-9 })
  })

  it('should name the least achievable acceleration, a·ω², when the limit is below it', () => {
    expect(() => inlineSliderCrank(0.1, { accelerationLimit: 100, speed: 50 })).toThrow(/nearest achievable is 125\.000 m\/s²/)
  })
})

describe('crank-rocker for a swing and a time ratio (FB-8 construction)', () => {
  it('should give back the swing and the time ratio by forward analysis to 1e-9, a Grashof crank-rocker', () => {
    for (const [swing, Q] of [[80, 1.2], [45, 1.1], [100, 1.4], [30, 1.05]] as const) {
      const design = bestCrankRocker(swing * D, Q, { ground: 0.1 })
      const analysis = analyseFourBar(fourBar({ ...design }), { speed: 1 })
      expect(analysis.grashof.className).toBe('crank-rocker')
      expectClose(analysis.outputSwing!, swing * D, { rel: 1e-9 })
      expectClose(analysis.timeRatio!, Q, { rel: 1e-9 })
      expectClose(design.ground, 0.1, { rel: 1e-12 })
    }
  })

  it('should find a best worst transmission angle that no pivot place on a dense scan beats', () => {
    const design = bestCrankRocker(80 * D, 1.2, { output: 0.07 })
    let scan = 0
    for (const family of [0, 1] as const) {
      for (let i = 0; i < 20000; i++) scan = Math.max(scan, crankRockerAt(80 * D, 1.2, { output: 0.07 }, (2 * Math.PI * i) / 20000, family)?.transmissionWorst ?? 0)
    }
    expect(design.transmissionWorst).toBeGreaterThanOrEqual(scan - 1e-9)
    // The analysis's own figure, over the whole turn.
    const analysis = analyseFourBar(fourBar({ ...design }), { speed: 1 })
    expectClose(analysis.transmissionWorst.value, design.transmissionWorst, { abs: 1e-9 })
  })

  // FB-6 (field-checks.md §3): a unit-time-ratio crank-rocker has a² + d² = b² + c² and sin(ψ/2) = a/c;
  // then cos μmin = ad/(bc). R. J. Brodell, A. H. Soni, "Design of the crank-rocker mechanism with unit
  // time ratio", J. Mechanisms 5 (1970) 1–4 (from memory); the closed form derived there and here.
  it('should give the unit-time-ratio crank-rocker its swing, Q = 1 and the least transmission angle asked for', () => {
    const design = unitTimeRatioCrankRocker(60 * D, 50 * D, 0.1)
    expectClose(design.input ** 2 + design.ground ** 2, design.coupler ** 2 + design.output ** 2, { rel: 1e-12 })
    const analysis = analyseFourBar(fourBar(design), { speed: 1 })
    expectClose([analysis.timeRatio!, analysis.outputSwing!, analysis.transmissionMin.value], [1, 60 * D, 50 * D], { rel: 1e-9 })
  })

  it('should send a unit time ratio to the closed form instead of an endless search', () => {
    expect(() => bestCrankRocker(60 * D, 1, { ground: 0.1 })).toThrow(/least transmission angle wanted/)
  })
})

describe('function generation through three precision points (FB-7)', () => {
  const f = (x: number) => x * x
  const range = { x0: 1, xf: 2 }
  const input = { start: 90 * D, span: 90 * D }
  const output = { start: 240 * D, span: 60 * D }
  const design = functionGenerator(f, range, input, output, 0.1)

  it('should place the precision points at the Chebyshev spacing', () => {
    // x_j = (x0 + xf)/2 − ((xf − x0)/2)·cos((2j − 1)π/6), Hartenberg & Denavit (from memory).
    expectClose(chebyshevPoints(1, 2), [1.5 - 0.5 * Math.cos(Math.PI / 6), 1.5, 1.5 + 0.5 * Math.cos(Math.PI / 6)], { rel: 1e-15 })
  })

  it('should solve Freudenstein’s three equations as mathjs’s general linear solver does', () => {
    const A = design.points.map((p) => [Math.cos(p.output), -Math.cos(p.input), 1])
    const rhs = design.points.map((p) => [Math.cos(p.input - p.output)])
    const K = (lusolve(A, rhs) as number[][]).map((r) => r[0]!)
    expectClose([...design.k], K, { rel: 1e-10 })
    expectClose([design.input, design.output], [0.1 / K[0]!, 0.1 / K[1]!], { rel: 1e-10 })
  })

  it('should pass through all three precision points on its one circuit', () => {
    const linkage = fourBar({ ground: design.ground, input: design.input, coupler: design.coupler, output: design.output, circuit: design.circuit })
    const state = new Float64Array(FOUR_BAR_STATE)
    for (const p of design.points) {
      expect(fourBarState(linkage, p.input, state)).toBe(true)
      expect(Math.abs(Math.atan2(Math.sin(state[THETA4]! - p.output), Math.cos(state[THETA4]! - p.output)))).toBeLessThan(1e-9)
    }
  })

  it('should report a structural error that vanishes at the precision points and is largest between them', () => {
    const { x, error } = design.errorCurve
    for (const p of design.points) {
      const i = Math.round(((p.x - 1) / 1) * (x.length - 1))
      // Interpolating the sampled error to the precision point gives nearly zero.
      const near = Math.abs(error[i]!)
      expect(near).toBeLessThan(design.errorMax * 0.05 + 1e-6)
    }
    expect(design.errorMax).toBeGreaterThan(0)
    expect(design.errorMax).toBeLessThan(0.05 * 3)
  })
})
