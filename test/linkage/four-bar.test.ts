/**
 * Four-bar against the outside world: Grashof's law, Freudenstein's closed form,
 * a textbook example, the transmission-angle extreme formulas and the toggle
 * construction. Case ids (FB-1 …) refer to the project's field-check sheet.
 */
import { describe, expect, it } from 'vitest'
import {
  FOUR_BAR_STATE,
  FourBarSweep,
  H3,
  H4,
  THETA3,
  THETA4,
  analyseFourBar,
  fourBar,
  fourBarRange,
  fourBarState,
  wrapTurn,
  grashof,
  solveFourBar,
  type FourBarLinkage,
} from '../../src/linkage/index.js'
import { deg, expectClose, expectPrinted, rad } from '../helpers/close.js'

const mm = 1e-3

function solveAt(linkage: FourBarLinkage, theta2: number): Float64Array {
  const state = new Float64Array(FOUR_BAR_STATE)
  solveFourBar(linkage.input, linkage.coupler, linkage.output, linkage.groundX, linkage.groundY, linkage.circuitSign, theta2, state)
  return state
}

describe('grashof() (FB-1)', () => {
  // Grashof's law: s + l < p + q lets the shortest link turn fully; the class follows
  // from which link is shortest. F. Grashof, Theoretische Maschinenlehre, Bd. 2, 1883
  // (from memory); statement confirmed in W.-T. Chang, C.-C. Lin, L.-I. Wu, "A note on
  // Grashof's theorem", J. Marine Science and Technology 13(4) 239–248, 2005.
  // Class names as in R. L. Norton, Design of Machinery, §2.12 (from memory).
  const cases: [number, number, number, number, string, string][] = [
    // ground d, input a, coupler b, output c
    [100, 40, 120, 80, 'crank-rocker', 'Grashof crank-rocker'],
    [40, 100, 120, 80, 'double-crank', 'Grashof double-crank (drag link)'],
    [100, 80, 40, 120, 'double-rocker', 'Grashof double-rocker'],
    [100, 65, 115, 70, 'triple-rocker', 'non-Grashof triple-rocker'],
    [60, 40, 100, 80, 'change-point', 'change-point linkage, s + l = p + q'],
    [100, 50, 100, 50, 'change-point', 'change-point linkage, parallelogram'],
  ]
  for (const [d, a, b, c, name, label] of cases) {
    it(`should class d=${d} a=${a} b=${b} c=${c} as ${name}`, () => {
      const result = grashof(d * mm, a * mm, b * mm, c * mm)
      expect(result.className).toBe(name)
      expect(result.label).toBe(label)
    })
  }

  it('should give the rocker-crank when the output is shortest', () => {
    expect(grashof(100 * mm, 80 * mm, 120 * mm, 40 * mm).className).toBe('rocker-crank')
  })

  it('should decide the boundary within a stated tolerance (1e-12 of the summed lengths)', () => {
    expect(grashof(0.06, 0.04, 0.1 * (1 + 1e-14), 0.08).className).toBe('change-point')
    expect(grashof(0.06, 0.04, 0.1 * (1 + 1e-9), 0.08).className).toBe('triple-rocker')
    expect(grashof(0.06, 0.04, 0.1 * (1 - 1e-9), 0.08).className).toBe('crank-rocker')
  })

  it('should agree with the input range: the input turns fully exactly when Grashof says so', () => {
    for (const [d, a, b, c] of cases.filter((k) => k[4] !== 'change-point')) {
      const linkage = fourBar({ ground: d * mm, input: a * mm, coupler: b * mm, output: c * mm })
      expect(fourBarRange(linkage).full).toBe(grashof(d * mm, a * mm, b * mm, c * mm).inputTurnsFully)
    }
  })
})

