/**
 * The demo notes, mutated the way real edits go wrong (truncated, a line
 * lost or doubled, a fence dropped, a number turned into NaN, Infinity, 1e308
 * or forty nines, a unit swapped, stray Unicode): the build never throws,
 * every message is at a place inside the note with a rule id of the
 * catalogue, and a package that builds has no NaN or Infinity among its
 * numbers. Seeded: a failure prints its seed and path, and `seed` + `path`
 * in fc.assert replays it.
 */
import { readFileSync } from 'node:fs'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { dataReader } from '../../src/cli/data-files.js'
import { messages } from '../../src/notes/messages.js'
import { build } from '../helpers/note.js'
import { MUTATION_RUNS, MUTATION_SEED, applyEdit } from '../helpers/mutations.js'

/** One edit, as numbers fast-check can shrink: which kind, where, with what. */
const edit = fc.record({ kind: fc.integer({ min: 0, max: 7 }), at: fc.nat(), pick: fc.nat() })

const NOTES = ['carton-pusher', 'sieve-rocker', 'plunger-pump', 'air-agitator'].map((name) => ({
  path: `reports/${name}.md`,
  text: readFileSync(new URL(`../../reports/${name}.md`, import.meta.url), 'utf8'),
}))

/** Numbers of a results document that are not finite (JSON would print them as null). */
function nonFinite(value: unknown, path = ''): string[] {
  if (typeof value === 'number') return Number.isFinite(value) ? [] : [path]
  // Numbers as shown (not the note's own words, which may say anything).
  if (typeof value === 'string') return /\.(display|actual|limit|margin|shown)$/.test(path) && /\b(NaN|Infinity)\b/.test(value) ? [`${path}: ${value}`] : []
  if (Array.isArray(value)) return value.flatMap((v, i) => nonFinite(v, `${path}[${i}]`))
  if (value && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => nonFinite(v, `${path}.${k}`))
  return []
}

const RULES = new Set(Object.keys(messages))

describe('mutated demo notes', () => {
  it('should build the unmutated demo notes with finite numbers (the check below can pass)', async () => {
    for (const note of NOTES) {
      const { built } = await build(note.text, note.path, dataReader(note.path))
      expect(built.ok, note.path).toBe(true)
      expect(nonFinite(built.results), note.path).toEqual([])
    }
  })

  it('should never throw, place every message inside the note, and print no NaN or Infinity', async () => {
    await fc.assert(
      fc.asyncProperty(fc.nat({ max: NOTES.length - 1 }), fc.array(edit, { minLength: 1, maxLength: 3 }), async (which, edits) => {
        const note = NOTES[which]!
        const text = edits.reduce(applyEdit, note.text)
        const { file, built } = await build(text.startsWith('---') ? text : `---\n${text}`, note.path, dataReader(note.path))
        const lineCount = String(file.value).split('\n').length
        for (const m of file.messages) {
          expect(m.ruleId && RULES.has(m.ruleId as never), `${m.ruleId}: ${m.reason}`).toBe(true)
          expect(m.line ?? 0, m.reason).toBeGreaterThanOrEqual(1)
          expect(m.line ?? 0, m.reason).toBeLessThanOrEqual(lineCount)
          expect(m.column ?? 0, m.reason).toBeGreaterThanOrEqual(1)
        }
        if (built.ok) {
          expect(nonFinite(built.results)).toEqual([])
          expect(built.html).not.toMatch(/class="lw-number">[^<]*(NaN|Infinity)/)
        } else {
          expect(file.messages.some((m) => m.fatal === true)).toBe(true)
        }
      }),
      { numRuns: Number(process.env.LINKWRIGHT_FUZZ_RUNS ?? MUTATION_RUNS), seed: Number(process.env.LINKWRIGHT_FUZZ_SEED ?? MUTATION_SEED) },
    )
  })
})
