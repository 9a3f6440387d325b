/**
 * The catalogue of bad inputs: every class of mistake the tool knows, each
 * with its rule id, the place the mistake was written (found in the note's own
 * text, not copied from the tool's output) and the exit status, run through
 * the built command line as a user would. The README's troubleshooting section
 * lists every class by its rule id. One build runs all note cases at once (the
 * other notes still build); the command-line cases run one by one.
 */
import { spawnSync } from 'node:child_process'
import { existsSync, mkdirSync, mkdtempSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'

const root = new URL('../../', import.meta.url).pathname
const bin = join(root, 'bin', 'linkwright.js')

const FRONT = '---\ntitle: Catalogue note\nnumber: T-30\nrevision: A\nstatus: draft\ndate: 2026-01-05\nreferences:\n  alpha: Alpha handbook, 2nd ed.\n---\n\n'
const drive = (body = 'crank: 40 mm\nrod: 160 mm\nspeed: 100 rpm', head = 'slider-crank #drive') => `\`\`\`${head}\n${body}\n\`\`\`\n`
const withDrive = (rest: string) => `${FRONT}${drive()}\n${rest}`

interface NoteCase {
  /** What went wrong, in the words of the README's troubleshooting list. */
  readonly what: string
  readonly note: string
  readonly rule: string
  /** Text at the place the message must point to (its first occurrence), or null for 1:1. */
  readonly at: string | null
}

const NOTE_CASES: readonly NoteCase[] = [
  { what: 'front matter that is not YAML', note: '---\ntitle: [unclosed\nnumber: X\n---\n\nText.\n', rule: 'front-matter-syntax', at: 'number' },
  { what: 'front matter without its identification', note: '---\ntitle: Only a title\nnumber: T-1\nrevision: A\n---\n\nText.\n', rule: 'missing-front-matter', at: 'title' },
  { what: 'a status word not known', note: FRONT.replace('status: draft', 'status: finished'), rule: 'front-matter-field', at: 'finished' },
  { what: 'a date that is not a date', note: FRONT.replace('date: 2026-01-05', 'date: 2026-13-45'), rule: 'front-matter-field', at: '2026-13-45' },
  {
    what: 'an alias bomb in the front matter',
    note: `${FRONT.replace('---\n\n', `a: &a [x, x, x, x, x, x, x, x, x]\nb: &b [${Array(9).fill('*a').join(', ')}]\nc: &c [${Array(9).fill('*b').join(', ')}]\nd: [${Array(9).fill('*c').join(', ')}]\n---\n\n`)}`,
    rule: 'front-matter-syntax',
    at: '*a',
  },
  { what: 'a block line without a colon', note: `${FRONT}${drive('crank: 40 mm\nrod: 160 mm\nspeed: 100 rpm\nthis line has no colon')}`, rule: 'block-syntax', at: 'this line has no colon' },
  { what: 'a misspelt block kind', note: `${FRONT}${drive(undefined, 'slidercrank #drive')}`, rule: 'unknown-block-kind', at: '```slidercrank' },
  { what: 'a linkage block without an id', note: `${FRONT}${drive(undefined, 'slider-crank')}`, rule: 'missing-block-id', at: '```slider-crank' },
  { what: 'a block id that is a unit', note: `${FRONT}${drive(undefined, 'slider-crank #mm')}`, rule: 'invalid-block-id', at: '```slider-crank' },
  { what: 'a block id used twice', note: `${FRONT}${drive()}\n${drive()}`, rule: 'duplicate-block-id', at: '```slider-crank #drive\ncrank: 40 mm\nrod: 160 mm\nspeed: 100 rpm\n```\n\n```slider-crank' },
  { what: 'an input a kind does not have', note: `${FRONT}${drive('crank: 40 mm\nrod: 160 mm\nspeed: 100 rpm\nstrok: 80 mm')}`, rule: 'unknown-input', at: 'strok' },
  { what: 'an input given twice', note: `${FRONT}${drive('crank: 40 mm\nrod: 160 mm\nspeed: 100 rpm\ncrank: 41 mm')}`, rule: 'duplicate-input', at: 'crank: 41' },
  { what: 'a required input missing', note: `${FRONT}${drive('crank: 40 mm\nspeed: 100 rpm')}`, rule: 'missing-input', at: '```slider-crank' },
  { what: 'a mass where a length belongs', note: `${FRONT}${drive('crank: 37.8 kg\nrod: 160 mm\nspeed: 100 rpm')}`, rule: 'dimension-mismatch', at: '37.8 kg' },
  { what: 'a bare number where a length belongs', note: `${FRONT}${drive('crank: 40\nrod: 160 mm\nspeed: 100 rpm')}`, rule: 'dimension-mismatch', at: '40\n' },
  { what: 'a negative length', note: `${FRONT}${drive('crank: -40 mm\nrod: 160 mm\nspeed: 100 rpm')}`, rule: 'linkage-error', at: '```slider-crank' },
  { what: 'a linkage that cannot assemble', note: `${FRONT}${drive('crank: 20 mm\nrod: 50 mm\noffset: 80 mm\nspeed: 100 rpm')}`, rule: 'linkage-error', at: '```slider-crank' },
  { what: 'a function definition in a value', note: `${FRONT}${drive('crank: f(x) = x\nrod: 160 mm\nspeed: 100 rpm')}`, rule: 'invalid-expression', at: 'f(x) = x' },
  { what: 'a function outside the budget (format, big numbers)', note: `${FRONT}${drive('crank: format(1, 1e9)\nrod: 160 mm\nspeed: 100 rpm')}`, rule: 'invalid-expression', at: 'format(1, 1e9)' },
  { what: 'a complex-number length', note: `${FRONT}${drive('crank: (38 + 2i) mm\nrod: 160 mm\nspeed: 100 rpm')}`, rule: 'invalid-expression', at: '(38 + 2i) mm' },
  { what: 'a unit raised to an infinite power', note: withDrive('```checks\nfast: drive.stroke <= 1 mm/s^Infinity\n```\n'), rule: 'invalid-expression', at: 'drive.stroke <= 1' },
  { what: 'a block id nobody defined', note: `${FRONT}${drive('crank: other.crank\nrod: 160 mm\nspeed: 100 rpm')}`, rule: 'unknown-block', at: 'other.crank' },
  { what: 'a result a block does not have', note: withDrive('```checks\nstroke: drive.strok >= 70 mm\n```\n'), rule: 'unknown-result', at: 'drive.strok' },
  { what: 'a choice word not known', note: `${FRONT}${drive('crank: 40 mm\nrod: 160 mm\nspeed: 100 rpm\nrotation: clockwise')}`, rule: 'invalid-choice', at: 'clockwise' },
  { what: 'a signed peak by its old name', note: withDrive('```checks\nspeed: drive.peak_velocity <= 2 m/s\n```\n'), rule: 'renamed-result', at: 'drive.peak_velocity' },
  {
    what: 'blocks that use each other',
    note: `${FRONT}${drive('crank: 40 mm\nrod: lower.rod\nspeed: 60 rpm', 'slider-crank #upper')}\n${drive('crank: 40 mm\nrod: upper.rod\nspeed: 60 rpm', 'slider-crank #lower')}`,
    rule: 'dependency-cycle',
    at: '```slider-crank #upper',
  },
  { what: 'a reference key not in the front matter', note: `${FRONT}${drive('crank: 40 mm ; [nope] item 3\nrod: 160 mm\nspeed: 100 rpm')}`, rule: 'unknown-reference', at: '[nope]' },
  { what: 'a check that is not a comparison', note: withDrive('```checks\nstroke: drive.stroke\n```\n'), rule: 'check-syntax', at: 'drive.stroke\n' },
  { what: 'a check comparing a length with an angle', note: withDrive('```checks\nstroke: drive.stroke >= 40 deg\n```\n'), rule: 'check-not-evaluable', at: 'drive.stroke >= 40 deg' },
  { what: 'a table with both a step and a row count', note: withDrive('```table\nof: drive\nquantities: position\nevery: 30 deg\nrows: 3\n```\n'), rule: 'table-syntax', at: 'rows' },
  { what: 'a chart over a billion degrees', note: withDrive('```chart\nof: drive\nseries: position\nx_range: 0 deg, 1e9 deg\n```\n'), rule: 'chart-syntax', at: '0 deg, 1e9 deg' },
  { what: 'a chart of a quantity the sweep has not', note: withDrive('```chart\nof: drive\nseries: speed\n```\n'), rule: 'unknown-quantity', at: 'speed\n' },
  { what: 'a drawing of a block that is not there', note: withDrive('```drawing\nof: drivee\n```\n'), rule: 'unknown-block', at: 'drivee' },
  { what: 'a prose value that cannot be printed', note: withDrive('The stroke is :value[drive.stroke]{unit=kg}.\n'), rule: 'invalid-value-reference', at: ':value[drive.stroke]' },
  { what: 'a display unit of the wrong kind', note: FRONT.replace('---\n\n', 'units:\n  system: SI\n  length: kg\n---\n\n') + drive(), rule: 'display-unit', at: 'kg\n' },
  { what: 'a flywheel on a linkage instead of its forces', note: withDrive('```flywheel #wheel\nof: drive\ncoefficient: 0.05\n```\n'), rule: 'wrong-block', at: 'drive\ncoefficient' },
  { what: 'a load file outside the design repository', note: withDrive('```forces #push\nof: drive\nload_file: ../../outside.csv\nload_during: outstroke\nslider_mass: 1 kg\n```\n'), rule: 'data-file', at: '../../outside.csv' },
  { what: 'a load table whose first column does not rise', note: withDrive('```forces #push\nof: drive\nload_against: crank-angle\nload: table\n  0 deg, 10 N\n  90 deg, 20 N\n  45 deg, 30 N\n  360 deg, 10 N\nslider_mass: 1 kg\n```\n'), rule: 'load-table', at: '45 deg, 30 N' },
  { what: 'a note that is a link to nothing', note: '', rule: 'unreadable-note', at: null },
]

/** Line and column (1-based) of the first occurrence of `text` in `note`. */
function placeOf(note: string, text: string | null): [number, number] {
  if (text === null) return [1, 1]
  const index = note.indexOf(text)
  expect(index, `"${text}" in the note`).toBeGreaterThanOrEqual(0)
  // A marker that spans lines points at its last line's start when it begins with a fence sequence.
  const target = text.includes('\n```') ? note.indexOf('```', index + text.lastIndexOf('\n```')) : index
  const before = note.slice(0, target)
  const line = before.split('\n').length
  return [line, target - before.lastIndexOf('\n')]
}

function run(args: readonly string[], cwd: string) {
  const result = spawnSync(process.execPath, [bin, ...args], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, timeout: 120_000 })
  return { code: result.status, stdout: result.stdout, stderr: result.stderr }
}

