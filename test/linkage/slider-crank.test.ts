/**
 * Slider-crank against the outside world. Values marked with a case id (SC-1,
 * OSC-1 …) are the published or derived check cases of the project's field-check
 * sheet; each case names its own source below.
 */
import { describe, expect, it } from 'vitest'
import {
  LinkageError,
  SliderCrankSweep,
  analyseSliderCrank,
  eccentric,
  rodAngle,
  sliderAcceleration,
  sliderCrank,
  sliderPosition,
  sliderVelocity,
} from '../../src/linkage/index.js'
import { deg, expectClose, expectPrinted, rad } from '../helpers/close.js'

const mm = 1e-3
const rpm = (n: number): number => (n * 2 * Math.PI) / 60

describe('in-line slider-crank (SC-1)', () => {
  // Stroke = 2 × crank, dead centres at 0° and 180°, Q = 1: elementary geometry,
  // common practice, no source; exact displacement as in J. B. Heywood, Internal
  // Combustion Engine Fundamentals, McGraw-Hill 1988, Sec. 2.2 (from memory).
  const linkage = sliderCrank({ crank: 50 * mm, rod: 200 * mm })
  const result = analyseSliderCrank(linkage, { speed: rpm(3000) })

  it('should have a stroke of twice the crank, whatever the rod', () => {
    expectClose(result.stroke, 100 * mm, { rel: 1e-12 })
    for (const rod of [60, 120, 500, 5000]) {
      const other = analyseSliderCrank(sliderCrank({ crank: 50 * mm, rod: rod * mm }), { speed: 1 })
      expectClose(other.stroke, 100 * mm, { rel: 1e-12 })
    }
  })

  it('should put the dead centres at 0° and 180° with positions l + r and l − r', () => {
    expectClose(result.outerDeadCentre, { theta: 0, position: 250 * mm }, { rel: 1e-12, abs: 1e-15 })
    expectClose(result.innerDeadCentre, { theta: Math.PI, position: 150 * mm }, { rel: 1e-12 })
    expect(result.timeRatio).toBe(1)
    expectClose(deg(result.instrokeAngle!), 180, { rel: 1e-12 })
  })
})

describe('piston displacement, exact and two-term (SC-2)', () => {
  // Exact form: Heywood, ICE Fundamentals (1988), Sec. 2.2 (from memory).
  // Two-term "primary + secondary" form: R. L. Norton, Design of Machinery,
  // McGraw-Hill, 5th ed. 2012 (edition from memory), Ch. 13 "Engine dynamics", Eq. 13.3 (from memory).
  const r = 50 * mm
  const l = 200 * mm
  const twoTerm = (theta: number, crank: number, rod: number): number =>
    rod - (crank * crank) / (4 * rod) + crank * Math.cos(theta) + ((crank * crank) / (4 * rod)) * Math.cos(2 * theta)
  const table: [number, string, string][] = [
    // θ (deg), exact x (mm), approximation error x_approx − x (mm)
    [30, '241.732619', '0.00615167016'],
    [60, '220.256242', '0.0562581023'],
    [90, '193.649167', '0.100832690'],
    [120, '170.256242', '0.0562581023'],
    [150, '155.130078', '0.00615167016'],
  ]

  it('should give the tabulated exact positions and show the two-term error', () => {
    for (const [theta, exact, error] of table) {
      const x = sliderPosition(r, l, 0, 1, rad(theta))
      expectPrinted(x / mm, exact)
      expectPrinted((twoTerm(rad(theta), r, l) - x) / mm, error)
    }
  })

  it('should agree with the two-term form ever more closely as a/b → 0', () => {
    // The largest error sits at 90° and equals r(λ³/8 + λ⁵/16 + …): it falls as λ³.
    let previous = Number.POSITIVE_INFINITY
    for (const ratio of [0.4, 0.2, 0.1, 0.05, 0.025]) {
      const rod = r / ratio
      const error = Math.abs(twoTerm(Math.PI / 2, r, rod) - sliderPosition(r, rod, 0, 1, Math.PI / 2))
      expectClose(error, r * (ratio ** 3 / 8 + ratio ** 5 / 16), { rel: 0.1 * ratio ** 2 })
      expect(error).toBeLessThan(previous / 7)
      previous = error
    }
  })
})

