/**
 * Section numbers and the table of contents: every h2 and h3 inside <main>
 * gets a number (3, 3.1 …) and an id; the contents list links to them.
 */
import type { Element, Root as HastRoot } from 'hast'
import { toString } from 'hast-util-to-string'
import { h } from 'hastscript'
import { visit } from 'unist-util-visit'

const NUMBERED = new Set(['h2', 'h3'])

/** Number the h2/h3 headings inside <main> in document order. */
export function numberSections(tree: HastRoot): void {
  let main: Element | null = null
  visit(tree, 'element', (node) => {
    if (node.tagName === 'main') main = node
  })
  if (!main) return
  const counters = [0, 0]
  visit(main as Element, 'element', (node) => {
    if (!NUMBERED.has(node.tagName)) return
    const level = node.tagName === 'h2' ? 0 : 1
    if (level === 0) {
      counters[0]! += 1
      counters[1] = 0
    } else {
      if (counters[0] === 0) return
      counters[1]! += 1
    }
    const number = level === 0 ? `${counters[0]}` : `${counters[0]}.${counters[1]}`
    node.properties.dataNumber = number
    node.properties.id = `section-${number.replace('.', '-')}`
    node.children.unshift(h('span.lw-section-number', `${number} `))
  })
}

/** The table of contents of numbered headings. */
export function contents(tree: HastRoot): Element {
  const items: Element[] = []
  visit(tree, 'element', (node) => {
    if (!NUMBERED.has(node.tagName) || node.properties.dataNumber === undefined) return
    const number = String(node.properties.dataNumber)
    const text = toString(node).replace(/^\S+\s+/, '').trim()
    items.push(
      h(`li.lw-contents-${node.tagName}`, [h('a', { href: `#${String(node.properties.id)}` }, [h('span.lw-contents-number', number), h('span.lw-contents-text', text)])]),
    )
  })
  return h('section.lw-contents', { id: 'contents', ariaLabel: 'Contents' }, [h('p.lw-contents-title', 'Contents'), h('ol', items)])
}