const name = (i: number) => `c${String(i + 1).padStart(2, '0')}.md`

describe('the catalogue of bad inputs', () => {
  let dir: string
  let result: ReturnType<typeof run>
  const firstError = new Map<string, { line: number; column: number; rule: string; reason: string }>()
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'linkwright-catalogue-'))
    mkdirSync(join(dir, 'notes'))
    NOTE_CASES.forEach((c, i) => {
      if (c.rule === 'unreadable-note') symlinkSync('missing.md', join(dir, 'notes', name(i)))
      else writeFileSync(join(dir, 'notes', name(i)), c.note)
    })
    writeFileSync(join(dir, 'notes', 'good.md'), withDrive('Good.\n'))
    result = run(['build', 'notes', '--no-pdf'], dir)
    for (const line of result.stderr.split('\n')) {
      const m = /^notes\/(c\d\d\.md):(\d+):(\d+) {2}error {2}(.*) {2}\[([a-z-]+)\]$/.exec(line)
      if (m && !firstError.has(m[1]!)) firstError.set(m[1]!, { line: Number(m[2]), column: Number(m[3]), reason: m[4]!, rule: m[5]! })
    }
  })

  it('should hold at least 30 classes', () => {
    expect(NOTE_CASES.length + CLI_CASES.length).toBeGreaterThanOrEqual(30)
  })

  it('should exit 1 for a folder with bad notes, and still build the good one', () => {
    expect(result.stderr).not.toMatch(/internal error|\n\s+at /)
    expect(result.code).toBe(1)
    expect(existsSync(join(dir, 'out', 'good', 'index.html'))).toBe(true)
  })

  NOTE_CASES.forEach((c, i) => {
    it(`should report ${c.what} as ${c.rule} where it was written`, () => {
      const found = firstError.get(name(i))
      expect(found, `an error for ${name(i)}:\n${result.stderr.split('\n').filter((l) => l.includes(name(i))).join('\n')}`).toBeDefined()
      expect([found!.rule, found!.line, found!.column]).toEqual([c.rule, ...placeOf(c.note, c.at)])
      expect(existsSync(join(dir, 'out', name(i).replace('.md', '')))).toBe(false)
    })
  })

  it('should list every class in the README troubleshooting section, by its rule id', () => {
    const readme = readFileSync(join(root, 'README.md'), 'utf8')
    const section = readme.slice(readme.indexOf('### Troubleshooting'), readme.indexOf('\n## ', readme.indexOf('### Troubleshooting')))
    const missing = [...new Set(NOTE_CASES.map((c) => c.rule))].filter((rule) => !section.includes(`\`${rule}\``))
    expect(missing).toEqual([])
    for (const exit of new Set(CLI_CASES.map((c) => c.exit))) expect(section, `exit ${exit}`).toContain(`exit ${exit}`)
  })

  for (const c of CLI_CASES) {
    it(`should answer ${c.what} with exit ${c.exit}`, () => {
      const work = mkdtempSync(join(tmpdir(), 'linkwright-catalogue-cli-'))
      writeFileSync(join(work, 'a.md'), withDrive('Fine.\n'))
      writeFileSync(join(work, 'file'), 'a file')
      const r = run(c.args, work)
      expect(r.stderr).not.toMatch(/internal error|\n\s+at /)
      expect(r.code).toBe(c.exit)
      expect(r.stderr).toMatch(c.says)
    })
  }
})