describe('piston velocity and acceleration (SC-3)', () => {
  // Derived closed forms, checked in the field-check sheet by a second route; the
  // dead-centre accelerations −rω²(1 + λ) and rω²(1 − λ) are the textbook result
  // (Norton, Design of Machinery, Ch. 13, from memory).
  const r = 50 * mm
  const l = 200 * mm
  const omega = rpm(3000)
  const exact: [number, string, string][] = [
    [30, '-9.56786094', '-4910.19372'],
    [60, '-15.3452443', '-1851.10139'],
    [90, '-15.7079633', '1274.16045'],
    [120, '-11.8617461', '3083.70081'],
    [180, '0', '3701.10165'],
  ]

  it('should reproduce the tabulated velocities and accelerations', () => {
    for (const [theta, v, a] of exact) {
      expectPrinted(sliderVelocity(r, l, 0, 1, rad(theta), omega), v)
      expectPrinted(sliderAcceleration(r, l, 0, 1, rad(theta), omega, 0), a)
    }
  })

  it('should give rω at 90° and −rω²(1 + λ) at the outer dead centre', () => {
    expectClose(sliderVelocity(r, l, 0, 1, Math.PI / 2, omega), -r * omega, { rel: 1e-12 })
    expectClose(sliderAcceleration(r, l, 0, 1, 0, omega, 0), -r * omega * omega * (1 + r / l), { rel: 1e-12 })
    expectClose(sliderAcceleration(r, l, 0, 1, Math.PI, omega, 0), r * omega * omega * (1 - r / l), { rel: 1e-12 })
  })

  it('should find the peak speed before 90° at 1.619 × the mean speed', () => {
    const result = analyseSliderCrank(sliderCrank({ crank: r, rod: l }), { speed: omega })
    const v = result.extremes.velocity
    // Counter-clockwise from the outer dead centre the slider first moves towards the crank: v < 0.
    expectClose(deg(v.min.theta), 76.7209772, { abs: 1e-6 })
    expectPrinted(v.min.value, '-16.1930676')
    // The largest magnitude is never negative, at the same angle.
    expectPrinted(v.absMax.value, '16.1930676')
    expectClose(deg(v.absMax.theta), 76.7209772, { abs: 1e-6 })
    // In-line: the return half mirrors it.
    expectPrinted(v.max.value, '16.1930676')
    expectClose(deg(v.max.theta), 360 - 76.7209772, { abs: 1e-6 })
    expectClose(result.meanSpeed!, 10, { rel: 1e-12 })
    expectPrinted(v.absMax.value / result.meanSpeed!, '1.61930676')
    const a = result.extremes.acceleration
    expect(a.min.theta).toBe(0)
    expectPrinted(a.min.value, '-6168.50275')
    expectPrinted(a.absMax.value, '6168.50275')
    // The greatest (towards +x) is at the inner dead centre, rω²(1 − λ) (SC-3), exactly 180°.
    expectPrinted(a.max.value, '3701.10165')
    expect(deg(a.max.theta)).toBeCloseTo(180, 9)
  })

  it('should add the tangential term x′α for a crank that speeds up', () => {
    // Not only constant speed: a = x″ω² + x′α.
    const alpha = 250
    const theta = rad(60)
    const constant = sliderAcceleration(r, l, 0, 1, theta, omega, 0)
    const speeding = sliderAcceleration(r, l, 0, 1, theta, omega, alpha)
    expectClose(speeding - constant, (sliderVelocity(r, l, 0, 1, theta, omega) / omega) * alpha, { rel: 1e-12 })
    expectPrinted(((speeding - constant) / alpha) * omega, '-15.3452443')
  })

  it('should give the rod angle from sin φ = −λ sin θ', () => {
    for (const theta of [10, 75, 200, 300]) {
      expectClose(Math.sin(rodAngle(r, l, 0, 1, rad(theta))), -(r / l) * Math.sin(rad(theta)), { rel: 1e-12, abs: 1e-15 })
    }
  })
})

