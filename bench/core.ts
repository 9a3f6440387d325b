/**
 * Linkage core throughput: full-cycle sweeps at 10⁶ crank angles against a bare
 * closed-form loop (the practical limit in JavaScript) and against the same
 * formulas evaluated point by point by a general expression evaluator (mathjs).
 */
import { all, create } from 'mathjs'
import { FourBarSweep, SliderCrankSweep, fourBar, sliderCrank } from '../src/linkage/index.js'
import { median, perSecond, printTable } from './measure.js'

const POINTS = 1_000_000
const crank = 0.05
const rod = 0.2
const offset = 0.03
const omega = 100

/** Bare closed form: position, velocity, acceleration and transmission angle inline. */
function bareLoop(x: Float64Array, v: Float64Array, a: Float64Array, mu: Float64Array): void {
  const step = (2 * Math.PI) / (POINTS - 1)
  const rod2 = rod * rod
  for (let i = 0; i < POINTS; i++) {
    const t = i * step
    const s = Math.sin(t)
    const c = Math.cos(t)
    const u = crank * s - offset
    const root = Math.sqrt(rod2 - u * u)
    const ac = crank * c
    x[i] = ac + root
    const dx = -crank * s - (u * ac) / root
    v[i] = dx * omega
    a[i] = (-ac - ((ac * ac - u * crank * s) / root + (u * u * ac * ac) / (root * root * root))) * omega * omega
    mu[i] = Math.acos(Math.abs(u) / rod)
  }
}

export async function runCoreBench(): Promise<void> {
  const x = new Float64Array(POINTS)
  const v = new Float64Array(POINTS)
  const a = new Float64Array(POINTS)
  const mu = new Float64Array(POINTS)
  const bare = await median(() => bareLoop(x, v, a, mu), 5)

  const sc = new SliderCrankSweep(sliderCrank({ crank, rod, offset }), POINTS)
  const full = { start: 0, end: 2 * Math.PI }
  const sliderSweep = await median(() => sc.update(full, { speed: omega }), 5)

  const arc = new SliderCrankSweep(sliderCrank({ crank, rod, offset, pathRadius: 2 }), POINTS)
  const arcSweep = await median(() => arc.update(full, { speed: omega }), 5)

  const fb = new FourBarSweep(fourBar({ ground: 0.1, input: 0.04, coupler: 0.12, output: 0.08 }), POINTS)
  const fourBarSweep = await median(() => fb.update(full, { speed: omega }), 5)

  // What a general calculation tool gives: compiled expressions, evaluated per point.
  const math = create(all!)
  const expressions = [
    'a*cos(t) + sqrt(b^2 - (a*sin(t) - h)^2)',
    '(-a*sin(t) - (a*sin(t) - h)*a*cos(t)/sqrt(b^2 - (a*sin(t) - h)^2)) * w',
    '(-a*cos(t) - ((a^2*cos(t)^2 - (a*sin(t) - h)*a*sin(t))/sqrt(b^2 - (a*sin(t) - h)^2) + (a*sin(t) - h)^2*a^2*cos(t)^2/(b^2 - (a*sin(t) - h)^2)^1.5)) * w^2',
    'acos(abs(a*sin(t) - h)/b)',
  ].map((e) => math.compile(e))
  const slowPoints = 20_000
  const scope = { a: crank, b: rod, h: offset, w: omega, t: 0 }
  const evaluator = await median(() => {
    const step = (2 * Math.PI) / (slowPoints - 1)
    for (let i = 0; i < slowPoints; i++) {
      scope.t = i * step
      x[i] = expressions[0]!.evaluate(scope) as number
      v[i] = expressions[1]!.evaluate(scope) as number
      a[i] = expressions[2]!.evaluate(scope) as number
      mu[i] = expressions[3]!.evaluate(scope) as number
    }
  }, 3, 1)
  const evaluatorPer = evaluator / slowPoints

  printTable('Linkage core: full-cycle sweeps (x, v, a, transmission angle, rod angle and rates)', [
    { name: 'bare closed-form loop, 10⁶ angles', value: `${bare.toFixed(1)} ms`, note: perSecond(POINTS, bare) },
    { name: 'slider-crank sweep, 10⁶ angles', value: `${sliderSweep.toFixed(1)} ms`, note: `${perSecond(POINTS, sliderSweep)}; ${(sliderSweep / bare).toFixed(2)} × bare loop` },
    { name: 'arc-path slider-crank sweep, 10⁶ angles', value: `${arcSweep.toFixed(1)} ms`, note: `${perSecond(POINTS, arcSweep)}; ${(arcSweep / bare).toFixed(2)} × bare loop` },
    { name: 'four-bar sweep, 10⁶ angles', value: `${fourBarSweep.toFixed(1)} ms`, note: `${perSecond(POINTS, fourBarSweep)}; ${(fourBarSweep / bare).toFixed(2)} × bare loop` },
    { name: 'mathjs compiled expressions, per point', value: `${(evaluatorPer * 1000).toFixed(2)} µs`, note: `${perSecond(1, evaluatorPer)}; sweep is ${((evaluatorPer * POINTS) / sliderSweep).toFixed(0)} × faster` },
  ])
}
