/**
 * Tolerance cost: a seeded Monte Carlo of 10⁶ samples of the slider-crank's stroke,
 * dead-centre positions, time ratio and least transmission angle, against a bare
 * loop computing exactly that (the same generator, Box–Muller and clipping, the
 * same closed forms written inline) and against the naive way (a full analysis of
 * each sampled linkage, timed on a few hundred and scaled). The crank-rocker's
 * Monte Carlo against its naive way too. Ratios say which way is better.
 */
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64'
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus'
import { CRANK_ROCKER_RESPONSE, SLIDER_CRANK_RESPONSE, analyseFourBar, analyseSliderCrank, fourBar, monteCarlo, sliderCrank, type Toleranced } from '../src/linkage/index.js'
import { median, record } from './measure.js'

const SAMPLES = 1_000_000
const NAIVE = 300
const SEED = 20240601

export async function runToleranceBench(): Promise<void> {
  const sc: Toleranced[] = [
    { name: 'crank', nominal: 0.05, lower: -0.05e-3, upper: 0.05e-3 },
    { name: 'rod', nominal: 0.2, lower: -0.1e-3, upper: 0.1e-3 },
    { name: 'offset', nominal: 0.03, lower: -0.2e-3, upper: 0.2e-3 },
  ]
  const cr: Toleranced[] = [
    { name: 'ground', nominal: 0.1, lower: -0.1e-3, upper: 0.1e-3 },
    { name: 'input', nominal: 0.035, lower: -0.05e-3, upper: 0.05e-3 },
    { name: 'coupler', nominal: 0.09, lower: -0.1e-3, upper: 0.1e-3 },
    { name: 'output', nominal: 0.07, lower: -0.1e-3, upper: 0.1e-3 },
  ]
  const bareOut = Array.from({ length: 5 }, () => new Float64Array(SAMPLES))
  let library = 0
  let bare = 0
  let crLibrary = 0
  const rounds = { library: [] as number[], bare: [] as number[], cr: [] as number[] }
  let check = 0
  for (let round = 0; round < 5; round++) {
    const warm = round === 0 ? 1 : 0
    rounds.library.push(await median(() => (check = monteCarlo(SLIDER_CRANK_RESPONSE, sc, SAMPLES, SEED, 'normal').samples[0]![SAMPLES - 1]!), 1, warm))
    rounds.bare.push(await median(() => bareSliderCrank(sc, bareOut), 1, warm))
    rounds.cr.push(await median(() => monteCarlo(CRANK_ROCKER_RESPONSE, cr, SAMPLES, SEED, 'normal'), 1, warm))
  }
  const mid = (list: number[]) => [...list].sort((p, q) => p - q)[Math.floor(list.length / 2)]!
  library = mid(rounds.library)
  bare = mid(rounds.bare)
  crLibrary = mid(rounds.cr)
  // The bare loop must compute what the library computes.
  if (check !== bareOut[0]![SAMPLES - 1]) throw new Error(`the bare loop differs from monteCarlo: ${check} against ${bareOut[0]![SAMPLES - 1]}`)

  // The naive way: a full analysis (1441-point sweep, extremes by bisection) of each sampled linkage.
  const rng = xoroshiro128plus(SEED)
  const draw = (t: Toleranced) => t.nominal + t.lower + (t.upper - t.lower) * uniformFloat64(rng)
  const naiveSc = await median(() => {
    for (let j = 0; j < NAIVE; j++) {
      const a = analyseSliderCrank(sliderCrank({ crank: draw(sc[0]!), rod: draw(sc[1]!), offset: draw(sc[2]!) }), { speed: 1 })
      if (!Number.isFinite(a.stroke!)) throw new Error('no stroke')
    }
  }, 3, 1)
  const naiveCr = await median(() => {
    for (let j = 0; j < NAIVE; j++) {
      const a = analyseFourBar(fourBar({ ground: draw(cr[0]!), input: draw(cr[1]!), coupler: draw(cr[2]!), output: draw(cr[3]!) }), { speed: 1 })
      if (!Number.isFinite(a.outputSwing!)) throw new Error('no swing')
    }
  }, 3, 1)
  const perSample = (ms: number, n: number) => (ms / n) * 1000 // µs
  record('Tolerances: seeded Monte Carlo of 10⁶ samples (normal, clipped), every result of the response', [
    {
      name: 'monteCarlo, slider-crank (stroke, dead-centre positions, time ratio, least transmission angle)',
      value: SAMPLES / library / 1000,
      unit: 'M samples/s',
      note: `${library.toFixed(0)} ms`,
      ratio: { value: bare / library, of: '× the throughput of a bare loop with the same generator and closed forms', better: 'higher', target: 0.5 },
    },
    {
      name: 'naive: full slider-crank analysis of each sample (timed on 300)',
      value: perSample(naiveSc, NAIVE),
      unit: 'µs a sample',
      note: `${((perSample(naiveSc, NAIVE) * SAMPLES) / 1e6).toFixed(0)} s for 10⁶`,
      ratio: { value: perSample(naiveSc, NAIVE) / perSample(library, SAMPLES), of: '× the Monte Carlo’s time per sample', better: 'higher', target: 100 },
    },
    {
      name: 'monteCarlo, crank-rocker (swing, time ratio, worst transmission angle; closed-form toggles)',
      value: SAMPLES / crLibrary / 1000,
      unit: 'M samples/s',
      note: `${crLibrary.toFixed(0)} ms`,
    },
    {
      name: 'naive: full four-bar analysis of each sample (timed on 300)',
      value: perSample(naiveCr, NAIVE),
      unit: 'µs a sample',
      note: `${((perSample(naiveCr, NAIVE) * SAMPLES) / 1e6).toFixed(0)} s for 10⁶`,
      ratio: { value: perSample(naiveCr, NAIVE) / perSample(crLibrary, SAMPLES), of: '× the crank-rocker Monte Carlo’s time per sample', better: 'higher', target: 100 },
    },
  ])
}

