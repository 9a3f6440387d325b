/**
 * Where a printed PDF put its named destinations: the page of each element id
 * the package links to (Chromium writes them into the catalogue's /Dests, one
 * plain object per page, no object streams). The contents list then gets its
 * page numbers from the PDF itself.
 */

/** The 1-based page of each named destination of a PDF printed by Chromium. */
export function destinationPages(pdf: Uint8Array): Map<string, number> {
  const text = Buffer.from(pdf).toString('latin1')
  const objects = new Map<number, string>()
  for (const match of text.matchAll(/(?:^|\n)(\d+) 0 obj\s*(<<[\s\S]*?>>)\s*(?:stream|endobj)/g)) objects.set(Number(match[1]), match[2]!)
  const catalog = [...objects.values()].find((body) => /\/Type\s*\/Catalog\b/.test(body))
  const pagesRef = catalog ? /\/Pages\s+(\d+)\s+0\s+R/.exec(catalog) : null
  const destsRef = catalog ? /\/Dests\s+(\d+)\s+0\s+R/.exec(catalog) : null
  const result = new Map<string, number>()
  if (!pagesRef || !destsRef) return result
  // Pages in order: the page tree walked depth first.
  const order: number[] = []
  const walk = (id: number, depth: number): void => {
    const body = objects.get(id)
    if (!body || depth > 32) return
    if (/\/Type\s*\/Pages\b/.test(body)) {
      const kids = /\/Kids\s*\[([^\]]*)\]/.exec(body)
      for (const kid of (kids?.[1] ?? '').matchAll(/(\d+)\s+0\s+R/g) ?? []) walk(Number(kid[1]), depth + 1)
    } else if (/\/Type\s*\/Page\b/.test(body)) order.push(id)
  }
  walk(Number(pagesRef[1]), 0)
  const dests = objects.get(Number(destsRef[1])) ?? ''
  for (const match of dests.matchAll(/\/([^\s/[\]<>()]+)\s*\[\s*(\d+)\s+0\s+R/g)) {
    const page = order.indexOf(Number(match[2]))
    if (page >= 0) result.set(decodeName(match[1]!), page + 1)
  }
  return result
}

/** A PDF name without its #xx escapes. */
function decodeName(name: string): string {
  return name.replace(/#([0-9a-fA-F]{2})/g, (_, hex: string) => String.fromCharCode(parseInt(hex, 16)))
}
