/**
 * Dynamics cost: the full force sweep (every joint force, torque, power and the
 * inertia forces) at 10⁶ crank angles against the kinematic sweep in the same run,
 * for the slider-crank (closed form, guide friction, a tabled load) and the
 * four-bar; and flywheel sizing on a 3600-step torque curve against the force
 * sweep of 3600 points that would feed it. Ratios are time over time: lower is better.
 */
import {
  F,
  FourBarForceSweep,
  FourBarSweep,
  MASSLESS,
  SliderCrankForceSweep,
  SliderCrankSweep,
  analyseSliderCrank,
  analyseSliderCrankForces,
  energyFluctuation,
  fourBar,
  loadTable,
  constantLoad,
  sliderCrank,
  type SliderCrankForceInput,
} from '../src/linkage/index.js'
import { median, mps, record } from './measure.js'

const POINTS = 1_000_000
const omega = 100

export async function runDynamicsBench(): Promise<void> {
  const full = { start: 0, end: 2 * Math.PI }
  const linkage = sliderCrank({ crank: 0.05, rod: 0.2, offset: 0.01 })
  const kinematics = analyseSliderCrank(linkage, { speed: omega })
  const timing = { innerAngle: kinematics.innerDeadCentre!.theta, outstrokeAngle: kinematics.outstrokeAngle!, outerPosition: kinematics.outerDeadCentre!.position }
  const input: SliderCrankForceInput = {
    masses: { ...MASSLESS, slider: 4.5, rod: 2.2, rodCentre: 0.055, rodInertia: 0.0058, crank: 6, crankCentre: 0.008, crankInertia: 0.02, counterweight: 2, counterweightRadius: 0.04 },
    load: loadTable([0, 0.02, 0.05, 0.1], [8000, 8000, 2000, 0], { abscissa: 'travel', sense: 'against-motion', stroke: 'outstroke' }),
    friction: 0.05,
    gravity: [0, -9.80665],
  }
  const kin = new SliderCrankSweep(linkage, POINTS)
  const dyn = new SliderCrankForceSweep(linkage, input, timing, POINTS)
  const fbLinkage = fourBar({ ground: 0.1, input: 0.04, coupler: 0.12, output: 0.08 })
  const fbKin = new FourBarSweep(fbLinkage, POINTS)
  const masses = { input: 0.5, inputCentre: 0.02, inputInertia: 0.0004, coupler: 0.9, couplerCentre: 0.05, couplerCentreAngle: 0.3, couplerInertia: 0.0015, output: 0.7, outputCentre: 0.035, outputInertia: 0.0011 }
  const fbDyn = new FourBarForceSweep(fbLinkage, { masses, outputLoad: constantLoad(2.5, 'against-motion'), outputLoadSense: 1, gravity: [0, -9.80665] }, POINTS)
  // Alternate each pair so that both see the same machine; medians of nine rounds.
  const times = { kin: [] as number[], dyn: [] as number[], fbKin: [] as number[], fbDyn: [] as number[] }
  for (let round = 0; round < 9; round++) {
    const warm = round === 0 ? 2 : 0
    times.kin.push(await median(() => kin.update(full, { speed: omega }), 1, warm))
    times.dyn.push(await median(() => dyn.update(full, omega), 1, warm))
    times.fbKin.push(await median(() => fbKin.update(full, { speed: omega }), 1, warm))
    times.fbDyn.push(await median(() => fbDyn.update(full, omega), 1, warm))
  }
  const mid = (list: number[]) => [...list].sort((p, q) => p - q)[Math.floor(list.length / 2)]!
  const [tKin, tDyn, tFbKin, tFbDyn] = [mid(times.kin), mid(times.dyn), mid(times.fbKin), mid(times.fbDyn)]
  // A result that is used, so that no loop is optimised away.
  if (!Number.isFinite(dyn.slots[F.TORQUE]![POINTS >> 1]!)) throw new Error('the force sweep gave no torque')

  // Flywheel sizing: ΔE on 3600 steps from the pointwise torque (as the flywheel block asks it), against a 3600-point force sweep.
  const forces = analyseSliderCrankForces(kinematics, input)
  const torque = (t: number) => forces.at(t, 'crank_torque')
  const flywheel = await median(() => energyFluctuation(torque, 0, 2 * Math.PI, 3600), 5, 1)
  const feed = new SliderCrankForceSweep(linkage, input, timing, 3600)
  const sweep3600 = await median(() => feed.update(full, omega), 21, 3)

  record('Dynamics: full force sweeps at 10⁶ crank angles against the kinematic sweeps in the same run', [
    { name: 'SliderCrankSweep.update (kinematics)', value: mps(POINTS, tKin), unit: 'M points/s', note: `${tKin.toFixed(1)} ms` },
    {
      name: 'SliderCrankForceSweep.update (forces, torque, power, inertia forces; tabled load, friction, gravity)',
      value: mps(POINTS, tDyn),
      unit: 'M points/s',
      note: `${tDyn.toFixed(1)} ms, kinematic state included`,
      ratio: { value: tDyn / tKin, of: '× the kinematic sweep’s time', better: 'lower', target: 2 },
    },
    { name: 'FourBarSweep.update (kinematics)', value: mps(POINTS, tFbKin), unit: 'M points/s', note: `${tFbKin.toFixed(1)} ms` },
    {
      name: 'FourBarForceSweep.update (pin forces, input torque, shaking force)',
      value: mps(POINTS, tFbDyn),
      unit: 'M points/s',
      note: `${tFbDyn.toFixed(1)} ms, kinematic state included`,
      ratio: { value: tFbDyn / tFbKin, of: '× the four-bar kinematic sweep’s time', better: 'lower', target: 2 },
    },
    {
      name: 'flywheel: ΔE of a 3600-step torque curve (Gauss–Legendre, turning points by bisection)',
      value: flywheel,
      unit: 'ms',
      note: `the 3600-point force sweep that feeds it: ${sweep3600.toFixed(2)} ms`,
      ratio: { value: flywheel / sweep3600, of: '× the time of the 3600-point force sweep', better: 'lower' },
    },
  ])
}
