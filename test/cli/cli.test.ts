/**
 * The command line as users run it: the built binary on notes in a temporary
 * folder. Needs `npm run build` first (part of `npm test`).
 */
import { spawnSync } from 'node:child_process'
import { cpSync, existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { analyseSliderCrank, sliderCrank } from '../../src/linkage/index.js'

const root = new URL('../../', import.meta.url).pathname
const bin = join(root, 'bin', 'linkwright.js')

function run(args: readonly string[], cwd: string) {
  const result = spawnSync(process.execPath, [bin, ...args], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } })
  return { code: result.status, stdout: result.stdout, stderr: result.stderr }
}

function workspace(): string {
  const dir = mkdtempSync(join(tmpdir(), 'linkwright-cli-'))
  cpSync(join(root, 'reports'), join(dir, 'reports'), { recursive: true })
  return dir
}

describe('linkwright build', () => {
  let dir: string
  let result: ReturnType<typeof run>
  beforeAll(() => {
    dir = workspace()
    result = run(['build', '--no-pdf'], dir)
  })

  it('should build every demo note and exit 0 (a FAIL check is a result, not an error)', () => {
    // Warnings (the agitator's dead points) are fine; no error line.
    expect(result.stderr).not.toMatch(/ {2}error {2}/)
    expect(result.code).toBe(0)
    expect(existsSync(join(dir, 'out/carton-pusher/index.html'))).toBe(true)
    expect(existsSync(join(dir, 'out/sieve-rocker/index.html'))).toBe(true)
    expect(existsSync(join(dir, 'out/carton-pusher/assets/katex/fonts/KaTeX_Main-Regular.woff2'))).toBe(true)
  })

  it('should write results.json with SI values, display values and every check', () => {
    const results = JSON.parse(readFileSync(join(dir, 'out/carton-pusher/results.json'), 'utf8'))
    expect(results.schema).toBe('linkwright-results/1')
    const pusher = results.blocks.find((b: { id: string }) => b.id === 'pusher')
    const core = analyseSliderCrank(sliderCrank({ crank: 0.0378, rod: 0.1, offset: 0.03, rotation: -1 }), { speed: (96 * 2 * Math.PI) / 60 })
    expect(pusher.results.stroke.si).toBeCloseTo(core.stroke, 15)
    expect(pusher.results.stroke.siUnit).toBe('m')
    expect(pusher.results.stroke.displayUnit).toBe('mm')
    expect(pusher.results.time_ratio.si).toBeCloseTo(core.timeRatio!, 14)
    expect(pusher.inputs.crank).toMatchObject({ si: 0.0378, expression: '37.8 mm', source: '[dwg-4410] item 3, crank disc pin radius', given: true })
    expect(results.checks.map((c: { status: string; informative: boolean }) => [c.status, c.informative])).toEqual([
      ['PASS', false],
      ['PASS', false],
      ['PASS', false],
      ['PASS', false],
      ['PASS', false],
      ['PASS', false],
      ['PASS', false],
      ['FAIL', true],
    ])
    expect(results.summary).toMatchObject({ checks: 7, passed: 7, failed: 0, informative: { checks: 1, failed: 1 }, gatePasses: true, errors: 0 })
    expect(results.caution).toMatch(/^These calculations describe machinery that can hurt people\..*does not claim compliance with any code or standard\.$/)
  })

  it('should give byte-identical output when run again', () => {
    const first = readFileSync(join(dir, 'out/carton-pusher/index.html'))
    const again = run(['build', '--no-pdf', '--quiet'], dir)
    expect(again.code).toBe(0)
    expect(readFileSync(join(dir, 'out/carton-pusher/index.html')).equals(first)).toBe(true)
  })

  it('should keep the last good package of a broken note, build the others and exit 1', () => {
    const work = workspace()
    expect(run(['build', '--no-pdf', '--quiet'], work).code).toBe(0)
    const before = readFileSync(join(work, 'out/carton-pusher/index.html'))
    writeFileSync(join(work, 'out/carton-pusher/marker.txt'), 'kept')
    const note = readFileSync(join(work, 'reports/carton-pusher.md'), 'utf8')
    writeFileSync(join(work, 'reports/carton-pusher.md'), note.replace('crank: 37.8 mm', 'crank: 37.8 kg'))
    const broken = run(['build', '--no-pdf'], work)
    expect(broken.code).toBe(1)
    expect(broken.stderr).toContain('reports/carton-pusher.md:66:8  error  Unexpected value for `crank` (crank radius): expected a length')
    expect(broken.stderr).toContain('  66 | crank: 37.8 kg ; [dwg-4410] item 3, crank disc pin radius')
    expect(broken.stderr).toMatch(/\n {5}\| {8}\^{7}\n/)
    expect(readFileSync(join(work, 'out/carton-pusher/index.html')).equals(before)).toBe(true)
    expect(readFileSync(join(work, 'out/carton-pusher/marker.txt'), 'utf8')).toBe('kept')
    // The other notes are as they were: left unchanged (incremental), or built again.
    expect(broken.stdout).toMatch(/reports\/sieve-rocker\.md: (unchanged, )?out\/sieve-rocker\/index\.html/)
  })
})

