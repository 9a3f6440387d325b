/**
 * `four-bar` blocks: Grashof class, transmission angle, toggles, output swing and
 * time ratio, output velocity and acceleration, and a coupler-point path.
 */
import { FOUR_BAR_STATE, FourBarSweep, THETA3, analyseFourBar, fourBar, fourBarState, wrapTurn, type Extremes, type FourBarAnalysis } from '../../linkage/index.js'
import { displayUnit, formatNumber, inNoteUnits, showQuantity, unitLabel } from '../display.js'
import { messages } from '../messages.js'
import { reportWarning } from '../report.js'
import type { MethodStep, NamedValue } from '../types.js'
import { inputDependencies, readInputs, type InputSpec } from './inputs.js'
import { angleConvention, displayRange, toDisplay } from './angles.js'
import { extremesRows, extremesValues, type ExtremesRow } from './extremes.js'
import { outcome, type AngleConvention, type AngleMarker, type BlockKind, type EvaluationContext, type SweepSource, type SweptQuantity } from './kind.js'
import { kinematicAssumptions, motionInputs, rotationSign, withLinkage } from './linkage-common.js'
import { TRANSMISSION_LIMIT, asNamed } from './slider-crank-outcome.js'

const DEG = 180 / Math.PI
import { flag, publish, quantity, tex, texBare, word } from './values.js'

const specs: readonly InputSpec[] = [
  { name: 'ground', label: 'ground link (pivot to pivot)', symbol: 'd', kind: 'length', required: true },
  { name: 'input', label: 'input link (crank)', symbol: 'a', kind: 'length', required: true },
  { name: 'coupler', label: 'coupler', symbol: 'b', kind: 'length', required: true },
  { name: 'output', label: 'output link (rocker)', symbol: 'c', kind: 'length', required: true },
  ...motionInputs,
  { name: 'circuit', label: 'assembly circuit', symbol: null, kind: 'choice', choices: ['open', 'crossed'], default: 'open' },
  { name: 'driver', label: 'driving link', symbol: null, kind: 'choice', choices: ['input', 'output'], default: 'input' },
  { name: 'coupler_point_distance', label: 'coupler point: distance from the input pin A', symbol: 'p', kind: 'length' },
  { name: 'coupler_point_angle', label: 'coupler point: angle from the coupler line A→B', symbol: '\\delta', kind: 'angle', default: '0 deg' },
]

export const fourBarKind: BlockKind = {
  name: 'four-bar',
  label: 'Four-bar linkage',
  needsId: true,
  dependencies: (block, ids) => inputDependencies(block, specs, ids),
  evaluate(block, context) {
    const inputs = readInputs(block, specs, 'four-bar', context)
    if (!inputs) return null
    const { si, words } = inputs
    const analysis = withLinkage(block, context, () => {
      const linkage = fourBar({
        ground: si.ground!,
        input: si.input!,
        coupler: si.coupler!,
        output: si.output!,
        circuit: words.circuit === 'crossed' ? 'crossed' : 'open',
        rotation: rotationSign(words.rotation),
        driver: words.driver === 'output' ? 'output' : 'input',
        couplerPoint: si.coupler_point_distance === undefined ? null : { distance: si.coupler_point_distance, angle: si.coupler_point_angle ?? 0 },
      })
      return analyseFourBar(linkage, { speed: si.speed!, angularAcceleration: si.angular_acceleration ?? 0 })
    })
    if (!analysis) return null
    const convention = angleConvention('x-axis', 'input', analysis.linkage.rotation, null)
    const source = fourBarSweep(analysis, convention)
    const results = fourBarResults(analysis, source)
    const extremes = fourBarExtremes(source)
    publish(context, block.id, [...asNamed(inputs.values), ...results, ...extremesValues(extremes)])
    const from = block.id ?? 'four-bar'
    const assumptions = kinematicAssumptions(from, 'input', 'pin joints')
    const drive = analysis.linkage.driver === 'output' ? ['needs_stored_energy'] : []
    return outcome(block, 'Four-bar linkage', {
      covers: ['kinematics'],
      inputs: inputs.values,
      results,
      extremes,
      method: fourBarMethod(analysis, source, context),
      warnings: fourBarWarnings(analysis, block.place, context),
      assumptions,
      summary: analysis.timeRatio !== null
        ? ['grashof_label', 'transmission_angle_worst', 'output_swing', 'time_ratio', 'output_angular_velocity_abs_max', ...drive]
        : ['grashof_label', 'transmission_angle_worst', 'output_turns_fully', 'output_angular_velocity_abs_max', ...drive],
      sweep: source,
      core: { type: 'four-bar', analysis },
    })
  },
}