describe('position analysis against Freudenstein (FB-2)', () => {
  // Freudenstein's equation K1 cos θ4 − K2 cos θ2 + K3 = cos(θ2 − θ4) and its
  // closed-form solution: F. Freudenstein, "Approximate synthesis of four-bar
  // linkages", Trans. ASME 77 (1955) 853–861 (from memory); Norton, Design of
  // Machinery, Ch. 4 (from memory). An independent formula from the core's circle
  // intersection.
  function freudenstein(a: number, b: number, c: number, d: number, theta2: number, open: boolean): number {
    const k1 = d / a
    const k2 = d / c
    const k3 = (a * a - b * b + c * c + d * d) / (2 * a * c)
    const A = Math.cos(theta2) - k1 - k2 * Math.cos(theta2) + k3
    const B = -2 * Math.sin(theta2)
    const C = k1 - (k2 + 1) * Math.cos(theta2) + k3
    const root = Math.sqrt(B * B - 4 * A * C)
    return 2 * Math.atan2(-B + (open ? -root : root), 2 * A)
  }

  it('should reproduce the tabulated open and crossed solutions at θ2 = 40°', () => {
    const open = solveAt(fourBar({ ground: 100 * mm, input: 40 * mm, coupler: 120 * mm, output: 80 * mm }), rad(40))
    expectPrinted(deg(open[THETA3]!), '20.2978828')
    expectPrinted(deg(open[THETA4]!), '57.3248801')
    const crossed = solveAt(
      fourBar({ ground: 100 * mm, input: 40 * mm, coupler: 120 * mm, output: 80 * mm, circuit: 'crossed' }),
      rad(40),
    )
    expectPrinted(deg(crossed[THETA3]!), '-60.9779668')
    expectPrinted(deg(crossed[THETA4]!), '-98.0049641')
  })

  it('should match the printed answers of the textbook example (Norton, Design of Machinery, Example 4-1)', () => {
    // a = 40, b = 120, c = 80, d = 100, θ2 = 40°: θ3 = 20.298°, θ4 = 57.325° (open).
    // The book's numbers are recalled, not read (from memory); they agree with the
    // independent computation above to every printed digit.
    const open = solveAt(fourBar({ ground: 100, input: 40, coupler: 120, output: 80 }), rad(40))
    expectPrinted(deg(open[THETA3]!), '20.298')
    expectPrinted(deg(open[THETA4]!), '57.325')
  })

  it('should agree with Freudenstein on both circuits over a full turn of several linkages', () => {
    const linkages: [number, number, number, number][] = [
      [100, 40, 120, 80],
      [0.3, 0.1, 0.25, 0.2],
      [5, 1, 5.5, 3],
    ]
    for (const [d, a, b, c] of linkages) {
      for (const circuit of ['open', 'crossed'] as const) {
        const linkage = fourBar({ ground: d, input: a, coupler: b, output: c, circuit })
        for (let i = 0; i < 360; i += 7) {
          const theta4 = solveAt(linkage, rad(i))[THETA4]!
          const reference = freudenstein(a, b, c, d, rad(i), circuit === 'open')
          expectClose(Math.cos(theta4 - reference), 1, { abs: 1e-12 })
        }
      }
    }
  })

  it('should give the velocity ratios and the static torque ratio', () => {
    // ω4/ω2 = a sin(θ2 − θ3)/(c sin(θ4 − θ3)), ω3/ω2 = a sin(θ4 − θ2)/(b sin(θ3 − θ4)):
    // Norton, Design of Machinery, Ch. 6 (from memory); values from FB-2.
    const state = solveAt(fourBar({ ground: 100 * mm, input: 40 * mm, coupler: 120 * mm, output: 80 * mm }), rad(40))
    expectPrinted(state[H4]! * 10, '2.79919410')
    expectPrinted(state[H3]! * 10, '-1.64836577')
    expectPrinted(1 / state[H4]!, '3.57245681')
  })
})

describe('transmission-angle extremes (FB-3)', () => {
  // For a crank that turns fully the extremes fall at θ2 = 0 and 180°:
  // cos μ = (b² + c² − (d ∓ a)²)/(2bc). Norton, Design of Machinery, Ch. 4
  // "Transmission angle" (from memory); derived from the law of cosines. The angle
  // as a design criterion: H. Alt, Werkstattstechnik 26 (1932) 61–64, confirmed as
  // its origin by S. S. Balli, S. Chand, "Transmission angle in mechanisms",
  // Mechanism and Machine Theory 37 (2002) 175–195.
  const result = analyseFourBar(fourBar({ ground: 100 * mm, input: 40 * mm, coupler: 120 * mm, output: 80 * mm }), {
    speed: 10,
  })

  it('should find μmin at θ2 = 0 and μmax at θ2 = 180° from the closed forms', () => {
    const [a, b, c, d] = [40, 120, 80, 100]
    const muAt0 = Math.acos((b * b + c * c - (d - a) ** 2) / (2 * b * c))
    const muAt180 = Math.acos((b * b + c * c - (d + a) ** 2) / (2 * b * c))
    expectClose(result.transmissionMin, { theta: 0, value: muAt0 }, { rel: 1e-12, abs: 1e-15 })
    expectClose(result.transmissionMax, { theta: Math.PI, value: muAt180 }, { rel: 1e-12 })
    expectPrinted(deg(result.transmissionMin.value), '26.3843297')
    expectPrinted(deg(result.transmissionMax.value), '86.4166783')
    expectPrinted(deg(result.transmissionWorst.value), '26.3843297')
  })

  it('should agree with a dense sweep', () => {
    const sweep = new FourBarSweep(result.linkage, 36_001).update({ start: 0, end: 2 * Math.PI }, { speed: 1 })
    expectClose(Math.min(...sweep.transmissionAngle), result.transmissionMin.value, { rel: 1e-9 })
    expectClose(Math.max(...sweep.transmissionAngle), result.transmissionMax.value, { rel: 1e-9 })
  })
})