interface CliCase {
  readonly what: string
  readonly args: readonly string[]
  readonly exit: number
  readonly says: RegExp
}

const CLI_CASES: readonly CliCase[] = [
  { what: 'an unknown command', args: ['buidl'], exit: 2, says: /unknown command `buidl`/ },
  { what: 'an unknown option', args: ['build', '--pfd'], exit: 2, says: /Unknown option '--pfd'/ },
  { what: 'a paper size not offered', args: ['build', 'a.md', '--paper', 'A3'], exit: 2, says: /--paper must be A4 or Letter/ },
  { what: 'a path that does not exist', args: ['build', 'nothere.md', '--no-pdf'], exit: 2, says: /cannot find nothere\.md/ },
  { what: 'a folder with no notes', args: ['build', '--no-pdf', 'empty'], exit: 2, says: /cannot find empty/ },
  { what: 'an --out that is a file', args: ['build', 'a.md', '--out', 'file', '--no-pdf'], exit: 2, says: /--out file is a file, not a folder/ },
  { what: 'an --out below a file', args: ['build', 'a.md', '--out', 'file/out', '--no-pdf'], exit: 4, says: /cannot create the output folder file\/out \(ENOTDIR\)/ },
  { what: 'a browser that cannot run', args: ['build', 'a.md', '--browser', '/nonexistent/chromium'], exit: 3, says: /cannot run the browser at \/nonexistent\/chromium/ },
]
