/**
 * Flywheel sizing from a crank torque curve: the energy the flywheel must give
 * and take over a cycle (the largest swing of the cumulative surplus of drive
 * over demand), the crank angles of greatest and least speed, the inertia for a
 * coefficient of speed fluctuation, and rim or solid-disc dimensions for a
 * material and an allowable rim speed. Pure, SI.
 *
 * With ω_mean = (ω_max + ω_min)/2 and Cs = (ω_max − ω_min)/ω_mean, the energy
 * identity ½I(ω_max² − ω_min²) = I·ω_mean²·Cs makes I = ΔE/(Cs·ω_mean²) exact.
 */
import { LinkageError, requireFinite } from './errors.js'
import { MAX_ITERATIONS } from './math.js'

// Five-point Gauss–Legendre nodes and weights on [−1, 1]: exact for polynomials to degree 9.
const NODES = [0, -0.5384693101056831, 0.5384693101056831, -0.906179845938664, 0.906179845938664]
const WEIGHTS = [0.5688888888888889, 0.47862867049936647, 0.47862867049936647, 0.23692688505618908, 0.23692688505618908]

function gauss(f: (x: number) => number, a: number, b: number): number {
  const half = (b - a) / 2
  const mid = (a + b) / 2
  let sum = 0
  for (let i = 0; i < 5; i++) sum += WEIGHTS[i]! * f(mid + half * NODES[i]!)
  return sum * half
}

/** The energy fluctuation of a torque curve over one cycle. */
export interface EnergyFluctuation {
  /** Mean torque over the cycle (N·m) and its RMS. */
  readonly meanTorque: number
  readonly rmsTorque: number
  /** The drive torque the surplus was taken against (the mean, or the torque stated). */
  readonly driveTorque: number
  /** Largest swing of the cumulative surplus ∫(T_drive − T) dθ, J. */
  readonly deltaE: number
  /** Crank angles (from the cycle's start) where the speed is greatest and least, rad. */
  readonly fastestAngle: number
  readonly slowestAngle: number
  /** The surplus there, J, from the start of the cycle. */
  readonly energyMax: number
  readonly energyMin: number
  /** Angles where drive and demand are equal (the surplus's turning points), rad. */
  readonly crossings: readonly number[]
}

/**
 * The energy fluctuation of the demand torque T(θ) over a cycle [start, start +
 * period] against a constant drive (its mean unless `drive` is given): sampled on
 * `intervals` steps, the turning points of the surplus found by bisection, and the
 * surplus integrated between them by Gauss–Legendre quadrature.
 */
export function energyFluctuation(torque: (theta: number) => number, start: number, period: number, intervals = 3600, drive: number | null = null): EnergyFluctuation {
  requireFinite('cycle start', start)
  if (!(period > 0) || !Number.isInteger(intervals) || intervals < 8) {
    throw new LinkageError('invalid-number', `A flywheel needs a cycle of positive length and at least 8 steps, got ${period} rad in ${intervals}`)
  }
  const h = period / intervals
  let total = 0
  let squares = 0
  for (let i = 0; i < intervals; i++) {
    const a = start + i * h
    total += gauss(torque, a, a + h)
    squares += gauss((t) => torque(t) ** 2, a, a + h)
  }
  const meanTorque = total / period
  const rmsTorque = Math.sqrt(squares / period)
  if (!Number.isFinite(meanTorque)) throw new LinkageError('invalid-number', 'The torque curve is not finite over the cycle')
  const driveTorque = drive ?? meanTorque
  const net = (t: number): number => driveTorque - torque(t)
  // Walk the cycle: the surplus at each step's end, and at each sign change of the net torque inside a step.
  let energy = 0
  let energyMax = 0
  let energyMin = 0
  let fastestAngle = start
  let slowestAngle = start
  const crossings: number[] = []
  let previous = net(start)
  for (let i = 0; i < intervals; i++) {
    const a = start + i * h
    const b = a + h
    const next = net(b)
    if ((previous > 0 && next < 0) || (previous < 0 && next > 0)) {
      let lo = a
      let hi = b
      for (let k = 0; k < MAX_ITERATIONS && hi - lo > 1e-13 * Math.max(1, Math.abs(hi)); k++) {
        const mid = (lo + hi) / 2
        const value = net(mid)
        if ((value > 0) === (previous > 0)) lo = mid
        else hi = mid
      }
      const root = (lo + hi) / 2
      const at = energy + gauss(net, a, root)
      crossings.push(root)
      if (at > energyMax) { energyMax = at; fastestAngle = root }
      if (at < energyMin) { energyMin = at; slowestAngle = root }
    }
    energy += gauss(net, a, b)
    if (drive !== null || i === intervals - 1) {
      // Against a stated drive the surplus need not return: its ends count too.
      if (energy > energyMax) { energyMax = energy; fastestAngle = b }
      if (energy < energyMin) { energyMin = energy; slowestAngle = b }
    }
    previous = next
  }
  return { meanTorque, rmsTorque, driveTorque, deltaE: energyMax - energyMin, fastestAngle, slowestAngle, energyMax, energyMin, crossings }
}

