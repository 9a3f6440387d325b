/**
 * Slider-crank and four-bar forces against the outside world: the field-check
 * cases TQ-1, DY-1, DY-2 (each with its source below), published worked examples
 * (each named, or marked from memory), and independent referees: the power
 * balance by virtual work, the cycle integral of the torque against the work
 * done on the load, and property tests.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  F,
  FB,
  FORCE_STATE,
  FOUR_BAR_FORCE_STATE,
  FOUR_BAR_STATE,
  MASSLESS,
  NO_LOAD,
  SLIDER_CRANK_STATE,
  POSITION,
  DX,
  DDX,
  DPHI,
  DDPHI,
  ROD_ANGLE,
  ROD_COS,
  ROD_SIN,
  CRANK_COS,
  CRANK_SIN,
  analyseSliderCrank,
  analyseSliderCrankForces,
  arcSliderForceInput,
  constantLoad,
  fourBar,
  fourBarForceState,
  loadTable,
  sliderCrank,
  sliderCrankForceState,
  sliderCrankForceKinematics,
  sliderCrankState,
  type SliderCrankForceInput,
  type SliderCrankMasses,
} from '../../src/linkage/index.js'
import { deg, expectClose, expectPrinted, rad } from '../helpers/close.js'

const mm = 1e-3
const rpm = (n: number): number => (n * 2 * Math.PI) / 60

/** Forces at one crank angle (ccw crank). */
function forcesAt(linkage: ReturnType<typeof sliderCrank>, input: SliderCrankForceInput, theta: number, omega: number, alpha = 0): Float64Array {
  const kin = new Float64Array(SLIDER_CRANK_STATE)
  const out = new Float64Array(FORCE_STATE)
  sliderCrankForceKinematics(linkage, theta, kin)
  sliderCrankForceState(linkage, input, null, theta, omega, alpha, kin, out)
  return out
}

const quasiStatic = (load: number): SliderCrankForceInput => ({ masses: MASSLESS, load: constantLoad(load, 'towards-crank'), friction: 0, gravity: [0, 0] })

describe('crank torque, rod force and guide thrust from a slider force (TQ-1)', () => {
  // T = −F·x′(θ) by virtual work (derived); the rod force F/cos φ and the guide thrust
  // F tan φ of the crank-effort relations, R. S. Khurmi, J. K. Gupta, Theory of Machines,
  // S. Chand, ch. 15 (from memory). r = 50 mm, l = 200 mm, F = 10 kN towards the crank.
  const linkage = sliderCrank({ crank: 50 * mm, rod: 200 * mm })
  const input = quasiStatic(10_000)
  const table: [number, string, string, string][] = [
    // θ, torque the force puts on the crank (N·m), rod force (N), guide force (N)
    [30, '304.554473', '10079.0526', '1259.88158'],
    [60, '488.454297', '10242.9504', '2217.66381'],
    [90, '500.000000', '10327.9556', '2581.98890'],
    [120, '377.571107', '10242.9504', '2217.66381'],
    [150, '195.445527', '10079.0526', '1259.88158'],
  ]
  it('should give the tabulated torque, rod compression and guide thrust', () => {
    for (const [theta, torque, rod, guide] of table) {
      const out = forcesAt(linkage, input, rad(theta), 1)
      // The drive's torque is the negative of what the force puts on the crank.
      expectPrinted(-out[F.TORQUE]!, torque, `T(${theta})`)
      expectPrinted(-out[F.ROD]!, rod, `rod(${theta})`)
      expectPrinted(Math.abs(out[F.SIDE]!), guide, `N(${theta})`)
      expectClose(out[F.LOAD_TORQUE]!, out[F.TORQUE]!, { rel: 1e-12 })
    }
  })

  it('should put the peak torque of a constant force at the peak slider speed, 76.72°', () => {
    const result = analyseSliderCrankForces(analyseSliderCrank(linkage, { speed: 1 }), input)
    const torque = result.extremes.get('crank_torque')!
    expectPrinted(-torque.min.value, '515.441349')
    expectClose(deg(torque.min.theta), 76.7209769, { abs: 1e-5 })
  })
})

