/**
 * Offset slider-crank synthesis for a stroke and a time ratio (SY-1 of the
 * field-check sheet): the closed form derived there from the two dead-centre
 * triangles (law of cosines and twice the triangle's area), confirmed by forward
 * analysis. The classical graphical construction is in Norton, Design of
 * Machinery, Ch. 3, and Uicker, Pennock & Shigley (from memory).
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { LinkageError, analyseSliderCrank, sliderCrank, synthesiseSliderCrank } from '../../src/linkage/index.js'
import { deg, expectClose, expectPrinted } from '../helpers/close.js'

const mm = 1e-3

describe('synthesiseSliderCrank() (SY-1)', () => {
  const design = synthesiseSliderCrank(100 * mm, 1.2, 40 * mm)

  it('should give the tabulated crank and rod', () => {
    expectPrinted(deg(design.alpha), '16.3636364')
    expectPrinted(design.crank / mm, '47.0366178')
    expectPrinted(design.rod / mm, '128.102715')
    expectPrinted(design.rod / design.crank, '2.72346782')
    expectPrinted(design.fullTurnMargin / mm, '41.0660970')
    expectPrinted(design.triangleLimit / mm, '347.757639')
    // Our own addition: past S·cot α the triangle puts the crank axis over the stroke.
    expectClose(design.offsetLimit, (100 * mm) / Math.tan(design.alpha), { rel: 1e-15 })
  })

  it('should analyse back to the stroke and time ratio asked for', () => {
    const result = analyseSliderCrank(sliderCrank({ crank: design.crank, rod: design.rod, offset: 40 * mm }), { speed: 1 })
    expectClose(result.stroke, 100 * mm, { rel: 1e-12 })
    expectClose(result.timeRatio!, 1.2, { rel: 1e-12 })
    expectPrinted(deg(result.rodAngleMax), '42.7989894')
  })

  it('should round-trip over random strokes, time ratios and offsets', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.005, max: 2, noNaN: true }),
        fc.double({ min: 1.01, max: 2, noNaN: true }),
        fc.double({ min: 0.01, max: 0.99, noNaN: true }),
        (stroke, q, share) => {
          const alpha = (Math.PI * (q - 1)) / (q + 1)
          const offset = (share * stroke) / Math.tan(alpha)
          const design = synthesiseSliderCrank(stroke, q, offset)
          expect(design.fullTurnMargin).toBeGreaterThan(0)
          // Right at the limit (b − a = |h|) the inner dead centre is ill-conditioned (√ of a tiny difference).
          if (design.fullTurnMargin <= 1e-3 * stroke) return
          const back = analyseSliderCrank(sliderCrank({ crank: design.crank, rod: design.rod, offset }), { speed: 1 }, { samples: 11 })
          expect(Math.abs(back.stroke - stroke)).toBeLessThanOrEqual(1e-9 * stroke)
          expect(Math.abs(back.timeRatio! - q)).toBeLessThanOrEqual(1e-9)
        },
      ),
      { numRuns: 1000, seed: 7 },
    )
  })

  it('should refuse what has no solution, in the engineer’s words', () => {
    expect(() => synthesiseSliderCrank(0.1, 1.2, 0.4)).toThrowError(/the offset must stay below S·cot α = 340.569 mm/)
    // Between S·cot α and (S/2)·cot(α/2) the triangle exists but puts the crank axis over the stroke.
    expect(() => synthesiseSliderCrank(0.1, 1.2, 0.345)).toThrowError(/whose crank turns fully/)
    expect(() => synthesiseSliderCrank(0.1, 3.5, 0.01)).toThrowError(/a time ratio of 3 or more cannot be reached/)
    expect(() => synthesiseSliderCrank(0.1, 1, 0.02)).toThrowError(LinkageError)
    expect(() => synthesiseSliderCrank(0.1, 1.2, 0)).toThrowError(/needs an offset/)
    expect(() => synthesiseSliderCrank(-0.1, 1.2, 0.02)).toThrowError(/stroke length must be greater than zero/)
  })
})
