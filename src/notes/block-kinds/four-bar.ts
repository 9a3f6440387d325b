/**
 * `four-bar` blocks: Grashof class, transmission angle, toggles, output swing and
 * time ratio, output velocity and acceleration, and a coupler-point path.
 */
import { FOUR_BAR_STATE, FourBarSweep, THETA3, analyseFourBar, fourBar, solveFourBar, type FourBarAnalysis } from '../../linkage/index.js'
import { displayUnit, showQuantity, unitLabel } from '../display.js'
import { messages } from '../messages.js'
import { reportWarning } from '../report.js'
import type { MethodStep, NamedValue } from '../types.js'
import { inputDependencies, readInputs, type InputSpec } from './inputs.js'
import { outcome, type AngleMarker, type BlockKind, type EvaluationContext, type SweepSource } from './kind.js'
import { kinematicAssumptions, motionInputs, rotationSign, withLinkage } from './linkage-common.js'
import { TRANSMISSION_LIMIT, asNamed } from './slider-crank-outcome.js'
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
    const results = fourBarResults(analysis)
    publish(context, block.id, [...asNamed(inputs.values), ...results])
    const from = block.id ?? 'four-bar'
    const assumptions = kinematicAssumptions(from, 'input', 'pin joints')
    return outcome(block, 'Four-bar linkage', {
      inputs: inputs.values,
      results,
      method: fourBarMethod(analysis, context),
      warnings: fourBarWarnings(analysis, block.place, context),
      assumptions,
      summary: analysis.timeRatio !== null
        ? ['grashof_class', 'transmission_angle_worst', 'output_swing', 'time_ratio', 'peak_output_velocity']
        : ['grashof_class', 'transmission_angle_worst', 'peak_output_velocity'],
      sweep: fourBarSweep(analysis),
    })
  },
}

function fourBarResults(a: FourBarAnalysis): NamedValue[] {
  const extended = a.toggles.find((t) => t.kind === 'extended')
  const folded = a.toggles.find((t) => t.kind === 'folded')
  const noSwing = a.grashof.outputTurnsFully ? 'the output turns fully' : 'the input cannot turn fully'
  const results: NamedValue[] = [
    word('grashof_class', 'Grashof class', a.grashof.className),
    word('grashof_label', 'class in words', a.grashof.label),
    quantity('short_plus_long', 'shortest + longest link, s + l', 's + l', 'length', a.grashof.shortPlusLong),
    quantity('other_two', 'sum of the other two links, p + q', 'p + q', 'length', a.grashof.otherTwo),
    flag('input_turns_fully', 'input turns fully', a.inputTurnsFully),
    quantity('transmission_angle_min', 'least transmission angle', '\\mu_{\\min}', 'angle', a.transmissionMin.value),
    quantity('transmission_angle_min_at', 'input angle at the least transmission angle', null, 'angle', a.transmissionMin.theta),
    quantity('transmission_angle_max', 'greatest transmission angle', '\\mu_{\\max}', 'angle', a.transmissionMax.value),
    quantity('transmission_angle_max_at', 'input angle at the greatest transmission angle', null, 'angle', a.transmissionMax.theta),
    quantity('transmission_angle_worst', 'worst transmission angle min(μmin, 180° − μmax)', '\\mu_{w}', 'angle', a.transmissionWorst.value),
    quantity('transmission_angle_worst_at', 'input angle at the worst transmission angle', null, 'angle', a.transmissionWorst.theta),
    quantity('extended_toggle_angle', 'input angle at the extended toggle (input and coupler in line)', '\\theta_e', 'angle', extended?.theta ?? null, 'no such toggle on this circuit'),
    quantity('folded_toggle_angle', 'input angle at the folded toggle (input and coupler overlapping)', '\\theta_f', 'angle', folded?.theta ?? null, 'no such toggle on this circuit'),
    quantity('output_swing', 'output swing', '\\psi', 'angle', a.outputSwing, noSwing),
    quantity('forward_angle', 'input travel, extended → folded toggle', '\\beta_1', 'angle', a.forwardAngle, noSwing),
    quantity('return_angle', 'input travel, folded → extended toggle', '\\beta_2', 'angle', a.returnAngle, noSwing),
    quantity('time_ratio', 'time ratio of the output swings (slower / faster)', 'Q', 'ratio', a.timeRatio, noSwing),
    quantity('peak_output_velocity', 'peak output angular velocity', '\\omega_{4,\\max}', 'angular-velocity', a.peakOutputVelocity.value),
    quantity('peak_output_velocity_at', 'input angle at the peak output angular velocity', null, 'angle', a.peakOutputVelocity.theta),
    quantity('peak_output_acceleration', 'peak output angular acceleration', '\\alpha_{4,\\max}', 'angular-acceleration', a.peakOutputAcceleration.value),
    quantity('peak_output_acceleration_at', 'input angle at the peak output angular acceleration', null, 'angle', a.peakOutputAcceleration.theta),
  ]
  if (a.inputLimits) {
    results.push(
      quantity('input_limit_start', 'input limit angle (start of range)', '\\theta_{L1}', 'angle', a.inputLimits[0]),
      quantity('input_limit_end', 'input limit angle (end of range)', '\\theta_{L2}', 'angle', a.inputLimits[1]),
    )
  }
  return results
}