describe('two-mass connecting rod (DY-1)', () => {
  // m_B = m3·l_A/l, m_A = m3·(l − l_A)/l; the model's inertia m3·l_A·l_B differs from I_G:
  // R. L. Norton, Design of Machinery, 5th ed., ch. 13 (from memory); derived.
  it('should split the rod between its pins and count its shares as reciprocating and rotating', () => {
    const masses: SliderCrankMasses = { ...MASSLESS, rod: 1.2, rodCentre: 60 * mm, rodInertia: 0.008 }
    const linkage = sliderCrank({ crank: 50 * mm, rod: 200 * mm })
    const result = analyseSliderCrankForces(analyseSliderCrank(linkage, { speed: 10 }), { masses, load: NO_LOAD, friction: 0, gravity: [0, 0] })
    expectPrinted(result.reciprocatingMass, '0.360000000')
    expectPrinted(result.rotatingMassRadius / (50 * mm), '0.840000000')
    // The model's inertia and its error against I_G (DY-1: 0.01008 kg·m², +26 %).
    expectPrinted(1.2 * 0.06 * 0.14, '0.0100800000')
    expectPrinted((1.2 * 0.06 * 0.14 - 0.008) / 0.008, '0.260000000')
  })
})

describe('primary and secondary inertia force (DY-2)', () => {
  // F = m r ω² cos θ (primary) and m r ω² λ cos 2θ (two-term secondary): Norton ch. 13;
  // J. B. Heywood, ICE Fundamentals, 1988, ch. 2 (both from memory). The exact force's
  // harmonics from the field-check sheet's 4096-point transform (derived there).
  const linkage = sliderCrank({ crank: 50 * mm, rod: 200 * mm })
  const omega = rpm(3000)
  const input: SliderCrankForceInput = { masses: { ...MASSLESS, slider: 0.8 }, load: NO_LOAD, friction: 0, gravity: [0, 0] }
  const result = analyseSliderCrankForces(analyseSliderCrank(linkage, { speed: omega }), input)

  it('should give the exact inertia force at the dead centres and at 90°', () => {
    expectPrinted(Math.abs(forcesAt(linkage, input, 0, omega)[F.RECIPROCATING]!), '4934.80220')
    expectPrinted(Math.abs(forcesAt(linkage, input, Math.PI, omega)[F.RECIPROCATING]!), '2960.88132')
    expectPrinted(Math.abs(forcesAt(linkage, input, Math.PI / 2, omega)[F.RECIPROCATING]!), '1019.32836')
  })

  it('should split it into its first and second harmonics, the primary exactly m r ω²', () => {
    expectClose(result.primary!.amplitude, 3947.84176, { rel: 1e-8 })
    // Exact second harmonic: 1.01610017 × the two-term m r ω² λ (986.960440 N).
    expectClose(result.secondary!.amplitude, 986.96044 * 1.01610017, { rel: 1e-7 })
    expectClose(result.secondary!.amplitude / result.primary!.amplitude, 0.25 * 1.01610017, { rel: 1e-7 })
  })
})

