/**
 * One note evaluated and rendered, as plain data that can cross a thread:
 * the package's files, the messages with their places, and what the rest of
 * the build needs of the model (checks, identification, data files,
 * fingerprint). The same function runs in process and in a worker.
 */
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { VFile } from 'vfile'
import type { CheckOutcome, DataFile } from '../notes/block-kinds/kind.js'
import type { NoteMeta } from '../notes/types.js'
import type { ChartCache } from '../render/chart-svg.js'
import { messages, SOURCE } from '../notes/messages.js'
import type { ChangesSince } from '../render/package.js'
import { COMMIT, TOOL } from '../version.js'
import { dataReader } from './data-files.js'
import { writeFileAtomic } from './files.js'
import { gitDate } from './git.js'
import { templatePath } from './paths.js'
import { toolWithBuild } from './tool-build.js'

/** A note to build. */
export interface BuildJob {
  readonly path: string
  /** The note's path as shown in the package and the messages. */
  readonly shown: string
  readonly text: string
  /** Where rendered charts are cached. */
  readonly cacheFolder: string
  /** A git revision to show the changes since, or null. */
  readonly since: string | null
}

/** A message as plain data. */
export interface PlainMessage {
  readonly reason: string
  readonly place: { start: { line: number; column: number }; end?: { line: number; column: number } } | null
  readonly ruleId: string | null
  readonly source: string | null
  readonly fatal: boolean | null | undefined
}

/** What the rest of the build needs of the model. */
export interface BuiltSummary {
  readonly checks: readonly CheckOutcome[]
  readonly meta: NoteMeta
  readonly dataFiles: readonly DataFile[]
  readonly fingerprint: string
}

/** A built note as plain data. */
export interface BuildReply {
  readonly ok: boolean
  readonly html: string | null
  readonly results: unknown
  readonly files: readonly (readonly [string, string])[]
  readonly messages: readonly PlainMessage[]
  readonly summary: BuiltSummary | null
  readonly date: string | null
  /** A bug met while building (not a bad note), or null. */
  readonly error: string | null
}

/** Rendered charts kept on disk by content key, so an unchanged chart is not rendered again. */
export function diskCache(folder: string): ChartCache {
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

let template: string | null = null

function plain(file: VFile): PlainMessage[] {
  return file.messages.map((m) => ({
    reason: m.reason,
    place: m.place ? ('start' in m.place ? { start: { line: m.place.start.line, column: m.place.start.column }, end: { line: m.place.end.line, column: m.place.end.column } } : { start: { line: m.place.line, column: m.place.column } }) : null,
    ruleId: m.ruleId ?? null,
    source: m.source ?? null,
    fatal: m.fatal,
  }))
}

/** Build one note; never throws. */
export async function buildOne(job: BuildJob): Promise<BuildReply> {
  const file = new VFile({ path: job.shown, value: job.text })
  try {
    const { buildNote } = await import('../build.js')
    template ??= readFileSync(templatePath('package.html'), 'utf8')
    let changes: ChangesSince | null = null
    if (job.since !== null) {
      const { resultsAt } = await import('./compare-command.js')
      const { diffResults } = await import('./results-diff.js')
      const [then, now] = [resultsAt(job.path, job.since), resultsAt(job.path, undefined)]
      if (typeof then === 'string' || typeof now === 'string') {
        file.message(messages['revision-compare'](job.since, typeof then === 'string' ? then : String(now)), { place: { line: 1, column: 1 }, ruleId: 'revision-compare', source: SOURCE }).fatal = false
      } else {
        changes = { revision: then.label, rows: diffResults(then.doc, now.doc).changes.filter((c) => c.what !== 'tool') }
      }
    }
    const built = await buildNote(file, {
      changes,
      tool: toolWithBuild(TOOL),
      notePath: job.shown,
      template,
      commit: COMMIT,
      gitDate: () => gitDate(job.path),
      readData: dataReader(job.path),
      chartCache: diskCache(job.cacheFolder),
    })
    const { model } = built
    return {
      ok: built.ok && built.html !== null,
      html: built.html,
      results: built.results,
      files: [...built.files],
      messages: plain(file),
      summary: { checks: model.checks, meta: model.meta, dataFiles: model.dataFiles, fingerprint: model.fingerprint },
      date: built.date,
      error: null,
    }
  } catch (error) {
    return { ok: false, html: null, results: null, files: [], messages: plain(file), summary: null, date: null, error: error instanceof Error ? error.message : String(error) }
  }
}

/** Put a reply's messages on the note's file in the main thread. */
export function restoreMessages(file: VFile, messages: readonly PlainMessage[]): void {
  for (const m of messages) {
    const options: { place?: PlainMessage['place'] & object; ruleId?: string; source?: string } = {}
    if (m.place) options.place = m.place
    if (m.ruleId) options.ruleId = m.ruleId
    if (m.source) options.source = m.source
    const message = file.message(m.reason, options as Parameters<VFile['message']>[1])
    message.fatal = m.fatal
  }
}
