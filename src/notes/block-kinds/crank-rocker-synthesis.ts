/**
 * `crank-rocker-synthesis` blocks: the four links of a crank-rocker for an
 * output swing and a time ratio by the toggle-circle construction, the crank
 * pivot placed for the best worst transmission angle (charted over its circle),
 * confirmed a Grashof crank-rocker by forward analysis; for a unit time ratio,
 * the closed form for a least transmission angle. Other blocks use the answer as
 * `id.ground`, `id.input`, `id.coupler`, `id.output`, `id.circuit`.
 */
import { analyseFourBar, bestCrankRocker, crankRockerAt, excessAngle, fourBar, unitTimeRatioCrankRocker } from '../../linkage/index.js'
import { messages } from '../messages.js'
import { reportError } from '../report.js'
import type { MethodStep } from '../types.js'
import { designChart } from './design-chart.js'
import { inputDependencies, readInputs, type InputSpec } from './inputs.js'
import { outcome, type BlockKind } from './kind.js'
import { withLinkage } from './linkage-common.js'
import { asNamed } from './slider-crank-outcome.js'
import { publish, quantity, tex, texBare, word } from './values.js'

const specs: readonly InputSpec[] = [
  { name: 'swing', label: 'required output swing', symbol: '\\psi', kind: 'angle', required: true },
  { name: 'time_ratio', label: 'required time ratio of the output’s swings (slower / faster)', symbol: 'Q', kind: 'ratio', required: true },
  { name: 'ground', label: 'ground link (pivot to pivot), which fixes the size', symbol: 'd', kind: 'length' },
  { name: 'output', label: 'output link (rocker), which fixes the size', symbol: 'c', kind: 'length' },
  { name: 'transmission_min', label: 'least transmission angle wanted (unit time ratio)', symbol: '\\mu_{\\min}', kind: 'angle' },
]

