/**
 * File-system glue: finding notes, and writing a package folder so that a
 * previous good package is never left half-replaced (write beside, then rename).
 */
import { existsSync, mkdirSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { basename, dirname, extname, join, relative, resolve } from 'node:path'

/**
 * Markdown notes under the given paths (files as given, folders searched),
 * sorted, each with the folder its package path is taken relative to.
 */
export function findNotes(paths: readonly string[]): { notes: string[]; missing: string[]; baseOf: Map<string, string> } {
  const notes = new Set<string>()
  const baseOf = new Map<string, string>()
  const missing: string[] = []
  const walk = (dir: string, base: string): void => {
    for (const name of readdirSync(dir).sort()) {
      if (name.startsWith('.') || name === 'node_modules') continue
      const full = join(dir, name)
      if (statSync(full).isDirectory()) walk(full, base)
      else if (extname(name).toLowerCase() === '.md') {
        notes.add(full)
        if (!baseOf.has(full)) baseOf.set(full, base)
      }
    }
  }
  for (const path of paths) {
    if (!existsSync(path)) missing.push(path)
    else if (statSync(path).isDirectory()) walk(path, path)
    else {
      notes.add(path)
      baseOf.set(path, dirname(path))
    }
  }
  return { notes: [...notes].sort(), missing, baseOf }
}

/** The package folder of a note: out/<folder relative to the base>/<stem>. */
export function packageFolder(outDir: string, note: string, base: string): string {
  const rel = relative(resolve(base), resolve(dirname(note)))
  const safe = rel.startsWith('..') ? '' : rel
  return join(outDir, safe, basename(note, extname(note)))
}

let counter = 0

/** A package folder written beside its target, waiting to replace it. */
export interface StagedFolder {
  /** The fresh folder (more files, such as the PDF, may be added). */
  readonly path: string
  /** Replace the target with the fresh folder (rename), then drop the old one. */
  commit(): void
  /** Drop the fresh folder; the target stays as it was. */
  discard(): void
}

/**
 * Write a package into a fresh folder beside the target. Nothing touches the
 * target until `commit()`, so a failure on the way leaves the old package whole.
 */
export function stageFolder(target: string, files: ReadonlyMap<string, string | Uint8Array>): StagedFolder {
  const parent = dirname(target)
  mkdirSync(parent, { recursive: true })
  recoverFolder(target)
  const tag = `${process.pid}-${++counter}`
  const fresh = join(parent, `.${basename(target)}.new-${tag}`)
  const old = join(parent, `.${basename(target)}.old-${tag}`)
  try {
    for (const [name, content] of files) {
      const path = join(fresh, name)
      mkdirSync(dirname(path), { recursive: true })
      writeFileSync(path, content)
    }
  } catch (error) {
    rmSync(fresh, { recursive: true, force: true })
    throw error
  }
  return {
    path: fresh,
    commit() {
      try {
        if (existsSync(target)) renameSync(target, old)
        renameSync(fresh, target)
      } catch (error) {
        if (!existsSync(target) && existsSync(old)) renameSync(old, target)
        rmSync(fresh, { recursive: true, force: true })
        throw error
      }
      rmSync(old, { recursive: true, force: true })
    },
    discard() {
      rmSync(fresh, { recursive: true, force: true })
    },
  }
}

/**
 * Tidy what an interrupted run (Ctrl-C, a crash) left beside a package folder:
 * fresh folders that were never committed go; an old package that was moved
 * aside but not replaced goes back in place, so no good package is lost.
 */
export function recoverFolder(target: string): void {
  const parent = dirname(target)
  const name = basename(target)
  if (!existsSync(parent)) return
  for (const entry of readdirSync(parent).sort()) {
    if (entry.startsWith(`.${name}.new-`)) rmSync(join(parent, entry), { recursive: true, force: true })
    else if (entry.startsWith(`.${name}.old-`)) {
      if (existsSync(target)) rmSync(join(parent, entry), { recursive: true, force: true })
      else renameSync(join(parent, entry), target)
    }
  }
}

/** Write a package folder in one step (stage, then commit). */
export function writeFolder(target: string, files: ReadonlyMap<string, string | Uint8Array>): void {
  stageFolder(target, files).commit()
}

/** Write one file by writing beside it and renaming over it. */
export function writeFileAtomic(path: string, content: string | Uint8Array): void {
  mkdirSync(dirname(path), { recursive: true })
  const fresh = `${path}.new-${process.pid}-${++counter}`
  writeFileSync(fresh, content)
  renameSync(fresh, path)
}
