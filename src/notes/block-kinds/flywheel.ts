/**
 * `flywheel` blocks: on a forces block (`of: <id>`), the energy the flywheel
 * must store and give back over a turn, the crank angles of greatest and least
 * speed, the moment of inertia for a coefficient of speed fluctuation (given, or
 * typical for the machine from a printed table with its source), or the
 * fluctuation a given inertia leaves; rim or disc dimensions for a density and
 * an allowable rim speed; for a press, the energy per stroke and the slowdown.
 */
import { energyFluctuation, flywheelDesign, flywheelInertia, speedFluctuation, type EnergyFluctuation, type FlywheelDesign } from '../../linkage/index.js'
import { formatFixed, showQuantity } from '../display.js'
import { messages } from '../messages.js'
import { reportError, reportWarning } from '../report.js'
import type { MethodStep, NamedValue } from '../types.js'
import { toDisplay } from './angles.js'
import { linkageOf } from './forces.js'
import { readInputs, type InputSpec } from './inputs.js'
import { outcome, type BlockKind, type DataTable } from './kind.js'
import { withLinkage } from './linkage-common.js'
import { asNamed } from './slider-crank-outcome.js'
import { flag, publish, quantity, tex, texBare, word } from './values.js'

/** Where the typical coefficients come from, as the package prints it. */
export const TYPICAL_COEFFICIENT_SOURCE =
  'Stored web reference page “Flywheel Effect or Polar Moment of Inertia”, table “Coefficient of Fluctuation of Rotation, Cf” (values confirmed as quoted; the page names no original source and does not define Cf: taken here as (n_max − n_min)/n_mean). Advisory values for a first size, not a requirement.'

/** Typical coefficients of speed fluctuation by machine: the table's range and the value used (the smaller end, the larger flywheel). */
export const TYPICAL_COEFFICIENTS: readonly { readonly machine: string; readonly words: string; readonly range: string; readonly value: number }[] = [
  { machine: 'crusher-hammer-punch-press', words: 'crushers, hammers, punch presses (belt drive)', range: '0.2', value: 0.2 },
  { machine: 'mixer-excavator-belt-compressor', words: 'concrete mixers, excavators, compressors (belt drive)', range: '0.143–0.1', value: 0.1 },
  { machine: 'shear-pump-flexible-coupling', words: 'shears and pumps (flexible coupling)', range: '0.05–0.04', value: 0.04 },
  { machine: 'wood-metal-working-machinery', words: 'woodworking and metalworking machinery (belt drive)', range: '0.0333', value: 0.0333 },
  { machine: 'paper-textile-flour-mill', words: 'paper, textile and flour mills (belt drive)', range: '0.025–0.02', value: 0.02 },
  { machine: 'geared-compressor-pump', words: 'compressors and pumps (gear drive)', range: '0.02', value: 0.02 },
  { machine: 'spinning-machinery', words: 'spinning machinery (belt drive)', range: '0.02–0.015', value: 0.015 },
  { machine: 'dc-generator-belt', words: 'DC generators (belt drive)', range: '0.029', value: 0.029 },
  { machine: 'dc-generator-direct', words: 'DC generators (direct drive)', range: '0.0143', value: 0.0143 },
  { machine: 'ac-generator-belt', words: 'AC generators (belt drive)', range: '0.0167', value: 0.0167 },
  { machine: 'ac-generator-direct', words: 'AC generators (direct drive)', range: '0.01', value: 0.01 },
]

const specs: readonly InputSpec[] = [
  { name: 'coefficient', label: 'coefficient of speed fluctuation (ω_max − ω_min)/ω_mean', symbol: 'C_s', kind: 'ratio' },
  { name: 'machine', label: 'machine type, for a typical coefficient of speed fluctuation', symbol: null, kind: 'choice', choices: TYPICAL_COEFFICIENTS.map((t) => t.machine) },
  { name: 'inertia', label: 'flywheel moment of inertia (to check instead of size)', symbol: 'I', kind: 'inertia' },
  { name: 'existing_inertia', label: 'inertia already turning with the crank (crank, gears and motor rotor referred to it)', symbol: 'I_0', kind: 'inertia', default: '0 kg*m^2', nonNegative: true },
  { name: 'drive_torque', label: 'constant drive torque (default: the mean torque)', symbol: 'T_d', kind: 'torque' },
  { name: 'form', label: 'flywheel form', symbol: null, kind: 'choice', choices: ['rim', 'disc'], default: 'rim' },
  { name: 'density', label: 'density of the flywheel material', symbol: '\\rho', kind: 'density' },
  { name: 'rim_speed_limit', label: 'allowable rim speed', symbol: 'v_{allow}', kind: 'velocity' },
  { name: 'diameter', label: 'flywheel diameter (rim: mean diameter)', symbol: 'D_f', kind: 'length' },
  { name: 'width_ratio', label: 'rim width over rim thickness', symbol: 'b/t', kind: 'ratio', default: '2' },
]

