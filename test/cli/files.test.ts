/**
 * Package folders are replaced whole or not at all, and what an interrupted run
 * leaves behind is tidied without losing the last good package.
 */
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { recoverFolder, stageFolder, writeFolder } from '../../src/cli/files.js'

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
    mkdirSync(join(out, '.pkg.old-123-1'))
    writeFileSync(join(out, '.pkg.old-123-1', 'index.html'), 'last good')
    mkdirSync(join(out, '.pkg.new-123-2'))
    recoverFolder(join(out, 'pkg'))
    expect(readFileSync(join(out, 'pkg', 'index.html'), 'utf8')).toBe('last good')
    expect(existsSync(join(out, '.pkg.new-123-2'))).toBe(false)
    expect(readdirSync(out)).toEqual(['pkg'])
  })
})