function fourBarResults(a: FourBarAnalysis, source: SweepSource): NamedValue[] {
  const angle = (theta: number | null | undefined): number | null => (theta === null || theta === undefined ? null : toDisplay(source, theta))
  const extended = a.toggles.find((t) => t.kind === 'extended')
  const folded = a.toggles.find((t) => t.kind === 'folded')
  const noSwing = a.outputTurnsFully ? 'the output turns fully' : !a.inputTurnsFully ? 'the input cannot turn fully' : 'no output swing on this assembly'
  const results: NamedValue[] = [
    word('grashof_class', 'Grashof class', a.grashof.className),
    word('grashof_label', 'class in words', a.grashof.label),
    quantity('short_plus_long', 'shortest + longest link, s + l', 's + l', 'length', a.grashof.shortPlusLong),
    quantity('other_two', 'sum of the other two links, p + q', 'p + q', 'length', a.grashof.otherTwo),
    flag('input_turns_fully', 'input turns fully', a.inputTurnsFully),
    flag('output_turns_fully', 'output turns fully (on the followed assembly)', a.outputTurnsFully),
    quantity('transmission_angle_worst', 'worst transmission angle min(μmin, 180° − μmax)', '\\mu_{w}', 'angle', a.transmissionWorst.value),
    quantity('transmission_angle_worst_at', 'input angle at the worst transmission angle', null, 'angle', angle(a.transmissionWorst.theta)),
    quantity('extended_toggle_angle', 'input angle at the extended toggle (input and coupler in line)', '\\theta_e', 'angle', angle(extended?.theta), 'no such toggle on this assembly'),
    quantity('folded_toggle_angle', 'input angle at the folded toggle (input and coupler overlapping)', '\\theta_f', 'angle', angle(folded?.theta), 'no such toggle on this assembly'),
    quantity('output_swing', 'output swing', '\\psi', 'angle', a.outputSwing, noSwing),
    quantity('forward_angle', 'input travel, extended → folded toggle', '\\beta_1', 'angle', a.forwardAngle, noSwing),
    quantity('return_angle', 'input travel, folded → extended toggle', '\\beta_2', 'angle', a.returnAngle, noSwing),
    quantity('time_ratio', 'time ratio of the output swings (slower / faster)', 'Q', 'ratio', a.timeRatio, noSwing),
    flag('needs_stored_energy', 'needs stored energy (a flywheel) to pass the dead points', a.needsStoredEnergy),
    quantity('dead_point_count', 'dead points in the range (where the driving link cannot move the driven one)', null, 'count', a.deadPoints.length),
    quantity('period_turns', 'input turns before the motion repeats', null, 'count', a.periodTurns),
  ]
  if (a.inputLimits) {
    results.push(
      quantity('input_limit_start', 'input limit angle (start of range)', '\\theta_{L1}', 'angle', angle(a.inputLimits[0])),
      quantity('input_limit_end', 'input limit angle (end of range)', '\\theta_{L2}', 'angle', angle(a.inputLimits[1])),
    )
  }
  return results
}

