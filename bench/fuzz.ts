/**
 * Fuzz throughput: the demo notes mutated as the test suite mutates them
 * (test/helpers/mutations.ts), each built in process to its package (or its
 * messages), against the same notes unmutated. Notes per second, higher is
 * better; and how many fuzz and bad-input cases one CI run builds.
 */
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { VFile } from 'vfile'
import { buildNote } from '../src/build.js'
import { dataReader } from '../src/cli/data-files.js'
import { TOOL } from '../src/version.js'
import { MUTATION_RUNS, MUTATION_SEED, applyEdit, type Edit } from '../test/helpers/mutations.js'
import { median, record } from './measure.js'

const root = new URL('../', import.meta.url).pathname.replace(/\/dist\/?$/, '/')
const template = readFileSync(join(root, 'templates/package.html'), 'utf8')
const NOTES = ['carton-pusher', 'sieve-rocker', 'plunger-pump', 'air-agitator'].map((name) => ({ path: `reports/${name}.md`, text: readFileSync(join(root, `reports/${name}.md`), 'utf8') }))
const COUNT = 80

/** A small seeded generator (mulberry32), so the benchmark replays the same edits. */
function generator(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return (t ^ (t >>> 14)) >>> 0
  }
}

async function buildText(path: string, text: string): Promise<boolean> {
  const file = new VFile({ path, value: text.startsWith('---') ? text : `---\n${text}` })
  const built = await buildNote(file, { tool: TOOL, notePath: path, template, commit: 'bench', readData: dataReader(join(root, path)) })
  return built.ok
}

export async function runFuzzBench(): Promise<void> {
  const next = generator(MUTATION_SEED)
  const cases = Array.from({ length: COUNT }, (_, i) => {
    const note = NOTES[i % NOTES.length]!
    const edits: Edit[] = Array.from({ length: 1 + (next() % 3) }, () => ({ kind: next() % 8, at: next(), pick: next() }))
    return { path: note.path, text: edits.reduce(applyEdit, note.text) }
  })
  let built = 0
  const mutated = await median(async () => {
    built = 0
    for (const c of cases) if (await buildText(c.path, c.text)) built++
  }, 3, 1)
  const plain = await median(async () => {
    for (let i = 0; i < COUNT; i++) await buildText(NOTES[i % NOTES.length]!.path, NOTES[i % NOTES.length]!.text)
  }, 3, 1)
  const rate = (COUNT / mutated) * 1000
  const plainRate = (COUNT / plain) * 1000
  // The fuzz and bad-input cases of one CI run, from the tests' own settings.
  const ci = { mutations: MUTATION_RUNS, randomNotes: 300, catalogue: 49, budgets: 14, boundaries: 3000 }
  record('Fuzzing (mutated demo notes built in process, one core)', [
    { name: `${COUNT} mutated notes, each built to a package or messages`, value: rate, unit: 'notes/s', note: `${built} of ${COUNT} still build`, ratio: { value: rate / plainRate, of: '× the unmutated notes’ rate', better: 'higher' } },
    { name: 'the same notes unmutated', value: plainRate, unit: 'notes/s' },
    { name: 'fuzz cases per CI run', value: ci.mutations + ci.randomNotes + ci.boundaries, unit: 'cases', note: `${ci.mutations} mutated demo notes, ${ci.randomNotes} random notes, ${ci.boundaries} boundary linkages; plus ${ci.catalogue} catalogue and ${ci.budgets} budget cases` },
  ])
}