function fourBarMethod(analysis: FourBarAnalysis, context: EvaluationContext): MethodStep[] {
  const { meta } = context
  const { ground: d, input: a, coupler: b, output: c } = analysis.linkage
  const L = (si: number): string => texBare(meta, si, 'length')
  const g = analysis.grashof
  const relation = g.condition === 'grashof' ? '<' : g.condition === 'non-grashof' ? '>' : '='
  const steps: MethodStep[] = [
    {
      label: 'Grashof condition and class',
      formula: 's + l \\ \\lessgtr\\ p + q',
      substituted: `${L(g.shortPlusLong)} ${relation} ${L(g.otherTwo)}`,
      result: `\\text{${g.label}; shortest link: ${g.shortest}}`,
      note: `Lengths in ${unitLabel(displayUnit('length', meta.units))}. s + l < p + q lets the shortest link turn fully relative to the others; equality is the change-point case.`,
      cites: ['lw-grashof'],
    },
  ]
  if (analysis.inputTurnsFully) {
    steps.push({
      label: 'Transmission-angle extremes (input in line with the ground)',
      formula: '\\cos\\mu_{0} = \\frac{b^2 + c^2 - (d-a)^2}{2bc},\\qquad \\cos\\mu_{180} = \\frac{b^2 + c^2 - (d+a)^2}{2bc}',
      substituted: `\\cos\\mu_{0} = \\frac{${L(b)}^2 + ${L(c)}^2 - (${L(d)} - ${L(a)})^2}{2 \\cdot ${L(b)} \\cdot ${L(c)}}`,
      result: `\\mu_{\\min} = ${tex(meta, analysis.transmissionMin.value, 'angle')},\\ \\mu_{\\max} = ${tex(meta, analysis.transmissionMax.value, 'angle')}`,
      note: 'μ is the angle between coupler and output; it depends on the input angle only through the diagonal AO4, which is shortest and longest at θ2 = 0° and 180°.',
      cites: ['lw-transmission'],
    })
  } else {
    steps.push({
      label: 'Input limits and transmission-angle extremes',
      formula: '\\cos\\theta_{L} = \\frac{a^2 + d^2 - (b \\pm c)^2}{2ad}',
      substituted: null,
      result: `\\theta_{L} = ${tex(meta, analysis.inputLimits![0], 'angle')},\\ ${tex(meta, analysis.inputLimits![1], 'angle')};\\ \\mu_{\\min} = ${tex(meta, analysis.transmissionMin.value, 'angle')}`,
      note: 'At a limit the coupler and output fall in line (μ = 0° or 180°): the input cannot drive past it.',
      cites: ['lw-transmission'],
    })
  }
  const extended = analysis.toggles.find((t) => t.kind === 'extended')
  const folded = analysis.toggles.find((t) => t.kind === 'folded')
  if (analysis.timeRatio !== null && extended && folded) {
    steps.push({
      label: 'Toggle positions (output extremes)',
      formula: '\\cos\\psi_e = \\frac{d^2 + (a+b)^2 - c^2}{2d(a+b)},\\qquad \\cos\\psi_f = \\frac{d^2 + (b-a)^2 - c^2}{2d(b-a)}',
      substituted: `\\cos\\psi_e = \\frac{${L(d)}^2 + (${L(a)} + ${L(b)})^2 - ${L(c)}^2}{2 \\cdot ${L(d)} \\cdot (${L(a)} + ${L(b)})}`,
      result: `\\theta_e = ${tex(meta, extended.theta, 'angle')},\\ \\theta_f = ${tex(meta, folded.theta, 'angle')}`,
      note: `On the ${analysis.linkage.circuit} circuit: θe = ±ψe and θf = 180° ± ψf, the sign being the circuit's.`,
    })
    steps.push({
      label: 'Output swing and time ratio',
      formula: '\\psi = |\\theta_4(\\theta_e) - \\theta_4(\\theta_f)|,\\qquad Q = \\frac{\\max(\\beta_1, \\beta_2)}{\\min(\\beta_1, \\beta_2)}',
      substituted: `Q = \\frac{${texBare(meta, Math.max(analysis.forwardAngle!, analysis.returnAngle!), 'angle')}}{${texBare(meta, Math.min(analysis.forwardAngle!, analysis.returnAngle!), 'angle')}}`,
      result: `\\psi = ${tex(meta, analysis.outputSwing!, 'angle')},\\ Q = ${texBare(meta, analysis.timeRatio, 'ratio')}`,
    })
  }
  steps.push({
    label: 'Peak output angular velocity and acceleration',
    formula: '\\omega_4 = \\omega_2\\frac{a\\sin(\\theta_2 - \\theta_3)}{c\\sin(\\theta_4 - \\theta_3)},\\qquad \\alpha_4 = \\omega_2^2\\frac{d^2\\theta_4}{d\\theta_2^2} + \\alpha_2\\frac{d\\theta_4}{d\\theta_2}',
    substituted: `\\omega_2 = ${tex(meta, analysis.speed, 'angular-velocity')},\\ \\alpha_2 = ${tex(meta, analysis.angularAcceleration, 'angular-acceleration')}`,
    result: `\\omega_{4,\\max} = ${tex(meta, analysis.peakOutputVelocity.value, 'angular-velocity')}\\ \\text{at}\\ ${tex(meta, analysis.peakOutputVelocity.theta, 'angle')},\\ \\alpha_{4,\\max} = ${tex(meta, analysis.peakOutputAcceleration.value, 'angular-acceleration')}\\ \\text{at}\\ ${tex(meta, analysis.peakOutputAcceleration.theta, 'angle')}`,
    note: 'Position by circle intersection on the chosen circuit; velocity and acceleration from the loop equation differentiated once and twice; peaks bracketed by a 1441-point sweep and refined by bisection on the slope. Signed: + counter-clockwise.',
  })
  return steps
}

