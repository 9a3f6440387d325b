/**
 * `linkwright build`: every note found becomes a package folder
 *
 *     out/<note>/index.html      the calculation package
 *     out/<note>/<note>.pdf      printed by Chromium (unless --no-pdf)
 *     out/<note>/results.json    inputs, results and checks in SI and as shown
 *     out/<note>/charts/*.vl.json  the vega-lite spec of each chart
 *     out/<note>/assets/…        styles and math fonts (nothing is fetched)
 *
 * A note with errors keeps its previous package untouched; the other notes
 * still build.
 */
import { execFileSync } from 'node:child_process'
import { readFileSync, readdirSync } from 'node:fs'
import { basename, dirname, join, relative } from 'node:path'
import { VFile } from 'vfile'
import { COMMIT, TOOL } from '../version.js'
import type { ChartCache } from '../render/chart-svg.js'
import { findNotes, packageFolder, writeFileAtomic, writeFolder } from './files.js'
import { katexDist, templatePath } from './paths.js'
import { report } from './reporter.js'

/** Options of the build command. */
export interface BuildOptions {
  readonly paths: readonly string[]
  readonly out: string
  readonly pdf: boolean
  readonly paper: 'A4' | 'Letter' | null
  readonly browser: string | null
  readonly quiet: boolean
}

/** Files every package carries, read once per run. */
function assets(): Map<string, Uint8Array | string> {
  const files = new Map<string, Uint8Array | string>()
  files.set('assets/package.css', readFileSync(templatePath('package.css'), 'utf8'))
  const dist = katexDist()
  files.set('assets/katex/katex.min.css', readFileSync(join(dist, 'katex.min.css'), 'utf8'))
  for (const font of readdirSync(join(dist, 'fonts')).sort()) {
    if (font.endsWith('.woff2')) files.set(`assets/katex/fonts/${font}`, readFileSync(join(dist, 'fonts', font)))
  }
  return files
}

/** Rendered charts kept on disk by content key, so an unchanged chart is not rendered again. */
function diskCache(folder: string): ChartCache {
  return {
    get(key) {
      try {
        return readFileSync(join(folder, `${key}.svg`), 'utf8')
      } catch {
        return undefined
      }
    },
    set(key, svg) {
      try {
        writeFileAtomic(join(folder, `${key}.svg`), svg)
      } catch {
        // A cache that cannot be written only costs time.
      }
    },
  }
}

/** Date of the note's last commit (YYYY-MM-DD), or null. */
function gitDate(path: string): string | null {
  try {
    const date = execFileSync('git', ['log', '-1', '--format=%cs', '--', basename(path)], {
      cwd: dirname(path),
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'ignore'],
    }).trim()
    return /^\d{4}-\d{2}-\d{2}$/.test(date) ? date : null
  } catch {
    return null
  }
}

/** Run the build command; returns the exit code. */
export async function buildCommand(options: BuildOptions, out: (text: string) => void, err: (text: string) => void): Promise<number> {
  const { notes, missing } = findNotes(options.paths)
  for (const path of missing) err(`linkwright: cannot find ${path}\n`)
  if (notes.length === 0) {
    err(`linkwright: no notes (.md) found in ${options.paths.join(', ')}\n`)
    return missing.length > 0 ? 2 : 1
  }
  // The renderer is loaded only by commands that render.
  const { buildNote } = await import('../build.js')
  const template = readFileSync(templatePath('package.html'), 'utf8')
  const shared = assets()
  const cache = diskCache(join(options.out, '.cache', 'charts'))
  const base = options.paths.length === 1 && !options.paths[0]!.endsWith('.md') ? options.paths[0]! : '.'
  const files: VFile[] = []
  let failed = missing.length > 0
  for (const path of notes) {
    const shown = relative(process.cwd(), path) || path
    const file = new VFile({ path: shown, value: readFileSync(path, 'utf8') })
    files.push(file)
    let built
    try {
      built = await buildNote(file, { tool: TOOL, notePath: shown, template, commit: COMMIT, gitDate: () => gitDate(path), chartCache: cache })
    } catch (error) {
      // A bug, not a bad note: say so with the note's name and go on with the others.
      file.message(`Cannot build this note: internal error: ${error instanceof Error ? error.message : String(error)}`, {
        place: { line: 1, column: 1 },
        ruleId: 'internal-error',
        source: 'linkwright',
      }).fatal = true
      failed = true
      continue
    }
    const folder = packageFolder(options.out, path, base)
    if (!built.ok || built.html === null) {
      failed = true
      if (!options.quiet) out(`${shown}: not built (errors below); the previous package in ${folder} is unchanged\n`)
      continue
    }
    const content = new Map(shared)
    content.set('index.html', built.html)
    content.set('results.json', `${JSON.stringify(built.results, null, 2)}\n`)
    for (const [name, text] of built.files) content.set(name, text)
    writeFolder(folder, content)
    const fails = built.model.checks.filter((c) => !c.passed).length
    if (!options.quiet) {
      out(`${shown}: ${join(folder, 'index.html')}${built.model.checks.length > 0 ? ` (${built.model.checks.length - fails} of ${built.model.checks.length} checks pass)` : ''}\n`)
    }
  }
  err(report(files, { quiet: options.quiet }))
  return failed ? 1 : 0
}
