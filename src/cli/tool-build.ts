/**
 * The tool's build as run: one sha-256 over the bundle's code (dist/, without
 * the benchmarks) and the templates, so the fingerprint changes when the core
 * or the templates change even if the version does not. Run from source (no
 * bundle), the source files stand in for it. The source revision's name,
 * written into the bundle, is left out (it is shown apart).
 */
import { createHash } from 'node:crypto'
import { existsSync, readFileSync, readdirSync } from 'node:fs'
import { join, relative } from 'node:path'
import type { Tool } from '../notes/note.js'
import { COMMIT } from '../version.js'
import { packageRoot } from './paths.js'

function files(dir: string, keep: (path: string) => boolean): string[] {
  if (!existsSync(dir)) return []
  const out: string[] = []
  const walk = (d: string) => {
    for (const entry of readdirSync(d, { withFileTypes: true })) {
      const full = join(d, entry.name)
      if (entry.isDirectory()) walk(full)
      else if (keep(full)) out.push(full)
    }
  }
  walk(dir)
  return out.sort()
}

let digest: string | null = null

/** sha-256 (hex) of the code and templates this process runs. */
export function buildDigest(): string {
  if (digest) return digest
  const root = packageRoot()
  const code = existsSync(join(root, 'dist', 'cli.js'))
    ? files(join(root, 'dist'), (p) => p.endsWith('.js') && !p.endsWith(`${join('dist', 'bench.js')}`))
    : files(join(root, 'src'), (p) => p.endsWith('.ts'))
  const hash = createHash('sha256')
  // The source revision's name is written into the bundle; it is shown apart, so a commit
  // that changes no code (a README edit) leaves the build, and the fingerprints, as they were.
  const label = JSON.stringify(COMMIT)
  for (const path of [...code, ...files(join(root, 'templates'), () => true)]) {
    const bytes = readFileSync(path)
    const content = path.endsWith('.js') ? Buffer.from(bytes.toString('utf8').split(label).join('""')) : bytes
    hash.update(relative(root, path)).update('\0').update(content).update('\0')
  }
  digest = hash.digest('hex')
  return digest
}

/** The tool with its build. */
export function toolWithBuild(tool: Tool): Tool {
  return { ...tool, build: buildDigest() }
}
