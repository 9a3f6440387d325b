/**
 * Linkage core throughput: full-cycle sweeps at 10⁶ crank angles against bare
 * loops that compute exactly the same arrays inline (the practical limit in
 * JavaScript), and against the same formulas evaluated point by point by a
 * general expression evaluator (mathjs). Reported as throughput × of the bare
 * loop: higher is better.
 */
import { all, create } from 'mathjs'
import { FourBarSweep, SliderCrankSweep, fourBar, sliderCrank } from '../src/linkage/index.js'
import { median, mps, record } from './measure.js'

const POINTS = 1_000_000
const crank = 0.05
const rod = 0.2
const offset = 0.03
const omega = 100

/** The slider-crank sweep's arrays, inline: what SliderCrankSweep.update computes for a straight path, slider on +x, crank-driven. */
function bareSliderCrank(out: Float64Array[]): void {
  const [angle, time, x, v, a, phi, w, alpha, mu] = out as [Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array]
  const step = (2 * Math.PI) / (POINTS - 1)
  const rod2 = rod * rod
  const omega2 = omega * omega
  for (let i = 0; i < POINTS; i++) {
    const t = i === POINTS - 1 ? 2 * Math.PI : i * step
    angle[i] = t
    const s = Math.sin(t)
    const c = Math.cos(t)
    const u = crank * s - offset
    const root = Math.sqrt(rod2 - u * u)
    const ac = crank * c
    const as = crank * s
    const root3 = root * root * root
    const dx = -as - (u * ac) / root
    const ddx = -ac - ((ac * ac - u * as) / root + (u * u * ac * ac) / root3)
    const dphi = -ac / root
    const ddphi = as / root - (ac * ac * u) / root3
    time[i] = t / omega
    x[i] = ac + root
    v[i] = dx * omega
    a[i] = ddx * omega2
    phi[i] = Math.atan2(-u, root)
    w[i] = dphi * omega
    alpha[i] = ddphi * omega2
    const ratio = Math.abs(u) / rod
    mu[i] = Math.acos(Math.min(ratio, 1))
  }
}

const [d4, a4, b4, c4] = [0.1, 0.04, 0.12, 0.08]

/** The four-bar sweep's arrays, inline: circle intersection, rates by Cramer's rule, μ, angles near their start values. */
function bareFourBar(out: Float64Array[], reference3: number, reference4: number): void {
  const [angle, time, t3s, t4s, w3, w4, al3, al4, mu] = out as [Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array]
  const step = (2 * Math.PI) / (POINTS - 1)
  const omega2 = omega * omega
  const turn = 2 * Math.PI
  const near = (value: number, reference: number): number => {
    let d = (value - reference) % turn
    if (d < 0) d += turn
    return reference + (d > Math.PI ? d - turn : d)
  }
  for (let i = 0; i < POINTS; i++) {
    const t2 = i === POINTS - 1 ? 2 * Math.PI : i * step
    angle[i] = t2
    const c2 = Math.cos(t2)
    const s2 = Math.sin(t2)
    const ax = a4 * c2
    const ay = a4 * s2
    const wx = d4 - ax
    const wy = -ay
    const diag2 = wx * wx + wy * wy
    const diag = Math.sqrt(diag2)
    const cosBeta = (b4 * b4 + diag2 - c4 * c4) / (2 * b4 * diag)
    const t3 = Math.atan2(wy, wx) + Math.acos(cosBeta > 1 ? 1 : Math.max(cosBeta, -1))
    const c3 = Math.cos(t3)
    const s3 = Math.sin(t3)
    const t4 = Math.atan2(ay + b4 * s3, ax + b4 * c3 - d4)
    const cc4 = Math.cos(t4)
    const ss4 = Math.sin(t4)
    const sin34 = s3 * cc4 - c3 * ss4
    const h3 = (-a4 * (s2 * cc4 - c2 * ss4)) / (b4 * sin34)
    const h4 = (-a4 * (s2 * c3 - c2 * s3)) / (c4 * sin34)
    const re = ax + b4 * h3 * h3 * c3 - c4 * h4 * h4 * cc4
    const im = ay + b4 * h3 * h3 * s3 - c4 * h4 * h4 * ss4
    time[i] = t2 / omega
    t3s[i] = near(t3, reference3)
    t4s[i] = near(t4, reference4)
    w3[i] = h3 * omega
    w4[i] = h4 * omega
    al3[i] = (-(re * cc4 + im * ss4) / (b4 * sin34)) * omega2
    al4[i] = (-(re * c3 + im * s3) / (c4 * sin34)) * omega2
    let m = Math.abs(t3 - t4) % turn
    if (m > Math.PI) m = turn - m
    mu[i] = m
  }
}

