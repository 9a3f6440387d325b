/**
 * `linkwright verify note.md package`: recompute a note and compare it with a
 * built package (its folder or its results.json), as a checker does before
 * relying on a signature. Match, or exactly what differs: the note edited, a
 * data file changed, the tool changed (version or build), results moved or
 * checks changed. The exit status says which: 0 match; otherwise 16 plus the
 * sum of 1 (note edited), 2 (data file changed), 4 (tool changed), 8 (results
 * or checks differ); 1 when the note cannot be evaluated; 2 for a wrong
 * command line.
 */
import { existsSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { readNote } from '../notes/note.js'
import { resultsDocument } from '../notes/results-json.js'
import { TOOL } from '../version.js'
import { dataReader } from './data-files.js'
import { gitDate } from './git.js'
import { noteFile, report } from './reporter.js'
import { toolWithBuild } from './tool-build.js'

/** Bits of the verify command's exit status above 16. */
export const DIFFERS = { note: 1, data: 2, tool: 4, results: 8 } as const

interface Results {
  fingerprint?: string
  noteSha256?: string
  tool?: { name?: string; version?: string; build?: string }
  dataFiles?: { path: string; sha256: string }[]
  blocks?: { id: string | null; results?: Record<string, { si?: number | null; value?: unknown; display?: string; displayUnit?: string }> }[]
  checks?: { block: string | null; label: string; status: string }[]
}

/** Relative difference, for the report. */
function relativeChange(from: number, to: number): string {
  if (from === 0) return to === 0 ? '0' : 'from zero'
  return `${((to - from) / Math.abs(from)) * 100 >= 0 ? '+' : ''}${(((to - from) / Math.abs(from)) * 100).toPrecision(3)} %`
}

/** Run the verify command; returns the exit code. */
export function verifyCommand(paths: readonly string[], out: (text: string) => void, err: (text: string) => void): number {
  if (paths.length !== 2) {
    err('linkwright verify: give the note and its package (folder or results.json): linkwright verify note.md out/note\n')
    return 2
  }
  const [notePath, target] = paths as [string, string]
  const resultsPath = existsSync(target) && statSync(target).isDirectory() ? join(target, 'results.json') : target
  let saved: Results
  try {
    saved = JSON.parse(readFileSync(resultsPath, 'utf8')) as Results
  } catch (error) {
    err(`linkwright verify: cannot read ${resultsPath} (${error instanceof Error ? error.message : String(error)})\n`)
    return 2
  }
  const shown = relative(process.cwd(), notePath) || notePath
  const read = noteFile(notePath, shown)
  if (read.problem !== null) {
    err(`linkwright verify: cannot read ${notePath}: ${read.problem}\n`)
    return 2
  }
  const { model } = readNote(read.file, toolWithBuild(TOOL), { gitDate: () => gitDate(notePath), readData: dataReader(notePath) })
  if (read.file.messages.some((m) => m.fatal === true)) {
    err(report([read.file]))
    err('linkwright verify: the note has errors, so it cannot be compared\n')
    return 1
  }
  const now = resultsDocument(model, read.file, shown, model.date) as Results
  const lines: string[] = []
  let bits = 0
  if (now.fingerprint === saved.fingerprint) {
    out(`${shown}: matches ${resultsPath} (fingerprint ${now.fingerprint!.slice(0, 16)})\n`)
    return 0
  }
  lines.push(`fingerprint: ${saved.fingerprint?.slice(0, 16) ?? 'none'} → ${now.fingerprint!.slice(0, 16)}`)
  if (saved.noteSha256 !== now.noteSha256) {
    bits |= DIFFERS.note
    lines.push('note: edited since the package was built')
  }
  const savedData = new Map((saved.dataFiles ?? []).map((f) => [f.path, f.sha256]))
  const nowData = new Map((now.dataFiles ?? []).map((f) => [f.path, f.sha256]))
  for (const path of new Set([...savedData.keys(), ...nowData.keys()])) {
    if (savedData.get(path) === nowData.get(path)) continue
    bits |= DIFFERS.data
    lines.push(`data file ${path}: ${!savedData.has(path) ? 'read now, not then' : !nowData.has(path) ? 'read then, not now' : 'changed'}`)
  }
  const [t0, t1] = [saved.tool ?? {}, now.tool ?? {}]
  if (t0.version !== t1.version || t0.build !== t1.build) {
    bits |= DIFFERS.tool
    lines.push(`tool: ${t0.name ?? '?'} ${t0.version ?? '?'}${t0.build ? ` (build ${t0.build.slice(0, 12)})` : ''} → ${t1.name} ${t1.version}${t1.build ? ` (build ${t1.build.slice(0, 12)})` : ''}`)
  }
  // Results by block and name, in SI.
  const index = (doc: Results) => new Map((doc.blocks ?? []).flatMap((b) => Object.entries(b.results ?? {}).map(([name, r]) => [`${b.id ?? '?'}.${name}`, r] as const)))
  const [r0, r1] = [index(saved), index(now)]
  for (const key of new Set([...r0.keys(), ...r1.keys()])) {
    const [a, b] = [r0.get(key), r1.get(key)]
    if (!a || !b) {
      bits |= DIFFERS.results
      lines.push(`result ${key}: ${!a ? 'new' : 'gone'}`)
      continue
    }
    const same = typeof a.si === 'number' && typeof b.si === 'number' ? a.si === b.si : JSON.stringify(a.value ?? a.si) === JSON.stringify(b.value ?? b.si)
    if (same) continue
    bits |= DIFFERS.results
    const change = typeof a.si === 'number' && typeof b.si === 'number' ? ` (${relativeChange(a.si, b.si)})` : ''
    lines.push(`result ${key}: ${a.display ?? '?'} → ${b.display ?? '?'}${b.displayUnit ? ` ${b.displayUnit}` : ''}${change}`)
  }
  const checkKey = (c: { block: string | null; label: string }) => `${c.block ?? '?'}: ${c.label}`
  const c0 = new Map((saved.checks ?? []).map((c) => [checkKey(c), c.status]))
  for (const c of now.checks ?? []) {
    const before = c0.get(checkKey(c))
    if (before !== c.status) {
      bits |= DIFFERS.results
      lines.push(`check ${checkKey(c)}: ${before ?? 'new'} → ${c.status}`)
    }
  }
  out(`${shown}: differs from ${resultsPath}\n${lines.map((l) => `  ${l}`).join('\n')}\n`)
  return 16 + bits
}
