/**
 * Rod buckling against the field-check cases BK-1 and BK-2 and published worked
 * examples: Euler's and Johnson's formulas, the transition slenderness, which
 * formula governs, and the factor of safety.
 */
import { describe, expect, it } from 'vitest'
import { column, sectionProperties } from '../../src/linkage/index.js'
import { expectClose, expectPrinted } from '../helpers/close.js'

const mm = 1e-3

describe('Euler column (BK-1, textbook example)', () => {
  // R. G. Budynas, J. K. Nisbett, Shigley's Mechanical Engineering Design, 9th ed., McGraw-Hill 2011,
  // §4-12, Eqs. (4-45), (4-46), (4-51) and Example 4-17 (confirmed in a published copy): 22 kN, n_d = 4,
  // 1.5 m, pinned, E = 207 GPa, S_y = 500 MPa: d = 37.48 mm, with 40 mm l/k = 150, (l/k)₁ = 90.4, Euler.
  it('should give the printed slenderness, transition and formula for a 40 mm round rod', () => {
    const result = column({ kind: 'round', diameter: 40 * mm }, 1.5, 1, 1, 207e9, 500e6, 22000)
    expectPrinted(result.inPlane.slenderness, '150.000000')
    expectPrinted(result.inPlane.transition, '90.3992945')
    expect(result.inPlane.formula).toBe('euler')
    expectPrinted(result.criticalLoad, '114103.098')
    expectPrinted(result.safetyFactor!, '5.18650446')
  })

  it('should reach P_cr = 88 kN at the book’s diameter d = (64 P_cr l²/(π³ C E))^¼ = 37.48 mm', () => {
    const d = ((64 * 88000 * 1.5 ** 2) / (Math.PI ** 3 * 207e9)) ** 0.25
    expectPrinted(d / mm, '37.48')
    expectClose(column({ kind: 'round', diameter: d }, 1.5, 1, 1, 207e9, 500e6, 22000).criticalLoad, 88000, { rel: 1e-12 })
  })
})

describe('Johnson parabola (BK-2)', () => {
  // Shigley 9th ed. §4-13, Eq. (4-53) (confirmed); lengths 0.3 m (Johnson) and 0.5 m (borderline).
  // Johnson's diameter for P_cr = n_d·P: d = 2·√(P_cr/(π S_y) + S_y l²/(π² C E)) (Shigley Eq. 4-53).
  const johnsonDiameter = (l: number) => 2 * Math.sqrt(88000 / (Math.PI * 500e6) + (500e6 * l * l) / (Math.PI ** 2 * 207e9))
  const eulerDiameter = (l: number) => ((64 * 88000 * l * l) / (Math.PI ** 3 * 207e9)) ** 0.25

  it('should take Johnson below the transition and Euler above it, checked after sizing', () => {
    expectPrinted(johnsonDiameter(0.3) / mm, '17.6690559')
    expectPrinted(johnsonDiameter(0.5) / mm, '21.6524206')
    expectPrinted(eulerDiameter(0.5) / mm, '21.6419143')
    const short = column({ kind: 'round', diameter: johnsonDiameter(0.3) }, 0.3, 1, 1, 207e9, 500e6, 22000)
    expect(short.inPlane.formula).toBe('johnson')
    expectPrinted(short.inPlane.slenderness, '67.9153434')
    expectClose(short.criticalLoad, 88000, { rel: 1e-8 })
    // At 0.5 m the Johnson diameter gives l/k = 92.37 > 90.40: Euler governs there.
    const borderline = column({ kind: 'round', diameter: johnsonDiameter(0.5) }, 0.5, 1, 1, 207e9, 500e6, 22000)
    expect(borderline.inPlane.formula).toBe('euler')
    expectPrinted(borderline.inPlane.slenderness, '92.3684255')
    const euler = column({ kind: 'round', diameter: eulerDiameter(0.5) }, 0.5, 1, 1, 207e9, 500e6, 22000)
    expectClose(euler.criticalLoad, 88000, { rel: 1e-8 })
  })

  it('should meet Euler tangentially at S_y/2 at the transition', () => {
    const d = 30 * mm
    const area = (Math.PI * d * d) / 4
    const transition = Math.sqrt((2 * Math.PI ** 2 * 207e9) / 500e6)
    const length = transition * (d / 4)
    const result = column({ kind: 'round', diameter: d }, length, 1, 1, 207e9, 500e6, null)
    expectClose(result.inPlane.eulerLoad / area, 250e6, { rel: 1e-12 })
    expectClose(result.inPlane.johnsonLoad / area, 250e6, { rel: 1e-12 })
  })
})

