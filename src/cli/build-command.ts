/**
 * `linkwright build`: every note found becomes a package folder
 *
 *     out/<note>/index.html        the calculation package
 *     out/<note>/<note>.pdf        printed by Chromium (unless --no-pdf)
 *     out/<note>/results.json      inputs, results and checks in SI and as shown
 *     out/<note>/charts/*.vl.json  the vega-lite spec of each chart
 *     out/<note>/assets/…          styles and math fonts (nothing is fetched)
 *
 * Each package is written beside its folder, printed there, and then renamed
 * into place: a note with errors, or a build that stops half-way, leaves the
 * previous package whole. The other notes still build.
 */
import { readFileSync, readdirSync } from 'node:fs'
import { basename, extname, join, relative } from 'node:path'
import { VFile } from 'vfile'
import type { NoteModel } from '../notes/note.js'
import type { ChartCache } from '../render/chart-svg.js'
import { statusWords } from '../render/sections.js'
import { tallyChecks, tallyWords } from '../notes/tally.js'
import { COMMIT, TOOL } from '../version.js'
import { findNotes, packageFolder, stageFolder, writeFileAtomic, type StagedFolder } from './files.js'
import { dataReader } from './data-files.js'
import { gitDate } from './git.js'
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

/** Exit codes of the build command. */
export const EXIT = { ok: 0, errors: 1, usage: 2, noBrowser: 3 } as const

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

/** A built note waiting to be printed and put in place. */
interface Staged {
  readonly file: VFile
  readonly folder: string
  readonly staged: StagedFolder
  readonly model: NoteModel
  readonly date: string | null
  readonly stem: string
}

/** Run the build command; returns the exit code. */
export async function buildCommand(options: BuildOptions, out: (text: string) => void, err: (text: string) => void): Promise<number> {
  const { notes, missing, baseOf } = findNotes(options.paths)
  for (const path of missing) err(`linkwright: cannot find ${path}\n`)
  if (notes.length === 0) {
    err(`linkwright: no notes (.md) found in ${options.paths.join(', ')}\n`)
    return missing.length > 0 ? EXIT.usage : EXIT.errors
  }
  // The renderer is loaded only by commands that render.
  const { buildNote } = await import('../build.js')
  const template = readFileSync(templatePath('package.html'), 'utf8')
  const shared = assets()
  const cache = diskCache(join(options.out, '.cache', 'charts'))
  const files: VFile[] = []
  const staged: Staged[] = []
  let failed = missing.length > 0

  // 1. Build every note into a staged folder.
  for (const path of notes) {
    const shown = relative(process.cwd(), path) || path
    const file = new VFile({ path: shown, value: readFileSync(path, 'utf8') })
    files.push(file)
    const folder = packageFolder(options.out, path, baseOf.get(path) ?? '.')
    try {
      const built = await buildNote(file, { tool: TOOL, notePath: shown, template, commit: COMMIT, gitDate: () => gitDate(path), readData: dataReader(path), chartCache: cache })
      if (!built.ok || built.html === null) {
        failed = true
        if (!options.quiet) out(`${shown}: not built (errors below); the previous package in ${folder} is unchanged\n`)
        continue
      }
      const content = new Map(shared)
      content.set('index.html', built.html)
      content.set('results.json', `${JSON.stringify(built.results, null, 2)}\n`)
      for (const [name, text] of built.files) content.set(name, text)
      staged.push({ file, folder, staged: stageFolder(folder, content), model: built.model, date: built.date, stem: basename(path, extname(path)) })
    } catch (error) {
      // A bug, not a bad note: say so with the note's name and go on with the others.
      file.message(`Cannot build this note: internal error: ${error instanceof Error ? error.message : String(error)}`, {
        place: { line: 1, column: 1 },
        ruleId: 'internal-error',
        source: 'linkwright',
      }).fatal = true
      failed = true
    }
  }

  // 2. Print the staged packages with one browser (depends on 1).
  let noBrowser = false
  const printed = new Map<Staged, number>()
  try {
    if (options.pdf && staged.length > 0) {
      const { findBrowser, INSTALL_HINT } = await import('../pdf/browser.js')
      const browser = findBrowser(options.browser)
      if (browser === null) {
        noBrowser = true
        err(`linkwright: ${options.browser ? `cannot run the browser at ${options.browser}. ` : ''}${INSTALL_HINT}\n`)
      } else {
        const { printPackages } = await import('../pdf/print.js')
        const results = await printPackages(staged.map((s) => printJob(s, options.paper)), browser)
        results.forEach((result, i) => {
          const item = staged[i]!
          for (const url of result.blocked) {
            item.file.message(`Blocked a request for \`${url}\` while printing: the package loads nothing from outside its folder`, {
              place: { line: 1, column: 1 },
              ruleId: 'remote-resource',
              source: 'linkwright',
            })
          }
          if (result.ok) printed.set(item, result.pages)
          else {
            failed = true
            item.file.message(`Cannot print the PDF: ${result.error}`, { place: { line: 1, column: 1 }, ruleId: 'pdf-print', source: 'linkwright' }).fatal = true
          }
        })
      }
    }
    // 3. Put every package in place.
    for (const item of staged) {
      item.staged.commit()
      if (options.quiet) continue
      const checks = item.model.checks.length > 0 ? ` (${tallyWords(tallyChecks(item.model.checks))})` : ''
      const pdf = printed.has(item) ? `, ${join(item.folder, `${item.stem}.pdf`)} (${printed.get(item)} pages)` : ''
      out(`${item.file.path}: ${join(item.folder, 'index.html')}${pdf}${checks}\n`)
    }
  } finally {
    // Anything not committed (an exception above) is dropped; the old packages stay.
    for (const item of staged) {
      try {
        item.staged.discard()
      } catch {
        // already committed or gone
      }
    }
  }
  err(report(files, { quiet: options.quiet }))
  if (failed) return EXIT.errors
  return noBrowser ? EXIT.noBrowser : EXIT.ok
}

function printJob(item: Staged, paper: 'A4' | 'Letter' | null) {
  const { meta } = item.model
  const people = (['prepared', 'checked', 'approved'] as const).flatMap((role) => (meta.people[role] ? [`${role} by ${meta.people[role]!.name}`] : []))
  const dates = [item.date, ...meta.revisions.map((r) => r.date)].filter((d): d is string => !!d && /^\d{4}-\d{2}-\d{2}$/.test(d)).sort()
  return {
    html: join(item.staged.path, 'index.html'),
    pdf: join(item.staged.path, `${item.stem}.pdf`),
    folder: item.staged.path,
    paper: paper ?? meta.paper,
    title: meta.title,
    number: meta.number,
    revision: meta.revision,
    status: statusWords(meta.status),
    fingerprint: item.model.fingerprint,
    author: people.join('; ') || 'not stated',
    // The note's date; failing that its latest revision; never the clock.
    date: item.date ?? dates[dates.length - 1] ?? '1970-01-01',
    tool: `${TOOL.name} ${TOOL.version}`,
  }
}