export const flywheelKind: BlockKind = {
  name: 'flywheel',
  label: 'Flywheel',
  needsId: false,
  dependencies(block, ids) {
    const of = block.body.entries.find((e) => e.name === 'of')?.value
    const found = new Set<string>(of && ids.has(of) ? [of] : [])
    for (const e of block.body.entries) for (const m of e.value.matchAll(/([A-Za-z_][A-Za-z0-9_]*)\./g)) if (ids.has(m[1]!)) found.add(m[1]!)
    return found
  },
  evaluate(block, context) {
    const found = linkageOf(block, context, 'flywheel', 'a forces block')
    if (!found) return null
    const { of, linkage: forces } = found
    if (forces.core?.type !== 'forces') {
      reportError(context.file, 'wrong-block', messages['wrong-block'](of.value, 'a forces block (the flywheel needs the crank torque over the cycle)'), of.valuePlace)
      return null
    }
    const cycle = forces.core.cycle
    const own = { ...block, body: { ...block.body, entries: block.body.entries.filter((e) => e.name !== 'of') } }
    const inputs = readInputs(own, specs, 'flywheel', context)
    if (!inputs) return null
    const { si, words } = inputs
    const place = (name: string) => block.body.entries.find((e) => e.name === name)?.valuePlace ?? block.place
    const given = ['coefficient', 'machine', 'inertia'].filter((n) => n in si || n in words)
    if (given.length !== 1) {
      const detail = given.length === 0 ? 'give one of `coefficient`, `machine` (for a typical coefficient) or `inertia` (to check one)' : `give only one of ${given.map((g) => `\`${g}\``).join(', ')}`
      reportError(context.file, given.length === 0 ? 'missing-input' : 'duplicate-input', given.length === 0 ? messages['missing-input']('coefficient', detail, 'flywheel') : messages['duplicate-input'](`${given[1]}\` beside \`${given[0]}`), given.length === 0 ? block.place : place(given[1]!))
      return null
    }
    if (!cycle.fullTurn) {
      reportError(context.file, 'wrong-block', messages['wrong-block'](of.value, 'forces on a crank that turns fully: a flywheel evens out the speed over a turn'), of.valuePlace)
      return null
    }
    const source = forces.sweep!
    // Integrate in time order: u is the crank's travel in its sense of rotation from the start of the range.
    const origin = cycle.rotation === 1 ? cycle.start : cycle.start + cycle.period
    const atTravel = (u: number): number => origin + cycle.rotation * u
    const fluctuation = withLinkage(block, context, () => energyFluctuation((u) => cycle.torque(atTravel(u)), 0, cycle.period, 3600, si.drive_torque ?? null))
    if (!fluctuation) return null
    const omega = cycle.speed
    const row = words.machine ? TYPICAL_COEFFICIENTS.find((t) => t.machine === words.machine)! : null
    const coefficient = si.coefficient ?? row?.value ?? null
    if (coefficient !== null && !(coefficient > 0 && coefficient < 1)) {
      reportError(context.file, 'dimension-mismatch', messages['dimension-mismatch']('coefficient', 'coefficient of speed fluctuation', `expected a number between 0 and 1, got ${coefficient}`), place('coefficient'))
      return null
    }
    const existing = si.existing_inertia ?? 0
    // Sizing: the inertia the speed fluctuation needs, less what already turns with the crank; checking: both together.
    const total = si.inertia !== undefined ? si.inertia + existing : withLinkage(block, context, () => flywheelInertia(fluctuation.deltaE, coefficient!, omega))
    if (total === null) return null
    const inertia = si.inertia ?? Math.max(0, total - existing)
    const cs = coefficient ?? speedFluctuation(fluctuation.deltaE, total, omega)
    const omegaMax = omega * (1 + cs / 2)
    let design: FlywheelDesign | null = null
    if (si.density !== undefined && inertia > 0) {
      if (si.diameter === undefined && si.rim_speed_limit === undefined) {
        reportError(context.file, 'missing-input', messages['missing-input']('diameter', 'flywheel diameter, or `rim_speed_limit` to take the largest it allows', 'flywheel'), place('density'))
        return null
      }
      design = withLinkage(block, context, () => flywheelDesign(inertia, words.form === 'disc' ? 'disc' : 'rim', si.density!, omegaMax, si.diameter !== undefined ? si.diameter / 2 : null, si.rim_speed_limit ?? null, si.width_ratio ?? 2))
      if (!design) return null
    }
    const angle = (u: number): number => toDisplay(source, atTravel(u))
    const results: NamedValue[] = [
      quantity('energy_fluctuation', 'energy the flywheel stores and gives back per turn (largest swing of the surplus)', '\\Delta E', 'energy', fluctuation.deltaE),
      quantity('fastest_angle', `${source.convention.label} where the speed is greatest`, '\\theta_{\\max}', 'angle', angle(fluctuation.fastestAngle)),
      quantity('slowest_angle', `${source.convention.label} where the speed is least`, '\\theta_{\\min}', 'angle', angle(fluctuation.slowestAngle)),
      cycle.driver === 'slider' || cycle.driver === 'output'
        ? quantity('driven_torque', 'steady torque the driven machine takes from the crank', 'T_L', 'torque', -fluctuation.driveTorque)
        : quantity('drive_torque', 'constant drive torque the surplus is taken against', 'T_d', 'torque', fluctuation.driveTorque),
      quantity('coefficient', si.inertia !== undefined ? 'coefficient of speed fluctuation the inertia leaves' : 'coefficient of speed fluctuation used', 'C_s', 'ratio', cs),
      quantity('inertia_total', si.inertia !== undefined ? 'moment of inertia turning with the crank (flywheel and the rest)' : 'moment of inertia the speed fluctuation needs, in all', 'I', 'inertia', total),
      quantity(si.inertia !== undefined ? 'inertia_given' : 'inertia_required', si.inertia !== undefined ? 'flywheel moment of inertia (given)' : 'flywheel moment of inertia to add', 'I_f', 'inertia', inertia),
      quantity('speed_max', 'greatest crank speed', '\\omega_{\\max}', 'rotational-speed', omegaMax),
      quantity('speed_min', 'least crank speed', '\\omega_{\\min}', 'rotational-speed', omega * (1 - cs / 2)),
    ]
    if (row) results.push(word('machine_type', 'machine type of the typical coefficient', row.words))
    if (design) {
      results.push(
        quantity('flywheel_mass', `${design.form === 'rim' ? 'rim' : 'disc'} mass`, 'm_f', 'mass', design.mass),
        quantity('flywheel_diameter', design.form === 'rim' ? 'mean rim diameter' : 'disc diameter', 'D_f', 'length', 2 * design.radius),
        ...(design.form === 'rim'
          ? [quantity('rim_thickness', 'rim thickness (radial)', 't', 'length', design.thickness), quantity('rim_width', 'rim width (axial)', 'b', 'length', design.width)]
          : [quantity('disc_thickness', 'disc thickness', 't', 'length', design.thickness)]),
        quantity('rim_speed', 'rim speed at the greatest crank speed', 'v', 'velocity', design.rimSpeed),
        quantity('hoop_stress', design.form === 'rim' ? 'hoop stress of a thin rim ρv²' : 'hoop stress of a thin rim ρv² (a disc’s peak stress is lower)', '\\sigma_h', 'pressure', design.hoopStress),
      )
      if (si.rim_speed_limit !== undefined) results.push(flag('rim_speed_within_limit', 'rim speed within the allowable', design.rimSpeed <= si.rim_speed_limit * (1 + 1e-9)))
    }
    const energyPerStroke = cycle.loadWork !== null && cycle.loadWork > 0 ? cycle.loadWork : null
    let slowdown: number | null = null
    if (energyPerStroke !== null && total > 0) {
      const after = omegaMax * omegaMax - (2 * energyPerStroke) / total
      slowdown = after > 0 ? 1 - Math.sqrt(after) / omegaMax : 1
    }
    results.push(
      quantity('energy_per_stroke', 'work done on the process load per stroke', 'E_s', 'energy', energyPerStroke, 'no work is done on a load'),
      quantity('slowdown_per_stroke', 'speed lost if the flywheel alone gives the energy per stroke, from the greatest speed', '\\Delta\\omega/\\omega', 'ratio', slowdown, 'no work is done on a load'),
    )
    publish(context, block.id, [...asNamed(inputs.values), ...results])
    const warnings: string[] = []
    if (design && si.rim_speed_limit !== undefined && design.rimSpeed > si.rim_speed_limit * (1 + 1e-9)) {
      const text = `The rim speed ${showQuantity(design.rimSpeed, 'velocity', context.meta.units, context.meta.digits)} exceeds the allowable ${showQuantity(si.rim_speed_limit, 'velocity', context.meta.units, context.meta.digits)}: a smaller diameter (and a heavier rim) is needed`
      warnings.push(text)
      reportWarning(context.file, 'dynamics-warning', messages['dynamics-warning'](text), place('diameter'))
    }
    if (design?.form === 'rim' && design.thickness > design.radius / 2) {
      // A thin rim's I = m·R² leaves out m·t²/4: fine for a slim rim, not for a thick one (common practice, no source).
      const text = `The rim is thick (${showQuantity(design.thickness, 'length', context.meta.units, context.meta.digits)} on a ${showQuantity(design.radius, 'length', context.meta.units, context.meta.digits)} mean radius): the thin-rim sizing no longer describes it; take a larger diameter`
      warnings.push(text)
      reportWarning(context.file, 'dynamics-warning', messages['dynamics-warning'](text), place('diameter'))
    }
    if (slowdown === 1) {
      const text = 'The flywheel cannot give the energy per stroke from its stored energy alone: the crank would stop without the motor'
      warnings.push(text)
      reportWarning(context.file, 'dynamics-warning', messages['dynamics-warning'](text), block.place)
    }
    const from = block.id ?? 'flywheel'
    const data: DataTable[] = row
      ? [
          {
            caption: 'Typical coefficients of speed fluctuation by machine type (the value used is the smaller end of a range, giving the larger flywheel)',
            columns: [{ label: 'machine type', unit: '' }, { label: 'Cs in the table', unit: '' }, { label: 'Cs used', unit: '' }],
            rows: TYPICAL_COEFFICIENTS.map((t) => [t.machine === row.machine ? `▶ ${t.words}` : t.words, t.range, formatFixed(t.value, 4)]),
            source: TYPICAL_COEFFICIENT_SOURCE,
          },
        ]
      : []
    return outcome(block, 'Flywheel', {
      covers: ['flywheel'],
      inputs: inputs.values,
      results,
      method: flywheelMethod(fluctuation, cs, total, existing, omega, design, si.inertia !== undefined, energyPerStroke, slowdown, angle, context),
      warnings,
      assumptions: [
        { text: 'The drive (motor) gives a constant torque, equal to the mean torque unless one is stated; the speed fluctuation is small, so the torque curve at the mean speed stands for the whole turn.', verify: false, from },
        { text: 'The flywheel’s inertia is all that stores energy: the inertia of the crank, gears and motor rotor referred to the crank shaft adds to it (a margin).', verify: false, from },
        ...(design?.form === 'rim' ? [{ text: 'A rim flywheel’s mass is taken at its mean radius; arms and hub are neglected (they add inertia: a margin).', verify: false, from }] : []),
      ],
      summary: [si.inertia !== undefined ? 'coefficient' : 'inertia_required', 'energy_fluctuation', ...(design ? ['flywheel_mass', 'rim_speed'] : [])],
      data,
    })
  },
}