describe('a machine link sized as a column (textbook example)', () => {
  // R. L. Mott, Machine Elements in Mechanical Design, ch. 6 "Columns" (book and edition from memory;
  // the example read in published copies): 9800 lb, 25 in, pinned, design factor 3, SAE 1020 hot-rolled
  // (S_y = 30 ksi, E = 30 × 10⁶ psi): Euler d = 1.06 in with l/k = 94.3, below C_c = 140.5, so Johnson:
  // d = 1.23 in with l/k = 81.3.
  const inch = 0.0254
  const lbf = 4.4482216152605
  const psi = 6894.757293168
  const P = 9800 * lbf
  const L = 25 * inch
  const E = 30e6 * psi
  const Sy = 30e3 * psi

  it('should find the Euler trial diameter too stout for Euler, and Johnson’s diameter at factor 3', () => {
    const dEuler = ((64 * 3 * P * L * L) / (Math.PI ** 3 * E)) ** 0.25
    expectPrinted(dEuler / inch, '1.06')
    const trial = column({ kind: 'round', diameter: dEuler }, L, 1, 1, E, Sy, P)
    expectPrinted(trial.inPlane.slenderness, '94.3')
    expectPrinted(trial.inPlane.transition, '140.5')
    expect(trial.inPlane.formula).toBe('johnson')
    const dJohnson = 2 * Math.sqrt((3 * P) / (Math.PI * Sy) + (Sy * L * L) / (Math.PI ** 2 * E))
    expectPrinted(dJohnson / inch, '1.23')
    expectClose(column({ kind: 'round', diameter: dJohnson }, L, 1, 1, E, Sy, P).safetyFactor!, 3, { rel: 1e-12 })
    expectPrinted(column({ kind: 'round', diameter: 1.23 * inch }, L, 1, 1, E, Sy, P).inPlane.slenderness, '81.3')
  })
})

describe('sections', () => {
  // Second moments of area: bh³/12, πd⁴/64, the tube's difference of two discs (elementary; derived).
  it('should give the two planes of a rectangle and of an I-section their own second moments', () => {
    const rect = sectionProperties({ kind: 'rectangle', width: 30 * mm, depth: 12 * mm })
    expectClose(rect.inPlane, (0.012 * 0.03 ** 3) / 12, { rel: 1e-12 })
    expectClose(rect.outOfPlane, (0.03 * 0.012 ** 3) / 12, { rel: 1e-12 })
    const tube = sectionProperties({ kind: 'tube', outer: 40 * mm, inner: 30 * mm })
    expectClose(tube.inPlane, sectionProperties({ kind: 'round', diameter: 0.04 }).inPlane - sectionProperties({ kind: 'round', diameter: 0.03 }).inPlane, { rel: 1e-12 })
    // A rod I-section, 40 high, 24 wide, flanges 6 and web 5 mm: the in-plane moment is the box less the two side pockets.
    const i = sectionProperties({ kind: 'i-section', height: 40 * mm, flangeWidth: 24 * mm, flange: 6 * mm, web: 5 * mm })
    expectClose(i.area, 2 * 0.024 * 0.006 + 0.028 * 0.005, { rel: 1e-12 })
    expectClose(i.inPlane, (0.024 * 0.04 ** 3 - 0.019 * 0.028 ** 3) / 12, { rel: 1e-12 })
  })

  it('should let the weaker plane govern, each with its own end conditions', () => {
    // A flat bar pinned in the plane of motion but held at its pins out of it.
    const result = column({ kind: 'rectangle', width: 30 * mm, depth: 12 * mm }, 0.4, 1, 4, 207e9, 350e6, 10000)
    expect(result.governing).toBe(result.inPlane.criticalLoad < result.outOfPlane.criticalLoad ? 'in-plane' : 'out-of-plane')
    expectClose(result.criticalLoad, Math.min(result.inPlane.criticalLoad, result.outOfPlane.criticalLoad), { rel: 0 })
  })
})
