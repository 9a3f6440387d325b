/**
 * Charts to SVG at build time: vega-lite compiles the spec, vega renders it
 * headless (renderer 'none', no canvas), and the SVG is cached by the spec's
 * content so an unchanged chart is not rendered again.
 */
import { createHash } from 'node:crypto'

/** Where rendered charts are kept between builds. */
export interface ChartCache {
  get(key: string): string | undefined
  set(key: string, svg: string): void
}

const memory = new Map<string, string>()
const MEMORY_LIMIT = 200

/** Content key of a spec's text (with the renderer's versions, so an upgrade re-renders). */
export function chartKey(specText: string, versions: string): string {
  return createHash('sha256').update(versions).update(specText).digest('hex')
}

let renderer: Promise<{ render(spec: unknown): Promise<string>; versions: string }> | null = null

/** vega and vega-lite, loaded on first use (they cost ~0.6 s to import). */
function loadRenderer() {
  renderer ??= (async () => {
    const [vl, vega] = await Promise.all([import('vega-lite'), import('vega')])
    return {
      versions: `vega-lite ${vl.version} vega ${vega.version}`,
      async render(spec: unknown): Promise<string> {
        // vega-lite's notes go to our list, not the console: a spec of ours should raise none.
        const notes: string[] = []
        const note = (...m: unknown[]) => {
          notes.push(m.join(' '))
          return logger
        }
        const logger: Record<string, unknown> = { level: () => logger, error: note, warn: note, info: () => logger, debug: () => logger }
        const compiled = vl.compile(spec as Parameters<typeof vl.compile>[0], { logger: logger as never }).spec
        if (notes.length > 0) throw new Error(`vega-lite: ${notes.join('; ')}`)
        const view = new vega.View(vega.parse(compiled), { renderer: 'none' })
        try {
          return await view.toSVG()
        } finally {
          view.finalize()
        }
      },
    }
  })()
  return renderer
}

/**
 * The SVG of a vega-lite spec, its ids made unique with `prefix` (several charts
 * share one page) and numbered in order so the text is the same on every run.
 */
export async function chartSvg(
  spec: unknown,
  prefix: string,
  cache?: ChartCache | null,
  specText: string = JSON.stringify(spec),
): Promise<{ svg: string; cached: boolean }> {
  const { render, versions } = await loadRenderer()
  const key = chartKey(specText, versions)
  // In memory the finished SVG is kept per prefix; on disk vega's own output.
  const finished = memory.get(`${prefix} ${key}`)
  if (finished !== undefined) return { svg: finished, cached: true }
  let svg = cache?.get(key)
  const cached = svg !== undefined
  if (svg === undefined) {
    svg = await render(spec)
    cache?.set(key, svg)
  }
  const result = stripAria(scopeIds(svg, prefix))
  if (memory.size >= MEMORY_LIMIT) memory.clear()
  memory.set(`${prefix} ${key}`, result)
  return { svg: result, cached }
}

/**
 * Take vega's ARIA roles and labels off the marks: the figure gives the chart one
 * text alternative, and per-mark roles without labels fail accessibility audits.
 */
export function stripAria(svg: string): string {
  return svg.replace(/\s(?:role="graphics-[a-z-]+"|aria-roledescription="[^"]*"|aria-label="[^"]*"|aria-hidden="[^"]*")/g, '')
}

/** Rename every id (and its url(#…)/href="#…" uses) to prefix-1, prefix-2 … in order of appearance. */
export function scopeIds(svg: string, prefix: string): string {
  const names = new Map<string, string>()
  for (const match of svg.matchAll(/\sid="([^"]+)"/g)) {
    if (!names.has(match[1]!)) names.set(match[1]!, `${prefix}-${names.size + 1}`)
  }
  if (names.size === 0) return svg
  return svg.replace(/(\sid="|url\(#|href="#)([^")]+)/g, (whole, lead: string, name: string) => {
    const renamed = names.get(name)
    return renamed ? `${lead}${renamed}` : whole
  })
}
