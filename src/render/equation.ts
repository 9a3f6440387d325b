/**
 * Math typeset at build time with KaTeX, as trusted raw HTML of our own (the
 * TeX comes from the block kinds, never from the note's raw HTML). Renders are
 * cached by content: the same formula appears in many packages.
 */
import katex from 'katex'
import type { Raw } from 'mdast-util-to-hast'

const cache = new Map<string, string>()
const CACHE_LIMIT = 5000

/** KaTeX HTML for a TeX string; display mode centres it on its own line. */
export function renderTex(tex: string, display: boolean): string {
  const key = `${display ? 'D' : 'I'}${tex}`
  let html = cache.get(key)
  if (html === undefined) {
    html = katex.renderToString(tex, {
      displayMode: display,
      throwOnError: false,
      output: 'htmlAndMathml',
      // Our own TeX: unusual constructs are fine, nothing goes to the console.
      strict: () => 'ignore',
    })
    if (cache.size >= CACHE_LIMIT) cache.clear()
    cache.set(key, html)
  }
  return html
}

/** The same as a hast raw node, to be serialised as it is. */
export function texNode(tex: string, display: boolean): Raw {
  return { type: 'raw', value: renderTex(tex, display) }
}
