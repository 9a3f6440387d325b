/**
 * The study block: each value of the varied input gives what the closed form
 * gives, the study's checks are judged at each value, the note's own results are
 * untouched, and bad studies are positioned messages.
 */
import type { VFile } from 'vfile'
import { describe, expect, it } from 'vitest'
import type { BlockOutcome } from '../../src/notes/block-kinds/kind.js'
import { expectClose } from '../helpers/close.js'
import { BODY_LINE, read } from '../helpers/note.js'

const errors = (file: VFile) => file.messages.filter((m) => m.fatal === true)
const outcomeOf = (outcomes: readonly (BlockOutcome | null)[], id: string) => outcomes.find((x) => x?.block.id === id)!

const DRIVE = `\`\`\`slider-crank #pusher
crank: 37.8 mm
rod: 100 mm
offset: 30 mm
speed: 96 rpm
\`\`\`
`
const STUDY = `${DRIVE}
\`\`\`study #sweep
of: pusher
vary: offset
from: 0 mm
to: 60 mm
steps: 7
show: stroke, time_ratio, transmission_angle_min
quick return: pusher.time_ratio >= 1.15
transmission: pusher.transmission_angle_min >= 40 deg
\`\`\`
`

describe('study of one input', () => {
  const { file, model } = read(STUDY)
  const study = outcomeOf(model.outcomes, 'sweep')
  const table = study.data[0]!

  it('should give at each offset the stroke and least transmission angle of the closed forms', () => {
    expect(errors(file)).toEqual([])
    // Offset slider-crank: S = √((b + a)² − e²) − √((b − a)² − e²), μmin = arccos((a + e)/b)
    // (Uicker, Pennock & Shigley, Theory of Machines and Mechanisms, 3rd ed. — from memory; derived in the field checks).
    const a = 37.8
    const b = 100
    table.rows.forEach((row, i) => {
      const e = i * 10
      expect(Number(row[0])).toBe(e)
      expectClose(Number(row[1]), Math.sqrt((b + a) ** 2 - e ** 2) - Math.sqrt((b - a) ** 2 - e ** 2), { abs: 0.006 })
      expectClose(Number(row[3]), (Math.acos((a + e) / b) * 180) / Math.PI, { abs: 0.0006 })
    })
  })

  it('should judge the study’s checks at each value', () => {
    // Time ratio ≥ 1.15 from 30 mm up; transmission ≥ 40° up to 30 mm: only 30 mm passes both.
    expect(table.rows.map((r) => r.slice(4).join(' '))).toEqual(['FAIL PASS', 'FAIL PASS', 'FAIL PASS', 'PASS PASS', 'PASS FAIL', 'PASS FAIL', 'PASS FAIL'])
    const passing = study.results.find((r) => r.name === 'values_passing')!
    expect(passing.value).toMatchObject({ type: 'quantity', si: 1 })
  })

  it('should leave the varied block’s own results as written', () => {
    const pusher = outcomeOf(model.outcomes, 'pusher')
    const alone = outcomeOf(read(DRIVE).model.outcomes, 'pusher')
    expect(pusher.results.map((r) => JSON.stringify(r.value))).toEqual(alone.results.map((r) => JSON.stringify(r.value)))
  })

  it('should say in its row why a value cannot be built, and go on', () => {
    // b − a = 62.2 mm: an offset of 70 mm leaves the crank unable to turn, and the rod cannot reach past 137.8 mm.
    const { file: f, model: m } = read(STUDY.replace('from: 0 mm\nto: 60 mm\nsteps: 7', 'values: 30 mm, 200 mm'))
    expect(errors(f)).toEqual([])
    const rows = outcomeOf(m.outcomes, 'sweep').data[0]!.rows
    expect(rows[0]![1]).toBe('80.008')
    expect(rows[1]!.at(-1)).toMatch(/^not built: /)
  })
})

describe('study of two inputs', () => {
  it('should cover every pair and give the closed form at each', () => {
    const { file, model } = read(STUDY.replace('steps: 7\n', 'steps: 7\nand_vary: rod\nand_values: 100 mm, 120 mm\n'))
    expect(errors(file)).toEqual([])
    const o = outcomeOf(model.outcomes, 'sweep')
    const rows = o.data[0]!.rows
    expect(rows).toHaveLength(14)
    for (const row of rows) {
      const [e, b, a] = [Number(row[0]), Number(row[1]), 37.8]
      // S = √((b + a)² − e²) − √((b − a)² − e²) at each pair.
      expectClose(Number(row[2]), Math.sqrt((b + a) ** 2 - e ** 2) - Math.sqrt((b - a) ** 2 - e ** 2), { abs: 0.006 })
    }
    expect(o.chart!.series).toHaveLength(2)
  })
})

describe('bad studies', () => {
  const at = (replace: [string, string]) => {
    const { file } = read(STUDY.replace(...replace))
    return errors(file).map((m) => [m.ruleId, m.line! - BODY_LINE, m.column])
  }
  it('should place each problem where it was written', () => {
    // DRIVE is six lines and a blank; the study opens on body line 8 (offset 7), `of:` on offset 8.
    expect(at(['vary: offset', 'vary: colour'])).toEqual([['invalid-choice', 9, 7]])
    expect(at(['to: 60 mm', 'to: 60 N'])).toEqual([['dimension-mismatch', 11, 5]])
    expect(at(['steps: 7', 'steps: 1000'])).toEqual([['invalid-choice', 12, 8]])
    expect(at(['show: stroke,', 'show: strok,'])).toEqual([['invalid-choice', 13, 7]])
    expect(at(['of: pusher', 'of: nothing'])).toEqual([['wrong-block', 8, 5]])
    expect(at(['steps: 7', 'steps: 7\nand_vary: offset\nand_values: 1 mm'])).toEqual([['invalid-choice', 13, 11]])
    expect(at(['steps: 7', 'steps: 7\nand_vary: rod\nand_values: 1 mm, 2 mm, 3 mm, 4 mm, 5 mm'])).toEqual([['invalid-choice', 14, 13]])
  })
})
