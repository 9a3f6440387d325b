/**
 * Reading a design note: Markdown with YAML front matter and fenced calculation
 * blocks, parsed with unified/remark, evaluated, and gathered into a model the
 * render layer turns into a package.
 *
 *     note.md ──remark-parse──► mdast ──front matter──► meta
 *                                 │
 *                                 ├──calculation blocks──► evaluate in dependency order ──► outcomes
 *                                 ├──:value / :cite directives──► printed values, citations
 *                                 └──block fences replaced by lwBlock nodes (rendered later)
 */
import { createHash } from 'node:crypto'
import type { Html, Image, Root } from 'mdast'
import remarkDirective from 'remark-directive'
import remarkFrontmatter from 'remark-frontmatter'
import remarkGfm from 'remark-gfm'
import remarkMath from 'remark-math'
import remarkParse from 'remark-parse'
import { unified } from 'unified'
import type { Position } from 'unist'
import { visit } from 'unist-util-visit'
import type { VFile } from 'vfile'
import type { Assumption, BlockOutcome, CheckOutcome, Citation, DataFile, DataReader } from './block-kinds/kind.js'
import { findBlocks } from './blocks.js'
import { evaluateBlocks } from './evaluate.js'
import { readFrontMatter } from './front-matter.js'
import { messages } from './messages.js'
import { resolveProse } from './prose.js'
import { builtinReferences } from './references.js'
import { reportError, reportWarning } from './report.js'
import type { CalcBlock, NoteMeta } from './types.js'

/** Where a calculation block stood in the note, for the render layer. */
export interface BlockNode {
  type: 'lwBlock'
  index: number
  position?: Position
}

declare module 'mdast' {
  interface RootContentMap {
    lwBlock: BlockNode
  }
  interface BlockContentMap {
    lwBlock: BlockNode
  }
}

/** The tool that evaluates: name, version and (when known) its build go into the fingerprint. */
export interface Tool {
  readonly name: string
  readonly version: string
  /**
   * sha-256 of the tool's own code and templates as run (the bundle's files), so
   * a change to the core or the templates changes the fingerprint even when the
   * version does not. Absent when run from source (tests in process).
   */
  readonly build?: string
}

/** A numbered reference of the package. */
export interface NumberedReference {
  readonly key: string
  readonly number: number
  readonly citation: string
  /** True for the tool's own method references. */
  readonly builtin: boolean
}

/** Options for {@link readNote}. */
export interface ReadOptions {
  /** Date of the note's last commit (YYYY-MM-DD), asked for only when the front matter says `date: git`. */
  readonly gitDate?: (() => string | null) | null
  /** Reads the data files a note names (load tables), relative to the note, refusing paths that leave the design repository. */
  readonly readData?: DataReader | null
}

/** Everything the package shows, in document order. */
export interface NoteModel {
  readonly meta: NoteMeta
  /** The package's date: the front matter's, or the note's last commit date for `date: git`; null when none. */
  readonly date: string | null
  readonly blocks: readonly CalcBlock[]
  readonly outcomes: readonly (BlockOutcome | null)[]
  readonly checks: readonly CheckOutcome[]
  readonly assumptions: readonly Assumption[]
  /** The note's own conclusions, in document order, with the block each came from. */
  readonly conclusions: readonly { readonly text: string; readonly line: number }[]
  readonly references: readonly NumberedReference[]
  /** Data files the note read, with their digests (they are part of the fingerprint). */
  readonly dataFiles: readonly DataFile[]
  /** sha-256 of the tool name, version, note text and the data files' digests (hex). */
  readonly fingerprint: string
  readonly tool: Tool
}

const parser = unified().use(remarkParse).use(remarkFrontmatter, ['yaml']).use(remarkGfm).use(remarkMath).use(remarkDirective).freeze()

