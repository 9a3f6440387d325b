/**
 * Package folders are replaced whole or not at all, and what an interrupted run
 * leaves behind is tidied without losing the last good package.
 */
import { spawnSync } from 'node:child_process'
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { recoverFolder, stageFolder, tidyOutput, writeFolder } from '../../src/cli/files.js'

describe('package folders', () => {
  it('should leave the old package untouched until commit, and drop the fresh one on discard', () => {
    const out = mkdtempSync(join(tmpdir(), 'linkwright-files-'))
    const target = join(out, 'pkg')
    writeFolder(target, new Map([['index.html', 'old']]))
    const staged = stageFolder(target, new Map([['index.html', 'new']]))
    expect(readFileSync(join(target, 'index.html'), 'utf8')).toBe('old')
    staged.discard()
    expect(readFileSync(join(target, 'index.html'), 'utf8')).toBe('old')
    expect(readdirSync(out)).toEqual(['pkg'])
    stageFolder(target, new Map([['index.html', 'new']])).commit()
    expect(readFileSync(join(target, 'index.html'), 'utf8')).toBe('new')
    expect(readdirSync(out)).toEqual(['pkg'])
  })

  it('should put back a package moved aside by an interrupted run, and drop unfinished ones', () => {
    const out = mkdtempSync(join(tmpdir(), 'linkwright-recover-'))
    // The id of a process that has ended: what a killed build leaves.
    const dead = spawnSync('true').pid
    mkdirSync(join(out, `.pkg.old-${dead}-1`))
    writeFileSync(join(out, `.pkg.old-${dead}-1`, 'index.html'), 'last good')
    mkdirSync(join(out, `.pkg.new-${dead}-2`))
    recoverFolder(join(out, 'pkg'))
    expect(readFileSync(join(out, 'pkg', 'index.html'), 'utf8')).toBe('last good')
    expect(existsSync(join(out, `.pkg.new-${dead}-2`))).toBe(false)
    expect(readdirSync(out)).toEqual(['pkg'])
  })

  it('should tidy a whole output folder of what killed builds left, for notes built or not', () => {
    const out = mkdtempSync(join(tmpdir(), 'linkwright-tidy-'))
    const dead = spawnSync('true').pid
    mkdirSync(join(out, 'sub', `.gone.new-${dead}-1`), { recursive: true })
    mkdirSync(join(out, 'sub', `.kept.old-${dead}-2`))
    writeFileSync(join(out, 'sub', `.kept.old-${dead}-2`, 'index.html'), 'last good')
    mkdirSync(join(out, '.cache', 'charts'), { recursive: true })
    writeFileSync(join(out, '.cache', 'charts', `abc.svg.new-${dead}-3`), '<svg')
    writeFileSync(join(out, '.cache', 'charts', 'abc.svg'), '<svg/>')
    tidyOutput(out)
    expect(readdirSync(join(out, 'sub'))).toEqual(['kept'])
    expect(readFileSync(join(out, 'sub', 'kept', 'index.html'), 'utf8')).toBe('last good')
    expect(readdirSync(join(out, '.cache', 'charts'))).toEqual(['abc.svg'])
  })

  it('should leave alone what a build that still runs is writing', () => {
    const out = mkdtempSync(join(tmpdir(), 'linkwright-live-'))
    mkdirSync(join(out, `.pkg.new-${process.ppid}-7`))
    recoverFolder(join(out, 'pkg'))
    expect(readdirSync(out)).toEqual([`.pkg.new-${process.ppid}-7`])
  })

  it('should refuse to commit over a folder holding files it did not write, and keep them', () => {
    const out = mkdtempSync(join(tmpdir(), 'linkwright-foreign-'))
    const target = join(out, 'pkg')
    writeFolder(target, new Map([['index.html', 'old']]))
    writeFileSync(join(target, 'notes.txt'), 'mine')
    expect(() => stageFolder(target, new Map([['index.html', 'new']])).commit()).toThrowError(/holds files linkwright did not write \(notes\.txt\)/)
    expect(readFileSync(join(target, 'notes.txt'), 'utf8')).toBe('mine')
    expect(readFileSync(join(target, 'index.html'), 'utf8')).toBe('old')
    expect(readdirSync(out)).toEqual(['pkg'])
  })
})
