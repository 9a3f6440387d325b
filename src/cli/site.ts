/**
 * Writing the package site: every package folder under the output folder
 * (found by its manifest) read from its results.json into the index page,
 * written atomically; an `index.html` linkwright did not write is left alone.
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs'
import { join, relative, sep } from 'node:path'
import { CAUTION } from '../notes/caution.js'
import { SITE_GENERATOR, sitePage, type SiteEntry } from '../render/site.js'
import { MANIFEST, writeFileAtomic } from './files.js'

interface SavedResults {
  document?: { title?: string; number?: string; revision?: string; status?: string }
  summary?: { passed?: number; failed?: number; notEvaluated?: number; informative?: { checks?: number; failed?: number } }
  checks?: { label?: string; status?: string; informative?: boolean }[]
}

/** Packages under `outDir`, each read from its results.json. */
export function siteEntries(outDir: string): SiteEntry[] {
  const entries: SiteEntry[] = []
  const walk = (dir: string, depth: number) => {
    let names: import('node:fs').Dirent[]
    try {
      names = readdirSync(dir, { withFileTypes: true })
    } catch {
      return
    }
    for (const entry of names) {
      if (!entry.isDirectory() || entry.name.startsWith('.')) continue
      const folder = join(dir, entry.name)
      if (!existsSync(join(folder, MANIFEST))) {
        if (depth < 8) walk(folder, depth + 1)
        continue
      }
      try {
        const files = (JSON.parse(readFileSync(join(folder, MANIFEST), 'utf8')) as { files?: string[] }).files ?? []
        const results = JSON.parse(readFileSync(join(folder, 'results.json'), 'utf8')) as SavedResults
        const doc = results.document ?? {}
        const gate = (results.checks ?? []).filter((c) => !c.informative)
        entries.push({
          folder: relative(outDir, folder).split(sep).join('/'),
          title: doc.title ?? entry.name,
          number: doc.number ?? '',
          revision: doc.revision ?? '',
          status: doc.status ?? '',
          checks: {
            passed: results.summary?.passed ?? 0,
            failed: results.summary?.failed ?? 0,
            notEvaluated: results.summary?.notEvaluated ?? 0,
            informative: results.summary?.informative?.checks ?? 0,
            informativeFailed: results.summary?.informative?.failed ?? 0,
          },
          failing: gate.filter((c) => c.status !== 'PASS').map((c) => `${c.label ?? '?'} (${c.status === 'FAIL' ? 'FAIL' : 'not evaluated'})`),
          pdf: files.find((f) => !f.includes('/') && f.endsWith('.pdf')) ?? null,
        })
      } catch {
        // A package without a readable results.json is not listed.
      }
    }
  }
  walk(outDir, 0)
  return entries
}

/** Write `outDir/index.html`; returns why not when an index.html there is not linkwright's. */
export function writeSite(outDir: string): string | null {
  const path = join(outDir, 'index.html')
  const old = existsSync(path) ? readFileSync(path, 'utf8') : null
  if (old !== null && !old.includes(`content="${SITE_GENERATOR}"`)) return `${path} was not written by linkwright; the package index is not written there`
  const page = sitePage(siteEntries(outDir), CAUTION)
  // Unchanged packages give an unchanged index, left as it is.
  if (page !== old) writeFileAtomic(path, page)
  return null
}
