/**
 * Charts and drawings against the core: the chart's points are the core's
 * sweep, its rules sit at the computed dead centres and limits; the drawing's
 * geometry, measured from the SVG, is the core's to scale.
 */
import { fromHtml } from 'hast-util-from-html'
import type { Element } from 'hast'
import { visit } from 'unist-util-visit'
import { beforeAll, describe, expect, it } from 'vitest'
import { SliderCrankSweep, analyseSliderCrank, sliderCrank, fourBar, analyseFourBar } from '../../src/linkage/index.js'
import type { BlockOutcome } from '../../src/notes/block-kinds/kind.js'
import { formatNumber } from '../../src/notes/display.js'
import { chartSpec, failingSpans } from '../../src/render/chart-spec.js'
import { chartSvg, scopeIds } from '../../src/render/chart-svg.js'
import { drawingSvg } from '../../src/render/drawing-svg.js'
import { expectClose } from '../helpers/close.js'
import { read } from '../helpers/note.js'

const rpm = (n: number) => (n * 2 * Math.PI) / 60
const deg = (r: number) => (r * 180) / Math.PI
const slider = { crank: 0.04, rod: 0.15, offset: 0.025 }
const note = `\`\`\`slider-crank #drive
crank: 40 mm
rod: 150 mm
offset: 25 mm
speed: 120 rpm
\`\`\`

\`\`\`chart #kin
of: drive
series: velocity, acceleration
\`\`\`

\`\`\`chart #mu
of: drive
series: transmission_angle
at_least: 70 deg
\`\`\`

\`\`\`chart #phase
of: drive
series: velocity
x: position
\`\`\`

\`\`\`drawing #sketch
of: drive
show: dead centres, 30 deg
\`\`\`
`

type Layer = { data?: { values: Record<string, number | string>[] }; mark: { type: string } | string; encoding?: Record<string, unknown> }

function layers(spec: Record<string, unknown>): Layer[] {
  if (Array.isArray(spec.layer)) return spec.layer as Layer[]
  return (spec.vconcat as { layer: Layer[] }[]).flatMap((panel) => panel.layer)
}
const markType = (l: Layer) => (typeof l.mark === 'string' ? l.mark : l.mark.type)

