/**
 * The price of the calculation layer: HTML build of the demo notes against the
 * same Markdown through a plain unified pipeline (blocks left as code); and the
 * command line's start-up (`linkwright check` of one note) against `node -e 0`.
 */
import { spawnSync } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import rehypeStringify from 'rehype-stringify'
import remarkParse from 'remark-parse'
import remarkRehype from 'remark-rehype'
import { unified } from 'unified'
import { VFile } from 'vfile'
import { buildNote } from '../src/build.js'
import { dataReader } from '../src/cli/data-files.js'
import { TOOL } from '../src/version.js'
import { median, record } from './measure.js'

const root = process.cwd()
// Charts and drawings are measured on their own (bench/figures.ts): this is the calculation layer's price.
const withoutFigures = (text: string) => text.replace(/```(?:chart|drawing)[^\n]*\n[\s\S]*?\n```\n/g, '')
const notes = ['reports/carton-pusher.md', 'reports/sieve-rocker.md', 'reports/plunger-pump.md', 'reports/air-agitator.md'].map((path) => ({ path, text: withoutFigures(readFileSync(join(root, path), 'utf8')) }))
const template = readFileSync(join(root, 'templates/package.html'), 'utf8')

async function buildAll(): Promise<void> {
  for (const note of notes) {
    const file = new VFile({ path: note.path, value: note.text })
    const built = await buildNote(file, { tool: TOOL, notePath: note.path, template, commit: 'bench', readData: dataReader(join(root, note.path)) })
    if (!built.html) throw new Error(`${note.path} did not build`)
  }
}

const plain = unified().use(remarkParse).use(remarkRehype).use(rehypeStringify).freeze()
function plainAll(): void {
  for (const note of notes) plain.processSync(note.text)
}

function wall(command: string, args: readonly string[]): number {
  const start = performance.now()
  spawnSync(command, args, { cwd: root, stdio: 'ignore' })
  return performance.now() - start
}

export async function runPackageBench(): Promise<void> {
  const coldStart = performance.now()
  await buildAll()
  const cold = performance.now() - coldStart
  // Alternate the two so that both see the same machine; many runs, medians.
  const warmTimes: number[] = []
  const bareTimes: number[] = []
  for (let i = 0; i < 10; i++) await buildAll()
  for (let i = 0; i < 10; i++) plainAll()
  for (let i = 0; i < 21; i++) {
    warmTimes.push(await median(buildAll, 1, 0))
    bareTimes.push(await median(plainAll, 1, 0))
  }
  const mid = (list: number[]) => [...list].sort((a, b) => a - b)[Math.floor(list.length / 2)]!
  const warm = mid(warmTimes)
  const bare = mid(bareTimes)
  const node = await median(() => wall(process.execPath, ['-e', '0']), 7, 1)
  const check = await median(() => wall(process.execPath, ['bin/linkwright.js', 'check', 'reports/sieve-rocker.md']), 7, 1)
  record('Package build (the four demo notes without their charts and drawings, HTML only, in process)', [
    { name: 'plain unified pipeline (blocks left as code)', value: bare, unit: 'ms' },
    { name: 'linkwright HTML build, first in process', value: cold, unit: 'ms', note: 'includes first-use costs', ratio: { value: cold / bare, of: '× the plain pipeline’s time', better: 'lower' } },
    { name: 'linkwright HTML build, warm', value: warm, unit: 'ms', ratio: { value: warm / bare, of: '× the plain pipeline’s time', better: 'lower', target: 4 } },
  ])
  record('Command-line start-up', [
    { name: '`node -e 0`', value: node, unit: 'ms' },
    { name: '`linkwright check reports/sieve-rocker.md`', value: check, unit: 'ms', ratio: { value: check / node, of: '× `node -e 0`', better: 'lower', target: 10 } },
  ])
}
