/**
 * Data lost, crashes and hangs of the command line under careless use and
 * faults: the built binary on notes in temporary folders, with the faults
 * made for real (a shell's file-size limit, a browser that hangs or dies,
 * builds racing into one folder, signals while printing). Each case lost a
 * package, crashed with a stack trace or hung before. Needs `npm run build`
 * and, for the printing cases, Chromium.
 */
import { spawn, spawnSync } from 'node:child_process'
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, symlinkSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { findBrowser } from '../../src/pdf/browser.js'

const root = new URL('../../', import.meta.url).pathname
const bin = join(root, 'bin', 'linkwright.js')
const browser = findBrowser()

const NOTE = `---
title: Fault note
number: T-9
revision: A
status: draft
date: 2026-01-05
---

# Fault note

\`\`\`slider-crank #drive
crank: 40 mm
rod: 160 mm
speed: 100 rpm
\`\`\`
`

function run(args: readonly string[], cwd: string, env: NodeJS.ProcessEnv = {}, shell?: string) {
  const command = shell ? '/bin/bash' : process.execPath
  const argv = shell ? ['-c', `${shell}; exec "$0" "$@"`, process.execPath, bin, ...args] : [bin, ...args]
  const result = spawnSync(command, argv, { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', ...env }, timeout: 120_000 })
  return { code: result.status, stdout: result.stdout, stderr: result.stderr, signal: result.signal }
}

function folder(name: string): string {
  return mkdtempSync(join(tmpdir(), `linkwright-${name}-`))
}

/** Every file under a folder with its bytes, for before/after comparisons. */
function snapshot(dir: string): Map<string, string> {
  const files = new Map<string, string>()
  const walk = (d: string, prefix: string) => {
    for (const entry of readdirSync(d, { withFileTypes: true }).sort((x, y) => x.name.localeCompare(y.name))) {
      if (entry.isDirectory()) walk(join(d, entry.name), `${prefix}${entry.name}/`)
      else files.set(`${prefix}${entry.name}`, readFileSync(join(d, entry.name)).toString('base64'))
    }
  }
  walk(dir, '')
  return files
}

const noStack = (text: string) => expect(text).not.toMatch(/\n\s+at .+:\d+:\d+\)?\n|internal error/)

describe('a build never deletes or replaces what it did not write', () => {
  it('should keep a notes folder named like a note, built into the notes folder itself', () => {
    const dir = folder('nested')
    writeFileSync(join(dir, 'n1.md'), NOTE)
    mkdirSync(join(dir, 'n1'))
    writeFileSync(join(dir, 'n1', 'sub.md'), NOTE)
    writeFileSync(join(dir, 'n1', 'drawing.dxf'), 'a drawing')
    const result = run(['build', '.', '--out', '.', '--no-pdf'], dir)
    noStack(result.stderr)
    expect(result.code).toBe(1)
    expect(readFileSync(join(dir, 'n1', 'sub.md'), 'utf8')).toBe(NOTE)
    expect(readFileSync(join(dir, 'n1', 'drawing.dxf'), 'utf8')).toBe('a drawing')
    expect(existsSync(join(dir, 'n1', 'sub', 'index.html'))).toBe(true)
    expect(result.stderr).toMatch(/^n1\.md:1:1 {2}error {2}Not built: its package folder n1 would hold the note n1\/sub\.md.*\[package-folder\]$/m)
  })

  it('should build the note in the folder with a separate --out, and say why the other is not built', () => {
    const dir = folder('nested-out')
    writeFileSync(join(dir, 'n1.md'), NOTE)
    mkdirSync(join(dir, 'n1'))
    writeFileSync(join(dir, 'n1', 'sub.md'), NOTE)
    const result = run(['build', '.', '--out', 'out', '--no-pdf'], dir)
    noStack(result.stderr)
    expect(result.code).toBe(1)
    expect(existsSync(join(dir, 'out', 'n1', 'sub', 'index.html'))).toBe(true)
    expect(result.stderr).toMatch(/^n1\.md:1:1 {2}error {2}Not built: its package folder out\/n1 would hold the package of n1\/sub\.md/m)
  })

  it('should refuse to replace a folder holding files it did not write', () => {
    const dir = folder('foreign')
    writeFileSync(join(dir, 'pump.md'), NOTE)
    mkdirSync(join(dir, 'pump'))
    writeFileSync(join(dir, 'pump', 'calc.xlsx'), 'the old spreadsheet')
    const result = run(['build', '.', '--out', '.', '--no-pdf'], dir)
    noStack(result.stderr)
    expect(result.code).toBe(1)
    expect(readFileSync(join(dir, 'pump', 'calc.xlsx'), 'utf8')).toBe('the old spreadsheet')
    expect(result.stderr).toMatch(/pump\.md:1:1 {2}error {2}Not built: pump is not a linkwright package \(it holds calc\.xlsx\)/)
    // A file added to a package afterwards is not linkwright's either.
    rmSync(join(dir, 'pump'), { recursive: true })
    expect(run(['build', '.', '--out', '.', '--no-pdf'], dir).code).toBe(0)
    writeFileSync(join(dir, 'pump', 'review-notes.txt'), 'checker’s notes')
    // Unchanged, the package is left alone; rebuilt (--force), it is not replaced either.
    expect(run(['build', '.', '--out', '.', '--no-pdf'], dir).stdout).toMatch(/pump\.md: unchanged/)
    const again = run(['build', '.', '--out', '.', '--no-pdf', '--force'], dir)
    expect(again.code).toBe(1)
    expect(again.stderr).toMatch(/holds files linkwright did not write \(review-notes\.txt\)/)
    expect(readFileSync(join(dir, 'pump', 'review-notes.txt'), 'utf8')).toBe('checker’s notes')
  })

  it('should give two notes of the same name in different folders a package each', () => {
    const dir = folder('same-name')
    for (const sub of ['a', 'b']) {
      mkdirSync(join(dir, sub))
      writeFileSync(join(dir, sub, 'same.md'), NOTE.replace('T-9', `T-${sub}`))
    }
    const result = run(['build', 'a/same.md', 'b/same.md', '--out', 'out', '--no-pdf'], dir)
    noStack(result.stderr)
    expect(result.code).toBe(0)
    expect(JSON.parse(readFileSync(join(dir, 'out/a/same/results.json'), 'utf8')).document.number).toBe('T-a')
    expect(JSON.parse(readFileSync(join(dir, 'out/b/same/results.json'), 'utf8')).document.number).toBe('T-b')
  })
})

describe('odd files and folders', () => {
  it('should report a link loop and a dangling note link at their paths, and build the other notes', () => {
    const dir = folder('links')
    mkdirSync(join(dir, 'notes'))
    writeFileSync(join(dir, 'notes', 'good.md'), NOTE)
    symlinkSync('.', join(dir, 'notes', 'self'))
    symlinkSync('missing.md', join(dir, 'notes', 'gone.md'))
    const result = run(['build', 'notes', '--no-pdf'], dir)
    noStack(result.stderr)
    expect(result.code).toBe(1)
    expect(existsSync(join(dir, 'out', 'good', 'index.html'))).toBe(true)
    expect(result.stderr).toMatch(/^notes\/gone\.md:1:1 {2}error {2}Cannot read this note: it is a link to a file that does not exist {2}\[unreadable-note\]$/m)
    expect(result.stderr).toMatch(/^notes\/self:1:1 {2}warning {2}Cannot read this note: it leads back to a folder already searched/m)
    const check = run(['check', 'notes'], dir)
    noStack(check.stderr)
    expect(check.code).toBe(1)
    expect(check.stderr).toMatch(/notes\/gone\.md:1:1 {2}error/)
  })

  it('should refuse an --out that is a file (exit 2) or cannot be created (exit 4), touching nothing', () => {
    const dir = folder('out-file')
    writeFileSync(join(dir, 'a.md'), NOTE)
    writeFileSync(join(dir, 'out'), 'a file')
    const file = run(['build', 'a.md', '--out', 'out', '--no-pdf'], dir)
    noStack(file.stderr)
    expect([file.code, file.stderr]).toEqual([2, 'linkwright build: --out out is a file, not a folder; nothing was built\n'])
    expect(readFileSync(join(dir, 'out'), 'utf8')).toBe('a file')
    const below = run(['build', 'a.md', '--out', 'out/inside', '--no-pdf'], dir)
    expect(below.code).toBe(4)
    expect(below.stderr).toMatch(/^linkwright build: cannot create the output folder out\/inside \(ENOTDIR\); nothing was built$/m)
  })

  it.skipIf(!existsSync('/sys/kernel'))('should refuse an output folder on a read-only file system with exit 4', () => {
    const dir = folder('out-ro')
    writeFileSync(join(dir, 'a.md'), NOTE)
    const result = run(['build', 'a.md', '--out', '/sys/linkwright-test/out', '--no-pdf'], dir)
    noStack(result.stderr)
    expect(result.code).toBe(4)
    expect(result.stderr).toMatch(/cannot create the output folder \/sys\/linkwright-test\/out \(E[A-Z]+\); nothing was built/)
  })

  it('should build the other notes when one note takes gigabytes to format, with no staging left', () => {
    const dir = folder('format')
    writeFileSync(join(dir, 'a.md'), NOTE.replace('# Fault note', '# Fault note\n\nValue :value[format(1, 1e9)].'))
    writeFileSync(join(dir, 'b.md'), NOTE)
    const result = run(['build', '.', '--out', 'out', '--no-pdf'], dir)
    noStack(result.stderr)
    expect(result.code).toBe(1)
    expect(result.stderr).toMatch(/^a\.md:11:7 {2}error {2}Cannot print the value `format\(1, 1e9\)`/m)
    expect(existsSync(join(dir, 'out', 'b', 'index.html'))).toBe(true)
    expect(readdirSync(join(dir, 'out')).filter((n) => n.includes('.new-') || n.includes('.old-') || n.endsWith('.lock'))).toEqual([])
  })

  it('should wait for another build into the same folder: three at once give the bytes of one', async () => {
    const dir = folder('concurrent')
    mkdirSync(join(dir, 'notes'))
    for (const n of ['a', 'b', 'c', 'd']) writeFileSync(join(dir, 'notes', `${n}.md`), NOTE.replace('T-9', `T-${n}`))
    expect(run(['build', 'notes', '--out', 'serial', '--no-pdf'], dir).code).toBe(0)
    const one = () =>
      new Promise<{ code: number | null; stderr: string }>((done) => {
        const child = spawn(process.execPath, [bin, 'build', 'notes', '--out', 'shared', '--no-pdf'], { cwd: dir, env: { ...process.env, NO_COLOR: '1' } })
        let stderr = ''
        child.stderr.on('data', (d) => (stderr += d))
        child.on('close', (code) => done({ code, stderr }))
      })
    const results = await Promise.all([one(), one(), one()])
    for (const r of results) {
      noStack(r.stderr)
      expect(r.code).toBe(0)
    }
    expect(snapshot(join(dir, 'shared'))).toEqual(snapshot(join(dir, 'serial')))
  })
})

describe('killed at any moment', () => {
  it('should leave every package the old one or a complete new one after SIGKILL at seeded moments, and the next build tidies up', async () => {
    const dir = folder('kill-moments')
    mkdirSync(join(dir, 'notes'))
    for (let i = 1; i <= 6; i++) writeFileSync(join(dir, 'notes', `n${i}.md`), NOTE.replace('T-9', `T-${i}`))
    expect(run(['build', 'notes', '--no-pdf'], dir).code).toBe(0)
    const complete = (name: string) => [...snapshot(join(dir, 'out', name)).keys()].sort()
    const files = complete('n1')
    // Moments spread over a build (start-up, evaluation, writing), from a fixed seed.
    let seed = 20261203
    const moments = Array.from({ length: 6 }, () => {
      seed = (seed * 1103515245 + 12345) % 2 ** 31
      return 150 + (seed % 1800)
    })
    for (const [round, delay] of moments.entries()) {
      for (let i = 1; i <= 6; i++) writeFileSync(join(dir, 'notes', `n${i}.md`), NOTE.replace('T-9', `T-${i}`).replace('160 mm', `${161 + round} mm`))
      const child = spawn(process.execPath, [bin, 'build', 'notes', '--no-pdf'], { cwd: dir, env: { ...process.env, NO_COLOR: '1' } })
      const closed = new Promise((done) => child.on('close', done))
      await new Promise((r) => setTimeout(r, delay))
      child.kill('SIGKILL')
      await closed
      for (let i = 1; i <= 6; i++) {
        expect(complete(`n${i}`), `n${i} after a kill at ${delay} ms`).toEqual(files)
        JSON.parse(readFileSync(join(dir, 'out', `n${i}`, 'results.json'), 'utf8'))
      }
    }
    const next = run(['build', 'notes', '--no-pdf'], dir)
    expect(next.code, next.stderr).toBe(0)
    expect(readdirSync(join(dir, 'out')).filter((n) => n.startsWith('.') && n !== '.cache')).toEqual([])
    expect(JSON.parse(readFileSync(join(dir, 'out', 'n6', 'results.json'), 'utf8')).blocks[0].inputs.rod.si).toBeCloseTo((161 + moments.length - 1) / 1000, 12)
  })
})

describe('where the output goes', () => {
  for (const [where, out] of [
    ['inside the notes folder', 'notes/out'],
    ['equal to the notes folder', 'notes'],
    ['above the notes folder', '.'],
  ] as const) {
    it(`should build safely with --out ${where}, twice, and leave the notes as they were`, () => {
      const dir = folder('out-where')
      mkdirSync(join(dir, 'notes', 'sub'), { recursive: true })
      writeFileSync(join(dir, 'notes', 'a.md'), NOTE)
      writeFileSync(join(dir, 'notes', 'sub', 'b.md'), NOTE)
      const notesBefore = [...snapshot(join(dir, 'notes')).entries()]
      for (let round = 0; round < 2; round++) {
        const result = run(['build', 'notes', '--out', out, '--no-pdf'], dir)
        noStack(result.stderr)
        expect(result.code, result.stderr).toBe(0)
        // The second build finds the same two notes (unchanged): the packages are never taken for notes.
        expect(result.stdout).toMatch(round === 0 ? /^built 2, unchanged 0 of 2 notes$/m : /^built 0, unchanged 2 of 2 notes$/m)
      }
      expect(existsSync(join(dir, out, 'a', 'index.html'))).toBe(true)
      expect(existsSync(join(dir, out, 'sub', 'b', 'index.html'))).toBe(true)
      const notesAfter = snapshot(join(dir, 'notes'))
      for (const [name, bytes] of notesBefore) expect(notesAfter.get(name), name).toBe(bytes)
    })
  }

  it('should refuse a load file reached through a link that leaves the design repository', () => {
    const dir = folder('data-link')
    const outside = folder('data-outside')
    writeFileSync(join(outside, 'load.csv'), 'travel (mm), force (N)\n0, 10\n80, 10\n')
    mkdirSync(join(dir, 'repo'))
    symlinkSync(join(outside, 'load.csv'), join(dir, 'repo', 'load.csv'))
    const note = `${NOTE}\n\`\`\`forces #push\nof: drive\nload_file: load.csv\nslider_mass: 1 kg\n\`\`\`\n`
    writeFileSync(join(dir, 'repo', 'a.md'), note)
    const result = run(['build', 'repo', '--no-pdf'], dir)
    noStack(result.stderr)
    expect(result.code).toBe(1)
    const line = note.split('\n').findIndex((l) => l.startsWith('load_file')) + 1
    expect(result.stderr).toMatch(new RegExp(`^repo/a\\.md:${line}:12 {2}error {2}Cannot read the data file \`load\\.csv\`: it lies outside the design repository`, 'm'))
  })
})

describe.skipIf(browser === null)('faults while printing', () => {
  /** A notes folder of `count` notes, built once with PDFs. */
  function printed(name: string, count: number): string {
    const dir = folder(name)
    mkdirSync(join(dir, 'notes'))
    for (let i = 1; i <= count; i++) writeFileSync(join(dir, 'notes', `n${i}.md`), NOTE.replace('T-9', `T-${i}`))
    const temp = folder(`${name}-tmp`)
    const first = run(['build', 'notes'], dir, { TMPDIR: temp })
    expect(first.code, first.stderr).toBe(0)
    // A normal run leaves no temporary files, no staging and no lock.
    expect(readdirSync(temp)).toEqual([])
    expect(readdirSync(join(dir, 'out')).filter((n) => n.startsWith('.') && n !== '.cache')).toEqual([])
    return dir
  }

  it('should keep every previous package, PDF and all, when printing fails (a shell file-size limit)', () => {
    const dir = printed('fsize', 2)
    const before = snapshot(join(dir, 'out'))
    expect([...before.keys()].filter((k) => k.endsWith('.pdf'))).toEqual(['n1/n1.pdf', 'n2/n2.pdf'])
    // 400 KiB: the HTML (about 140 KB) is written; Chromium cannot write its print.
    const result = run(['build', 'notes', '--force'], dir, {}, 'ulimit -f 400')
    noStack(result.stderr)
    expect(result.code).toBe(1)
    expect(result.stderr).toMatch(/n1\.md:1:1 {2}error {2}Cannot print the PDF: .*; the previous package is as it was {2}\[pdf-print\]/)
    expect(snapshot(join(dir, 'out'))).toEqual(before)
  })

  it('should not replace a package that has a PDF by one without, when no browser starts', () => {
    const dir = printed('nobrowser', 1)
    const before = snapshot(join(dir, 'out'))
    writeFileSync(join(dir, 'notes', 'new.md'), NOTE)
    const result = run(['build', 'notes', '--browser', '/bin/false', '--force'], dir)
    noStack(result.stderr)
    expect(result.code).toBe(3)
    expect(result.stderr).toMatch(/n1\.md:1:1 {2}warning {2}Not replaced: the previous package in out\/n1 has a PDF/)
    // The kept package is byte for byte the old one; a note without a previous package gets its HTML.
    const after = snapshot(join(dir, 'out'))
    for (const [name, bytes] of before) if (name.startsWith('n1/')) expect(after.get(name), name).toBe(bytes)
    expect(existsSync(join(dir, 'out', 'new', 'index.html'))).toBe(true)
  })

  it('should bound the wait for a browser that hangs, and one that exits at once: exit 3 with the HTML built', () => {
    const dir = folder('hang')
    writeFileSync(join(dir, 'a.md'), NOTE)
    const marker = `${Math.floor(1000 + Math.random() * 8000)}.25`
    writeFileSync(join(dir, 'hang.sh'), `#!/bin/sh\nexec sleep ${marker}\n`)
    writeFileSync(join(dir, 'die.sh'), '#!/bin/sh\necho crashed >&2\nexit 1\n')
    chmodSync(join(dir, 'hang.sh'), 0o755)
    chmodSync(join(dir, 'die.sh'), 0o755)
    const started = Date.now()
    const hang = run(['build', 'a.md', '--out', 'out', '--browser', './hang.sh'], dir, { LINKWRIGHT_BROWSER_TIMEOUT: '2' })
    expect(Date.now() - started).toBeLessThan(60_000)
    noStack(hang.stderr)
    expect(hang.code).toBe(3)
    expect(hang.stderr).toMatch(/cannot start the browser at \.\/hang\.sh \(it did not start within 2 s\)/)
    expect(existsSync(join(dir, 'out', 'a', 'index.html'))).toBe(true)
    expect(spawnSync('pgrep', ['-f', `sleep ${marker}`]).status, 'the hanging browser is not left running').toBe(1)
    rmSync(join(dir, 'out'), { recursive: true })
    const die = run(['build', 'a.md', '--out', 'out', '--browser', './die.sh'], dir)
    noStack(die.stderr)
    expect(die.code).toBe(3)
    expect(die.stderr).toMatch(/cannot start the browser at \.\/die\.sh/)
    expect(existsSync(join(dir, 'out', 'a', 'index.html'))).toBe(true)
  })

  for (const signal of ['SIGTERM', 'SIGINT', 'SIGKILL'] as const) {
    it(`should leave every previous package whole and no browser running after ${signal} while printing`, async () => {
      const dir = printed(`signal-${signal}`, 4)
      const before = snapshot(join(dir, 'out'))
      for (let i = 1; i <= 4; i++) writeFileSync(join(dir, 'notes', `n${i}.md`), NOTE.replace('T-9', `T-${i}`).replace('160 mm', '170 mm'))
      const temp = folder(`signal-tmp-${signal}`)
      const child = spawn(process.execPath, [bin, 'build', 'notes'], { cwd: dir, env: { ...process.env, NO_COLOR: '1', TMPDIR: temp } })
      let stderr = ''
      child.stderr.on('data', (d) => (stderr += d))
      const closed = new Promise<number | null>((done) => child.on('close', (code) => done(code)))
      // Wait until the browser runs (its profile appears), then stop the build.
      for (let i = 0; i < 600 && !readdirSync(temp).some((n) => n.startsWith('linkwright-chromium-')); i++) await new Promise((r) => setTimeout(r, 50))
      expect(readdirSync(temp).some((n) => n.startsWith('linkwright-chromium-')), 'the browser started').toBe(true)
      child.kill(signal)
      const code = await closed
      // A caught signal kills the browser at once; after SIGKILL it ends when its pipe closes.
      const browsers = () => spawnSync('pgrep', ['-af', `user-data-dir=${temp}`], { encoding: 'utf8' })
      for (let i = 0; i < (signal === 'SIGKILL' ? 100 : 15) && browsers().status === 0; i++) await new Promise((r) => setTimeout(r, 100))
      const left = browsers()
      expect(left.status, `no browser left running: ${left.stdout.slice(0, 400)}`).toBe(1)
      if (signal !== 'SIGKILL') {
        expect(code).toBe(signal === 'SIGTERM' ? 143 : 130)
        noStack(stderr)
        expect(stderr).toMatch(new RegExp(`stopped by ${signal}`))
        expect(readdirSync(temp).filter((n) => n.startsWith('linkwright-')), 'no profile left').toEqual([])
      }
      // Whatever the moment, each package is the old one or a complete new one.
      const after = snapshot(join(dir, 'out'))
      for (let i = 1; i <= 4; i++) {
        const names = [...after.keys()].filter((k) => k.startsWith(`n${i}/`)).sort()
        expect(names, `package n${i} complete`).toEqual([...before.keys()].filter((k) => k.startsWith(`n${i}/`)).sort())
      }
      // The next build tidies what a killed run left and succeeds.
      const next = run(['build', 'notes'], dir, { TMPDIR: temp })
      expect(next.code, next.stderr).toBe(0)
      expect(readdirSync(temp).filter((n) => n.startsWith('linkwright-'))).toEqual([])
      expect(readdirSync(join(dir, 'out')).filter((n) => n.startsWith('.') && n !== '.cache')).toEqual([])
      expect(JSON.parse(readFileSync(join(dir, 'out', 'n1', 'results.json'), 'utf8')).blocks[0].inputs.rod.si).toBeCloseTo(0.17, 12)
    })
  }
})

describe('the package layout', () => {
  it('should keep the manifest of what it wrote in each package, and copy nothing else', () => {
    const dir = folder('manifest')
    writeFileSync(join(dir, 'a.md'), NOTE)
    expect(run(['build', 'a.md', '--out', 'out', '--no-pdf'], dir).code).toBe(0)
    const manifest = JSON.parse(readFileSync(join(dir, 'out', 'a', '.linkwright-package.json'), 'utf8'))
    expect(manifest.tool).toBe('linkwright')
    expect(manifest.files).toContain('index.html')
    expect(manifest.files).toContain('results.json')
    expect([...snapshot(join(dir, 'out', 'a')).keys()].filter((f) => f !== '.linkwright-package.json').sort()).toEqual([...manifest.files].sort())
  })
})
