/**
 * File-system glue: finding notes, and writing a package folder so that a
 * previous good package is never left half-replaced (write beside, then rename).
 */
import { existsSync, mkdirSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { basename, dirname, extname, join, relative, resolve } from 'node:path'

/** Markdown notes under the given paths (files as given, folders searched), sorted. */
export function findNotes(paths: readonly string[]): { notes: string[]; missing: string[] } {
  const notes = new Set<string>()
  const missing: string[] = []
  const walk = (dir: string): void => {
    for (const name of readdirSync(dir).sort()) {
      if (name.startsWith('.') || name === 'node_modules') continue
      const full = join(dir, name)
      if (statSync(full).isDirectory()) walk(full)
      else if (extname(name).toLowerCase() === '.md') notes.add(full)
    }
  }
  for (const path of paths) {
    if (!existsSync(path)) missing.push(path)
    else if (statSync(path).isDirectory()) walk(path)
    else notes.add(path)
  }
  return { notes: [...notes].sort(), missing }
}

/** The package folder of a note: out/<folder relative to the base>/<stem>. */
export function packageFolder(outDir: string, note: string, base: string): string {
  const rel = relative(resolve(base), resolve(dirname(note)))
  const safe = rel.startsWith('..') ? '' : rel
  return join(outDir, safe, basename(note, extname(note)))
}

let counter = 0

/**
 * Write a package folder: files go into a fresh folder beside the target, which
 * then replaces the target by rename. A failure on the way leaves the old
 * package as it was.
 */
export function writeFolder(target: string, files: ReadonlyMap<string, string | Uint8Array>): void {
  const parent = dirname(target)
  mkdirSync(parent, { recursive: true })
  const tag = `${process.pid}-${++counter}`
  const fresh = join(parent, `.${basename(target)}.new-${tag}`)
  const old = join(parent, `.${basename(target)}.old-${tag}`)
  try {
    for (const [name, content] of files) {
      const path = join(fresh, name)
      mkdirSync(dirname(path), { recursive: true })
      writeFileSync(path, content)
    }
    if (existsSync(target)) renameSync(target, old)
    renameSync(fresh, target)
  } catch (error) {
    rmSync(fresh, { recursive: true, force: true })
    if (!existsSync(target) && existsSync(old)) renameSync(old, target)
    throw error
  }
  rmSync(old, { recursive: true, force: true })
}

/** Write one file by writing beside it and renaming over it. */
export function writeFileAtomic(path: string, content: string | Uint8Array): void {
  mkdirSync(dirname(path), { recursive: true })
  const fresh = `${path}.new-${process.pid}-${++counter}`
  writeFileSync(fresh, content)
  renameSync(fresh, path)
}