/** Moment of inertia for an energy swing ΔE (J), a coefficient of speed fluctuation Cs and the mean speed ω (rad/s). */
export function flywheelInertia(deltaE: number, coefficient: number, omega: number): number {
  if (!(coefficient > 0)) throw new LinkageError('invalid-number', `The coefficient of speed fluctuation must be positive, got ${coefficient}`)
  if (!(omega > 0)) throw new LinkageError('invalid-number', `The mean speed must be positive, got ${omega} rad/s`)
  return deltaE / (coefficient * omega * omega)
}

/** The coefficient of speed fluctuation a given inertia leaves. */
export function speedFluctuation(deltaE: number, inertia: number, omega: number): number {
  return deltaE / (inertia * omega * omega)
}

/** A flywheel's shape: a rim (thin ring, its mass at the mean radius) or a solid disc. */
export type FlywheelForm = 'rim' | 'disc'

/** A flywheel made: outer (disc) or mean (rim) radius, mass, section, rim speed. */
export interface FlywheelDesign {
  readonly form: FlywheelForm
  /** Mean rim radius, or the disc's radius, m. */
  readonly radius: number
  readonly mass: number
  /** Rim: cross-section area (m²), thickness and width; disc: thickness (width = 0). */
  readonly area: number
  readonly thickness: number
  readonly width: number
  /** Rim speed at the greatest speed, m/s, and the hoop stress ρv² it gives a thin rim, Pa. */
  readonly rimSpeed: number
  readonly hoopStress: number
}

/**
 * Dimensions of a flywheel of inertia I (kg·m²) in a material of density ρ,
 * at its greatest speed ω_max: the radius is given, or the largest the allowable
 * rim speed permits. A rim of width/thickness ratio `aspect` (b = aspect·t).
 */
export function flywheelDesign(inertia: number, form: FlywheelForm, density: number, omegaMax: number, radius: number | null, allowableRimSpeed: number | null, aspect = 2): FlywheelDesign {
  for (const [name, value] of [['inertia', inertia], ['density', density], ['greatest speed', omegaMax]] as const) {
    if (!(value > 0) || !Number.isFinite(value)) throw new LinkageError('invalid-number', `The flywheel's ${name} must be positive, got ${value}`)
  }
  const r = radius ?? (allowableRimSpeed !== null ? allowableRimSpeed / omegaMax : Number.NaN)
  if (!(r > 0)) throw new LinkageError('invalid-number', 'A flywheel needs a radius or an allowable rim speed to size it')
  // Rim: I = m·R² with the mass at the mean radius; disc: I = m·R²/2.
  const mass = form === 'rim' ? inertia / (r * r) : (2 * inertia) / (r * r)
  let area: number
  let thickness: number
  let width: number
  if (form === 'rim') {
    area = mass / (2 * Math.PI * r * density)
    thickness = Math.sqrt(area / aspect)
    width = aspect * thickness
  } else {
    thickness = mass / (density * Math.PI * r * r)
    area = thickness * 2 * r
    width = 0
  }
  const rimSpeed = omegaMax * r
  return { form, radius: r, mass, area, thickness, width, rimSpeed, hoopStress: density * rimSpeed * rimSpeed }
}
