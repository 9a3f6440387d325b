/**
 * The package site: one static index page of every package in an output
 * folder (title, number, revision, status, checks in words, links to the HTML,
 * the PDF and results.json) with a filter by text and by status. Self-contained
 * (its style and its few lines of script inline), so it works from disk and
 * from any static server; it loads nothing.
 */
import { h } from 'hastscript'
import { toHtml } from 'hast-util-to-html'

/** One package as the index lists it. */
export interface SiteEntry {
  /** Folder relative to the index, `/`-separated. */
  readonly folder: string
  readonly title: string
  readonly number: string
  readonly revision: string
  /** draft, for review, approved */
  readonly status: string
  readonly checks: { readonly passed: number; readonly failed: number; readonly notEvaluated: number; readonly informative: number; readonly informativeFailed: number }
  /** Labels of the gate checks that FAIL or cannot be evaluated. */
  readonly failing: readonly string[]
  /** The PDF's file name in the folder, or null. */
  readonly pdf: string | null
}

/** Marks the page as linkwright's, so a build replaces only an index it wrote. */
export const SITE_GENERATOR = 'linkwright package index'

const STYLE = `
body { font-family: "DejaVu Sans", "Liberation Sans", Arial, sans-serif; color: #1c2226; margin: 2em auto; max-width: 70em; padding: 0 1em; }
h1 { font-size: 1.4em; border-bottom: 2px solid #0b5563; padding-bottom: 0.2em; }
table { border-collapse: collapse; width: 100%; font-size: 0.92em; }
th, td { border-bottom: 1px solid #9aa5ad; padding: 0.35em 0.5em; text-align: left; vertical-align: top; }
th { background: #eef1f3; }
td.n { font-variant-numeric: tabular-nums; white-space: nowrap; }
.fail { color: #a11d21; font-weight: bold; }
.pass { color: #1d6b2f; }
.filters { margin: 0.8em 0; display: flex; gap: 1em; align-items: center; }
.caution { font-size: 0.85em; color: #4d5962; }
a { color: #0b5563; }
`

// Our own script, not a note's: show the rows whose text and status match.
const SCRIPT = `
const text = document.getElementById('filter-text');
const status = document.getElementById('filter-status');
const rows = [...document.querySelectorAll('tbody tr')];
const count = document.getElementById('shown');
function apply() {
  const words = text.value.trim().toLowerCase();
  let shown = 0;
  for (const row of rows) {
    const ok = (!words || row.textContent.toLowerCase().includes(words)) && (!status.value || row.dataset.status === status.value);
    row.hidden = !ok;
    if (ok) shown++;
  }
  count.textContent = String(shown);
}
text.addEventListener('input', apply);
status.addEventListener('change', apply);
`

function checksWords(e: SiteEntry): string {
  const total = e.checks.passed + e.checks.failed + e.checks.notEvaluated
  if (total === 0 && e.checks.informative === 0) return 'no acceptance checks'
  const parts = [`${e.checks.passed} of ${total} pass`]
  if (e.checks.failed > 0) parts.push(`${e.checks.failed} FAIL`)
  if (e.checks.notEvaluated > 0) parts.push(`${e.checks.notEvaluated} not evaluated`)
  if (e.checks.informative > 0) parts.push(`${e.checks.informative} informative${e.checks.informativeFailed > 0 ? ` (${e.checks.informativeFailed} FAIL, not part of the gate)` : ''}`)
  return parts.join(', ')
}

/** The index page. */
export function sitePage(entries: readonly SiteEntry[], caution: string): string {
  const sorted = [...entries].sort((a, b) => a.number.localeCompare(b.number) || a.folder.localeCompare(b.folder))
  const failing = sorted.filter((e) => e.failing.length > 0).length
  const statuses = [...new Set(sorted.map((e) => e.status))].sort()
  const page = h('html', { lang: 'en' }, [
    h('head', [
      h('meta', { charset: 'utf-8' }),
      h('meta', { name: 'generator', content: SITE_GENERATOR }),
      h('meta', { name: 'viewport', content: 'width=device-width, initial-scale=1' }),
      h('title', 'Calculation packages'),
      h('style', STYLE),
    ]),
    h('body', [
      h('h1', 'Calculation packages'),
      h('p', [
        `${sorted.length} package${sorted.length === 1 ? '' : 's'}; `,
        failing === 0 ? 'every gate check passes.' : h('span.fail', `${failing} with a gate check that fails or cannot be evaluated.`),
      ]),
      h('div.filters', [
        h('label', ['Filter ', h('input#filter-text', { type: 'search', placeholder: 'title, number, check…' })]),
        h('label', ['Status ', h('select#filter-status', [h('option', { value: '' }, 'any'), ...statuses.map((s) => h('option', { value: s }, s))])]),
        h('span', ['shown: ', h('span#shown', String(sorted.length))]),
      ]),
      h('table', [
        h('thead', h('tr', ['Number', 'Rev', 'Title', 'Status', 'Checks', 'Files'].map((c) => h('th', { scope: 'col' }, c)))),
        h(
          'tbody',
          sorted.map((e) =>
            h('tr', { dataStatus: e.status }, [
              h('td.n', e.number),
              h('td.n', e.revision),
              h('td', h('a', { href: `${e.folder}/index.html` }, e.title)),
              h('td', e.status),
              h('td', [
                h(e.failing.length > 0 ? 'span.fail' : 'span.pass', checksWords(e)),
                e.failing.length > 0 ? h('div', `failing: ${e.failing.join('; ')}`) : null,
              ]),
              h('td', [
                h('a', { href: `${e.folder}/index.html` }, 'HTML'),
                e.pdf ? [' · ', h('a', { href: `${e.folder}/${e.pdf}` }, 'PDF')] : null,
                ' · ',
                h('a', { href: `${e.folder}/results.json` }, 'results.json'),
              ]),
            ]),
          ),
        ),
      ]),
      h('p.caution', caution),
      h('script', SCRIPT),
    ]),
  ])
  return `<!doctype html>\n${toHtml(page)}\n`
}
