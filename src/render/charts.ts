/**
 * Every chart of a note: its vega-lite spec (written beside the package) and its
 * SVG. A chart seen before in this process (same numbers, same marks) is reused
 * whole; otherwise the SVG comes from the renderer's cache or from vega.
 */
import { createHash } from 'node:crypto'
import type { ChartOutcome } from '../notes/block-kinds/kind.js'
import type { NoteModel } from '../notes/note.js'
import { chartSpec, specText } from './chart-spec.js'
import { chartSvg, type ChartCache } from './chart-svg.js'

/** The charts of a note, ready for the package. */
export interface RenderedCharts {
  /** SVG and spec file by block index. */
  readonly charts: Map<number, { svg: string; specFile: string }>
  /** Spec files by relative path. */
  readonly files: Map<string, string>
  /** How many were not rendered again. */
  readonly cached: number
}

const finished = new Map<string, { text: string; svg: string }>()
const FINISHED_LIMIT = 200

/** Content key of a chart outcome: the bytes of its numbers and everything else it shows. */
function contentKey(chart: ChartOutcome, digits: number, name: string): string {
  const hash = createHash('sha256')
  const { x, series, ...rest } = chart
  hash.update(JSON.stringify({ rest, digits, name, x: { ...x, values: null }, series: series.map((s) => ({ ...s, values: null })) }))
  for (const values of [x.values, ...series.map((s) => s.values)]) hash.update(new Uint8Array(values.buffer, values.byteOffset, values.byteLength))
  return hash.digest('hex')
}

/** Render the charts of a note (concurrently; vega is loaded on first use). */
export async function renderCharts(model: NoteModel, cache?: ChartCache | null): Promise<RenderedCharts> {
  const charts = new Map<number, { svg: string; specFile: string }>()
  const files = new Map<string, string>()
  let cached = 0
  await Promise.all(
    model.blocks.map(async (block) => {
      const chart = model.outcomes[block.index]?.chart
      if (!chart) return
      const name = block.id ?? `chart-${block.index + 1}`
      const specFile = `charts/${name}.vl.json`
      const key = contentKey(chart, model.meta.digits, name)
      let done = finished.get(key)
      if (done) cached++
      else {
        const spec = chartSpec(chart)
        const text = specText(spec)
        const rendered = await chartSvg(spec, `lw-${name}`, cache, text)
        if (rendered.cached) cached++
        done = { text, svg: rendered.svg }
        if (finished.size >= FINISHED_LIMIT) finished.clear()
        finished.set(key, done)
      }
      files.set(specFile, done.text)
      charts.set(block.index, { svg: done.svg, specFile })
    }),
  )
  return { charts, files, cached }
}