function fourBarWarnings(analysis: FourBarAnalysis, place: import('unist').Position, context: EvaluationContext): string[] {
  const { meta } = context
  const angle = (si: number): string => showQuantity(si, 'angle', meta.units, meta.digits)
  const warnings: string[] = []
  for (const w of analysis.warnings) {
    warnings.push(w.message)
    reportWarning(context.file, 'linkage-warning', messages['linkage-warning'](w.message), place)
  }
  if (analysis.transmissionWorst.value < TRANSMISSION_LIMIT) {
    const text = messages['transmission-angle-low'](angle(analysis.transmissionWorst.value), `θ2 = ${angle(analysis.transmissionWorst.theta)}`, '40°')
    warnings.push(text)
    reportWarning(context.file, 'transmission-angle-low', text, place)
  }
  return warnings
}

function fourBarSweep(analysis: FourBarAnalysis): SweepSource {
  const { linkage } = analysis
  const timeOrigin = linkage.rotation === 1 ? analysis.range.start : analysis.range.end
  const markers: AngleMarker[] = analysis.toggles.map((t) => ({
    name: t.kind,
    label: t.kind === 'extended' ? 'extended toggle' : 'folded toggle',
    theta: t.theta,
  }))
  if (analysis.inputLimits) {
    markers.push({ name: 'limit-start', label: 'input limit', theta: analysis.inputLimits[0] })
    markers.push({ name: 'limit-end', label: 'input limit', theta: analysis.inputLimits[1] })
  }
  markers.sort((p, q) => p.theta - q.theta)
  const point = linkage.couplerPoint
  const quantities = [
    { name: 'coupler_angle', label: 'coupler angle', kind: 'angle' as const },
    { name: 'output_angle', label: 'output angle', kind: 'angle' as const },
    { name: 'coupler_angular_velocity', label: 'coupler angular velocity', kind: 'angular-velocity' as const },
    { name: 'output_angular_velocity', label: 'output angular velocity', kind: 'angular-velocity' as const },
    { name: 'coupler_angular_acceleration', label: 'coupler angular acceleration', kind: 'angular-acceleration' as const },
    { name: 'output_angular_acceleration', label: 'output angular acceleration', kind: 'angular-acceleration' as const },
    { name: 'transmission_angle', label: 'transmission angle', kind: 'angle' as const },
    { name: 'time', label: 'time from the start of the range', kind: 'time' as const },
    ...(point
      ? [
          { name: 'coupler_point_x', label: 'coupler point x', kind: 'length' as const },
          { name: 'coupler_point_y', label: 'coupler point y', kind: 'length' as const },
          { name: 'coupler_point_speed', label: 'coupler point speed', kind: 'velocity' as const },
        ]
      : []),
  ]
  const columnsOf = (sweep: FourBarSweep): Record<string, Float64Array> => {
    return {
      coupler_angle: sweep.couplerAngle,
      output_angle: sweep.outputAngle,
      coupler_angular_velocity: sweep.couplerAngularVelocity,
      output_angular_velocity: sweep.outputAngularVelocity,
      coupler_angular_acceleration: sweep.couplerAngularAcceleration,
      output_angular_acceleration: sweep.outputAngularAcceleration,
      transmission_angle: sweep.transmissionAngle,
      time: sweep.time,
      ...(point ? { coupler_point_x: sweep.couplerPointX, coupler_point_y: sweep.couplerPointY, coupler_point_speed: sweep.couplerPointSpeed } : {}),
    }
  }
  const state = new Float64Array(FOUR_BAR_STATE)
  return {
    peaks: {
      output_angular_velocity: { ...analysis.peakOutputVelocity, label: 'peak' },
      output_angular_acceleration: { ...analysis.peakOutputAcceleration, label: 'peak' },
      transmission_angle: { ...analysis.transmissionMin, label: 'least' },
    },
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
        if (!solveFourBar(linkage.input, linkage.coupler, linkage.output, linkage.groundX, linkage.groundY, linkage.circuitSign, theta, state)) return null
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
    angleLabel: 'input angle',
    start: analysis.range.start,
    end: analysis.range.end,
    fullTurn: analysis.inputTurnsFully,
    quantities,
    markers,
    at(angles) {
      return columnsOf(new FourBarSweep(linkage, angles.length).updateAt(angles, analysis, timeOrigin))
    },
    sample(count) {
      const sweep = new FourBarSweep(linkage, count).update(analysis.range, analysis)
      return { angles: sweep.inputAngle, columns: columnsOf(sweep) }
    },
  }
}
