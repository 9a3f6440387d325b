/**
 * `linkwright build`: every note found becomes a package folder
 *
 *     out/<note>/index.html        the calculation package
 *     out/<note>/<note>.pdf        printed by Chromium (unless --no-pdf)
 *     out/<note>/results.json      inputs, results and checks in SI and as shown
 *     out/<note>/charts/*.vl.json  the vega-lite spec of each chart
 *     out/<note>/tables/*.csv      each table block as CSV
 *     out/index.html               the package site: every package in out/, with a filter
 *     out/<note>/assets/…          styles and math fonts (nothing is fetched)
 *
 * Each package is written beside its folder, printed there, and then renamed
 * into place: a note with errors, or a build that stops half-way, leaves the
 * previous package whole. The other notes still build.
 */
import { existsSync, lstatSync, readFileSync, readdirSync } from 'node:fs'
import { basename, extname, join, relative } from 'node:path'
import type { VFile } from 'vfile'
import { messages, SOURCE, type RuleId } from '../notes/messages.js'
import { statusWords } from '../render/sections.js'
import { tallyChecks, tallyWords } from '../notes/tally.js'
import { COMMIT, TOOL } from '../version.js'
import { toolWithBuild } from './tool-build.js'
import { codeOf, discardOpenStages, findNotes, ForeignFolderError, foreignContent, makeFolder, planFolders, stageFolder, tidyOutput, type StagedFolder } from './files.js'
import { dataReader } from './data-files.js'
import { gitDate } from './git.js'
import { lockOutput, releaseHeldLocks } from './lock.js'
import { katexDist, templatePath } from './paths.js'
import { noteFile, pathProblemFile, report } from './reporter.js'
import { packageKey, unchanged, usesGitDate, type KeyInputs } from './incremental.js'
import { buildAll } from './pool.js'
import { restoreMessages, type BuildReply, type BuiltSummary } from './build-one.js'
import { progressLine } from './progress.js'
import { onStop } from './signals.js'
import { writeSite } from './site.js'

/** Options of the build command. */
export interface BuildOptions {
  readonly paths: readonly string[]
  readonly out: string
  readonly pdf: boolean
  readonly paper: 'A4' | 'Letter' | null
  readonly browser: string | null
  readonly quiet: boolean
  /** Rebuild every package, changed or not. */
  readonly force?: boolean
  /** Show in each package what moved since this git revision (rebuilds every package). */
  readonly since?: string | null
}

/** Exit codes of the build command. */
export const EXIT = { ok: 0, errors: 1, usage: 2, noBrowser: 3, output: 4 } as const

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

/** A built note waiting to be printed and put in place. */
interface Staged {
  readonly file: VFile
  readonly folder: string
  readonly staged: StagedFolder
  readonly model: BuiltSummary
  readonly date: string | null
  readonly stem: string
  /** What the package is built from, for its key (the PDF's presence is known only after printing). */
  readonly keyInputs: Omit<KeyInputs, 'dataFiles' | 'pdf'>
}

/** Report a problem of a note's file or package at 1:1 of the note (an error unless said). */
function fail(file: VFile, ruleId: RuleId, reason: string, fatal = true): void {
  file.message(reason, { place: { line: 1, column: 1 }, ruleId, source: SOURCE }).fatal = fatal
}

/** Make sure `out` is a folder this build can write; a message and an exit code when not. */
function prepareOutput(outDir: string): { code: number; text: string } | null {
  let stat = null
  try {
    stat = lstatSync(outDir)
  } catch {
    // not there yet
  }
  if (stat !== null && !stat.isDirectory()) return { code: EXIT.usage, text: `linkwright build: --out ${outDir} is a file, not a folder; nothing was built\n` }
  try {
    makeFolder(outDir)
  } catch (error) {
    return { code: EXIT.output, text: `linkwright build: cannot create the output folder ${outDir} (${codeOf(error)}); nothing was built\n` }
  }
  return null
}