describe('worst transmission angle from the greatest μ (FB-3 formulas, other supplement)', () => {
  // a = 45, b = c = 100, d = 150 mm: μ at θ2 = 180° is 154.3°, so 180° − μmax = 25.7° is
  // worse than μmin = 63.3° at θ2 = 0°. Both from the law-of-cosines forms of FB-3 (derived).
  const [a, b, c, d] = [45, 100, 100, 150]
  const mu0 = Math.acos((b * b + c * c - (d - a) ** 2) / (2 * b * c))
  const mu180 = Math.acos((b * b + c * c - (d + a) ** 2) / (2 * b * c))

  it('should take the worst from 180° − μmax when that is smaller, at θ2 = 180°', () => {
    const result = analyseFourBar(fourBar({ ground: d * mm, input: a * mm, coupler: b * mm, output: c * mm }), { speed: 1 })
    expectClose(deg(mu0), 63.33, { abs: 0.01 })
    expectClose(deg(mu180), 154.3, { abs: 0.05 })
    expectClose(result.transmissionMin.value, mu0, { rel: 1e-12 })
    expectClose(result.transmissionMax.value, mu180, { rel: 1e-12 })
    expectClose(result.transmissionWorst.value, Math.PI - mu180, { rel: 1e-12 })
    expectClose(deg(result.transmissionWorst.theta), 180, { abs: 1e-9 })
  })
})

describe('crank-rocker toggles, swing and time ratio (FB-5)', () => {
  // Output extremes where crank and coupler fall in line: the standard toggle
  // construction (Norton, Design of Machinery, Ch. 3 and 4; Uicker, Pennock &
  // Shigley; both from memory), derived in the field-check sheet and confirmed there
  // by maximising θ4 numerically.
  const result = analyseFourBar(fourBar({ ground: 100 * mm, input: 40 * mm, coupler: 120 * mm, output: 80 * mm }), {
    speed: 10,
  })

  it('should find both toggle positions and the output there', () => {
    const extended = result.toggles.find((t) => t.kind === 'extended')!
    const folded = result.toggles.find((t) => t.kind === 'folded')!
    expectPrinted(deg(extended.theta), '24.1468480')
    expectPrinted(deg(folded.theta), '231.317813')
    expectPrinted(deg(extended.outputAngle), '54.9003678')
    expectPrinted(deg(folded.outputAngle), '128.682187')
  })

  it('should give the swing and the time ratio', () => {
    expectPrinted(deg(result.outputSwing!), '73.7818196')
    expectPrinted(result.timeRatio!, '1.35557333')
  })
})

describe('unit time-ratio crank-rocker (FB-6)', () => {
  // Q = 1 requires a² + d² = b² + c²; then cos μmin = ad/(bc) and μmax = 180° − μmin.
  // R. J. Brodell, A. H. Soni, "Design of the crank-rocker mechanism with unit time
  // ratio", J. Mechanisms 5 (1970) 1–4 (from memory); closed form derived in the
  // field-check sheet.
  it('should analyse a synthesised linkage back to Q = 1, the swing and μmin', () => {
    const d = 100 * mm
    const swing = rad(60)
    const muMin = rad(50)
    const b = (d * Math.sin(swing / 2)) / Math.cos(muMin)
    const c = (d * Math.sqrt(1 - (b / d) ** 2)) / Math.cos(swing / 2)
    const a = c * Math.sin(swing / 2)
    const result = analyseFourBar(fourBar({ ground: d, input: a, coupler: b, output: c }), { speed: 1 })
    expectClose(result.timeRatio!, 1, { rel: 1e-9 })
    expectClose(result.outputSwing!, swing, { rel: 1e-9 })
    expectClose(result.transmissionMin.value, muMin, { rel: 1e-9 })
    expectClose(result.transmissionMax.value, Math.PI - muMin, { rel: 1e-9 })
  })
})