/** Parse and evaluate a note. Problems are messages on `file`; this never throws on bad input. */
export function readNote(file: VFile, tool: Tool, options?: ReadOptions | null): { tree: Root; model: NoteModel } {
  const tree = parser.parse(file) as Root
  // 1. Front matter (depends on nothing; everything else depends on its settings).
  const first = tree.children[0]
  const meta =
    first?.type === 'yaml'
      ? readFrontMatter(first.value, (first.position?.start.line ?? 1) + 1, file)
      : readFrontMatter(null, 1, file)
  // The check command and the build resolve `date: git` the same way, so they agree on it.
  const date = meta.date === 'git' ? (options?.gitDate?.() ?? null) : meta.date
  if (meta.date === 'git' && date === null) {
    reportError(file, 'front-matter-field', messages['front-matter-field']('date', 'cannot find the note’s last commit date for `date: git`: the note is not committed, or git is not available'), first?.position ?? { line: 1, column: 1 })
  }
  // 2. Blocks, evaluated in dependency order.
  const found = findBlocks(tree, file)
  const blocks = found.map((f) => f.block)
  const { outcomes, context } = evaluateBlocks(blocks, meta, file, options?.readData ?? null)
  // 3. Prose: values and citations (depends on every block's values).
  resolveProse(tree, context)
  flagRemoteResources(tree, file)
  // 4. Block fences become placeholders the render layer fills.
  for (const { node, block } of found) {
    const replacement = node as unknown as BlockNode
    replacement.type = 'lwBlock'
    replacement.index = block.index
    delete (replacement as unknown as { value?: string }).value
  }
  const model: NoteModel = {
    meta,
    date,
    blocks,
    outcomes,
    checks: outcomes.flatMap((o) => o?.checks ?? []),
    assumptions: gatherAssumptions(outcomes),
    conclusions: outcomes.flatMap((o) => (o ? o.conclusions.map((text) => ({ text, line: o.block.place.start.line })) : [])),
    references: numberReferences(meta, blocks, outcomes, context.citations),
    dataFiles: context.dataFiles,
    fingerprint: fingerprint(tool, String(file.value), context.dataFiles),
    tool,
  }
  return { tree, model }
}

/**
 * Fingerprint of a package: sha-256 over the tool's name, version and build
 * (its code and templates), the note's text (line endings normalised) and the
 * data files it reads, so a signed package is tied to exactly what was computed.
 */
export function fingerprint(tool: Tool, source: string, dataFiles: readonly DataFile[] = []): string {
  const note = source.replace(/\r\n?/g, '\n')
  // The data files a note reads are part of what was computed: their digests join the fingerprint.
  const canonical = JSON.stringify({
    tool: tool.name,
    version: tool.version,
    ...(tool.build ? { build: tool.build } : {}),
    note,
    ...(dataFiles.length > 0 ? { data: dataFiles.map((f) => [f.path, f.sha256]) } : {}),
  })
  return createHash('sha256').update(canonical).digest('hex')
}

function gatherAssumptions(outcomes: readonly (BlockOutcome | null)[]): Assumption[] {
  const own = outcomes.flatMap((o) => (o?.gathered === 'assumptions' ? o.assumptions : []))
  const method = new Map<string, Assumption>()
  const covered = new Set(outcomes.flatMap((o) => o?.covers ?? []))
  for (const o of outcomes) {
    if (!o || o.gathered === 'assumptions') continue
    for (const a of o.assumptions) {
      if (a.droppedWith && covered.has(a.droppedWith)) continue
      const seen = method.get(a.text)
      method.set(a.text, seen ? { ...seen, from: `${seen.from}, ${a.from}` } : a)
    }
  }
  return [...own, ...method.values()]
}

function numberReferences(
  meta: NoteMeta,
  blocks: readonly CalcBlock[],
  outcomes: readonly (BlockOutcome | null)[],
  citations: readonly Citation[],
): NumberedReference[] {
  const all: Citation[] = [...citations]
  for (const block of blocks) {
    for (const step of outcomes[block.index]?.method ?? []) {
      for (const key of step.cites ?? []) all.push({ key, line: block.place.start.line, column: block.place.start.column })
    }
  }
  all.sort((p, q) => p.line - q.line || p.column - q.column)
  const numbered: NumberedReference[] = []
  for (const { key } of all) {
    if (numbered.some((r) => r.key === key)) continue
    const own = meta.references.get(key)
    const builtin = builtinReferences.get(key)
    if (own === undefined && builtin === undefined) continue
    numbered.push({ key, number: numbered.length + 1, citation: own ?? builtin!, builtin: own === undefined })
  }
  return numbered
}

function flagRemoteResources(tree: Root, file: VFile): void {
  const remote = /^(?:[a-z][a-z0-9+.-]*:)?\/\//i
  visit(tree, (node) => {
    if (node.type === 'image' && remote.test((node as Image).url)) {
      reportWarning(file, 'remote-resource', messages['remote-resource']((node as Image).url), node.position)
    }
    if (node.type === 'html') {
      for (const match of (node as Html).value.matchAll(/(?:src|href)\s*=\s*["']?((?:[a-z][a-z0-9+.-]*:)?\/\/[^"'\s>]+)/gi)) {
        reportWarning(file, 'remote-resource', messages['remote-resource'](match[1]!), node.position)
      }
    }
  })
}