export async function runCoreBench(): Promise<void> {
  const arrays = Array.from({ length: 9 }, () => new Float64Array(POINTS))
  const full = { start: 0, end: 2 * Math.PI }
  const sc = new SliderCrankSweep(sliderCrank({ crank, rod, offset }), POINTS)
  const fbLinkage = fourBar({ ground: d4, input: a4, coupler: b4, output: c4 })
  const fb = new FourBarSweep(fbLinkage, POINTS)
  const arc = new SliderCrankSweep(sliderCrank({ crank, rod, offset, pathRadius: 2 }), POINTS)
  // Alternate each sweep with its bare loop so that both see the same machine; medians.
  const pairs = { slider: [[], []] as number[][], four: [[], []] as number[][] }
  for (let round = 0; round < 9; round++) {
    pairs.slider[0]!.push(await median(() => bareSliderCrank(arrays), 1, round === 0 ? 2 : 0))
    pairs.slider[1]!.push(await median(() => sc.update(full, { speed: omega }), 1, round === 0 ? 2 : 0))
    pairs.four[0]!.push(await median(() => bareFourBar(arrays, fb.couplerReference, fb.outputReference), 1, round === 0 ? 2 : 0))
    pairs.four[1]!.push(await median(() => fb.update(full, { speed: omega }), 1, round === 0 ? 2 : 0))
  }
  const mid = (list: number[]) => [...list].sort((p, q) => p - q)[Math.floor(list.length / 2)]!
  const [bareSc, sweepSc, bareFb, sweepFb] = [mid(pairs.slider[0]!), mid(pairs.slider[1]!), mid(pairs.four[0]!), mid(pairs.four[1]!)]
  const arcSweep = await median(() => arc.update(full, { speed: omega }), 5)
  // Like with like: the bare loop must compute what the sweep computes (the last runs of both are in the arrays).
  bareSliderCrank(arrays)
  const swept = [sc.crankAngle, sc.time, sc.position, sc.velocity, sc.acceleration, sc.rodAngle, sc.rodAngularVelocity, sc.rodAngularAcceleration, sc.transmissionAngle]
  swept.forEach((values, k) => {
    for (let i = 0; i < POINTS; i += 997) {
      const [p, q] = [values[i]!, arrays[k]![i]!]
      if (!(Math.abs(p - q) <= 1e-12 * Math.max(1, Math.abs(q)))) throw new Error(`the bare slider-crank loop differs from the sweep in array ${k} at ${i}: ${q} against ${p}`)
    }
  })

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
  const x = arrays[0]!
  const evaluator = await median(
    () => {
      const step = (2 * Math.PI) / (slowPoints - 1)
      for (let i = 0; i < slowPoints; i++) {
        scope.t = i * step
        for (const e of expressions) x[i] = e.evaluate(scope) as number
      }
    },
    3,
    1,
  )
  const evaluatorPerPoint = evaluator / slowPoints

  record('Linkage core: full-cycle sweeps at 10⁶ angles (every swept quantity), against bare loops computing the same arrays', [
    { name: 'bare slider-crank loop', value: mps(POINTS, bareSc), unit: 'M points/s', note: `${bareSc.toFixed(1)} ms` },
    {
      name: 'SliderCrankSweep.update',
      value: mps(POINTS, sweepSc),
      unit: 'M points/s',
      note: `${sweepSc.toFixed(1)} ms`,
      ratio: { value: bareSc / sweepSc, of: '× the bare loop’s throughput', better: 'higher', target: 0.8 },
    },
    { name: 'bare four-bar loop', value: mps(POINTS, bareFb), unit: 'M points/s', note: `${bareFb.toFixed(1)} ms` },
    {
      name: 'FourBarSweep.update',
      value: mps(POINTS, sweepFb),
      unit: 'M points/s',
      note: `${sweepFb.toFixed(1)} ms`,
      ratio: { value: bareFb / sweepFb, of: '× the bare four-bar loop’s throughput', better: 'higher', target: 0.5 },
    },
    {
      name: 'arc-path slider-crank sweep (an equivalent four-bar per point)',
      value: mps(POINTS, arcSweep),
      unit: 'M points/s',
      ratio: { value: bareFb / arcSweep, of: '× the bare four-bar loop’s throughput', better: 'higher' },
    },
    {
      name: 'mathjs compiled expressions (x, v, a, μ), per point',
      value: evaluatorPerPoint * 1000,
      unit: 'µs',
      ratio: { value: (evaluatorPerPoint * POINTS) / sweepSc, of: '× the speed of mathjs: how much faster the sweep is', better: 'higher' },
    },
  ])
}
