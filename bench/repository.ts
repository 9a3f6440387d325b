/**
 * A design repository's life: builds of 1, 10, 50 and 200 generated notes
 * (variations of the four demo notes), HTML only, and of 1 and 10 with PDFs:
 * per-note cost, peak memory, cold / warm (nothing changed) / one note
 * changed, and the parallel build against a serial one of the same notes.
 * Each build is the real command line in a child process; its peak memory is
 * the process's own maximum resident set (worker threads included).
 */
import { spawnSync } from 'node:child_process'
import { cpSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { record } from './measure.js'

const root = process.cwd()
const DEMOS = ['carton-pusher', 'sieve-rocker', 'plunger-pump', 'air-agitator'].map((n) => readFileSync(join(root, 'reports', `${n}.md`), 'utf8'))

/** n notes, each a demo with its number and one prose line of its own (so every package differs). */
function repository(n: number): string {
  const dir = mkdtempSync(join(tmpdir(), 'linkwright-repo-bench-'))
  mkdirSync(join(dir, 'notes'))
  cpSync(join(root, 'reports', 'data'), join(dir, 'notes', 'data'), { recursive: true })
  for (let i = 0; i < n; i++) {
    const text = DEMOS[i % DEMOS.length]!.replace(/^number: (.*)$/m, `number: $1-${i}`).replace(/\n## /, `\nGenerated variation ${i}.\n\n## `)
    writeFileSync(join(dir, 'notes', `n${String(i).padStart(3, '0')}.md`), text)
  }
  return dir
}

/** One build: wall time (ms) and peak memory (MiB). */
function build(dir: string, args: readonly string[], env: NodeJS.ProcessEnv = {}): { ms: number; mib: number } {
  const rss = join(dir, '.rss')
  const wrapper = `process.on('exit', () => require('node:fs').writeFileSync(${JSON.stringify(rss)}, String(process.resourceUsage().maxRSS))); process.argv.splice(1, 1, ${JSON.stringify(join(root, 'bin', 'linkwright.js'))}); import(${JSON.stringify(join(root, 'dist', 'cli.js'))})`
  const start = performance.now()
  const result = spawnSync(process.execPath, ['-e', wrapper, 'x', 'build', 'notes', '--quiet', ...args], { cwd: dir, encoding: 'utf8', env: { ...process.env, ...env } })
  const ms = performance.now() - start
  if (result.status !== 0 && result.status !== 1) throw new Error(`build failed (${result.status}): ${result.stderr.slice(0, 400)}`)
  return { ms, mib: Number(readFileSync(rss, 'utf8')) / 1024 }
}

export async function runRepositoryBench(): Promise<void> {
  const rows: Parameters<typeof record>[1][number][] = []
  let coldPerNote1 = 0
  for (const n of [1, 10, 50, 200]) {
    const dir = repository(n)
    const cold = build(dir, ['--no-pdf'])
    const warm = build(dir, ['--no-pdf'])
    writeFileSync(join(dir, 'notes', 'n000.md'), `${readFileSync(join(dir, 'notes', 'n000.md'), 'utf8')}\nOne sentence more.\n`)
    const one = build(dir, ['--no-pdf'])
    if (n === 1) coldPerNote1 = cold.ms
    rows.push(
      { name: `${n} notes, HTML: cold`, value: cold.ms / 1000, unit: 's', note: `${(cold.ms / n).toFixed(0)} ms a note, peak ${cold.mib.toFixed(0)} MiB`, ratio: n > 1 ? { value: cold.ms / n / coldPerNote1, of: '× the per-note cost of a build of one note', better: 'lower', target: 1 } : undefined },
      { name: `${n} notes, HTML: warm (nothing changed)`, value: warm.ms / 1000, unit: 's', ratio: { value: warm.ms / cold.ms, of: '× the cold build', better: 'lower', target: n === 200 ? 0.05 : undefined } },
      { name: `${n} notes, HTML: one note changed`, value: one.ms / 1000, unit: 's', ratio: { value: one.ms / (0.05 * cold.ms + coldPerNote1), of: '× (0.05 × cold + one note’s own cost)', better: 'lower', target: n === 200 ? 1 : undefined } },
    )
    if (n === 200) rows.push({ name: '200 notes, HTML: peak memory', value: cold.mib, unit: 'MiB', ratio: { value: cold.mib / 1024, of: '× 1 GiB', better: 'lower', target: 1 } })
    if (n === 50) {
      rmSync(join(dir, 'out'), { recursive: true, force: true })
      const serial = build(dir, ['--no-pdf'], { LINKWRIGHT_WORKERS: '1' })
      rows.push({ name: '50 notes, HTML: serial (one thread)', value: serial.ms / 1000, unit: 's', ratio: { value: serial.ms / cold.ms, of: '× the serial build’s throughput (the parallel build)', better: 'higher', target: 1.6 } })
    }
    rmSync(dir, { recursive: true, force: true })
  }
  for (const n of [1, 10]) {
    const dir = repository(n)
    const cold = build(dir, [])
    const warm = build(dir, [])
    rows.push(
      { name: `${n} notes with PDF: cold`, value: cold.ms / 1000, unit: 's', note: `${(cold.ms / n).toFixed(0)} ms a note, peak ${cold.mib.toFixed(0)} MiB` },
      { name: `${n} notes with PDF: warm`, value: warm.ms / 1000, unit: 's', ratio: { value: warm.ms / cold.ms, of: '× the cold build', better: 'lower' } },
    )
    rmSync(dir, { recursive: true, force: true })
  }
  record('Design repository: builds of generated notes (the command line in a child process)', rows)
}