describe('crank angle of the greatest piston speed (textbook worked example)', () => {
  // R. S. Khurmi, J. K. Gupta, Theory of Machines (S. Chand; edition not confirmed),
  // Example 15.3 — the book and example number from memory; the inputs and the
  // book's method were read in a published re-working of the example: crank
  // 300 mm, rod 1 m, 200 rpm; d/dθ of the two-term velocity ωr(sinθ + sin2θ/2n)
  // set to zero, 2cos²θ + n cosθ − 1 = 0, θ printed to whole degrees. Its answers
  // are computed here with its own method (computed, not printed values); the
  // core's exact answers must sit within that method's error.
  it('should agree with the two-term answer within its approximation error', () => {
    const n = 1 / 0.3
    const omega = (200 * 2 * Math.PI) / 60
    const cos = (-n + Math.sqrt(n * n + 8)) / 4
    const bookTheta = Math.round(deg(Math.acos(cos)))
    const bookSpeed = omega * 0.3 * (Math.sin(rad(bookTheta)) + Math.sin(rad(2 * bookTheta)) / (2 * n))
    expect(bookTheta).toBe(75)
    expectPrinted(bookSpeed, '6.54')
    const exact = analyseSliderCrank(sliderCrank({ crank: 0.3, rod: 1 }), { speed: omega })
    expectClose(deg(exact.extremes.velocity.absMax.theta), 75, { abs: 0.5 })
    expectClose(exact.extremes.velocity.absMax.value, bookSpeed, { rel: 0.005 })
  })
})

describe('mean piston speed', () => {
  // v̄ = 2·S·n: J. B. Heywood, Internal Combustion Engine Fundamentals, McGraw-Hill,
  // 1988, §2.2 (from memory). The figures are computed here, not taken from a book:
  // a 90 mm stroke at 3000 rpm gives 2 × 0.090 m × 50 s⁻¹ = 9 m/s.
  it('should give 9 m/s for a 90 mm stroke at 3000 rpm', () => {
    const result = analyseSliderCrank(sliderCrank({ crank: 45 * mm, rod: 150 * mm }), { speed: rpm(3000) })
    expectClose(result.meanSpeed!, 9, { rel: 1e-12 })
  })
})

describe('offset slider-crank (OSC-1)', () => {
  // Dead-centre construction and time ratio Q = (180° + α)/(180° − α): derived in
  // the field-check sheet and confirmed by brute-force search; the same relations
  // are in J. J. Uicker, G. R. Pennock, J. E. Shigley, Theory of Machines and
  // Mechanisms, 3rd ed., Oxford University Press 2003, offset slider-crank and time
  // ratio (from memory, section not confirmed).
  const r = 50 * mm
  const l = 200 * mm
  const e = 30 * mm
  const result = analyseSliderCrank(sliderCrank({ crank: r, rod: l, offset: e }), { speed: 10 })

  it('should find the dead-centre crank angles and positions', () => {
    expectPrinted(deg(result.outerDeadCentre!.theta), '6.89210258')
    expectPrinted(deg(result.innerDeadCentre!.theta), '191.536959')
    expectPrinted(result.outerDeadCentre!.position / mm, '248.193473')
    expectPrinted(result.innerDeadCentre!.position / mm, '146.969385')
  })

  it('should agree with the closed-form offset stroke √((a+b)²−h²) − √((b−a)²−h²)', () => {
    const closed = Math.sqrt((r + l) ** 2 - e * e) - Math.sqrt((l - r) ** 2 - e * e)
    expectClose(result.stroke, closed, { rel: 1e-12 })
    expectPrinted(result.stroke / mm, '101.224088')
    expectPrinted((result.stroke - 2 * r) / mm, '1.22408835')
  })

  it('should give the time ratio and the crank travel of each stroke', () => {
    expectPrinted(deg(result.instrokeAngle!), '184.644856')
    expectPrinted(deg(result.outstrokeAngle!), '175.355144')
    expectPrinted(result.timeRatio!, '1.05297656')
  })

  it('should swap the strokes when the crank turns the other way', () => {
    const reversed = analyseSliderCrank(sliderCrank({ crank: r, rod: l, offset: e, rotation: -1 }), { speed: 10 })
    expectPrinted(deg(reversed.instrokeAngle!), '175.355144')
    expectPrinted(reversed.timeRatio!, '1.05297656')
  })

  it('should give the largest rod angle asin((r + e)/l) and the least transmission angle', () => {
    expectPrinted(deg(result.rodAngleMax), '23.5781785')
    expectPrinted(deg(result.transmissionMin.value), '66.4218215')
    expectClose(deg(result.transmissionMin.theta), 270, { rel: 1e-12 })
    expectClose(deg(result.transmissionMax.value), 90, { rel: 1e-12 })
  })

  it('should mirror everything for the slider on the other side', () => {
    const left = analyseSliderCrank(sliderCrank({ crank: r, rod: l, offset: e, sliderSide: -1 }), { speed: 10 })
    expectClose(left.stroke, result.stroke, { rel: 1e-12 })
    expectClose(left.timeRatio!, result.timeRatio!, { rel: 1e-12 })
    expectClose(left.outerDeadCentre!.position, -result.outerDeadCentre!.position, { rel: 1e-12 })
    expectPrinted(180 - deg(left.outerDeadCentre!.theta), '6.89210258')
  })
})

