/**
 * Timing helpers and the report every benchmark writes to: warm up, take the
 * median of several runs, and state each figure with the ratio it is judged by
 * (measured in the same run), which way is better, and whether it meets its target.
 */
import { cpus } from 'node:os'

/** Median wall time of `runs` calls after `warmup` calls, in milliseconds. */
export async function median(fn: () => unknown, runs = 7, warmup = 2): Promise<number> {
  for (let i = 0; i < warmup; i++) await fn()
  const times: number[] = []
  for (let i = 0; i < runs; i++) {
    const start = performance.now()
    await fn()
    times.push(performance.now() - start)
  }
  times.sort((a, b) => a - b)
  return times[Math.floor(times.length / 2)]!
}

/** The machine, named above every report. */
export function machine(): { cpus: number; model: string; node: string } {
  const list = cpus()
  return { cpus: list.length, model: list[0]?.model.trim() ?? 'unknown CPU', node: process.version }
}

/** A ratio a figure is judged by. */
export interface Ratio {
  /** The ratio, e.g. 0.93 (× of the bare loop). */
  readonly value: number
  /** What it is a ratio of, in words: "throughput × of the bare loop". */
  readonly of: string
  readonly better: 'higher' | 'lower'
  /** The target, when there is one, e.g. 0.8 (≥ for higher-is-better, ≤ for lower). */
  readonly target?: number
}

/** One measured figure. */
export interface Measure {
  readonly name: string
  readonly value: number
  readonly unit: string
  readonly note?: string
  readonly ratio?: Ratio
}

/** A titled group of figures. */
export interface Section {
  readonly title: string
  readonly measures: readonly Measure[]
}

const sections: Section[] = []

/** Record a group of figures for the report. */
export function record(title: string, measures: readonly Measure[]): void {
  sections.push({ title, measures })
}

/** Met or not met, when the ratio has a target. */
export function verdict(ratio: Ratio): 'met' | 'not met' | null {
  if (ratio.target === undefined) return null
  const met = ratio.better === 'higher' ? ratio.value >= ratio.target : ratio.value <= ratio.target
  return met ? 'met' : 'not met'
}

/** The report as Markdown tables. */
export function markdown(): string {
  const m = machine()
  const out = [`linkwright benchmarks — ${m.cpus} × ${m.model}, Node ${m.node}`]
  for (const section of sections) {
    out.push('', `### ${section.title}`, '', '| measure | value | ratio | target | note |', '|---|---|---|---|---|')
    for (const x of section.measures) {
      const ratio = x.ratio ? `${x.ratio.value.toFixed(2)} ${x.ratio.of} (${x.ratio.better} is better)` : ''
      const target = x.ratio?.target !== undefined ? `${x.ratio.better === 'higher' ? '≥' : '≤'} ${x.ratio.target}: **${verdict(x.ratio)}**` : ''
      out.push(`| ${x.name} | ${format(x.value)} ${x.unit} | ${ratio} | ${target} | ${x.note ?? ''} |`)
    }
  }
  return `${out.join('\n')}\n`
}

/** The report as one JSON object. */
export function json(): string {
  return `${JSON.stringify({
    machine: machine(),
    sections: sections.map((s) => ({
      title: s.title,
      measures: s.measures.map((x) => ({ ...x, ...(x.ratio ? { ratio: { ...x.ratio, verdict: verdict(x.ratio) } } : {}) })),
    })),
  })}\n`
}

function format(value: number): string {
  return Math.abs(value) >= 100 ? value.toFixed(0) : Math.abs(value) >= 1 ? value.toFixed(2) : value.toPrecision(3)
}

/** Points per second from a count and milliseconds, in millions. */
export function mps(points: number, ms: number): number {
  return points / ms / 1000
}
