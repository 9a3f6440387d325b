/**
 * A connecting rod (or any strut) as a column: section properties, slenderness,
 * Euler's and Johnson's critical loads, which governs, and the factor of safety
 * against a compressive load. Each plane of bending has its own end conditions.
 * Pure, SI.
 *
 *     Euler    P_cr = C·π²·E·A / (l/k)²                    for l/k ≥ (l/k)₁
 *     Johnson  P_cr = A·(S_y − (S_y·l/(2πk))² / (C·E))      for l/k < (l/k)₁
 *     (l/k)₁ = √(2π²·C·E / S_y), where the two meet tangentially at S_y/2.
 */
import { LinkageError } from './errors.js'

/** A column's cross-section (m). In-plane is the plane of the linkage's motion. */
export type ColumnSection =
  | { readonly kind: 'round'; readonly diameter: number }
  | { readonly kind: 'tube'; readonly outer: number; readonly inner: number }
  /** width in the plane of motion, depth along the pin axis. */
  | { readonly kind: 'rectangle'; readonly width: number; readonly depth: number }
  /** An I-section whose web lies in the plane of motion: overall height (in plane), flange width (along the pins), flange and web thicknesses. */
  | { readonly kind: 'i-section'; readonly height: number; readonly flangeWidth: number; readonly flange: number; readonly web: number }

/** Area and second moments about the two axes: bending in the plane of motion, and out of it. */
export interface SectionProperties {
  readonly area: number
  readonly inPlane: number
  readonly outOfPlane: number
}

/** Section properties; throws LinkageError for dimensions that do not make a section. */
export function sectionProperties(section: ColumnSection): SectionProperties {
  const positive = (name: string, v: number): void => {
    if (!(v > 0) || !Number.isFinite(v)) throw new LinkageError('invalid-length', `The section's ${name} must be positive, got ${v} m`, { name, value: v })
  }
  switch (section.kind) {
    case 'round': {
      positive('diameter', section.diameter)
      const d = section.diameter
      const i = (Math.PI * d ** 4) / 64
      return { area: (Math.PI * d * d) / 4, inPlane: i, outOfPlane: i }
    }
    case 'tube': {
      positive('outer diameter', section.outer)
      if (!(section.inner >= 0 && section.inner < section.outer)) throw new LinkageError('invalid-length', `A tube's bore must be less than its outer diameter, got ${section.inner} and ${section.outer} m`)
      const i = (Math.PI * (section.outer ** 4 - section.inner ** 4)) / 64
      return { area: (Math.PI * (section.outer ** 2 - section.inner ** 2)) / 4, inPlane: i, outOfPlane: i }
    }
    case 'rectangle':
      positive('width', section.width)
      positive('depth', section.depth)
      return { area: section.width * section.depth, inPlane: (section.depth * section.width ** 3) / 12, outOfPlane: (section.width * section.depth ** 3) / 12 }
    case 'i-section': {
      const { height: H, flangeWidth: B, flange: tf, web: tw } = section
      for (const [n, v] of [['height', H], ['flange width', B], ['flange thickness', tf], ['web thickness', tw]] as const) positive(n, v)
      if (!(2 * tf < H && tw < B)) throw new LinkageError('invalid-length', 'An I-section needs two flanges thinner than half its height and a web narrower than its flanges')
      const inner = H - 2 * tf
      return {
        area: 2 * B * tf + inner * tw,
        inPlane: (B * H ** 3 - (B - tw) * inner ** 3) / 12,
        outOfPlane: (2 * tf * B ** 3 + inner * tw ** 3) / 12,
      }
    }
  }
}

/** Buckling in one plane. */
export interface ColumnPlane {
  /** End-condition constant C (1 pinned–pinned; 4 fixed–fixed in theory). */
  readonly endConstant: number
  readonly radiusOfGyration: number
  readonly slenderness: number
  /** (l/k)₁ where Euler and Johnson meet. */
  readonly transition: number
  readonly formula: 'euler' | 'johnson'
  readonly eulerLoad: number
  readonly johnsonLoad: number
  /** The critical load of the governing formula. */
  readonly criticalLoad: number
}

/** The column: both planes and the one that governs. */
export interface ColumnResult {
  readonly section: SectionProperties
  readonly inPlane: ColumnPlane
  readonly outOfPlane: ColumnPlane
  readonly governing: 'in-plane' | 'out-of-plane'
  readonly criticalLoad: number
  /** Critical load over the compressive load, or null without a load. */
  readonly safetyFactor: number | null
}

function plane(area: number, second: number, length: number, C: number, E: number, Sy: number): ColumnPlane {
  const k = Math.sqrt(second / area)
  const slenderness = length / k
  const transition = Math.sqrt((2 * Math.PI * Math.PI * C * E) / Sy)
  const eulerLoad = (C * Math.PI * Math.PI * E * area) / (slenderness * slenderness)
  const johnsonLoad = area * (Sy - (Sy * slenderness / (2 * Math.PI)) ** 2 / (C * E))
  const formula = slenderness >= transition ? 'euler' : 'johnson'
  return { endConstant: C, radiusOfGyration: k, slenderness, transition, formula, eulerLoad, johnsonLoad, criticalLoad: formula === 'euler' ? eulerLoad : johnsonLoad }
}

/**
 * A column of length l (pin centres) with end constants for bending in and out
 * of the plane of motion, Young's modulus E and yield strength S_y (Pa), against
 * a compressive load (N, ≥ 0) or none.
 */
export function column(section: ColumnSection, length: number, endInPlane: number, endOutOfPlane: number, modulus: number, yieldStrength: number, load: number | null): ColumnResult {
  for (const [name, v] of [['length', length], ['end-condition constant in the plane', endInPlane], ['end-condition constant out of the plane', endOutOfPlane], ["Young's modulus", modulus], ['yield strength', yieldStrength]] as const) {
    if (!(v > 0) || !Number.isFinite(v)) throw new LinkageError('invalid-number', `The column's ${name} must be positive, got ${v}`, { name, value: v })
  }
  const properties = sectionProperties(section)
  const inPlane = plane(properties.area, properties.inPlane, length, endInPlane, modulus, yieldStrength)
  const outOfPlane = plane(properties.area, properties.outOfPlane, length, endOutOfPlane, modulus, yieldStrength)
  const governing = inPlane.criticalLoad <= outOfPlane.criticalLoad ? 'in-plane' : 'out-of-plane'
  const criticalLoad = Math.min(inPlane.criticalLoad, outOfPlane.criticalLoad)
  return { section: properties, inPlane, outOfPlane, governing, criticalLoad, safetyFactor: load !== null && load > 0 ? criticalLoad / load : null }
}
