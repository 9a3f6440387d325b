/**
 * An independent referee from the npm registry: mathjs differentiates the
 * slider-position expression symbolically; its first and second derivatives
 * must match the core's hand-derived kinematic coefficients over a sweep.
 */
import { all, create } from 'mathjs'
import { describe, expect, it } from 'vitest'
import { SLIDER_CRANK_STATE, DX, DDX, POSITION, DPHI, analyseSliderCrank, sliderCrank, sliderCrankState } from '../../src/linkage/index.js'
import { expectClose } from '../helpers/close.js'

const math = create(all!)

describe('symbolic derivatives (mathjs) against the core', () => {
  const position = math.parse('a * cos(t) + s * sqrt(b^2 - (a * sin(t) - h)^2)')
  const first = math.derivative(position, 't')
  const second = math.derivative(first, 't')
  // φ = asin((h − a sin t)/b) for the slider on +x, π − asin(…) on −x: the rate carries the side's sign.
  const rodAngle = math.parse('s * asin((h - a * sin(t)) / b)')
  const rodRate = math.derivative(rodAngle, 't')
  const compiled = [position, first, second, rodRate].map((node) => node.compile())

  const linkages = [
    { crank: 0.05, rod: 0.2, offset: 0, sliderSide: 1 as const },
    { crank: 0.05, rod: 0.2, offset: 0.03, sliderSide: 1 as const },
    { crank: 0.012, rod: 0.045, offset: -0.02, sliderSide: -1 as const },
    { crank: 0.3, rod: 0.75, offset: 0.1, sliderSide: 1 as const },
  ]
  for (const input of linkages) {
    it(`should agree for crank ${input.crank}, rod ${input.rod}, offset ${input.offset}, side ${input.sliderSide}`, () => {
      const linkage = sliderCrank(input)
      const state = new Float64Array(SLIDER_CRANK_STATE)
      const scope = { a: input.crank, b: input.rod, h: input.offset, s: input.sliderSide, t: 0 }
      for (let i = 0; i < 720; i++) {
        scope.t = (i * Math.PI) / 360
        sliderCrankState(linkage, scope.t, state)
        const [x, dx, ddx, dphi] = compiled.map((c) => c.evaluate(scope) as number)
        const scale = input.crank
        expectClose(state[POSITION], x, { rel: 1e-12, abs: 1e-15 * scale }, `x(${i}/2 deg)`)
        expectClose(state[DX], dx, { rel: 1e-10, abs: 1e-12 * scale }, `dx(${i}/2 deg)`)
        expectClose(state[DDX], ddx, { rel: 1e-10, abs: 1e-12 * scale }, `ddx(${i}/2 deg)`)
        expectClose(state[DPHI], dphi, { rel: 1e-10, abs: 1e-12 }, `dphi(${i}/2 deg)`)
      }
    })
  }
})

describe('acceleration extremes of a crank that speeds up, against the symbolic referee', () => {
  // a = ω²·x″ + α·x′ with x′ and x″ from mathjs's derivatives (not the core's): a dense
  // scan of that expression gives the greatest and least acceleration; the core's
  // refined extremes must agree. The tangential term α·x′ moves both by a lot here.
  const position = math.parse('a * cos(t) + sqrt(b^2 - (a * sin(t) - h)^2)')
  const first = math.derivative(position, 't').compile()
  const second = math.derivative(math.derivative(position, 't'), 't').compile()
  for (const alpha of [0, 4000, -4000]) {
    it(`should find the greatest and least slider acceleration at α = ${alpha} rad/s²`, () => {
      const omega = 100
      const scope = { a: 0.05, b: 0.2, h: 0.03, t: 0 }
      let max = Number.NEGATIVE_INFINITY
      let min = Number.POSITIVE_INFINITY
      for (let i = 0; i < 200_000; i++) {
        scope.t = (i * 2 * Math.PI) / 200_000
        const acc = omega * omega * (second.evaluate(scope) as number) + alpha * (first.evaluate(scope) as number)
        max = Math.max(max, acc)
        min = Math.min(min, acc)
      }
      const core = analyseSliderCrank(sliderCrank({ crank: 0.05, rod: 0.2, offset: 0.03 }), { speed: omega, angularAcceleration: alpha }).extremes.acceleration
      // A 200 000-point scan sits within (Δθ)²·a″/8 ≈ 1e-7 relative of the true extreme, below it.
      expectClose(core.max.value, max, { rel: 1e-6 })
      expectClose(core.min.value, min, { rel: 1e-6 })
      expect(core.max.value).toBeGreaterThanOrEqual(max - 1e-9 * Math.abs(max))
    })
  }
})
