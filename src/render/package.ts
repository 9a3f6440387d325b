/**
 * The HTML calculation package of one note.
 *
 *     mdast (blocks as lwBlock, values as lwValue/lwCite)
 *       ──toHast──► hast with <lw-slot> placeholders for our own markup
 *       ──rehype-raw, rehype-sanitize──► the note's own HTML made safe
 *       ──rehype-katex──► prose math typeset
 *       ──fill slots──► blocks, values, citations (trusted markup, KaTeX inside)
 *       ──template──► cover, contents, summary, body, assumptions, references,
 *                     software, caution, sign-off, footer
 */
import type { Element, ElementContent, Root as HastRoot, RootContent } from 'hast'
import { fromHtml } from 'hast-util-from-html'
import { defaultSchema, type Schema } from 'hast-util-sanitize'
import { toHtml } from 'hast-util-to-html'
import { h } from 'hastscript'
import type { Root } from 'mdast'
import { toString as mdastText } from 'mdast-util-to-string'
import { toHast, type Handler } from 'mdast-util-to-hast'
import rehypeKatex from 'rehype-katex'
import rehypeRaw from 'rehype-raw'
import rehypeSanitize from 'rehype-sanitize'
import { unified } from 'unified'
import { SKIP, visit } from 'unist-util-visit'
import type { VFile } from 'vfile'
import type { BlockNode, NoteModel } from '../notes/note.js'
import type { CiteNode, ValueNode } from '../notes/prose.js'
import { renderBlock, type RenderContext } from './block.js'
import { citation } from './markup.js'
import { assumptions, changesSince, conclusions, cover, footer, references, revisionHistory, scope, signOff, software, statusWords, summary } from './sections.js'
import { contents, numberSections } from './contents.js'

/** Options for {@link renderPackage}. */
export interface RenderOptions {
  /** The shell HTML with `<lw-slot name="…">` placeholders (templates/package.html). */
  readonly template: string
  /** Path of the note as shown in the package (relative to the repository). */
  readonly notePath: string
  /** Date printed on the cover (front matter date or the note's commit date). */
  readonly date: string | null
  /** Revision of the tool's source, e.g. a commit id. */
  readonly commit: string
  /** Rendered chart SVG by block index, and the file its spec was written to. */
  readonly charts?: ReadonlyMap<number, { readonly svg: string; readonly specFile: string }>
  /** What moved since a revision, for a "Changes since" section and change marks; null for none. */
  readonly changes?: ChangesSince | null
}

/** One difference from the revision compared with, as shown. */
export interface ChangeRow {
  readonly what: 'note' | 'data' | 'tool' | 'block' | 'input' | 'result' | 'check'
  readonly name: string
  readonly from: string | null
  readonly to: string | null
  readonly relative?: number
}

/** The changes since a revision. */
export interface ChangesSince {
  /** The revision as the user named it, with its commit. */
  readonly revision: string
  readonly rows: readonly ChangeRow[]
}

// User HTML may keep GitHub-like markup and math classes, plus our placeholders; nothing else.
const schema: Schema = {
  ...defaultSchema,
  tagNames: [...(defaultSchema.tagNames ?? []), 'lw-slot'],
  attributes: {
    ...defaultSchema.attributes,
    'lw-slot': ['dataSlot'],
    code: [['className', /^language-./, 'math-inline', 'math-display']],
  },
}

const katexOptions = { strict: () => 'ignore' as const, throwOnError: false }
// rehype-raw re-parses the whole tree with parse5: only worth it when the note has HTML.
const withRawHtml = unified().use(rehypeRaw).use(rehypeSanitize, schema).use(rehypeKatex, katexOptions).freeze()
const withoutRawHtml = unified().use(rehypeSanitize, schema).use(rehypeKatex, katexOptions).freeze()

const templates = new Map<string, HastRoot>()