describe('dates', () => {
  it('should take `date: git` from the note’s last commit, not the clock', () => {
    const dir = mkdtempSync(join(tmpdir(), 'linkwright-git-'))
    const git = (...args: string[]) =>
      spawnSync('git', args, {
        cwd: dir,
        encoding: 'utf8',
        env: { ...process.env, GIT_AUTHOR_DATE: '2025-03-04T10:00:00Z', GIT_COMMITTER_DATE: '2025-03-04T10:00:00Z', GIT_AUTHOR_NAME: 't', GIT_AUTHOR_EMAIL: 't@example.org', GIT_COMMITTER_NAME: 't', GIT_COMMITTER_EMAIL: 't@example.org' },
      })
    git('init', '-q')
    writeFileSync(join(dir, 'note.md'), '---\ntitle: Dated\nnumber: D-1\nrevision: A\nstatus: draft\ndate: git\n---\n\nText.\n')
    git('add', 'note.md')
    git('commit', '-q', '-m', 'note')
    const result = run(['build', 'note.md', '--no-pdf', '--quiet'], dir)
    expect(result.code).toBe(0)
    const results = JSON.parse(readFileSync(join(dir, 'out/note/results.json'), 'utf8'))
    expect(results.document.date).toBe('2025-03-04')
    expect(readFileSync(join(dir, 'out/note/index.html'), 'utf8')).toContain('2025-03-04')
  })

  it('should say so when a `date: git` note is not committed', () => {
    const dir = mkdtempSync(join(tmpdir(), 'linkwright-nogit-'))
    writeFileSync(join(dir, 'note.md'), '---\ntitle: Dated\nnumber: D-1\nrevision: A\nstatus: draft\ndate: git\n---\n\nText.\n')
    const result = run(['build', 'note.md', '--no-pdf'], dir)
    expect(result.code).toBe(1)
    expect(result.stderr).toContain('cannot find the note’s last commit date for `date: git`')
    // The check command agrees with the build.
    const checked = run(['check', 'note.md'], dir)
    expect(checked.code).toBe(1)
    expect(checked.stderr).toContain('cannot find the note’s last commit date for `date: git`')
  })
})

describe('linkwright check', () => {
  it('should print each failing check and exit 1', () => {
    const dir2 = workspace()
    writeFileSync(join(dir2, 'reports/carton-pusher.md'), readFileSync(join(dir2, 'reports/carton-pusher.md'), 'utf8').replace(' (informative) ;', ' ;'))
    const result = run(['check'], dir2)
    expect(result.code).toBe(1)
    expect(result.stdout).toContain('reports/carton-pusher.md: 7 of 8 checks pass (1 FAIL)')
    expect(result.stdout).toMatch(/reports\/carton-pusher\.md:\d+ {2}FAIL {2}option B quick return: 1\.0000, limit ≥ 1\.1500/)
  })

  it('should show an informative FAIL apart and pass the gate, with the caution', () => {
    const result = run(['check'], workspace())
    expect(result.stdout).toContain('reports/carton-pusher.md: 7 of 7 checks pass; 1 informative check, not part of the gate (1 FAIL)')
    expect(result.stdout).toMatch(/FAIL \(informative\) {2}option B quick return/)
    expect(result.stdout).toContain('Caution: These calculations describe machinery that can hurt people.')
    expect(result.code).toBe(0)
  })

  it('should exit 0 when every check passes', () => {
    const dir = workspace()
    const result = run(['check', 'reports/sieve-rocker.md'], dir)
    expect(result.stdout).toContain('6 of 6 checks pass')
    expect(result.code).toBe(0)
  })
})

describe('command line', () => {
  it('should print help for the tool and each command', async () => {
    const dir = workspace()
    for (const args of [['--help'], ['build', '--help'], ['check', '--help']]) {
      const result = run(args, dir)
      expect(result.code).toBe(0)
      const name = args.length === 1 ? 'linkwright' : args[0]!
      await expect(result.stdout).toMatchFileSnapshot(`./help/${name}.txt`)
    }
  })

  it('should exit 2 on an unknown command or option', () => {
    const dir = workspace()
    expect(run(['bulid'], dir).code).toBe(2)
    expect(run(['build', '--fast'], dir).code).toBe(2)
    expect(run(['build', '--paper', 'A3'], dir).code).toBe(2)
  })
})