function fourBarExtremes(source: SweepSource): ExtremesRow[] {
  const unbounded = (theta: number): string =>
    `unbounded at the input limit angle ${formatNumber(toDisplay(source, theta) * DEG, 5)}°, where the coupler and output fall in line and the input cannot drive the output`
  return extremesRows(
    source.quantities.filter((q) => source.extremes.has(q.name)),
    source.extremes,
    (theta) => toDisplay(source, theta),
    unbounded,
    'input angle',
  )
}

function fourBarMethod(analysis: FourBarAnalysis, source: SweepSource, context: EvaluationContext): MethodStep[] {
  const { meta } = context
  const { ground: d, input: a, coupler: b, output: c } = analysis.linkage
  const L = (si: number): string => texBare(meta, si, 'length')
  const angle = (theta: number): string => tex(meta, toDisplay(source, theta), 'angle')
  const g = analysis.grashof
  const relation = g.condition === 'grashof' ? '<' : g.condition === 'non-grashof' ? '>' : '='
  const steps: MethodStep[] = [
    {
      label: 'Grashof condition and class',
      formula: 's + l \\ \\lessgtr\\ p + q',
      substituted: `${L(g.shortPlusLong)} ${relation} ${L(g.otherTwo)}`,
      result: `\\text{${g.label}; shortest link: ${g.shortest}}`,
      note: `Lengths in ${unitLabel(displayUnit('length', meta.units))}. s + l < p + q lets the shortest link turn fully relative to the others; equality is the change-point case (decided within 1e-12 of the summed lengths). Input angles θ2 are ${source.convention.words}.`,
      cites: ['lw-grashof'],
    },
  ]
  if (analysis.linkage.branch) {
    steps.push({
      label: 'Change points: the assembly followed through them',
      formula: '|AO_4| = b + c \\ \\text{or}\\ |b - c| \\iff \\text{all four links in line}',
      substituted: null,
      result: `\\theta_2 = ${analysis.changePoints.map((t) => angle(t)).join(',\\ ')}`,
      note: `Between change points the ${analysis.linkage.circuit} assembly (${analysis.linkage.circuit === 'open' ? 'a quadrilateral O2-A-B-O4 that does not cross itself' : 'a self-crossing quadrilateral'}) is taken on each interval${analysis.linkage.branch.assemblyKept ? '' : ', except where the output would jump: there the continuous motion is followed'}; the motion repeats after ${analysis.periodTurns} input turn${analysis.periodTurns === 1 ? '' : 's'} and the output ${analysis.outputTurnsFully ? 'turns fully' : 'rocks'}.`,
    })
  }
  const mu = analysis.extremes.transmissionAngle
  if (analysis.linkage.driver === 'output') {
    steps.push({
      label: 'Transmission angle (coupler against the input it drives)',
      formula: '\\mu = \\angle(\\text{coupler}, \\text{input})',
      substituted: null,
      result: `\\mu_{\\min} = ${tex(meta, mu.min.value, 'angle')}\\ \\text{at}\\ ${angle(mu.min.theta)},\\ \\mu_{\\max} = ${tex(meta, mu.max.value, 'angle')}`,
      note: 'The output drives: at the dead points input and coupler fall in line (μ = 0° or 180°) and the output cannot turn the input.',
      cites: ['lw-transmission'],
    })
  } else if (analysis.inputTurnsFully && !analysis.linkage.branch) {
    steps.push({
      label: 'Transmission-angle extremes (input in line with the ground)',
      formula: '\\cos\\mu_{0} = \\frac{b^2 + c^2 - (d-a)^2}{2bc},\\qquad \\cos\\mu_{180} = \\frac{b^2 + c^2 - (d+a)^2}{2bc}',
      substituted: `\\cos\\mu_{0} = \\frac{${L(b)}^2 + ${L(c)}^2 - (${L(d)} - ${L(a)})^2}{2 \\cdot ${L(b)} \\cdot ${L(c)}}`,
      result: `\\mu_{\\min} = ${tex(meta, analysis.transmissionMin.value, 'angle')},\\ \\mu_{\\max} = ${tex(meta, analysis.transmissionMax.value, 'angle')},\\ \\mu_w = ${tex(meta, analysis.transmissionWorst.value, 'angle')}`,
      note: 'μ is the angle between coupler and output; it depends on the input angle only through the diagonal AO4, which is shortest and longest at θ2 = 0° and 180° from the ground line. The figure checked is μ_w = min(μ_min, 180° − μ_max).',
      cites: ['lw-transmission'],
    })
  } else if (analysis.inputLimits) {
    steps.push({
      label: 'Input limits and transmission-angle extremes',
      formula: '\\cos\\theta_{L} = \\frac{a^2 + d^2 - (b \\pm c)^2}{2ad}',
      substituted: null,
      result: `\\theta_{L} = ${angle(analysis.inputLimits[0])},\\ ${angle(analysis.inputLimits[1])};\\ \\mu_{\\min} = ${tex(meta, analysis.transmissionMin.value, 'angle')}`,
      note: 'At a limit the coupler and output fall in line (μ = 0° or 180°): the input cannot drive past it.',
      cites: ['lw-transmission'],
    })
  } else {
    steps.push({
      label: 'Transmission-angle extremes',
      formula: '\\mu = \\angle(\\text{coupler}, \\text{output})',
      substituted: null,
      result: `\\mu_{\\min} = ${tex(meta, analysis.transmissionMin.value, 'angle')},\\ \\mu_{\\max} = ${tex(meta, analysis.transmissionMax.value, 'angle')},\\ \\mu_w = ${tex(meta, analysis.transmissionWorst.value, 'angle')}`,
      note: 'Over the followed assembly by a sweep, refined by bisection on the slope.',
      cites: ['lw-transmission'],
    })
  }
  const extended = analysis.toggles.find((t) => t.kind === 'extended')
  const folded = analysis.toggles.find((t) => t.kind === 'folded')
  if (analysis.timeRatio !== null && extended && folded) {
    steps.push({
      label: 'Toggle positions (output extremes)',
      formula: '\\cos\\gamma_e = \\frac{d^2 + (a+b)^2 - c^2}{2d(a+b)},\\qquad \\cos\\gamma_f = \\frac{d^2 + (b-a)^2 - c^2}{2d(b-a)}',
      substituted: `\\cos\\gamma_e = \\frac{${L(d)}^2 + (${L(a)} + ${L(b)})^2 - ${L(c)}^2}{2 \\cdot ${L(d)} \\cdot (${L(a)} + ${L(b)})}`,
      result: `\\theta_e = ${angle(extended.theta)},\\ \\theta_f = ${angle(folded.theta)}`,
      note: `γe and γf are the angles at O2 between the ground line and O2B at the two toggles. On the ${analysis.linkage.circuit} circuit θe = ±γe and θf = 180° ± γf, the sign being the circuit's.`,
    })
    steps.push({
      label: 'Output swing and time ratio',
      formula: '\\psi = |\\theta_4(\\theta_e) - \\theta_4(\\theta_f)|,\\qquad Q = \\frac{\\max(\\beta_1, \\beta_2)}{\\min(\\beta_1, \\beta_2)}',
      substituted: `Q = \\frac{${texBare(meta, Math.max(analysis.forwardAngle!, analysis.returnAngle!), 'angle')}}{${texBare(meta, Math.min(analysis.forwardAngle!, analysis.returnAngle!), 'angle')}}`,
      result: `\\psi = ${tex(meta, analysis.outputSwing!, 'angle')},\\ Q = ${texBare(meta, analysis.timeRatio, 'ratio')}`,
    })
  }
  const w = analysis.extremes.outputAngularVelocity
  const acc = analysis.extremes.outputAngularAcceleration
  const extreme = (v: { theta: number; value: number }, kind: 'angular-velocity' | 'angular-acceleration'): string =>
    Number.isFinite(v.value) ? `${tex(meta, v.value, kind)}\\ \\text{at}\\ ${angle(v.theta)}` : `\\text{unbounded at}\\ ${angle(v.theta)}`
  steps.push({
    label: 'Output angular velocity and acceleration: greatest and least',
    formula: '\\omega_4 = \\omega_2\\frac{a\\sin(\\theta_2 - \\theta_3)}{c\\sin(\\theta_4 - \\theta_3)},\\qquad \\alpha_4 = \\omega_2^2\\frac{d^2\\theta_4}{d\\theta_2^2} + \\alpha_2\\frac{d\\theta_4}{d\\theta_2}',
    substituted: `\\omega_2 = ${tex(meta, analysis.speed, 'angular-velocity')},\\ \\alpha_2 = ${tex(meta, analysis.angularAcceleration, 'angular-acceleration')}`,
    result: `\\begin{gathered}\\omega_{4,\\max} = ${extreme(w.max, 'angular-velocity')},\\quad \\omega_{4,\\min} = ${extreme(w.min, 'angular-velocity')}\\\\ \\alpha_{4,\\max} = ${extreme(acc.max, 'angular-acceleration')},\\quad \\alpha_{4,\\min} = ${extreme(acc.min, 'angular-acceleration')}\\end{gathered}`,
    note: 'Position by circle intersection on the chosen circuit; velocity and acceleration from the loop equation differentiated once and twice; extremes bracketed by a sweep and refined by bisection on the slope. Signed: + counter-clockwise.',
  })
  return steps
}