describe('piston effort, rod thrust, guide force and turning moment of a steam engine (textbook example)', () => {
  // R. S. Khurmi, J. K. Gupta, Theory of Machines (S. Chand; edition not confirmed),
  // Example 15.7 — the book from memory; the inputs and the book's method were read in a
  // published re-working: crank 300 mm, rod 1.2 m, bore 0.5 m, reciprocating mass 250 kg,
  // 250 rpm, θ = 60° from the inner dead centre (the dead centre away from the crank), net
  // steam pressure 0.35 N/mm². Method: F_P = F_L − F_I, F_Q = F_P/cos φ, F_N = F_P tan φ,
  // F_T = F_Q sin(θ + φ), T = F_T·r, with the two-term F_I = m ω² r (cos θ + cos 2θ/n).
  // The book's answers are computed here with its own method (not printed values).
  const r = 0.3
  const l = 1.2
  const omega = rpm(250)
  const theta = rad(60)
  const FL = 0.35e6 * (Math.PI / 4) * 0.5 ** 2
  const n = l / r
  const phi = Math.asin(Math.sin(theta) / n)
  const linkage = sliderCrank({ crank: r, rod: l })
  const input: SliderCrankForceInput = { masses: { ...MASSLESS, slider: 250 }, load: constantLoad(FL, 'towards-crank'), friction: 0, gravity: [0, 0] }
  const out = forcesAt(linkage, input, theta, omega)

  it('should obey the book’s relations exactly with the exact acceleration', () => {
    const kin = new Float64Array(SLIDER_CRANK_STATE)
    sliderCrankState(linkage, theta, kin)
    // The exact inertia force from SC-3's x″ (not the force solution): towards the crank here.
    const FIexact = -250 * kin[2]! * omega * omega
    const FP = FL - FIexact
    expectClose(-out[F.ROD]!, FP / Math.cos(phi), { rel: 1e-12 })
    expectClose(Math.abs(out[F.SIDE]!), FP * Math.tan(phi), { rel: 1e-12 })
    expectClose(-out[F.TORQUE]!, (FP / Math.cos(phi)) * Math.sin(theta + phi) * r, { rel: 1e-12 })
    // The crank-pin force: tangential F_Q sin(θ + φ) and radial F_Q cos(θ + φ) (towards the axis).
    expectClose(out[F.PIN_TANGENTIAL]!, (FP / Math.cos(phi)) * Math.sin(theta + phi), { rel: 1e-12 })
    expectClose(-out[F.PIN_RADIAL]!, (FP / Math.cos(phi)) * Math.cos(theta + phi), { rel: 1e-12 })
  })

  it('should agree with the book’s two-term answer to within that approximation’s error', () => {
    const FI = 250 * omega * omega * r * (Math.cos(theta) + Math.cos(2 * theta) / n)
    const FP = FL - FI
    const T = (FP / Math.cos(phi)) * Math.sin(theta + phi) * r
    expectClose(-out[F.TORQUE]!, T, { rel: 2e-3 })
    expectClose(Math.abs(out[F.SIDE]!), FP * Math.tan(phi), { rel: 2e-3 })
  })
})

