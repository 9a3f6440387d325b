/**
 * The package's own sections around the note's body: cover, revision history,
 * summary, assumptions, references, calculation software, caution and sign-off.
 */
import type { Element } from 'hast'
import { h } from 'hastscript'
import { CAUTION } from '../notes/caution.js'
import { extremesValues } from '../notes/block-kinds/extremes.js'
import { displayValue } from '../notes/display.js'
import type { NoteModel } from '../notes/note.js'
import type { Person } from '../notes/types.js'
import { blockAnchor, type RenderContext } from './block.js'
import { failuresFirst, tallyChecks, tallyWords } from '../notes/tally.js'
import { checkRowClass, table, verdict, withCitations } from './markup.js'

/** Status in words for the cover and every page. */
export function statusWords(status: NoteModel['meta']['status']): string {
  return status === 'draft' ? 'DRAFT' : status === 'for review' ? 'FOR REVIEW' : 'APPROVED'
}

/** Fingerprint as printed: the first 16 hex digits in groups of four. */
export function shortFingerprint(fingerprint: string): string {
  return fingerprint.slice(0, 16).replace(/(.{4})(?=.)/g, '$1 ')
}

/** Cover: identification of the package. */
export function cover(model: NoteModel, date: string | null): Element {
  const { meta } = model
  const row = (label: string, value: string | null, wide = false) =>
    value ? h(`div.lw-cover-row${wide ? '.lw-cover-wide' : ''}`, [h('dt', label), h('dd', value)]) : null
  return h('header.lw-cover', { id: 'cover' }, [
    h('p.lw-cover-kind', 'Linkage design calculation'),
    h('h1.lw-title', meta.title),
    h('dl.lw-cover-fields', [
      row('Document', meta.number),
      row('Revision', meta.revision),
      row('Project', meta.project),
      row('Status', statusWords(meta.status)),
      row('Date', date),
      row('Prepared by', personLine(meta.people.prepared)),
      row('Checked by', personLine(meta.people.checked)),
      row('Approved by', personLine(meta.people.approved) ?? '—'),
      row('Purpose', meta.purpose, true),
    ]),
    h('p.lw-status-banner', { className: [`lw-status-${meta.status.replace(' ', '-')}`] }, statusWords(meta.status)),
  ])
}

function personLine(person: Person | null): string | null {
  if (!person) return null
  return person.date ? `${person.name}, ${person.date}` : person.name
}

/** Revision history table. */
export function revisionHistory(model: NoteModel): Element {
  const { revisions, revision } = model.meta
  return h('section.lw-section', { id: 'revisions' }, [
    h('h2', 'Revision history'),
    revisions.length === 0
      ? h('p', `Revision ${revision}: no history given in the front matter.`)
      : table('lw-revisions', null, ['Revision', 'Date', 'Description'], revisions.map((r) => [r.revision, r.date, r.description])),
  ])
}

/** Summary: key results of each linkage block, then every check with failures first. */
export function summary(model: NoteModel, context: RenderContext): Element {
  const { meta } = model
  const rows: (string | Element)[][] = []
  for (const block of model.blocks) {
    const outcome = model.outcomes[block.index]
    if (!outcome) continue
    for (const name of outcome.summary) {
      const result = [...outcome.results, ...extremesValues(outcome.extremes), ...outcome.inputs].find((r) => r.name === name)
      if (!result) continue
      const shown = displayValue(result.value, meta.units, meta.digits)
      rows.push([h('a', { href: `#${blockAnchor(block)}` }, `#${block.id}`), result.label, h('span.lw-number', shown.number), shown.label])
    }
  }
  const checks = failuresFirst(model.checks)
  const tally = tallyChecks(model.checks)
  const errored = model.outcomes.some((o, i) => o === null && model.blocks[i]!.kind !== 'assumptions')
  const words = tallyWords(tally)
  return h('section.lw-section', { id: 'summary' }, [
    h('h2', 'Summary'),
    h('p.lw-check-count', [
      tally.gate.total === 0 && tally.informative.total === 0
        ? 'No acceptance checks are stated in this note.'
        : `${words.charAt(0).toUpperCase()}${words.slice(1)}.`,
      errored ? ' Some blocks have errors and are not evaluated.' : '',
    ]),
    checks.length > 0
      ? table(
          'lw-summary-checks',
          'Acceptance checks (failures first, informative checks last)',
          ['Result', 'Check', 'Value', 'Limit', 'Source'],
          checks.map((c) => [verdict(c), c.label, h('span.lw-number', c.actual), h('span.lw-limit', c.limit), c.source ? withCitations(c.source, context.references) : '—']),
          (i) => checkRowClass(checks[i]!),
        )
      : null,
    rows.length > 0 ? table('lw-key-results', 'Key results', ['Block', 'Result', 'Value', 'Unit'], rows) : null,
  ])
}

