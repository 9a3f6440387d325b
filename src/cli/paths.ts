/**
 * Where the tool's own files are: the package root (found from this module,
 * bundled or not), its templates, and the KaTeX styles and fonts.
 */
import { existsSync, readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

let root: string | null = null

/** The folder holding linkwright's package.json. */
export function packageRoot(): string {
  if (root) return root
  let dir = dirname(fileURLToPath(import.meta.url))
  for (;;) {
    const manifest = join(dir, 'package.json')
    if (existsSync(manifest) && (JSON.parse(readFileSync(manifest, 'utf8')) as { name?: string }).name === 'linkwright') break
    const parent = dirname(dir)
    if (parent === dir) throw new Error('Cannot find linkwright’s package.json above its own code')
    dir = parent
  }
  root = dir
  return dir
}

/** A file under templates/. */
export function templatePath(name: string): string {
  return join(packageRoot(), 'templates', name)
}

/** The folder of KaTeX's distributed CSS and fonts. */
export function katexDist(): string {
  const require = createRequire(join(packageRoot(), 'package.json'))
  return dirname(require.resolve('katex/dist/katex.min.css'))
}
