/**
 * File-system glue: finding notes, naming their package folders so that they
 * never collide, and writing a package folder so that a previous good package
 * is never left half-replaced (write beside, then rename) and nothing
 * linkwright did not write is ever replaced.
 */
import { existsSync, lstatSync, mkdirSync, readFileSync, readdirSync, realpathSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { basename, dirname, extname, join, relative, resolve, sep } from 'node:path'

/** A path that could not be taken as a note, and why (reported as a message on that path). */
export interface PathProblem {
  readonly path: string
  readonly reason: string
  /** False for what loses nothing (a link loop, not searched twice): a warning. */
  readonly fatal?: boolean
}

/** What {@link findNotes} found. */
export interface FoundNotes {
  /** The notes, sorted. */
  readonly notes: string[]
  /** Paths given on the command line that do not exist. */
  readonly missing: string[]
  /** Links to nothing, unreadable folders, links looping back. */
  readonly problems: PathProblem[]
  /** The folder package paths are taken relative to: the deepest folder holding everything given. */
  readonly base: string
}

/** Most folders searched below one path: a design repository, not a disk. */
const MAX_FOLDERS = 20_000

/**
 * Markdown notes under the given paths (files as given, folders searched),
 * sorted. Symbolic links are followed once: a link back into a folder already
 * searched, a link to nothing, or a folder that cannot be read is a problem,
 * not a crash. Folders starting with `.`, `node_modules` and the folders in
 * `skip` (the output folder) are not searched.
 */
export function findNotes(paths: readonly string[], skip: readonly string[] = []): FoundNotes {
  const notes = new Set<string>()
  const missing: string[] = []
  const problems: PathProblem[] = []
  const seenFiles = new Set<string>()
  const seenFolders = new Set<string>()
  // The output folder is not searched below the paths given (it may be one of them).
  const skipped = new Set<string>(skip.flatMap((s) => (existsSync(s) ? [realpathSync(s)] : [])))
  let folders = 0
  const addNote = (full: string): void => {
    const real = realOrNull(full)
    if (real === null) {
      problems.push({ path: full, reason: 'it is a link to a file that does not exist' })
      return
    }
    if (seenFiles.has(real)) return
    if (!statSync(real).isFile()) {
      problems.push({ path: full, reason: 'it is not a file' })
      return
    }
    seenFiles.add(real)
    notes.add(full)
  }
  const walk = (dir: string): void => {
    const real = realOrNull(dir)
    if (real === null) {
      problems.push({ path: dir, reason: 'it is a link to a folder that does not exist' })
      return
    }
    if (seenFolders.has(real)) {
      problems.push({ path: dir, reason: 'it leads back to a folder already searched (a link loop); not searched again', fatal: false })
      return
    }
    seenFolders.add(real)
    if (++folders > MAX_FOLDERS) {
      if (folders === MAX_FOLDERS + 1) problems.push({ path: dir, reason: `more than ${MAX_FOLDERS} folders below the paths given; the rest are not searched` })
      return
    }
    let names: string[]
    try {
      names = readdirSync(dir).sort()
    } catch (error) {
      problems.push({ path: dir, reason: `the folder cannot be read (${codeOf(error)})` })
      return
    }
    for (const name of names) {
      if (name.startsWith('.') || name === 'node_modules') continue
      const full = join(dir, name)
      let kind: 'folder' | 'note' | 'other'
      try {
        const stat = lstatSync(full)
        const target = stat.isSymbolicLink() ? statOrNull(full) : stat
        if (target === null) kind = extname(name).toLowerCase() === '.md' ? 'note' : 'other'
        else kind = target.isDirectory() ? 'folder' : extname(name).toLowerCase() === '.md' ? 'note' : 'other'
      } catch {
        continue
      }
      if (kind === 'folder') {
        if (!skipped.has(realOrSelf(full))) walk(full)
      }
      else if (kind === 'note') addNote(full)
    }
  }
  const anchors: string[] = []
  for (const path of paths) {
    if (!existsSync(path)) {
      if (lstatOrNull(path)?.isSymbolicLink()) problems.push({ path, reason: 'it is a link to nothing' })
      else missing.push(path)
    } else if (statSync(path).isDirectory()) {
      anchors.push(resolve(path))
      walk(path)
    } else {
      anchors.push(resolve(dirname(path)))
      addNote(path)
    }
  }
  return { notes: [...notes].sort(), missing, problems, base: commonFolder(anchors) }
}

/** The real path (links resolved), or null when it leads nowhere. */
function realOrNull(path: string): string | null {
  try {
    return realpathSync(path)
  } catch {
    return null
  }
}

function realOrSelf(path: string): string {
  return realOrNull(path) ?? path
}

function statOrNull(path: string) {
  try {
    return statSync(path)
  } catch {
    return null
  }
}

function lstatOrNull(path: string) {
  try {
    return lstatSync(path)
  } catch {
    return null
  }
}

/** The error code of a file-system error (`EACCES`), or its message. */
export function codeOf(error: unknown): string {
  const code = (error as { code?: unknown } | null)?.code
  return typeof code === 'string' ? code : error instanceof Error ? error.message : String(error)
}

/** The deepest folder holding all the given absolute folders. */
export function commonFolder(folders: readonly string[]): string {
  if (folders.length === 0) return resolve('.')
  let common = folders[0]!.split(sep)
  for (const folder of folders.slice(1)) {
    const parts = folder.split(sep)
    let i = 0
    while (i < common.length && i < parts.length && common[i] === parts[i]) i++
    common = common.slice(0, i)
  }
  return common.join(sep) || sep
}

/** The package folder of a note: out/<folder relative to the base>/<stem>. */
export function packageFolder(outDir: string, note: string, base: string): string {
  const rel = relative(resolve(base), resolve(dirname(note)))
  const safe = rel.startsWith('..') ? '' : rel
  return join(outDir, safe, basename(note, extname(note)))
}

/**
 * Package folders of the notes, and the notes whose folder cannot be theirs:
 * two notes with one folder (`a.md`, `a.MD`), or a folder that would hold
 * another note's package or a note itself (`n1.md` beside a folder `n1/` of
 * notes). Such a note gets no package; the others are not touched.
 */
export function planFolders(notes: readonly string[], outDir: string, base: string): { folders: Map<string, string>; clashes: PathProblem[] } {
  const folders = new Map<string, string>()
  const clashes: PathProblem[] = []
  const owner = new Map<string, string>()
  for (const note of notes) {
    const folder = packageFolder(outDir, note, base)
    const key = resolve(folder)
    const other = owner.get(key)
    if (other !== undefined) {
      clashes.push({ path: note, reason: `its package folder ${folder} is already the package folder of ${other}; rename one of the notes` })
      continue
    }
    owner.set(key, note)
    folders.set(note, folder)
  }
  const keys = [...owner.keys()]
  const noteFiles = notes.map((n) => resolve(n))
  for (const [key, note] of [...owner]) {
    const inside = (path: string) => path.startsWith(key + sep)
    const held = keys.find((k) => k !== key && inside(k))
    const source = noteFiles.find((n) => n === key || inside(n))
    if (held === undefined && source === undefined) continue
    const what = source !== undefined ? `the note ${relative(process.cwd(), source)}` : `the package of ${owner.get(held!)!}`
    clashes.push({ path: note, reason: `its package folder ${folders.get(note)!} would hold ${what}; rename the note or that folder, or build into another --out` })
    folders.delete(note)
  }
  return { folders, clashes }
}

/**
 * Create a folder and its missing parents, one level at a time (Node's own
 * recursive mkdir never returns on some special file systems, such as /proc).
 */
export function makeFolder(path: string): void {
  const missing: string[] = []
  let dir = resolve(path)
  while (lstatOrNull(dir) === null) {
    missing.push(dir)
    const parent = dirname(dir)
    if (parent === dir) break
    dir = parent
  }
  for (const folder of missing.reverse()) mkdirSync(folder)
}

/** The file in a package folder that says linkwright wrote it, and which files it wrote. */
export const MANIFEST = '.linkwright-package.json'

/** Files of a folder, relative to it, `/`-separated, sorted (links are listed, not followed). */
function filesUnder(folder: string): string[] {
  const out: string[] = []
  const walk = (dir: string, prefix: string) => {
    for (const name of readdirSync(dir).sort()) {
      const full = join(dir, name)
      if (lstatSync(full).isDirectory()) walk(full, `${prefix}${name}/`)
      else out.push(`${prefix}${name}`)
    }
  }
  walk(folder, '')
  return out
}

/** Files a package of an earlier release (without a manifest) may hold. */
const EARLIER_PACKAGE = /^(index\.html|results\.json|[^/]+\.pdf|charts\/[^/]+\.vl\.json|assets\/.+)$/

/**
 * Why an existing folder may not be replaced by a package, or null when it may:
 * it is not a folder, or it holds a file linkwright did not write.
 */
export function foreignContent(target: string): string | null {
  const stat = lstatOrNull(target)
  if (stat === null) return null
  if (!stat.isDirectory()) return `${target} exists and is not a folder`
  let files: string[]
  try {
    files = filesUnder(target)
  } catch (error) {
    return `${target} cannot be read (${codeOf(error)})`
  }
  let written: Set<string> | null = null
  if (files.includes(MANIFEST)) {
    try {
      const manifest = JSON.parse(readFileSync(join(target, MANIFEST), 'utf8')) as { tool?: unknown; files?: unknown }
      if (manifest.tool === 'linkwright' && Array.isArray(manifest.files)) written = new Set(manifest.files.map(String))
    } catch {
      written = null
    }
  } else if (files.includes('results.json') && files.every((f) => EARLIER_PACKAGE.test(f))) {
    written = new Set(files)
  }
  if (written === null) {
    const shown = files.slice(0, 3).join(', ')
    return `${target} is not a linkwright package${files.length > 0 ? ` (it holds ${shown}${files.length > 3 ? ', …' : ''})` : ''}`
  }
  const extra = files.filter((f) => f !== MANIFEST && !written.has(f))
  if (extra.length === 0) return null
  return `${target} holds files linkwright did not write (${extra.slice(0, 3).join(', ')}${extra.length > 3 ? ', …' : ''})`
}

/** Refused to replace a folder that holds what linkwright did not write. */
export class ForeignFolderError extends Error {
  override readonly name = 'ForeignFolderError'
}

let counter = 0

/** A package folder written beside its target, waiting to replace it. */
export interface StagedFolder {
  /** The fresh folder (more files, such as the PDF, may be added before commit). */
  readonly path: string
  /** Replace the target with the fresh folder (rename), then drop the old one; `record` joins the manifest. */
  commit(record?: Readonly<Record<string, unknown>>): void
  /** Drop the fresh folder; the target stays as it was. */
  discard(): void
}

/** Staged folders not yet committed or discarded: dropped if the process is stopped. */
const open = new Set<string>()

/** Drop every staged folder not yet committed (on a signal). Synchronous. */
export function discardOpenStages(): void {
  for (const path of open) rmSync(path, { recursive: true, force: true })
  open.clear()
}

/**
 * Write a package into a fresh folder beside the target. Nothing touches the
 * target until `commit()`, so a failure on the way leaves the old package whole;
 * the commit refuses a target holding files linkwright did not write
 * ({@link ForeignFolderError}) and lists what it wrote in the package's manifest.
 */
export function stageFolder(target: string, files: ReadonlyMap<string, string | Uint8Array>): StagedFolder {
  const parent = dirname(target)
  mkdirSync(parent, { recursive: true })
  recoverFolder(target)
  const tag = `${process.pid}-${++counter}`
  const fresh = join(parent, `.${basename(target)}.new-${tag}`)
  const old = join(parent, `.${basename(target)}.old-${tag}`)
  open.add(fresh)
  try {
    for (const [name, content] of files) {
      const path = join(fresh, name)
      mkdirSync(dirname(path), { recursive: true })
      writeFileSync(path, content)
    }
  } catch (error) {
    rmSync(fresh, { recursive: true, force: true })
    open.delete(fresh)
    throw error
  }
  return {
    path: fresh,
    commit(record = {}) {
      const foreign = foreignContent(target)
      if (foreign !== null) {
        rmSync(fresh, { recursive: true, force: true })
        open.delete(fresh)
        throw new ForeignFolderError(foreign)
      }
      writeFileSync(join(fresh, MANIFEST), `${JSON.stringify({ tool: 'linkwright', files: filesUnder(fresh), ...record }, null, 2)}\n`)
      try {
        if (existsSync(target)) renameSync(target, old)
        renameSync(fresh, target)
      } catch (error) {
        if (!existsSync(target) && existsSync(old)) renameSync(old, target)
        rmSync(fresh, { recursive: true, force: true })
        open.delete(fresh)
        throw error
      }
      open.delete(fresh)
      rmSync(old, { recursive: true, force: true })
    },
    discard() {
      rmSync(fresh, { recursive: true, force: true })
      open.delete(fresh)
    },
  }
}

/** True when a process with this id runs (on this machine). */
export function processAlive(pid: number): boolean {
  if (!Number.isInteger(pid) || pid <= 0) return false
  if (pid === process.pid) return true
  try {
    process.kill(pid, 0)
    return true
  } catch (error) {
    return codeOf(error) === 'EPERM'
  }
}

/**
 * Tidy what an interrupted run (Ctrl-C, a crash, SIGKILL) left beside a package
 * folder: fresh folders that were never committed go; an old package that was
 * moved aside but not replaced goes back in place, so no good package is lost.
 * Only what a process that no longer runs left is touched.
 */
export function recoverFolder(target: string): void {
  const parent = dirname(target)
  const name = basename(target)
  if (!existsSync(parent)) return
  for (const entry of readdirSync(parent).sort()) {
    const match = /^\.(.+)\.(new|old)-(\d+)-\d+$/.exec(entry)
    if (!match || match[1] !== name) continue
    const pid = Number(match[3])
    if (pid === process.pid || processAlive(pid)) continue
    if (match[2] === 'new') rmSync(join(parent, entry), { recursive: true, force: true })
    else if (existsSync(target)) rmSync(join(parent, entry), { recursive: true, force: true })
    else renameSync(join(parent, entry), target)
  }
}

/**
 * Tidy a whole output folder at the start of a build: what killed runs left
 * beside any package folder (see {@link recoverFolder}) and half-written
 * single files (`name.new-<pid>-<n>`). Packages are not searched inside.
 */
export function tidyOutput(outDir: string): void {
  const walk = (dir: string, depth: number) => {
    let entries: import('node:fs').Dirent[]
    try {
      entries = readdirSync(dir, { withFileTypes: true })
    } catch {
      return
    }
    const targets = new Set<string>()
    for (const entry of entries) {
      const staging = /^\.(.+)\.(?:new|old)-(\d+)-\d+$/.exec(entry.name)
      if (staging && entry.isDirectory()) targets.add(staging[1]!)
      const file = /\.new-(\d+)-\d+$/.exec(entry.name)
      if (!staging && file && entry.isFile() && !processAlive(Number(file[1]))) rmSync(join(dir, entry.name), { force: true })
    }
    for (const target of targets) recoverFolder(join(dir, target))
    if (depth >= 8) return
    for (const entry of entries) {
      // A package folder holds no other packages; staging folders were handled above.
      if (!entry.isDirectory() || entry.name.startsWith('.') && entry.name !== '.cache') continue
      if (existsSync(join(dir, entry.name, MANIFEST))) continue
      walk(join(dir, entry.name), depth + 1)
    }
  }
  walk(outDir, 0)
}

/** Write a package folder in one step (stage, then commit). */
export function writeFolder(target: string, files: ReadonlyMap<string, string | Uint8Array>): void {
  stageFolder(target, files).commit()
}

/** Write one file by writing beside it and renaming over it. */
export function writeFileAtomic(path: string, content: string | Uint8Array): void {
  mkdirSync(dirname(path), { recursive: true })
  const fresh = `${path}.new-${process.pid}-${++counter}`
  try {
    writeFileSync(fresh, content)
    renameSync(fresh, path)
  } catch (error) {
    rmSync(fresh, { force: true })
    throw error
  }
}
