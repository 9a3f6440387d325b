/**
 * Git holds the project's own sources and the lock file only: no downloaded
 * wheels, binaries or build output.
 */
import { execFileSync } from 'node:child_process'
import { readFileSync, readdirSync, statSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'

const root = join(import.meta.dirname, '..', '..')
const LIMIT = 1024 * 1024

describe('the repository', () => {
  it('should track no file over 1 MB', () => {
    const tracked = execFileSync('git', ['ls-files', '-z'], { cwd: root, encoding: 'utf8' }).split('\0').filter(Boolean)
    expect(tracked.length).toBeGreaterThan(20)
    const large = tracked.filter((path) => {
      try {
        return statSync(join(root, path)).size > LIMIT
      } catch {
        return false
      }
    })
    expect(large).toEqual([])
  })

  it('should track no built or downloaded artefacts', () => {
    const tracked = execFileSync('git', ['ls-files'], { cwd: root, encoding: 'utf8' }).split('\n').filter(Boolean)
    const artefacts = tracked.filter((p) => /^(dist|out|node_modules|test-artifacts)\//.test(p) || /\.(whl|tgz|zip|so|dll|exe|pdf)$/i.test(p))
    expect(artefacts).toEqual([])
  })

  it('should declare every package it imports, the ones the tool runs with as dependencies, and no more', () => {
    const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { dependencies: Record<string, string>; devDependencies: Record<string, string> }
    const files = (dir: string): string[] =>
      readdirSync(join(root, dir), { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? files(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : []))
    const packageOf = (spec: string) => (spec.startsWith('@') ? spec.split('/').slice(0, 2).join('/') : spec.split('/')[0]!)
    const imported = (dir: string, typesToo: boolean) => {
      const names = new Set<string>()
      for (const file of files(dir)) {
        const text = readFileSync(join(root, file), 'utf8')
        for (const m of text.matchAll(/^import (type )?[^'"]*?from '([^'.][^']*)'|import\('([^'.][^']*)'\)(?!\.)|require\('([^'.][^']*)'\)|resolve\('([^'.][^']*)'\)|\)\('([^'.][^']*)'\)/gm)) {
          if (m[1] && !typesToo) continue
          const spec = m[2] ?? m[3] ?? m[4] ?? m[5] ?? m[6]!
          if (!spec.startsWith('node:')) names.add(packageOf(spec))
        }
      }
      return names
    }
    const runtime = imported('src', false)
    const all = new Set([...imported('src', true), ...imported('test', true), ...imported('bench', true)])
    const declared = new Set([...Object.keys(manifest.dependencies), ...Object.keys(manifest.devDependencies)])
    // Types of hast, mdast and unist are imported by their bare names.
    const typeName = (n: string) => (declared.has(n) ? n : `@types/${n}`)
    expect([...all].map(typeName).filter((n) => !declared.has(n)), 'imported, not declared').toEqual([])
    expect([...runtime].filter((n) => !(n in manifest.dependencies)), 'run by the tool, not in dependencies').toEqual([])
    // Tools used from the command line or config, not imported.
    const used = new Set([...all].map(typeName).concat(['@biomejs/biome', 'typescript', 'vite', '@types/node', 'vega', 'vega-lite']))
    expect([...declared].filter((n) => !used.has(n)), 'declared, never used').toEqual([])
  })
})