function fourBarWarnings(analysis: FourBarAnalysis, place: import('unist').Position, context: EvaluationContext): string[] {
  const { meta } = context
  const angle = (si: number): string => showQuantity(si, 'angle', meta.units, meta.digits)
  // An output-driven linkage's transmission angle reaches 0° at its dead points: the dead-point warning says so.
  const warnings: string[] = []
  for (const w of analysis.warnings) {
    const text = inNoteUnits(w.message, meta.units)
    warnings.push(text)
    reportWarning(context.file, 'linkage-warning', messages['linkage-warning'](text), place)
  }
  if (analysis.transmissionWorst.value < TRANSMISSION_LIMIT && analysis.linkage.driver !== 'output') {
    const text = messages['transmission-angle-low'](angle(analysis.transmissionWorst.value), `θ2 = ${angle(analysis.transmissionWorst.theta)}`, '40°')
    warnings.push(text)
    reportWarning(context.file, 'transmission-angle-low', text, place)
  }
  return warnings
}

/** Swept quantities of a four-bar. */
function fourBarQuantities(withPoint: boolean): SweptQuantity[] {
  return [
    { name: 'coupler_angle', label: 'coupler angle', kind: 'angle' },
    { name: 'output_angle', label: 'output angle', kind: 'angle' },
    { name: 'coupler_angular_velocity', label: 'coupler angular velocity', kind: 'angular-velocity' },
    { name: 'output_angular_velocity', label: 'output angular velocity', kind: 'angular-velocity' },
    { name: 'coupler_angular_acceleration', label: 'coupler angular acceleration', kind: 'angular-acceleration' },
    { name: 'output_angular_acceleration', label: 'output angular acceleration', kind: 'angular-acceleration' },
    { name: 'transmission_angle', label: 'transmission angle', kind: 'angle' },
    { name: 'time', label: 'time from the start of the cycle', kind: 'time' },
    ...(withPoint
      ? ([
          { name: 'coupler_point_x', label: 'coupler point x', kind: 'length' },
          { name: 'coupler_point_y', label: 'coupler point y', kind: 'length' },
          { name: 'coupler_point_speed', label: 'coupler point speed', kind: 'velocity' },
        ] as const)
      : []),
  ]
}