describe('a crank that cannot turn fully', () => {
  // Full rotation needs b ≥ a + |h|: the rod must reach the path at θ = 90° and 270°.
  const linkage = sliderCrank({ crank: 50 * mm, rod: 70 * mm, offset: 30 * mm })
  const result = analyseSliderCrank(linkage, { speed: 10 })

  it('should report the limit angles where the rod stands square to the path', () => {
    expect(result.fullRotation).toBe(false)
    // a·sinθ − h = −b there: sinθ = (h − b)/a = −0.8.
    expectClose(result.limitAngles!.map(deg), [360 - 53.13010235415598, 233.13010235415598], { rel: 1e-12 })
    expect(result.timeRatio).toBeNull()
    expect(result.meanSpeed).toBeNull()
  })

  it('should say so in the engineer’s words with the numbers', () => {
    const warning = result.warnings.find((w) => w.code === 'crank-cannot-turn')
    expect(warning?.message).toContain(
      'the connecting rod (70 mm) cannot reach the slider path for every crank angle: a full turn needs rod ≥ crank + |offset| = 80 mm',
    )
  })

  it('should still give the slider travel over the range it can rock through', () => {
    let min = Number.POSITIVE_INFINITY
    let max = Number.NEGATIVE_INFINITY
    const { start, end } = result.range
    for (let i = 0; i <= 100_000; i++) {
      const x = sliderPosition(50 * mm, 70 * mm, 30 * mm, 1, start + ((end - start) * i) / 100_000)
      min = Math.min(min, x)
      max = Math.max(max, x)
    }
    expectClose(result.stroke, max - min, { rel: 1e-6 })
  })
})

describe('slider-driven linkage', () => {
  // A fact of the trade: a slider (piston) pushing along the rod cannot turn the
  // crank when crank and rod are in line; the engine's flywheel carries it through
  // (common practice, no source).
  const result = analyseSliderCrank(sliderCrank({ crank: 40 * mm, rod: 150 * mm, driver: 'slider' }), { speed: 50 })

  it('should report the dead centres as dead points that need stored energy', () => {
    expect(result.deadPoints.map((p) => deg(p.theta))).toEqual([0, 180])
    expect(result.needsStoredEnergy).toBe(true)
    expect(result.warnings.map((w) => w.code)).toEqual(['dead-points-need-stored-energy'])
    expect(result.warnings[0]!.message).toMatch(/flywheel or other stored energy must carry the crank/)
  })

  it('should measure the transmission angle against the crank it drives: nil at the dead points', () => {
    expect(result.transmissionMin.value).toBeLessThan(1e-12)
    expect([0, 180]).toContain(Math.round(deg(result.transmissionMin.theta)))
    // At θ = 90° the rod leans asin(λ) from the path and the crank stands square to it: μ = 90° − asin(a/b).
    const crankDriven = analyseSliderCrank(sliderCrank({ crank: 40 * mm, rod: 150 * mm }), { speed: 50 })
    expect(crankDriven.needsStoredEnergy).toBe(false)
    expectClose(crankDriven.transmissionMin.value, Math.PI / 2 - Math.asin(40 / 150), { rel: 1e-12 })
  })
})