/** Render a note's package to an HTML string. */
export function renderPackage(tree: Root, model: NoteModel, file: VFile, options: RenderOptions): string {
  // 1. Numbering shared by the sections: references and assumptions.
  const context: RenderContext = {
    model,
    references: new Map(model.references.map((r) => [r.key, r])),
    assumptionNumbers: new Map(model.assumptions.map((a, i) => [a.text, `A${i + 1}`])),
    charts: options.charts ?? new Map(),
    changed: new Set((options.changes?.rows ?? []).filter((r) => r.what === 'input' || r.what === 'result').map((r) => r.name)),
  }
  // 2. Markdown → hast, our nodes as slots (depends on 1 for citations).
  const slots: ElementContent[][] = []
  const slot = (content: ElementContent[]): Element => {
    slots.push(content)
    return { type: 'element', tagName: 'lw-slot', properties: { dataSlot: String(slots.length - 1) }, children: [] }
  }
  const handlers: Record<string, Handler> = {
    lwBlock: (_state, node: BlockNode) => {
      const block = model.blocks[node.index]!
      return slot([renderBlock(block, model.outcomes[node.index] ?? null, context)])
    },
    lwValue: (_state, node: ValueNode) => slot([h('span.lw-value', { title: node.expression }, node.text)]),
    lwCite: (_state, node: CiteNode) => {
      const ref = context.references.get(node.key)
      return slot(ref ? [citation(ref)] : [{ type: 'text', value: `[${node.key}]` }])
    },
  }
  shiftHeadings(tree, model.meta.title)
  const hast = toHast(tree, { handlers, allowDangerousHtml: true }) as HastRoot
  // 3. Make the note's own HTML safe, typeset its math.
  let hasRaw = false
  visit(hast, 'raw', () => {
    hasRaw = true
    return false
  })
  const body = (hasRaw ? withRawHtml : withoutRawHtml).runSync(hast, file) as HastRoot
  foldKatexCauses(file)
  // 4. Put our markup into the slots (after sanitising, so it is kept as it is).
  visit(body, 'element', (node, index, parent) => {
    if (node.tagName !== 'lw-slot' || !parent || index === undefined) return undefined
    const content = slots[Number(node.properties.dataSlot)] ?? []
    parent.children.splice(index, 1, ...(content as RootContent[] as Element[]))
    return [SKIP, index + content.length]
  })
  // 5. The shell: its slots are found once in the small template, then filled.
  const shell = structuredClone(template(options.template))
  const slotsOfShell = findSlots(shell)
  const sections: Record<string, ElementContent[]> = {
    cover: [cover(model, options.date)],
    scope: [scope(model)],
    revisions: options.changes ? [revisionHistory(model), changesSince(options.changes)] : [revisionHistory(model)],
    summary: [summary(model, context)],
    body: body.children as ElementContent[],
    conclusions: [conclusions(model, context)],
    assumptions: [assumptions(model, context)],
    references: [references(model)],
    software: [software(model, options.notePath, options.commit)],
    'sign-off': [signOff(model)],
    footer: [footer(model)],
  }
  decorateShell(slotsOfShell.elements, model)
  for (const [name, content] of Object.entries(sections)) fillSlot(slotsOfShell, name, content)
  fillSlot(slotsOfShell, 'contents', [contents(numberSections(shell))])
  return toHtml(shell, { allowDangerousHtml: true })
}

/**
 * The note's own headings sit among the package's sections: its top level
 * becomes h2; a leading heading that repeats the title (already on the cover) goes.
 */
function shiftHeadings(tree: Root, title: string): void {
  const first = tree.children.find((n) => n.type !== 'yaml')
  if (first?.type === 'heading' && mdastText(first).trim() === title.trim()) {
    tree.children.splice(tree.children.indexOf(first), 1)
  }
  let top = 6
  visit(tree, 'heading', (node) => {
    top = Math.min(top, node.depth)
  })
  const shift = 2 - top
  visit(tree, 'heading', (node) => {
    node.depth = Math.min(6, Math.max(1, node.depth + shift)) as 1 | 2 | 3 | 4 | 5 | 6
  })
}

function template(text: string): HastRoot {
  let parsed = templates.get(text)
  if (!parsed) {
    parsed = fromHtml(text)
    templates.set(text, parsed)
  }
  return parsed
}

/** Slots and the title and body elements of a shell, found in one pass. */
interface ShellSlots {
  readonly slots: Map<string, { slot: Element; parent: Element | HastRoot }>
  readonly elements: Element[]
}

function findSlots(shell: HastRoot): ShellSlots {
  const slots = new Map<string, { slot: Element; parent: Element | HastRoot }>()
  const elements: Element[] = []
  visit(shell, 'element', (node, _index, parent) => {
    if (node.tagName === 'lw-slot' && parent) slots.set(String(node.properties.name), { slot: node, parent })
    if (node.tagName === 'title' || node.tagName === 'body') elements.push(node)
  })
  return { slots, elements }
}

function decorateShell(elements: readonly Element[], model: NoteModel): void {
  for (const node of elements) {
    if (node.tagName === 'title') node.children = [{ type: 'text', value: `${model.meta.number} rev ${model.meta.revision} — ${model.meta.title}` }]
    if (node.tagName === 'body') {
      const classes = [`lw-status-${model.meta.status.replace(' ', '-')}`, `lw-paper-${model.meta.paper.toLowerCase()}`]
      node.properties.className = [...((node.properties.className as string[] | undefined) ?? []), ...classes]
      node.properties.dataStatus = statusWords(model.meta.status)
    }
  }
}

/** Replace a named slot of the shell with content. */
function fillSlot(shell: ShellSlots, name: string, content: ElementContent[]): void {
  const found = shell.slots.get(name)
  if (!found) return
  const index = found.parent.children.indexOf(found.slot)
  if (index >= 0) found.parent.children.splice(index, 1, ...(content as Element[]))
}

/** rehype-katex puts the parse error in `cause`; bring its words into the reason. */
function foldKatexCauses(file: VFile): void {
  for (const message of file.messages) {
    if (message.source === 'rehype-katex' && message.cause instanceof Error) {
      message.reason = `${message.reason}: ${message.cause.message}`
      message.message = message.reason
      message.cause = undefined
      message.fatal = true
    }
  }
}