describe('the power balance (virtual work), an independent referee', () => {
  // Drive power T·ω = d(KE)/dt − P·v − Σ m g·v_G at every crank angle, with KE and the
  // velocities from central differences of positions computed here from the geometry alone.
  const crank = 0.06
  const rod = 0.25
  const offset = 0.02
  const masses: SliderCrankMasses = { slider: 3.2, rod: 1.4, rodCentre: 0.09, rodInertia: 0.012, crank: 2.1, crankCentre: 0.02, crankInertia: 0.03, counterweight: 1.5, counterweightRadius: 0.04, counterweightPhase: Math.PI }
  const gravity: [number, number] = [0, -9.81]
  const load = loadTable([0.12, 0.16, 0.22, 0.3], [0, 800, 2500, 400], { abscissa: 'position', sense: 'against-motion' })
  const linkage = sliderCrank({ crank, rod, offset })
  const input: SliderCrankForceInput = { masses, load, friction: 0, gravity }
  const omega = 40
  const geometry = (t: number) => {
    const ax = crank * Math.cos(t)
    const ay = crank * Math.sin(t)
    const bx = ax + Math.sqrt(rod * rod - (ay - offset) ** 2)
    const phi = Math.atan2(offset - ay, bx - ax)
    return { bx, gx: ax + masses.rodCentre * Math.cos(phi), gy: ay + masses.rodCentre * Math.sin(phi), phi }
  }
  const energy = (t: number, h: number) => {
    const [p, q] = [geometry(t - h), geometry(t + h)]
    const vB = ((q.bx - p.bx) / (2 * h)) * omega
    const vGx = ((q.gx - p.gx) / (2 * h)) * omega
    const vGy = ((q.gy - p.gy) / (2 * h)) * omega
    const w = ((q.phi - p.phi) / (2 * h)) * omega
    const crankPart = 0.5 * masses.crankInertia * omega * omega
    return 0.5 * masses.slider * vB * vB + 0.5 * masses.rod * (vGx * vGx + vGy * vGy) + 0.5 * masses.rodInertia * w * w + crankPart
  }
  const potential = (t: number) => {
    const g = geometry(t)
    // Heights (y) times weight, with gravity along −y; the slider stays at y = e.
    return 9.81 * (masses.rod * g.gy + masses.crank * masses.crankCentre * Math.sin(t) + masses.counterweight * masses.counterweightRadius * Math.sin(t + Math.PI))
  }

  it('should balance drive power with the rates of kinetic and potential energy and the load’s power', () => {
    const h = 1e-4
    for (let i = 0; i < 36; i++) {
      const t = rad(5 + i * 10)
      const out = forcesAt(linkage, input, t, omega)
      const dKE = (energy(t + h, h) - energy(t - h, h)) / (2 * h)
      const dPE = (potential(t + h) - potential(t - h)) / (2 * h)
      const dx = (geometry(t + h).bx - geometry(t - h).bx) / (2 * h)
      const expected = dKE + dPE - out[F.LOAD]! * dx
      expectClose(out[F.TORQUE]!, expected, { rel: 1e-5, abs: 1e-4 }, `T(${5 + i * 10}°)`)
    }
  })

  it('should give a cycle integral of the torque equal to the work done on the load', () => {
    const result = analyseSliderCrankForces(analyseSliderCrank(linkage, { speed: omega }), input)
    expectClose(result.driveWork!, result.loadWork!, { rel: 1e-9 })
    // Work on the load by its own definition: ∮ −P dx, with dx from the geometry.
    let work = 0
    const steps = 20_000
    for (let i = 0; i < steps; i++) {
      const t = (2 * Math.PI * (i + 0.5)) / steps
      const out = forcesAt(linkage, input, t, omega)
      work += -out[F.LOAD]! * (geometry(t + Math.PI / steps).bx - geometry(t - Math.PI / steps).bx)
    }
    expectClose(result.loadWork!, work, { rel: 1e-6 })
  })
})

describe('the force analysis’s lean kinematic state', () => {
  it('should agree with the full state (straight and arc paths) and give the rod’s and crank’s direction cosines', () => {
    for (const linkage of [sliderCrank({ crank: 0.05, rod: 0.2, offset: 0.012, sliderSide: -1 }), sliderCrank({ crank: 0.04, rod: 0.16, offset: 0.01, pathRadius: 0.5 })]) {
      const full = new Float64Array(SLIDER_CRANK_STATE)
      const lean = new Float64Array(SLIDER_CRANK_STATE)
      for (let k = 0; k < 72; k++) {
        const theta = (k * 2 * Math.PI) / 72 + 0.013
        sliderCrankState(linkage, theta, full)
        sliderCrankForceKinematics(linkage, theta, lean)
        for (const slot of [POSITION, DX, DDX, DPHI, DDPHI]) expectClose(lean[slot], full[slot]!, { rel: 1e-13, abs: 1e-15 })
        expectClose([lean[ROD_COS], lean[ROD_SIN], lean[CRANK_COS], lean[CRANK_SIN]], [Math.cos(full[ROD_ANGLE]!), Math.sin(full[ROD_ANGLE]!), Math.cos(theta), Math.sin(theta)], { abs: 1e-14 })
      }
    }
  })
})