function fourBarSweep(analysis: FourBarAnalysis, convention: AngleConvention): SweepSource {
  const { linkage } = analysis
  const timeOrigin = linkage.rotation === 1 ? analysis.range.start : analysis.range.end
  const markers: AngleMarker[] = analysis.toggles.map((t) => ({
    name: t.kind,
    label: t.kind === 'extended' ? 'extended toggle' : 'folded toggle',
    short: t.kind === 'extended' ? 'ET' : 'FT',
    theta: t.theta,
  }))
  for (const theta of analysis.changePoints) markers.push({ name: 'change-point', label: 'change point', short: 'CP', theta: wrapTurn(theta) })
  if (analysis.inputLimits) {
    markers.push({ name: 'limit-start', label: 'input limit', short: 'limit', theta: analysis.inputLimits[0] })
    markers.push({ name: 'limit-end', label: 'input limit', short: 'limit', theta: analysis.inputLimits[1] })
  }
  const point = linkage.couplerPoint
  const quantities = fourBarQuantities(point !== null)
  const columnsOf = (sweep: FourBarSweep): Record<string, Float64Array> => ({
    coupler_angle: sweep.couplerAngle,
    output_angle: sweep.outputAngle,
    coupler_angular_velocity: sweep.couplerAngularVelocity,
    output_angular_velocity: sweep.outputAngularVelocity,
    coupler_angular_acceleration: sweep.couplerAngularAcceleration,
    output_angular_acceleration: sweep.outputAngularAcceleration,
    transmission_angle: sweep.transmissionAngle,
    time: sweep.time,
    ...(point ? { coupler_point_x: sweep.couplerPointX, coupler_point_y: sweep.couplerPointY, coupler_point_speed: sweep.couplerPointSpeed } : {}),
  })
  const e = analysis.extremes
  const extremes = new Map<string, Extremes>([
    ['coupler_angle', e.couplerAngle],
    ['output_angle', e.outputAngle],
    ['coupler_angular_velocity', e.couplerAngularVelocity],
    ['output_angular_velocity', e.outputAngularVelocity],
    ['coupler_angular_acceleration', e.couplerAngularAcceleration],
    ['output_angular_acceleration', e.outputAngularAcceleration],
    ['transmission_angle', e.transmissionAngle],
  ])
  if (e.couplerPointX && e.couplerPointY && e.couplerPointSpeed) {
    extremes.set('coupler_point_x', e.couplerPointX)
    extremes.set('coupler_point_y', e.couplerPointY)
    extremes.set('coupler_point_speed', e.couplerPointSpeed)
  }
  const unboundedAtEnds = new Set<string>()
  for (const [name, x] of extremes) if (x.unbounded.positive || x.unbounded.negative) unboundedAtEnds.add(name)
  const [displayStart, displayEnd] = displayRange(convention, analysis.range.start, analysis.range.end, analysis.inputTurnsFully, analysis.periodTurns)
  const state = new Float64Array(FOUR_BAR_STATE)
  return {
    extremes,
    unboundedAtEnds,
    geometry: {
      kind: 'four-bar',
      pivots: [
        [0, 0],
        [linkage.groundX, linkage.groundY],
      ],
      path: null,
      rotation: linkage.rotation,
      crank: linkage.input,
      pose(theta) {
        if (!fourBarState(linkage, theta, state)) return null
        const ax = linkage.input * Math.cos(theta)
        const ay = linkage.input * Math.sin(theta)
        const t3 = state[THETA3]!
        const points: Record<string, readonly [number, number]> = {
          O: [0, 0],
          A: [ax, ay],
          B: [ax + linkage.coupler * Math.cos(t3), ay + linkage.coupler * Math.sin(t3)],
          O4: [linkage.groundX, linkage.groundY],
        }
        if (point) points.P = [ax + point.distance * Math.cos(t3 + point.angle), ay + point.distance * Math.sin(t3 + point.angle)]
        return points
      },
    },
    convention,
    displayStart,
    displayEnd,
    rotation: linkage.rotation,
    speed: analysis.speed,
    timeOrigin,
    start: analysis.range.start,
    end: analysis.range.end,
    fullTurn: analysis.inputTurnsFully,
    periodTurns: analysis.periodTurns,
    quantities,
    markers,
    at(angles) {
      return columnsOf(new FourBarSweep(linkage, angles.length).updateAt(angles, analysis, timeOrigin))
    },
  }
}