export const crankRockerSynthesisKind: BlockKind = {
  name: 'crank-rocker-synthesis',
  label: 'Crank-rocker synthesis',
  needsId: true,
  dependencies: (block, ids) => inputDependencies(block, specs, ids),
  evaluate(block, context) {
    const inputs = readInputs(block, specs, 'crank-rocker-synthesis', context)
    if (!inputs) return null
    const { si } = inputs
    const { meta } = context
    const place = (name: string) => block.body.entries.find((e) => e.name === name)?.valuePlace ?? block.place
    if ((si.ground === undefined) === (si.output === undefined)) {
      const both = si.ground !== undefined
      reportError(context.file, both ? 'duplicate-input' : 'missing-input', both ? messages['duplicate-input']('output` beside `ground') : messages['missing-input']('ground', 'ground link, or `output`, to fix the size', 'crank-rocker-synthesis'), both ? place('output') : block.place)
      return null
    }
    const swing = si.swing!
    const q = si.time_ratio!
    const unit = q === 1
    if (unit && si.transmission_min === undefined) {
      reportError(context.file, 'missing-input', messages['missing-input']('transmission_min', 'least transmission angle wanted: for a time ratio of 1 the best runs off to a vanishing crank', 'crank-rocker-synthesis'), place('time_ratio'))
      return null
    }
    if (unit && si.ground === undefined) {
      reportError(context.file, 'missing-input', messages['missing-input']('ground', 'ground link, for the unit-time-ratio construction', 'crank-rocker-synthesis'), block.place)
      return null
    }
    const scale = si.ground !== undefined ? { ground: si.ground } : { output: si.output! }
    const design = withLinkage(block, context, () => {
      if (!unit) return bestCrankRocker(swing, q, scale)
      const lengths = unitTimeRatioCrankRocker(swing, si.transmission_min!, si.ground!)
      const analysis = analyseFourBar(fourBar(lengths), { speed: 1 })
      return { ...lengths, pivotAngle: Math.PI, swing: analysis.outputSwing ?? Number.NaN, timeRatio: analysis.timeRatio ?? Number.NaN, transmissionWorst: analysis.transmissionWorst.value, circuit: 'open' as const, place: 0, family: 0 as const }
    })
    if (!design) return null
    const analysis = analyseFourBar(fourBar({ ground: design.ground, input: design.input, coupler: design.coupler, output: design.output, circuit: design.circuit }), { speed: 1 })
    const results = [
      quantity('ground', 'ground link (pivot to pivot)', 'd', 'length', design.ground),
      quantity('input', 'input link (crank)', 'a', 'length', design.input),
      quantity('coupler', 'coupler', 'b', 'length', design.coupler),
      quantity('output', 'output link (rocker)', 'c', 'length', design.output),
      word('circuit', 'assembly circuit that gives the swing', design.circuit),
      word('grashof_label', 'Grashof class', analysis.grashof.label),
      quantity('swing', 'output swing found by analysis', '\\psi', 'angle', analysis.outputSwing),
      quantity('time_ratio', 'time ratio found by analysis', 'Q', 'ratio', analysis.timeRatio),
      quantity('transmission_angle_worst', 'worst transmission angle min(μmin, 180° − μmax)', '\\mu_w', 'angle', design.transmissionWorst),
      quantity('excess_angle', 'crank angle between the toggles beyond 180°', '\\Delta', 'angle', excessAngle(q)),
    ]
    publish(context, block.id, [...asNamed(inputs.values), ...results])
    const delta = excessAngle(q)
    const method: MethodStep[] = unit
      ? [
          {
            label: 'Unit time ratio: both toggles on one line through the crank pivot',
            formula: 'a^2 + d^2 = b^2 + c^2,\\quad \\sin\\frac{\\psi}{2} = \\frac{a}{c},\\quad \\cos\\mu_{\\min} = \\frac{a\\,d}{b\\,c}',
            substituted: `\\psi = ${tex(meta, swing, 'angle')},\\ \\mu_{\\min} = ${tex(meta, si.transmission_min!, 'angle')},\\ d = ${tex(meta, design.ground, 'length')}`,
            result: `b = \\frac{d\\sin(\\psi/2)}{\\cos\\mu_{\\min}} = ${tex(meta, design.coupler, 'length')},\\ c = ${tex(meta, design.output, 'length')},\\ a = c\\sin\\frac{\\psi}{2} = ${tex(meta, design.input, 'length')}`,
            note: 'The unit-time-ratio crank-rocker after R. J. Brodell and A. H. Soni (1970); the closed form is derived from the two conditions.',
          },
        ]
      : [
          {
            label: 'Toggle angle from the time ratio',
            formula: '\\Delta = 180^\\circ\\,\\frac{Q - 1}{Q + 1}',
            substituted: `\\Delta = 180^\\circ \\cdot \\frac{${texBare(meta, q, 'ratio')} - 1}{${texBare(meta, q, 'ratio')} + 1}`,
            result: `\\Delta = ${tex(meta, delta, 'angle')}`,
          },
          {
            label: 'Toggle circle: where the crank pivot may stand',
            formula: '|B_1B_2| = 2c\\sin\\frac{\\psi}{2},\\qquad R = \\frac{|B_1B_2|}{2\\sin\\Delta}',
            substituted: `\\psi = ${tex(meta, swing, 'angle')},\\ \\Delta = ${tex(meta, delta, 'angle')}`,
            result: `R = ${texBare(meta, Math.sin(swing / 2) / Math.sin(delta), 'ratio')}\\,c`,
            note: 'B1 and B2 are the rocker pin at its extremes. From every point of a circle of radius R through B1 and B2 the chord is seen under Δ (the inscribed-angle theorem), the crank travel beyond 180° between the toggles.',
          },
          {
            label: 'Links from the pivot’s place',
            formula: 'a = \\frac{|O_2B_1| - |O_2B_2|}{2},\\qquad b = \\frac{|O_2B_1| + |O_2B_2|}{2},\\qquad d = |O_2O_4|',
            substituted: null,
            result: `a = ${tex(meta, design.input, 'length')},\\ b = ${tex(meta, design.coupler, 'length')},\\ c = ${tex(meta, design.output, 'length')},\\ d = ${tex(meta, design.ground, 'length')}`,
            note: 'At the toggles crank and coupler are in line, extended (|O2B1| = b + a) and folded (|O2B2| = b − a). The pivot’s place on the circle is the one free choice: it is taken where the worst transmission angle is best (a scan of both circles, refined by golden-section search; the chart shows it).',
          },
        ]
    method.push({
      label: 'Confirmed by forward analysis',
      formula: '\\text{Grashof: } s + l < p + q,\\quad \\text{input shortest}',
      substituted: null,
      result: `\\psi = ${tex(meta, analysis.outputSwing ?? Number.NaN, 'angle')},\\ Q = ${texBare(meta, analysis.timeRatio ?? Number.NaN, 'ratio')},\\ \\mu_w = ${tex(meta, design.transmissionWorst, 'angle')}`,
      note: `${analysis.grashof.label}, ${design.circuit} circuit. The worst transmission angle is min(μmin, 180° − μmax) over the whole turn.`,
    })
    let chart = null
    if (!unit) {
      // The pivot's place round its circle against the worst transmission angle, where it makes a crank-rocker.
      const ts: number[] = []
      const mus: number[] = []
      for (let i = 0; i < 361; i++) {
        const t = (2 * Math.PI * i) / 360
        ts.push(t)
        mus.push(crankRockerAt(swing, q, scale, t, design.family)?.transmissionWorst ?? Number.NaN)
      }
      chart = designChart(meta, block.id ?? 'crank-rocker', block.title ? `${block.title}: the pivot round its circle` : 'Worst transmission angle as the crank pivot goes round its circle', { name: 'pivot', label: 'place of the crank pivot on its circle (about the circle’s centre)', kind: 'angle', values: ts }, [{ name: 'transmission_angle_worst', label: 'worst transmission angle', kind: 'angle', values: mus }], { source: '361 places of the pivot round its circle; gaps where the place gives no crank-rocker', height: 160, marks: [{ label: 'the design chosen', short: 'chosen', x: design.place }] })
    }
    const from = block.id ?? 'crank-rocker-synthesis'
    return outcome(block, 'Crank-rocker synthesis', {
      covers: ['synthesis'],
      inputs: inputs.values,
      results,
      method,
      summary: ['input', 'coupler', 'output', 'ground', 'transmission_angle_worst'],
      chart,
      assumptions: [{ text: 'The synthesised lengths are exact; they are then rounded to what can be made, and the rounded linkage is analysed in a four-bar block.', verify: false, from }],
    })
  },
}