/** Assumptions gathered from the note and from each block's method, numbered A1, A2 …. */
export function assumptions(model: NoteModel, context: RenderContext): Element {
  return h('section.lw-section', { id: 'assumptions' }, [
    h('h2', 'Assumptions'),
    model.assumptions.length === 0
      ? h('p', 'None stated.')
      : table(
          'lw-assumptions',
          null,
          ['No.', 'Assumption', 'Stated by', 'Status'],
          model.assumptions.map((a) => [
            context.assumptionNumbers.get(a.text) ?? '',
            withCitations(a.text, context.references),
            a.from ? `method of ${a.from.split(', ').map((f) => `#${f}`).join(', ')}` : 'the note',
            a.verify ? h('strong.lw-verify', 'to be verified') : 'stated',
          ]),
        ),
  ])
}

/** Numbered references: every citation used, the note's own and the tool's method references. */
export function references(model: NoteModel): Element {
  return h('section.lw-section', { id: 'references' }, [
    h('h2', 'References'),
    model.references.length === 0
      ? h('p', 'No references are cited.')
      : h(
          'ol.lw-references',
          model.references.map((r) =>
            h('li', { id: `ref-${r.key}` }, [h('span.lw-ref-number', `[${r.number}] `), r.citation, r.builtin ? h('span.lw-ref-origin', ' (cited by the method)') : null]),
          ),
        ),
  ])
}

/** Identification of the calculation software, as design-control practice asks. */
export function software(model: NoteModel, notePath: string, commit: string): Element {
  return h('section.lw-section', { id: 'software' }, [
    h('h2', 'Calculation software'),
    h('dl.lw-software', [
      h('div', [h('dt', 'Program'), h('dd', `${model.tool.name} ${model.tool.version}`)]),
      h('div', [h('dt', 'Source revision'), h('dd', h('code', commit))]),
      h('div', [h('dt', 'Input'), h('dd', h('code', notePath))]),
      h('div', [h('dt', 'Outputs'), h('dd', 'this package (HTML, PDF) and results.json beside it')]),
      h('div', [
        h('dt', 'Verification'),
        h(
          'dd',
          'The linkage core is checked by the program’s test suite against published worked examples, handbook formulas, an independent symbolic differentiation and invariants over thousands of random linkages; the checks and their sources are listed with the program.',
        ),
      ]),
    ]),
  ])
}

/** The safety caution every package carries. */
export function caution(): Element {
  return h('section.lw-section.lw-caution', { id: 'caution', role: 'note' }, [h('h2', 'Caution'), h('p', CAUTION)])
}

/** Sign-off: roles with name, date and signature lines, the checker's checklist and the fingerprint. */
export function signOff(model: NoteModel): Element {
  const { people } = model.meta
  const role = (label: string, person: Person | null) =>
    h('tr', [
      h('th', { scope: 'row' }, label),
      h('td', person?.name ?? ''),
      h('td', person?.date ?? ''),
      h('td.lw-signature', { ariaLabel: `signature of the person who ${label.toLowerCase()}` }, ''),
    ])
  const checklist = [
    'Inputs verified against their stated sources',
    'Method appropriate for the mechanism and its duty',
    'Results reasonable (orders of magnitude, signs, extremes)',
    'Acceptance checks reviewed, including every FAIL',
    'Assumptions to be verified are tracked',
  ]
  return h('section.lw-section.lw-sign-off', { id: 'sign-off' }, [
    h('h2', 'Sign-off'),
    h('table.lw-table.lw-roles', [
      h('thead', h('tr', [h('th', { scope: 'col' }, 'Role'), h('th', { scope: 'col' }, 'Name'), h('th', { scope: 'col' }, 'Date'), h('th', { scope: 'col' }, 'Signature')])),
      h('tbody', [role('Prepared', people.prepared), role('Checked', people.checked), role('Approved', people.approved)]),
    ]),
    h('p.lw-part-title', 'Checker’s checklist'),
    h('ul.lw-checklist', checklist.map((item) => h('li', [h('span.lw-box', { ariaHidden: 'true' }, '☐ '), item]))),
    h('p.lw-fingerprint', [
      'Fingerprint ',
      h('code', { title: model.fingerprint }, shortFingerprint(model.fingerprint)),
      ` — sha-256 of the note and ${model.tool.name} ${model.tool.version}; full value `,
      h('code.lw-fingerprint-full', model.fingerprint),
      '. A signature applies only to the package with this fingerprint.',
    ]),
  ])
}

/** Footer line printed on screen (the PDF has its own page footer). */
export function footer(model: NoteModel): Element {
  return h('footer.lw-footer', [
    `${model.meta.number} rev ${model.meta.revision} · ${statusWords(model.meta.status)} · fingerprint `,
    h('code', shortFingerprint(model.fingerprint)),
    ` · ${model.tool.name} ${model.tool.version}`,
  ])
}