describe('errors', () => {
  it('should refuse zero, negative and non-finite lengths with a stable code', () => {
    for (const [crank, rod] of [
      [0, 0.1],
      [-0.01, 0.1],
      [0.01, Number.NaN],
      [Number.POSITIVE_INFINITY, 0.1],
    ] as const) {
      let caught: unknown
      try {
        sliderCrank({ crank, rod })
      } catch (error) {
        caught = error
      }
      expect(caught).toBeInstanceOf(LinkageError)
      expect(['invalid-length', 'invalid-number']).toContain((caught as LinkageError).code)
    }
  })

  it('should refuse a rod that cannot reach the path at any angle', () => {
    expect(() => sliderCrank({ crank: 0.02, rod: 0.05, offset: 0.08 })).toThrowError(
      /cannot reach the slider path at any crank angle: the offset \(80 mm\) exceeds crank \+ rod = 70 mm/,
    )
  })
})

describe('eccentric drive', () => {
  // "An eccentric is an expanded crank": common practice, no source. The stroke
  // follows the offset slider-crank closed form with r = eccentricity.
  it('should analyse as the equivalent slider-crank', () => {
    const drive = eccentric({
      eccentricity: 12.5 * mm,
      strapLength: 300 * mm,
      offset: 20 * mm,
      sheaveDiameter: 120 * mm,
      shaftDiameter: 50 * mm,
      minimumWall: 8 * mm,
    })
    const result = analyseSliderCrank(drive.equivalent, { speed: rpm(120) })
    const [r, l, e] = [12.5 * mm, 300 * mm, 20 * mm]
    expectClose(result.stroke, Math.sqrt((l + r) ** 2 - e * e) - Math.sqrt((l - r) ** 2 - e * e), { rel: 1e-12 })
    expectClose(drive.wall, 60 * mm - 12.5 * mm - 25 * mm, { rel: 1e-12 })
  })

  it('should refuse a sheave that does not enclose the shaft with the wall asked for', () => {
    expect(() =>
      eccentric({ eccentricity: 20 * mm, strapLength: 200 * mm, sheaveDiameter: 90 * mm, shaftDiameter: 50 * mm, minimumWall: 5 * mm }),
    ).toThrowError(/thinnest wall is 0 mm, below the 5 mm minimum; a sheave of at least 100 mm is needed/)
  })

  it('should take a wall exactly at the minimum as meeting it, and say a consistent shortfall just below it', () => {
    // 154 mm sheave, 40 mm eccentricity, 50 mm shaft: wall = 77 − 40 − 25 = 12 mm, the minimum exactly.
    // 0.154 is not exact in binary: the wall comes out within 1e-17 m of 12 mm either way.
    const drive = eccentric({ eccentricity: 0.04, strapLength: 0.16, sheaveDiameter: 0.154, shaftDiameter: 0.05, minimumWall: 0.012 })
    expectClose(drive.wall, 0.012, { abs: 1e-15 })
    // 1 µm short: refused, and the needed sheave prints larger than the one given.
    let message = ''
    try {
      eccentric({ eccentricity: 0.04, strapLength: 0.16, sheaveDiameter: 0.153998, shaftDiameter: 0.05, minimumWall: 0.012 })
    } catch (error) {
      message = (error as Error).message
    }
    expect(message).toContain('The sheave (153.998 mm diameter)')
    expect(message).toContain('the thinnest wall is 11.999 mm, below the 12 mm minimum; a sheave of at least 154 mm is needed')
  })
})

describe('SliderCrankSweep', () => {
  it('should fill one typed array per quantity and recompute in place', () => {
    const linkage = sliderCrank({ crank: 50 * mm, rod: 200 * mm, offset: 30 * mm })
    const sweep = new SliderCrankSweep(linkage, 361)
    const before = sweep.position
    sweep.update({ start: 0, end: 2 * Math.PI }, { speed: 10 })
    expect(sweep.position).toBe(before)
    expect(sweep.position).toBeInstanceOf(Float64Array)
    expectClose(sweep.position[90]!, sliderPosition(50 * mm, 200 * mm, 30 * mm, 1, Math.PI / 2), { rel: 1e-14 })
    sweep.update({ start: 0, end: 2 * Math.PI }, { speed: 20 })
    expectClose(sweep.velocity[45]!, sliderVelocity(50 * mm, 200 * mm, 30 * mm, 1, Math.PI / 4, 20), { rel: 1e-12 })
    expectClose(sweep.time[360]!, (2 * Math.PI) / 20, { rel: 1e-12 })
  })
})