describe('charts', () => {
  let outcomes: readonly (BlockOutcome | null)[]
  beforeAll(() => {
    const { model, file } = read(note)
    expect(file.messages.filter((m) => m.fatal)).toEqual([])
    outcomes = model.outcomes
  })

  it('should plot exactly the core’s sweep, in the display units', () => {
    const chart = outcomes[1]!.chart!
    const sweep = new SliderCrankSweep(sliderCrank(slider), 361).update({ start: 0, end: 2 * Math.PI }, { speed: rpm(120) })
    const lines = layers(chartSpec(chart)).filter((l) => markType(l) === 'line')
    expect(lines).toHaveLength(2)
    const velocity = lines[0]!.data!.values
    const acceleration = lines[1]!.data!.values
    expect(velocity).toHaveLength(361)
    for (let i = 0; i < 361; i += 10) {
      expectClose(velocity[i]!.x as number, deg(sweep.crankAngle[i]!), { rel: 1e-8, abs: 1e-9 })
      expectClose(velocity[i]!.y as number, sweep.velocity[i]!, { rel: 1e-8, abs: 1e-12 })
      expectClose(acceleration[i]!.y as number, sweep.acceleration[i]!, { rel: 1e-8, abs: 1e-12 })
    }
  })

  it('should put a dead-centre rule at each computed crank angle', () => {
    const core = analyseSliderCrank(sliderCrank(slider), { speed: rpm(120) })
    const rules = layers(chartSpec(outcomes[1]!.chart!)).filter((l) => markType(l) === 'rule')
    const xs = rules.flatMap((l) => l.data!.values.map((v) => v.x as number))
    expect(xs).toHaveLength(4)
    expectClose(xs.slice(0, 2), [deg(core.outerDeadCentre!.theta), deg(core.innerDeadCentre!.theta)], { rel: 1e-8 })
  })

  it('should mark the analysis’s exact greatest and least values, not a grid sample', () => {
    const core = analyseSliderCrank(sliderCrank(slider), { speed: rpm(120) })
    const points = layers(chartSpec(outcomes[1]!.chart!))
      .filter((l) => markType(l) === 'point')
      .flatMap((l) => l.data!.values)
    const v = core.extremes.velocity
    const a = core.extremes.acceleration
    expectClose(points.map((p) => p.x as number), [deg(v.max.theta), deg(v.min.theta), deg(a.max.theta), deg(a.min.theta)], { rel: 1e-8 })
    expectClose(points.map((p) => p.y as number), [v.max.value, v.min.value, a.max.value, a.min.value], { rel: 1e-8 })
    // The label says the same figure the results table prints.
    const texts = layers(chartSpec(outcomes[1]!.chart!)).filter((l) => markType(l) === 'text').flatMap((l) => l.data!.values.map((x) => x.text as string))
    expect(texts).toContain(`least ${formatNumber(v.min.value, 5)} m/s at ${formatNumber(deg(v.min.theta), 5)}°`)
  })

  it('should draw the limit at its value and shade the stretch that breaks it', () => {
    const chart = outcomes[2]!.chart!
    const spec = layers(chartSpec(chart))
    const limit = spec.find((l) => markType(l) === 'rule' && (l.mark as { color?: string }).color === '#a11d21')!
    expect(limit.data!.values[0]!.y).toBe(70)
    const shaded = spec.find((l) => markType(l) === 'rect')!.data!.values
    expect(shaded).toHaveLength(1)
    // μ = acos(|a sinθ − h|/b) falls below 70° where |a sinθ − h| > b cos 70°: around θ = 270°.
    const b = 0.15
    const core = (theta: number) => Math.acos(Math.abs(0.04 * Math.sin(theta) - 0.025) / b)
    for (const edge of [shaded[0]!.x as number, shaded[0]!.x2 as number]) expectClose(deg(core((edge * Math.PI) / 180)), 70, { abs: 0.01 })
  })

  it('should run time on through the cycle when charted against time', () => {
    const { model } = read(`${note}\n\`\`\`chart\nof: drive\nseries: velocity\nx: time\n\`\`\`\n`)
    const chart = model.outcomes[5]!.chart!
    const t = chart.x.values
    for (let i = 1; i < t.length; i++) expect(t[i]!).toBeGreaterThan(t[i - 1]!)
    // 120 rpm: one turn in 0.5 s.
    expectClose(t[t.length - 1]!, 0.5, { rel: 1e-12 })
    expectClose(t[0]!, 0, { abs: 1e-15 })
  })

  it('should find failing spans by interpolating the crossings', () => {
    const xs = Float64Array.of(0, 1, 2, 3, 4)
    const ys = Float64Array.of(5, 3, 1, 3, 5)
    expect(failingSpans(xs, ys, 'at least', 2)).toEqual([[1.5, 2.5]])
    expect(failingSpans(xs, ys, 'at most', 4)).toEqual([
      [0, 0.5],
      [3.5, 4],
    ])
  })

  it('should render to SVG headless, the same text each time, ids scoped per chart, cached by content', async () => {
    const spec = chartSpec(outcomes[3]!.chart!)
    const first = await chartSvg(spec, 'lw-phase')
    const again = await chartSvg(spec, 'lw-phase')
    expect(first.svg.startsWith('<svg')).toBe(true)
    expect(first.svg).toContain('<path')
    expect(again.svg).toBe(first.svg)
    expect(again.cached).toBe(true)
    const ids = [...first.svg.matchAll(/\sid="([^"]+)"/g)].map((m) => m[1])
    expect(ids.every((id) => id!.startsWith('lw-phase-'))).toBe(true)
    expect(scopeIds('<g id="a"><use href="#a"/><path clip-path="url(#a)"/></g>', 'p')).toBe('<g id="p-1"><use href="#p-1"/><path clip-path="url(#p-1)"/></g>')
  })
})