/** Run the build command; returns the exit code. */
export async function buildCommand(options: BuildOptions, out: (text: string) => void, err: (text: string) => void): Promise<number> {
  const found = findNotes(options.paths, [options.out])
  for (const path of found.missing) err(`linkwright: cannot find ${path}\n`)
  const files: VFile[] = found.problems.map((p) => pathProblemFile(p, messages['unreadable-note'](p.reason), p.fatal !== false))
  const failed = found.missing.length > 0 || files.some((f) => f.messages.some((m) => m.fatal === true))
  if (found.notes.length === 0) {
    err(`linkwright: no notes (.md) found in ${options.paths.join(', ')}\n`)
    err(report(files, { quiet: options.quiet }))
    return found.missing.length > 0 ? EXIT.usage : EXIT.errors
  }
  const unusable = prepareOutput(options.out)
  if (unusable) {
    err(unusable.text)
    return unusable.code
  }
  let lock: Awaited<ReturnType<typeof lockOutput>>
  try {
    lock = await lockOutput(options.out, { waiting: (pid) => out(`waiting for the build running as process ${pid} to finish with ${options.out}/\n`) })
  } catch (error) {
    err(`linkwright build: cannot write into the output folder ${options.out} (${codeOf(error)}); nothing was built\n`)
    return EXIT.output
  }
  tidyOutput(options.out)
  const stopCleanup = onStop(() => {
    discardOpenStages()
    releaseHeldLocks()
  })
  try {
    return await buildLocked(options, found, files, failed, out, err)
  } finally {
    stopCleanup()
    lock.release()
  }
}