describe('property tests', () => {
  const runs = { numRuns: 300, seed: 20261202 }
  const linkages = fc.record({
    crank: fc.double({ min: 0.01, max: 0.2, noNaN: true }),
    rodRatio: fc.double({ min: 2.2, max: 8, noNaN: true }),
    offsetRatio: fc.double({ min: -0.5, max: 0.5, noNaN: true }),
    theta: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
    load: fc.double({ min: -5e4, max: 5e4, noNaN: true }),
  })

  it('should give the quasi-static torque −P·dx/dθ with no masses', () => {
    fc.assert(
      fc.property(linkages, ({ crank, rodRatio, offsetRatio, theta, load }) => {
        const linkage = sliderCrank({ crank, rod: crank * rodRatio, offset: offsetRatio * crank })
        const out = forcesAt(linkage, quasiStatic(load), theta, 123)
        expect(Math.abs(out[F.TORQUE]! - out[F.LOAD_TORQUE]!)).toBeLessThanOrEqual(1e-9 * (Math.abs(out[F.LOAD_TORQUE]!) + Math.abs(load) * crank))
      }),
      runs,
    )
  })

  it('should make the primary and secondary parts converge on the exact inertia force as crank/rod → 0', () => {
    let previous = Number.POSITIVE_INFINITY
    for (const ratio of [0.4, 0.2, 0.1, 0.05]) {
      const linkage = sliderCrank({ crank: 0.05, rod: 0.05 / ratio })
      const input: SliderCrankForceInput = { masses: { ...MASSLESS, slider: 1 }, load: NO_LOAD, friction: 0, gravity: [0, 0] }
      const result = analyseSliderCrankForces(analyseSliderCrank(linkage, { speed: 100 }), input)
      let worst = 0
      for (let i = 0; i < 72; i++) {
        const t = rad(i * 5)
        const exact = forcesAt(linkage, input, t, 100)[F.RECIPROCATING]!
        const parts = result.primary!.a * Math.cos(t) + result.primary!.b * Math.sin(t) + result.secondary!.a * Math.cos(2 * t) + result.secondary!.b * Math.sin(2 * t)
        worst = Math.max(worst, Math.abs(exact - parts))
      }
      // What is left is the fourth harmonic, A4 ≈ λ³/4 of m r ω² (DY-2's series).
      const mrw2 = 0.05 * 100 * 100
      expect(worst).toBeLessThanOrEqual(mrw2 * (ratio ** 3 / 4) * 1.3)
      expect(worst).toBeLessThan(previous)
      previous = worst
    }
  })

  it('should converge on the straight-path slider-crank’s forces as a four-bar’s output link grows long', () => {
    const masses: SliderCrankMasses = { ...MASSLESS, slider: 2, rod: 1, rodCentre: 0.06, rodInertia: 0.004, crank: 1, crankCentre: 0.01, crankInertia: 0.01 }
    const straight = sliderCrank({ crank: 0.05, rod: 0.2, offset: 0.01 })
    const input: SliderCrankForceInput = { masses, load: constantLoad(3000, 'towards-crank'), friction: 0, gravity: [0, -9.81] }
    const kin = new Float64Array(FOUR_BAR_STATE)
    const out = new Float64Array(FOUR_BAR_FORCE_STATE)
    for (const radius of [20, 200, 2000]) {
      const arc = sliderCrank({ crank: 0.05, rod: 0.2, offset: 0.01, pathRadius: radius })
      const fbInput = arcSliderForceInput(arc, input, null)
      let worst = 0
      for (let i = 0; i < 24; i++) {
        const t = rad(7 + i * 15)
        fourBarForceState(arc.equivalentFourBar!, fbInput, t, 50, 0, kin, out)
        const reference = forcesAt(straight, input, t, 50)[F.TORQUE]!
        worst = Math.max(worst, Math.abs(out[FB.TORQUE]! - reference) / (Math.abs(reference) + 1))
      }
      // The arc's sag under the stroke grows as 1/R: so does the difference.
      expect(worst).toBeLessThan(2 / radius)
    }
  })
})