function flywheelMethod(
  f: EnergyFluctuation,
  cs: number,
  inertia: number,
  existing: number,
  omega: number,
  design: FlywheelDesign | null,
  checking: boolean,
  energyPerStroke: number | null,
  slowdown: number | null,
  angle: (u: number) => number,
  context: Parameters<BlockKind['evaluate']>[1],
): MethodStep[] {
  const { meta } = context
  const steps: MethodStep[] = [
    {
      label: 'Energy fluctuation over a turn',
      formula: 'E(\\theta) = \\int_{0}^{\\theta} (T_d - T)\\,d\\theta,\\qquad \\Delta E = E_{\\max} - E_{\\min}',
      substituted: `T_d = ${tex(meta, f.driveTorque, 'torque')},\\quad E_{\\max} = ${tex(meta, f.energyMax, 'energy')}\\ \\text{at}\\ ${tex(meta, angle(f.fastestAngle), 'angle')},\\quad E_{\\min} = ${tex(meta, f.energyMin, 'energy')}\\ \\text{at}\\ ${tex(meta, angle(f.slowestAngle), 'angle')}`,
      result: `\\Delta E = ${tex(meta, f.deltaE, 'energy')}`,
      note: `T is the torque the linkage needs (from the forces block), T_d the constant drive${f.driveTorque < 0 ? ' (negative: the slider drives, and the driven machine takes the steady torque −T_d from the crank)' : ''}. The surplus E is integrated in the sense of rotation from the start of the turn by five-point Gauss–Legendre quadrature on 3600 steps, with the turning points (T = T_d) found by bisection. The speed is greatest where E is greatest.`,
    },
  ]
  if (checking) {
    steps.push({
      label: 'Speed fluctuation the inertia leaves',
      formula: 'C_s = \\frac{\\Delta E}{I\\,\\omega^2}',
      substituted: `C_s = \\frac{${tex(meta, f.deltaE, 'energy')}}{${tex(meta, inertia, 'inertia')} \\times (${tex(meta, omega, 'angular-velocity')})^2}`,
      result: `C_s = ${texBare(meta, cs, 'ratio')}`,
      note: `From ½I(ω_max² − ω_min²) = ΔE with ω = (ω_max + ω_min)/2 and C_s = (ω_max − ω_min)/ω, exactly.${existing > 0 ? ' I is the flywheel and the inertia already turning with the crank together.' : ''}`,
    })
  } else {
    steps.push({
      label: 'Moment of inertia for the coefficient of speed fluctuation',
      formula: 'I = \\frac{\\Delta E}{C_s\\,\\omega^2}',
      substituted: `I = \\frac{${tex(meta, f.deltaE, 'energy')}}{${texBare(meta, cs, 'ratio')} \\times (${tex(meta, omega, 'angular-velocity')})^2}`,
      result: existing > 0 ? `I = ${tex(meta, inertia, 'inertia')},\\quad I_f = I - I_0 = ${tex(meta, Math.max(0, inertia - existing), 'inertia')}` : `I = ${tex(meta, inertia, 'inertia')}`,
      note: `From ½I(ω_max² − ω_min²) = ΔE with ω = (ω_max + ω_min)/2 and C_s = (ω_max − ω_min)/ω, exactly.${existing > 0 ? ' I_0 is the inertia already turning with the crank; the flywheel adds I_f.' : ''}`,
    })
  }
  if (design) {
    const rim = design.form === 'rim'
    steps.push({
      label: rim ? 'Rim dimensions' : 'Disc dimensions',
      formula: rim ? 'm = \\frac{I}{R^2},\\quad A = \\frac{m}{2\\pi R\\,\\rho} = b\\,t,\\quad v = \\omega_{\\max} R' : 'm = \\frac{2I}{R^2},\\quad t = \\frac{m}{\\rho\\,\\pi R^2},\\quad v = \\omega_{\\max} R',
      substituted: `R = ${tex(meta, design.radius, 'length')},\\quad \\omega_{\\max} = ${tex(meta, omega * (1 + cs / 2), 'angular-velocity')}`,
      result: `m = ${tex(meta, design.mass, 'mass')},\\quad ${rim ? `t = ${tex(meta, design.thickness, 'length')},\\ b = ${tex(meta, design.width, 'length')}` : `t = ${tex(meta, design.thickness, 'length')}`},\\quad v = ${tex(meta, design.rimSpeed, 'velocity')}`,
      note: `R is the ${rim ? 'mean rim' : 'disc'} radius: as given, or the largest the allowable rim speed permits. Hoop stress of a thin rim σ = ρv² = ${showQuantity(design.hoopStress, 'pressure', meta.units, meta.digits)}.`,
    })
  }
  if (energyPerStroke !== null && slowdown !== null) {
    steps.push({
      label: 'Energy per stroke and slowdown',
      formula: '\\frac{\\Delta\\omega}{\\omega_{\\max}} = 1 - \\sqrt{1 - \\frac{2E_s}{I\\,\\omega_{\\max}^2}}',
      substituted: `E_s = ${tex(meta, energyPerStroke, 'energy')},\\quad I = ${tex(meta, inertia, 'inertia')}`,
      result: `\\frac{\\Delta\\omega}{\\omega_{\\max}} = ${texBare(meta, slowdown, 'ratio')}`,
      note: 'The speed the flywheel loses if it alone gives the work of one stroke, the motor adding nothing during it: a bound for a press whose working stroke is short.',
    })
  }
  return steps
}