/** What monteCarlo computes for the slider-crank, written out by hand. */
function bareSliderCrank(inputs: readonly Toleranced[], out: Float64Array[]): void {
  const rng = xoroshiro128plus(SEED)
  const lo0 = inputs[0]!.nominal + inputs[0]!.lower
  const lo1 = inputs[1]!.nominal + inputs[1]!.lower
  const lo2 = inputs[2]!.nominal + inputs[2]!.lower
  // As monteCarlo forms them: low end plus width.
  const hi0 = lo0 + (inputs[0]!.upper - inputs[0]!.lower)
  const hi1 = lo1 + (inputs[1]!.upper - inputs[1]!.lower)
  const hi2 = lo2 + (inputs[2]!.upper - inputs[2]!.lower)
  const lo = [lo0, lo1, lo2]
  const hi = [hi0, hi1, hi2]
  const mid = inputs.map((t) => t.nominal + (t.upper + t.lower) / 2)
  const sig = inputs.map((t) => (t.upper - t.lower) / 6)
  const x = new Float64Array(3)
  let spare = Number.NaN
  const [s0, s1, s2, s3, s4] = out as [Float64Array, Float64Array, Float64Array, Float64Array, Float64Array]
  for (let j = 0; j < SAMPLES; j++) {
    for (let i = 0; i < 3; i++) {
      let z: number
      if (Number.isNaN(spare)) {
        const u1 = 1 - uniformFloat64(rng)
        const u2 = uniformFloat64(rng)
        const r = Math.sqrt(-2 * Math.log(u1))
        z = r * Math.cos(2 * Math.PI * u2)
        spare = r * Math.sin(2 * Math.PI * u2)
      } else {
        z = spare
        spare = Number.NaN
      }
      x[i] = Math.min(hi[i]!, Math.max(lo[i]!, mid[i]! + sig[i]! * z))
    }
    const a = x[0]!
    const b = x[1]!
    const e = x[2]!
    const P = Math.sqrt((b + a) * (b + a) - e * e)
    const M = Math.sqrt((b - a) * (b - a) - e * e)
    const d = Math.abs(Math.asin(e / (b - a)) - Math.asin(e / (b + a)))
    s0[j] = P - M
    s1[j] = P
    s2[j] = M
    s3[j] = (Math.PI + d) / (Math.PI - d)
    s4[j] = Math.acos((a + Math.abs(e)) / b)
  }
}
