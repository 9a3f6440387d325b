/**
 * Section numbers and the table of contents: every h2 and h3 that is a child
 * or grandchild of <main> (the package's sections and the note's headings) gets
 * a number (3, 3.1 …) and an id; the contents list links to them.
 */
import type { Element, ElementContent, Root as HastRoot } from 'hast'
import { toString } from 'hast-util-to-string'
import { h } from 'hastscript'

/** A numbered heading. */
interface Numbered {
  readonly number: string
  readonly text: string
  readonly id: string
  readonly level: 2 | 3
}

/** Number the h2/h3 headings under <main>, in document order; returns them for the contents. */
export function numberSections(tree: HastRoot): Numbered[] {
  const main = findMain(tree)
  if (!main) return []
  const numbered: Numbered[] = []
  let major = 0
  let minor = 0
  const number = (node: Element): void => {
    if (node.tagName !== 'h2' && node.tagName !== 'h3') return
    if (node.tagName === 'h2') {
      major += 1
      minor = 0
    } else {
      if (major === 0) return
      minor += 1
    }
    const text = toString(node).trim()
    const label = node.tagName === 'h2' ? `${major}` : `${major}.${minor}`
    const id = `section-${label.replace('.', '-')}`
    node.properties.id = id
    node.properties.dataNumber = label
    node.children.unshift(h('span.lw-section-number', `${label} `))
    numbered.push({ number: label, text, id, level: node.tagName === 'h2' ? 2 : 3 })
  }
  // Headings sit directly in <main>'s sections and in the note's body: two levels are enough.
  for (const child of main.children) {
    if (child.type !== 'element') continue
    number(child)
    for (const grandchild of child.children) if (grandchild.type === 'element') number(grandchild)
  }
  return numbered
}

/** The table of contents of numbered headings. */
export function contents(headings: readonly Numbered[]): Element {
  const items: ElementContent[] = headings.map((heading) =>
    h(`li.lw-contents-h${heading.level}`, [
      h('a', { href: `#${heading.id}` }, [h('span.lw-contents-number', heading.number), h('span.lw-contents-text', heading.text)]),
      // Filled with the page number when the package is printed (the screen has no pages).
      h('span.lw-contents-page', { dataTarget: heading.id }, ''),
    ]),
  )
  return h('section.lw-contents', { id: 'contents', ariaLabel: 'Contents' }, [h('p.lw-contents-title', 'Contents'), h('ol', items)])
}

function findMain(tree: HastRoot | Element): Element | null {
  for (const child of tree.children) {
    if (child.type !== 'element') continue
    if (child.tagName === 'main') return child
    if (child.tagName === 'html' || child.tagName === 'body') {
      const found = findMain(child)
      if (found) return found
    }
  }
  return null
}