describe('limit positions and dead points', () => {
  it('should give the input limits of a triple-rocker where coupler and output fall in line', () => {
    const linkage = fourBar({ ground: 100 * mm, input: 65 * mm, coupler: 115 * mm, output: 70 * mm })
    const result = analyseFourBar(linkage, { speed: 1 })
    expect(result.inputTurnsFully).toBe(false)
    const [a, b, c, d] = [65, 115, 70, 100]
    // Here the diagonal |AO4| is never as long as b + c; the limit is where it
    // shrinks to |b − c|, coupler folded onto the output: cos θ2 = (a² + d² − (b − c)²)/(2ad).
    const limit = Math.acos((a * a + d * d - (b - c) ** 2) / (2 * a * d))
    expectClose(result.inputLimits!, [limit, 2 * Math.PI - limit], { rel: 1e-12 })
    for (const theta of result.inputLimits!) {
      const state = solveAt(linkage, theta)
      expectClose(Math.cos(state[THETA3]! - state[THETA4]!), 1, { abs: 1e-9 })
    }
    expect(result.warnings.map((w) => w.code)).toContain('input-cannot-turn')
  })

  it('should report the toggles as dead points when the output drives', () => {
    const result = analyseFourBar(
      fourBar({ ground: 100 * mm, input: 40 * mm, coupler: 120 * mm, output: 80 * mm, driver: 'output' }),
      { speed: 1 },
    )
    expect(result.deadPoints).toHaveLength(2)
    expect(result.needsStoredEnergy).toBe(true)
    expect(result.warnings.map((w) => w.code)).toEqual(['dead-points-need-stored-energy'])
    // The transmission angle is measured against the input it drives: nil where input and coupler fall in line.
    expect(result.transmissionMin.value).toBeLessThan(1e-9)
  })
})

