/**
 * Charts and drawings: vega rendering of a 361-point chart and a 3-series chart
 * (first, uncached, cached), our own drawing, and a package with six charts
 * against the same package without them.
 */
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { VFile } from 'vfile'
import { buildNote } from '../src/build.js'
import { readNote } from '../src/notes/note.js'
import { chartSpec } from '../src/render/chart-spec.js'
import { chartSvg } from '../src/render/chart-svg.js'
import { drawingSvg } from '../src/render/drawing-svg.js'
import { TOOL } from '../src/version.js'
import { median, record } from './measure.js'

const root = process.cwd()
const template = readFileSync(join(root, 'templates/package.html'), 'utf8')
const base = `---
title: Bench
number: B-1
revision: A
status: draft
date: 2026-01-01
---

\`\`\`slider-crank #drive
crank: 40 mm
rod: 150 mm
offset: 20 mm
speed: 120 rpm
\`\`\`

\`\`\`drawing #sketch
of: drive
\`\`\`
`
const chart = (i: number, series: string, tag: string) => `\n\`\`\`chart #c${i} Chart ${i} ${tag}\nof: drive\nseries: ${series}\n\`\`\`\n`
const sixCharts = (tag: string) =>
  base + ['velocity', 'acceleration', 'transmission_angle', 'position', 'rod_angle', 'rod_angular_velocity'].map((s, i) => chart(i, s, tag)).join('')

export async function runFiguresBench(): Promise<void> {
  const { model } = readNote(new VFile({ value: `${base + chart(0, 'velocity', '') + chart(1, 'velocity, acceleration, transmission_angle', '')}\n\`\`\`chart #c2\nof: drive\nseries: velocity, acceleration, transmission_angle\nlayout: stacked\n\`\`\`\n` }), TOOL)
  const single = model.outcomes[2]!.chart!
  const three = model.outcomes[4]!.chart!
  const drawing = model.outcomes[1]!.drawing!
  let n = 0
  // First render: includes loading vega and vega-lite.
  const start = performance.now()
  await chartSvg(chartSpec(single), 'first')
  const first = performance.now() - start
  // Uncached: a new title each time makes a new spec.
  const uncached = await median(() => chartSvg({ ...chartSpec(single), description: `run ${++n}` }, 'x'), 9, 2)
  const cached = await median(() => chartSvg(chartSpec(single), 'x'), 9, 2)
  const threeUncached = await median(() => chartSvg({ ...chartSpec(three), description: `run ${++n}` }, 'x'), 7, 1)
  const drawingTime = await median(() => drawingSvg(drawing, 'd'), 21, 3)

  const build = async (text: string) => {
    const built = await buildNote(new VFile({ path: 'b.md', value: text }), { tool: TOOL, notePath: 'b.md', template, commit: 'bench' })
    if (!built.html) throw new Error('bench note did not build')
  }
  // Alternate the builds so that each sees the same machine; medians of many runs.
  for (let i = 0; i < 5; i++) {
    await build(base)
    await build(sixCharts(''))
  }
  const times: [number[], number[], number[]] = [[], [], []]
  for (let i = 0; i < 15; i++) {
    times[0].push(await median(() => build(base), 1, 0))
    times[1].push(await median(() => build(sixCharts('')), 1, 0))
    if (i < 7) times[2].push(await median(() => build(sixCharts(`run ${++n}`)), 1, 0))
  }
  const mid = (list: number[]) => [...list].sort((a, b) => a - b)[Math.floor(list.length / 2)]!
  const [without, withCached, withUncached] = times.map(mid) as [number, number, number]
  record('Charts and drawings', [
    { name: '361-point line chart, first render in process', value: first, unit: 'ms', note: 'includes loading vega and vega-lite' },
    { name: '361-point line chart, uncached', value: uncached, unit: 'ms' },
    { name: '361-point line chart, cached', value: cached, unit: 'ms', ratio: { value: uncached / cached, of: '× faster than rendering', better: 'higher' } },
    { name: '3-series chart (3 × 361 points), uncached', value: threeUncached, unit: 'ms' },
    { name: 'to-scale drawing (SVG)', value: drawingTime, unit: 'ms' },
    { name: 'package without charts (one linkage, one drawing)', value: without, unit: 'ms' },
    { name: 'same package with six charts, charts cached', value: withCached, unit: 'ms', ratio: { value: withCached / without, of: '× the package without them', better: 'lower', target: 2 } },
    { name: 'same package with six charts, none cached', value: withUncached, unit: 'ms', ratio: { value: withUncached / without, of: '× the package without them', better: 'lower' } },
  ])
}
