/**
 * Timing helpers for the benchmarks: warm up, then take the median of several
 * runs. Figures are reported as ratios measured in the same process.
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

/** One line naming the machine, printed above every table. */
export function machine(): string {
  const list = cpus()
  return `${list.length} × ${list[0]?.model.trim() ?? 'unknown CPU'}, Node ${process.version}`
}

/** A row of a benchmark table. */
export interface Row {
  readonly name: string
  readonly value: string
  readonly note?: string
}

/** Print rows as a Markdown table under a heading. */
export function printTable(title: string, rows: readonly Row[]): void {
  console.log(`\n### ${title}\n`)
  console.log('| measure | value | note |')
  console.log('|---|---|---|')
  for (const row of rows) console.log(`| ${row.name} | ${row.value} | ${row.note ?? ''} |`)
}

/** Format a rate in points per second. */
export function perSecond(points: number, ms: number): string {
  return `${((points / ms) * 1000 / 1e6).toFixed(2)} M points/s`
}