describe('change-point linkages followed through their change points', () => {
  // Facts of elementary geometry (derived): a parallelogram's opposite sides stay parallel,
  // so its output copies the input; the crossed assembly (antiparallelogram) turns its
  // output the other way; a deltoid with input = coupler rocks its output between the two
  // equilateral poses |O2B| = a + b = c = d, i.e. θ4 = 120° and 240°.
  const state = new Float64Array(FOUR_BAR_STATE)
  const crosses = (linkage: FourBarLinkage, theta: number): boolean => {
    const a: [number, number] = [linkage.input * Math.cos(theta), linkage.input * Math.sin(theta)]
    const b: [number, number] = [a[0] + linkage.coupler * Math.cos(state[THETA3]!), a[1] + linkage.coupler * Math.sin(state[THETA3]!)]
    const side = (p: number[], q: number[], r: number[]) => (q[0]! - p[0]!) * (r[1]! - p[1]!) - (q[1]! - p[1]!) * (r[0]! - p[0]!)
    const cross = (p1: number[], p2: number[], p3: number[], p4: number[]) =>
      side(p3, p4, p1) * side(p3, p4, p2) < -1e-12 && side(p1, p2, p3) * side(p1, p2, p4) < -1e-12
    return cross([0, 0], a, b, [linkage.groundX, 0]) || cross(a, b, [linkage.groundX, 0], [0, 0])
  }

  it('should keep the open parallelogram a parallelogram past 180°: output angle = input angle, ω4 = ω2', () => {
    const linkage = fourBar({ ground: 100 * mm, input: 50 * mm, coupler: 100 * mm, output: 50 * mm })
    for (let t = 1; t < 360; t += 7) {
      expect(fourBarState(linkage, rad(t), state)).toBe(true)
      expectClose(wrapTurn(state[THETA4]!), rad(t), { abs: 1e-9 })
      expectClose(state[H4]!, 1, { abs: 1e-9 })
      expect(crosses(linkage, rad(t))).toBe(false)
    }
    const result = analyseFourBar(linkage, { speed: 10 })
    expect(result.outputTurnsFully).toBe(true)
    expect(result.outputSwing).toBeNull()
    expect(result.timeRatio).toBeNull()
    expectClose(result.extremes.outputAngularVelocity.max.value, 10, { rel: 1e-9 })
    expectClose(result.extremes.outputAngularVelocity.min.value, 10, { rel: 1e-9 })
    expect(result.changePoints.map((t) => Math.round(deg(t)))).toEqual([0, 180])
    expect(result.warnings.map((w) => w.code)).toContain('change-point-linkage')
    expect(result.warnings.find((w) => w.code === 'change-point-linkage')!.message).toContain('follows the open assembly through them')
  })

  it('should keep the crossed assembly crossed: the antiparallelogram turns its output the other way', () => {
    const linkage = fourBar({ ground: 100 * mm, input: 50 * mm, coupler: 100 * mm, output: 50 * mm, circuit: 'crossed' })
    let net = 0
    let previous = Number.NaN
    for (let t = 1; t < 360; t += 7) {
      fourBarState(linkage, rad(t), state)
      expect(crosses(linkage, rad(t))).toBe(true)
      expect(state[H4]!).toBeLessThan(0)
      if (Number.isFinite(previous)) net += Math.atan2(Math.sin(state[THETA4]! - previous), Math.cos(state[THETA4]! - previous))
      previous = state[THETA4]!
    }
    expect(analyseFourBar(linkage, { speed: 10 }).outputTurnsFully).toBe(true)
    expect(net).toBeLessThan(-1.9 * Math.PI)
  })

  it('should move smoothly through a change point: the state there is the limit of both sides', () => {
    const linkage = fourBar({ ground: 100 * mm, input: 50 * mm, coupler: 100 * mm, output: 50 * mm, circuit: 'crossed' })
    for (const cp of [0, Math.PI]) {
      fourBarState(linkage, cp, state)
      const at = state[H4]!
      fourBarState(linkage, cp - 1e-4, state)
      const before = state[H4]!
      fourBarState(linkage, cp + 1e-4, state)
      const after = state[H4]!
      expectClose(at, (before + after) / 2, { rel: 1e-6 })
      expectClose(before, after, { rel: 1e-3 })
    }
  })

  it('should rock a deltoid with input = coupler between 120° and 240°, time ratio 2', () => {
    const linkage = fourBar({ ground: 100 * mm, input: 50 * mm, coupler: 50 * mm, output: 100 * mm })
    const result = analyseFourBar(linkage, { speed: 1 })
    expect(result.grashof.form).toBe('deltoid')
    expect(result.outputTurnsFully).toBe(false)
    expectClose(deg(result.extremes.outputAngle.min.value), 120, { abs: 1e-6 })
    expectClose(deg(result.extremes.outputAngle.max.value), 240, { abs: 1e-6 })
    expectClose(deg(result.outputSwing!), 120, { abs: 1e-6 })
    // 240° of input travel one way, 120° back (computed from the equilateral poses at θ2 = 60° and 300°).
    expectClose(result.timeRatio!, 2, { rel: 1e-6 })
  })

  it('should need two input turns for a deltoid whose input pin passes over the output pivot', () => {
    // Ground = input (short), coupler = output (long): at θ2 = 0 the input pin A lies on O4.
    // Continuous motion turns the output once for two turns of the input (the Galloway
    // linkage; the name and the 2:1 from memory, the motion computed here).
    const linkage = fourBar({ ground: 50 * mm, input: 50 * mm, coupler: 100 * mm, output: 100 * mm })
    const result = analyseFourBar(linkage, { speed: 1 })
    expect(result.periodTurns).toBe(2)
    expect(result.outputTurnsFully).toBe(true)
    expectClose(deg(result.range.end - result.range.start), 720, { abs: 1e-9 })
    // Half way round the first turn the output has made a quarter turn: θ4 = θ2/2 at θ2 = 180° for a = d.
    fourBarState(linkage, Math.PI, state)
    expectClose(deg(wrapTurn(state[THETA4]!)), 120, { abs: 1e-6 })
  })
})

describe('coupler point', () => {
  it('should ride on the coupler: fixed distances to both coupler pins', () => {
    const linkage = fourBar({
      ground: 100 * mm,
      input: 40 * mm,
      coupler: 120 * mm,
      output: 80 * mm,
      couplerPoint: { distance: 70 * mm, angle: rad(30) },
    })
    const sweep = new FourBarSweep(linkage, 721).update({ start: 0, end: 2 * Math.PI }, { speed: 5 })
    // |PB|² = p² + b² − 2pb cos δ (law of cosines in the coupler triangle).
    const pb = Math.sqrt(70 ** 2 + 120 ** 2 - 2 * 70 * 120 * Math.cos(rad(30))) * mm
    for (let i = 0; i < sweep.count; i += 37) {
      const t2 = sweep.inputAngle[i]!
      const ax = 40 * mm * Math.cos(t2)
      const ay = 40 * mm * Math.sin(t2)
      const bx = ax + 120 * mm * Math.cos(sweep.couplerAngle[i]!)
      const by = ay + 120 * mm * Math.sin(sweep.couplerAngle[i]!)
      expectClose(Math.hypot(sweep.couplerPointX[i]! - ax, sweep.couplerPointY[i]! - ay), 70 * mm, { rel: 1e-12 })
      expectClose(Math.hypot(sweep.couplerPointX[i]! - bx, sweep.couplerPointY[i]! - by), pb, { rel: 1e-12 })
    }
  })
})