/** Circles, lines and groups of an SVG string. */
function svgElements(svg: string): Element[] {
  const found: Element[] = []
  visit(fromHtml(svg, { fragment: true, space: 'svg' }), 'element', (node: Element) => {
    found.push(node)
  })
  return found
}

describe('drawings', () => {
  it('should draw the stroke dimension as long as the computed stroke, to the drawing’s scale', () => {
    const { model } = read(note)
    const drawing = model.outcomes[4]!.drawing!
    const svg = drawingSvg(drawing, 'test')
    const elements = svgElements(svg)
    const root = elements.find((e) => e.tagName === 'svg')!
    const scale = Number(root.properties.dataScale)
    const [ox, oy] = [Number(root.properties.dataOriginX), Number(root.properties.dataOriginY)]
    const core = analyseSliderCrank(sliderCrank(slider), { speed: rpm(120) })
    // The stroke's extension lines start at the slider pin at each dead centre.
    const stroke = elements.find((e) => (e.properties.className as string[] | undefined)?.includes('lw-dim-stroke'))!
    const ext = stroke.children.filter((c): c is Element => c.type === 'element' && (c.properties.className as string[]).includes('lw-dim-ext'))
    const x1 = Number(ext[0]!.properties.x1)
    const x2 = Number(ext[1]!.properties.x1)
    expectClose(Math.abs(x2 - x1) / scale, core.stroke, { abs: 0.02 / scale })
    expectClose((x1 - ox) / scale, core.innerDeadCentre!.position, { abs: 0.02 / scale })
    expect(stroke.properties.dataSi).toBe(core.stroke.toPrecision(12))
    // Pins of the pose at 30° where the core puts them.
    const a = [0.04 * Math.cos(Math.PI / 6), 0.04 * Math.sin(Math.PI / 6)]
    const pins = elements.filter((e) => (e.properties.className as string[] | undefined)?.includes('lw-pin') && e.properties.dataJoint === 'A')
    const solidA = pins.find((p) => Math.abs(Number(p.properties.cx) - (ox + scale * a[0]!)) < 0.02)
    expect(solidA).toBeDefined()
    expectClose(Number(solidA!.properties.cy), oy - scale * a[1]!, { abs: 0.01 })
    // The offset dimension reads the input.
    const offset = elements.find((e) => (e.properties.className as string[] | undefined)?.includes('lw-dim-offset'))!
    expect(Number(offset.properties.dataSi)).toBeCloseTo(0.025, 12)
  })

  it('should put the four-bar’s pivots and coupler path where the core does', () => {
    const { model } = read(
      '```four-bar #fb\nground: 100 mm\ninput: 40 mm\ncoupler: 120 mm\noutput: 80 mm\nspeed: 1 rad/s\ncoupler_point_distance: 60 mm\ncoupler_point_angle: 30 deg\n```\n\n```drawing\nof: fb\n```\n',
    )
    const drawing = model.outcomes[1]!.drawing!
    const core = analyseFourBar(fourBar({ ground: 0.1, input: 0.04, coupler: 0.12, output: 0.08 }), { speed: 1 })
    expect(drawing.poses.filter((p) => p.ghost).map((p) => p.theta)).toEqual(core.toggles.map((t) => t.theta))
    expectClose(drawing.swing!.to - drawing.swing!.from, core.toggles[1]!.outputAngle - core.toggles[0]!.outputAngle, { abs: 1e-12 })
    const svg = drawingSvg(drawing, 'fb')
    const elements = svgElements(svg)
    const root = elements.find((e) => e.tagName === 'svg')!
    const scale = Number(root.properties.dataScale)
    const pivots = elements.filter((e) => (e.properties.className as string[] | undefined)?.includes('lw-pivot'))
    expectClose((Number(pivots[1]!.properties.cx) - Number(pivots[0]!.properties.cx)) / scale, 0.1, { abs: 0.02 / scale })
    expect(drawing.couplerPath!.length).toBe(722)
  })
})
