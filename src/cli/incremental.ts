/**
 * Incremental builds: a package is rebuilt only when something it was built
 * from has changed. The key is a sha-256 over the note's text, the data files
 * it read (by digest), the tool's build, the source revision shown in the
 * package, the note's path as shown, the paper and whether a PDF was asked
 * for, and the git date when the note takes its date from git. It is kept in
 * the package's manifest with the data files' digests, so the next build can
 * recompute it before evaluating anything; an unchanged package is left as it
 * is, byte for byte.
 */
import { createHash } from 'node:crypto'
import { existsSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import type { DataReader } from '../notes/block-kinds/kind.js'
import { MANIFEST } from './files.js'

/** What a package is built from, beyond the note's text. */
export interface KeyInputs {
  readonly noteText: string
  readonly notePath: string
  readonly dataFiles: readonly { readonly path: string; readonly sha256: string }[]
  readonly build: string
  readonly version: string
  readonly commit: string
  readonly pdf: boolean
  readonly paper: string | null
  readonly gitDate: string | null
}

/** The key of a package. */
export function packageKey(inputs: KeyInputs): string {
  const note = createHash('sha256').update(inputs.noteText.replace(/\r\n?/g, '\n')).digest('hex')
  // A fixed order, whatever order the caller's object has.
  const canonical = [note, inputs.notePath, inputs.dataFiles.map((f) => [f.path, f.sha256]), inputs.build, inputs.version, inputs.commit, inputs.pdf, inputs.paper, inputs.gitDate]
  return createHash('sha256').update(JSON.stringify(canonical)).digest('hex')
}

/** True when the note takes its date from git (its key then covers the date). */
export function usesGitDate(noteText: string): boolean {
  return /^date:\s*git\s*$/m.test(noteText)
}

/**
 * Whether the package in `folder` was built from exactly these inputs and is
 * whole (every file its manifest lists is there): then it need not be built.
 */
export function unchanged(folder: string, inputs: Omit<KeyInputs, 'dataFiles'>, readData: DataReader): boolean {
  let manifest: { files?: unknown; key?: unknown; dataFiles?: unknown }
  try {
    manifest = JSON.parse(readFileSync(join(folder, MANIFEST), 'utf8'))
  } catch {
    return false
  }
  if (typeof manifest.key !== 'string' || !Array.isArray(manifest.files) || !Array.isArray(manifest.dataFiles)) return false
  if (!manifest.files.every((f) => typeof f === 'string' && existsSync(join(folder, f)))) return false
  // The data files as they are now, read the way the note reads them.
  const dataFiles: { path: string; sha256: string }[] = []
  for (const entry of manifest.dataFiles as { path?: unknown }[]) {
    if (typeof entry?.path !== 'string') return false
    const read = readData(entry.path)
    if (!read.ok) return false
    dataFiles.push({ path: entry.path, sha256: read.sha256 })
  }
  return packageKey({ ...inputs, dataFiles }) === manifest.key
}