describe('four-bar kinetostatics against the power balance (virtual work)', () => {
  // T2·ω2 = d(KE)/dt + d(PE)/dt − T4·ω4 at every input angle, with the links' positions from an
  // independent circle intersection here and their velocities from central differences.
  const [d, a, b, c] = [0.1, 0.04, 0.12, 0.08]
  const masses = { input: 0.5, inputCentre: 0.02, inputInertia: 0.0004, coupler: 0.9, couplerCentre: 0.05, couplerCentreAngle: 0.3, couplerInertia: 0.0015, output: 0.7, outputCentre: 0.035, outputInertia: 0.0011 }
  const linkage = fourBarOf(d, a, b, c)
  const load = constantLoad(2.5, 'against-motion')
  const input = { masses, outputLoad: load, outputLoadSense: 1 as const, gravity: [0, -9.81] as [number, number] }
  const omega = 30
  const pose = (t: number) => {
    const ax = a * Math.cos(t)
    const ay = a * Math.sin(t)
    const dx = d - ax
    const dy = -ay
    const r = Math.hypot(dx, dy)
    // Open circuit: B to the left of A→O4 (the core's sign convention for γ = 0).
    const along = (b * b - c * c + r * r) / (2 * r)
    const h = Math.sqrt(b * b - along * along)
    const bx = ax + (along * dx - h * dy) / r
    const by = ay + (along * dy + h * dx) / r
    const t3 = Math.atan2(by - ay, bx - ax)
    const t4 = Math.atan2(by, bx - d)
    const g3 = t3 + masses.couplerCentreAngle
    return { t3, t4, g2: [masses.inputCentre * Math.cos(t), masses.inputCentre * Math.sin(t)], g3: [ax + masses.couplerCentre * Math.cos(g3), ay + masses.couplerCentre * Math.sin(g3)], g4: [d + masses.outputCentre * Math.cos(t4), masses.outputCentre * Math.sin(t4)] }
  }
  const unwrap = (x: number) => Math.atan2(Math.sin(x), Math.cos(x))

  it('should balance the input’s power with the links’ energy rates and the output load’s power', () => {
    const kin = new Float64Array(FOUR_BAR_STATE)
    const out = new Float64Array(FOUR_BAR_FORCE_STATE)
    const h = 1e-5
    const kinetic = (t: number) => {
      const [p, q] = [pose(t - h), pose(t + h)]
      const v = (i: 'g2' | 'g3' | 'g4', k: 0 | 1) => ((q[i][k]! - p[i][k]!) / (2 * h)) * omega
      const w3 = (unwrap(q.t3 - p.t3) / (2 * h)) * omega
      const w4 = (unwrap(q.t4 - p.t4) / (2 * h)) * omega
      return (
        0.5 * masses.inputInertia * omega * omega +
        0.5 * masses.coupler * (v('g3', 0) ** 2 + v('g3', 1) ** 2) +
        0.5 * masses.couplerInertia * w3 * w3 +
        0.5 * masses.outputInertia * w4 * w4
      )
    }
    const potential = (t: number) => {
      const p = pose(t)
      return 9.81 * (masses.input * p.g2[1]! + masses.coupler * p.g3[1]! + masses.output * p.g4[1]!)
    }
    for (let i = 0; i < 24; i++) {
      const t = rad(3 + i * 15)
      fourBarForceState(linkage, input, t, omega, 0, kin, out)
      const dKE = (kinetic(t + 1e-4) - kinetic(t - 1e-4)) / 2e-4
      const dPE = (potential(t + 1e-4) - potential(t - 1e-4)) / 2e-4
      const w4 = unwrap(pose(t + 1e-6).t4 - pose(t - 1e-6).t4) / 2e-6
      const expected = dKE + dPE - out[FB.LOAD_TORQUE]! * w4
      expectClose(out[FB.TORQUE]!, expected, { rel: 1e-5, abs: 1e-5 }, `T2(${3 + i * 15}°)`)
      // The load torque opposes the output's motion.
      expect(out[FB.LOAD_TORQUE]! * w4).toBeLessThanOrEqual(0)
    }
  })
})

function fourBarOf(ground: number, input: number, coupler: number, output: number) {
  return fourBar({ ground, input, coupler, output })
}