/** The build proper, with the output folder locked. */
async function buildLocked(
  options: BuildOptions,
  found: ReturnType<typeof findNotes>,
  files: VFile[],
  failedBefore: boolean,
  out: (text: string) => void,
  err: (text: string) => void,
): Promise<number> {
  let failed = failedBefore
  let built = 0
  let skipped = 0
  const shared = assets()
  const cacheFolder = join(options.out, '.cache', 'charts')
  const { folders, clashes } = planFolders(found.notes, options.out, found.base)
  const clashOf = new Map(clashes.map((c) => [c.path, c.reason]))
  const staged: Staged[] = []

  // 1. Read every note, and keep those that must be built (changed, or --force).
  const tool = toolWithBuild(TOOL)
  const pending: { file: VFile; path: string; folder: string; keyInputs: Staged['keyInputs'] }[] = []
  for (const path of found.notes) {
    const shown = relative(process.cwd(), path) || path
    const read = noteFile(path, shown)
    const file = read.file
    files.push(file)
    if (read.problem !== null) {
      fail(file, 'unreadable-note', messages['unreadable-note'](read.problem))
      failed = true
      continue
    }
    const folder = folders.get(path)
    if (folder === undefined) {
      fail(file, 'package-folder', messages['package-folder'](clashOf.get(path) ?? 'it has no package folder'))
      failed = true
      continue
    }
    const keyInputs = {
      noteText: String(file.value),
      notePath: shown,
      build: tool.build ?? '',
      version: tool.version,
      commit: COMMIT,
      paper: options.paper,
      gitDate: usesGitDate(String(file.value)) ? gitDate(path) : null,
    }
    if (!options.force && !options.since && unchanged(folder, { ...keyInputs, pdf: options.pdf }, dataReader(path))) {
      skipped++
      if (!options.quiet) out(`${shown}: unchanged, ${join(folder, 'index.html')}\n`)
      continue
    }
    pending.push({ file, path, folder, keyInputs })
  }

  // 2. Evaluate and render them, in worker threads up to the core count, and stage each
  //    beside its package folder as it comes (depends on 1). What is said of each note is
  //    kept in the notes' order, so the output does not depend on which thread was first.
  const progress = progressLine(pending.length, options.quiet)
  const said: string[] = new Array(pending.length).fill('')
  const stagedAt: (Staged | null)[] = new Array(pending.length).fill(null)
  const stage = (i: number, reply: BuildReply): void => {
    const { file, path, folder, keyInputs } = pending[i]!
    progress(String(file.path))
    restoreMessages(file, reply.messages)
    if (reply.error !== null) {
      // A bug, not a bad note: say so with the note's name and go on with the others.
      fail(file, 'internal-error', messages['internal-error'](reply.error))
      failed = true
      return
    }
    if (!reply.ok || reply.html === null || reply.summary === null) {
      failed = true
      said[i] = `${file.path}: not built (errors below); the previous package in ${folder} is unchanged\n`
      return
    }
    // Checked before printing, and again when the package is put in place.
    const foreign = foreignContent(folder)
    if (foreign !== null) {
      fail(file, 'package-folder', messages['package-folder'](`${foreign}, so the package is not written there; move those files or build into another --out`))
      failed = true
      return
    }
    const content = new Map(shared)
    content.set('index.html', reply.html)
    content.set('results.json', `${JSON.stringify(reply.results, null, 2)}\n`)
    for (const [name, text] of reply.files) content.set(name, text)
    try {
      stagedAt[i] = { file, folder, staged: stageFolder(folder, content), model: reply.summary, date: reply.date, stem: basename(path, extname(path)), keyInputs }
    } catch (error) {
      fail(file, 'package-write', messages['package-write'](folder, codeOf(error)))
      failed = true
    }
  }
  await buildAll(
    pending.map((p) => ({ path: p.path, shown: String(p.file.path), text: String(p.file.value), cacheFolder, since: options.since ?? null })),
    stage,
  )
  progress(null)
  if (!options.quiet) out(said.join(''))
  for (const item of stagedAt) if (item) staged.push(item)

  // 2. Print the staged packages with one browser (depends on 1).
  let noBrowser = false
  const printed = new Map<Staged, number>()
  const unprinted = new Set<Staged>()
  try {
    if (options.pdf && staged.length > 0) {
      const { findBrowser, INSTALL_HINT, killBrowsers } = await import('../pdf/browser.js')
      const browser = findBrowser(options.browser)
      if (browser === null) {
        noBrowser = true
        err(`linkwright: ${options.browser ? `cannot run the browser at ${options.browser}. ` : ''}${INSTALL_HINT}\n`)
      } else {
        const { printPackages } = await import('../pdf/print.js')
        const stopBrowser = onStop(killBrowsers)
        let results: Awaited<ReturnType<typeof printPackages>> | undefined
        try {
          results = await printPackages(staged.map((s) => printJob(s, options.paper)), browser)
        } catch (error) {
          noBrowser = true
          const reason = (error instanceof Error ? error.message : String(error)).split('\n')[0]
          err(`linkwright: cannot start the browser at ${browser} (${reason}), so no PDF was printed; the HTML packages are built where no previous PDF would be lost. \`--browser\` names another; \`--no-pdf\` skips printing.\n`)
        } finally {
          stopBrowser()
        }
        results?.forEach((result, i) => {
          const item = staged[i]!
          for (const url of result.blocked) {
            item.file.message(`Blocked a request for \`${url}\` while printing: the package loads nothing from outside its folder`, {
              place: { line: 1, column: 1 },
              ruleId: 'remote-resource',
              source: SOURCE,
            })
          }
          if (result.ok) printed.set(item, result.pages)
          else {
            failed = true
            unprinted.add(item)
            fail(item.file, 'pdf-print', messages['pdf-print'](result.error ?? 'unknown reason'))
          }
        })
      }
    }
    // 3. Put in place every package that is complete: one whose PDF was asked for
    //    and failed is dropped, and one without its PDF never replaces one with it.
    for (const item of staged) {
      if (unprinted.has(item)) continue
      if (options.pdf && !printed.has(item) && existsSync(join(item.folder, `${item.stem}.pdf`))) {
        fail(item.file, 'pdf-kept', messages['pdf-kept'](item.folder), false)
        continue
      }
      try {
        const dataFiles = item.model.dataFiles.map((f) => ({ path: f.path, sha256: f.sha256 }))
        item.staged.commit({ key: packageKey({ ...item.keyInputs, dataFiles, pdf: printed.has(item) }), dataFiles })
        built++
      } catch (error) {
        failed = true
        if (error instanceof ForeignFolderError) fail(item.file, 'package-folder', messages['package-folder'](`${error.message}, so the package is not written there`))
        else fail(item.file, 'package-write', messages['package-write'](item.folder, codeOf(error)))
        continue
      }
      if (options.quiet) continue
      const checks = item.model.checks.length > 0 ? ` (${tallyWords(tallyChecks(item.model.checks))})` : ''
      const pdf = printed.has(item) ? `, ${join(item.folder, `${item.stem}.pdf`)} (${printed.get(item)} pages)` : ''
      out(`${item.file.path}: ${join(item.folder, 'index.html')}${pdf}${checks}\n`)
    }
  } finally {
    // Anything not committed (dropped above, or an exception) goes; the old packages stay.
    for (const item of staged) {
      try {
        item.staged.discard()
      } catch {
        // already committed or gone
      }
    }
  }
  // The package site: every package in the output folder, built now or before.
  try {
    const refused = writeSite(options.out)
    if (refused) err(`linkwright: ${refused}\n`)
    else if (!options.quiet) out(`index of the packages: ${join(options.out, 'index.html')}\n`)
  } catch (error) {
    err(`linkwright: cannot write the package index in ${options.out} (${codeOf(error)})\n`)
  }
  const notBuilt = found.notes.length - built - skipped
  if (!options.quiet) out(`built ${built}, unchanged ${skipped}${notBuilt > 0 ? `, not built ${notBuilt}` : ''} of ${found.notes.length} note${found.notes.length === 1 ? '' : 's'}\n`)
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
