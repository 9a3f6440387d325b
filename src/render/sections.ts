/**
 * The package's own sections around the note's body: cover, scope and caution,
 * revision history, summary, conclusions, assumptions, references, calculation
 * software and sign-off.
 */
import type { Element, ElementContent } from 'hast'
import { h } from 'hastscript'
import type { ChangeRow, ChangesSince } from './package.js'
import { CAUTION } from '../notes/caution.js'
import { extremesValues } from '../notes/block-kinds/extremes.js'
import type { Topic } from '../notes/block-kinds/kind.js'
import { displayValue } from '../notes/display.js'
import type { NoteModel } from '../notes/note.js'
import { TEST_COUNT, VERIFICATION } from '../verification.js'
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

/**
 * A person in a role as the package may show them: the preparer as written; the
 * checker and approver with their dates only once the status is approved — before
 * that they are assigned, not signed.
 */
export function signedPerson(model: NoteModel, role: 'prepared' | 'checked' | 'approved'): { name: string; date: string | null; signed: boolean } | null {
  const person = model.meta.people[role]
  if (!person) return null
  const signed = role === 'prepared' || model.meta.status === 'approved'
  return { name: person.name, date: signed ? person.date : null, signed }
}

/** Cover: identification of the package, and where its caution is. */
export function cover(model: NoteModel, date: string | null): Element {
  const { meta } = model
  const row = (label: string, value: string | null, wide = false) =>
    value ? h(`div.lw-cover-row${wide ? '.lw-cover-wide' : ''}`, [h('dt', label), h('dd', value)]) : null
  const personLine = (role: 'prepared' | 'checked' | 'approved'): string | null => {
    const p = signedPerson(model, role)
    if (!p) return null
    if (!p.signed) return `${p.name} (assigned; not yet signed)`
    return p.date ? `${p.name}, ${p.date}` : p.name
  }
  return h('header.lw-cover', { id: 'cover' }, [
    h('p.lw-cover-kind', 'Linkage design calculation'),
    h('h1.lw-title', meta.title),
    h('dl.lw-cover-fields', [
      row('Document', meta.number),
      row('Revision', meta.revision),
      row('Project', meta.project),
      row('Status', statusWords(meta.status)),
      row('Date', date),
      row('Prepared by', personLine('prepared')),
      row('Checked by', personLine('checked') ?? '—'),
      row('Approved by', personLine('approved') ?? '—'),
      row('Purpose', meta.purpose, true),
    ]),
    h('p.lw-cover-caution', [h('strong', 'Caution. '), 'These results are for checking by a qualified engineer; read the caution under ', h('a', { href: '#scope' }, 'Scope and caution'), ' before using any of them.']),
    h('p.lw-status-banner', { className: [`lw-status-${meta.status.replace(' ', '-')}`] }, statusWords(meta.status)),
  ])
}

/** What each topic means when a package covers it, and the exclusion when it does not. */
const TOPICS: readonly { topic: Topic; covered: string; excluded: string }[] = [
  { topic: 'kinematics', covered: 'kinematics: positions, dead centres and toggles, stroke or swing, time ratio, transmission angle, velocities and accelerations over the cycle', excluded: 'Kinematics: not calculated.' },
  { topic: 'synthesis', covered: 'synthesis of link lengths for the stated requirements', excluded: '' },
  { topic: 'forces', covered: 'forces, crank torque and drive power from the stated loads and masses', excluded: 'Forces, crank torque, drive power and motor size.' },
  { topic: 'flywheel', covered: 'the flywheel for a stated speed fluctuation', excluded: 'Flywheel sizing and speed fluctuation.' },
  { topic: 'buckling', covered: 'the connecting rod as a column (buckling)', excluded: 'Buckling of the connecting rod.' },
  { topic: 'bearings', covered: 'pin bearing pressure, sliding speed and pV', excluded: 'Pin bearing pressures and pV.' },
  { topic: 'tolerances', covered: 'the effect of the stated tolerances', excluded: 'The effect of manufacturing tolerances.' },
  { topic: 'clearances', covered: 'the effect of pin clearances', excluded: 'Pin clearances and wear.' },
  { topic: 'study', covered: 'parameter studies over the stated ranges', excluded: '' },
]

/** Left out of every package: what the tool does not calculate at all. */
const ALWAYS_EXCLUDED = [
  'Stresses in the parts and their fatigue life; elastic deflection, vibration and the dynamics of the drive train.',
  'Lubrication, heating and wear.',
  'Guarding, safety functions and the machine’s risk assessment.',
  'Compliance with any code or standard: none is claimed.',
]

/** Scope and caution: what the package covers and leaves out, and the safety caution. */
export function scope(model: NoteModel): Element {
  const covered = new Set(model.outcomes.flatMap((o) => o?.covers ?? []))
  const linkages = model.blocks.flatMap((b) => {
    const o = model.outcomes[b.index]
    return o?.covers.includes('kinematics') ? [`#${b.id} (${o.kindLabel.toLowerCase()})`] : []
  })
  const topics = TOPICS.filter((t) => covered.has(t.topic)).map((t) => t.covered)
  const exclusions = [...model.meta.exclusions, ...TOPICS.filter((t) => !covered.has(t.topic) && t.excluded).map((t) => t.excluded), ...ALWAYS_EXCLUDED]
  const checks = tallyChecks(model.checks)
  return h('section.lw-section', { id: 'scope' }, [
    h('h2', 'Scope and caution'),
    model.meta.scope ? h('p', model.meta.scope) : null,
    h('p', [
      linkages.length > 0 ? `This package calculates, for ${linkages.join(', ')}: ` : 'This package calculates: ',
      topics.length > 0 ? topics.join('; ') : 'no linkage',
      checks.gate.total + checks.informative.total > 0 ? `; and compares the results with ${checks.gate.total + checks.informative.total} acceptance checks.` : '.',
    ]),
    h('p.lw-part-title', 'Not covered'),
    h('ul.lw-exclusions', exclusions.map((e) => h('li', e))),
    h('div.lw-caution', { id: 'caution', role: 'note' }, [h('p.lw-caution-title', 'Caution'), h('p', CAUTION)]),
  ])
}

/** Revision history table. */
export function revisionHistory(model: NoteModel): Element {
  const { revisions, revision } = model.meta
  return h('section.lw-section', { id: 'revisions' }, [
    h('h2', 'Revision history'),
    revisions.length === 0
      ? h('p', `Revision ${revision}: no history given in the front matter.`)
      : table('lw-revisions', null, ['Revision', 'Date', 'Description'], revisions.map((r) => [r.revision, h('span.lw-date', r.date), r.description])),
  ])
}

/** What moved since the revision compared with: one row each, the changed rows of the blocks marked Δ. */
export function changesSince(changes: ChangesSince): Element {
  const words: Record<ChangeRow['what'], string> = { note: 'note', data: 'data file', tool: 'program', block: 'block', input: 'input', result: 'result', check: 'check' }
  const rows = changes.rows.filter((r) => r.what !== 'note' && r.what !== 'tool')
  return h('section.lw-section.lw-changes', { id: 'changes' }, [
    h('h2', `Changes since revision ${changes.revision}`),
    h('p', rows.length === 0
      ? 'Nothing the package states moved since that revision (the note’s text may differ in words).'
      : `${rows.length} change${rows.length === 1 ? '' : 's'} to review; the inputs and results that changed are marked Δ in their blocks.`),
    rows.length === 0
      ? null
      : table(
          'lw-changes-table',
          null,
          ['What', 'Name', 'Was', 'Is', 'Change'],
          rows.map((r) => [
            words[r.what],
            h('code', r.what === 'block' ? `#${r.name}` : r.name),
            r.from ?? (r.what === 'block' ? '' : 'new'),
            r.to ?? (r.what === 'block' ? 'removed' : 'gone'),
            r.relative !== undefined ? `${r.relative >= 0 ? '+' : '−'}${Math.abs(r.relative * 100).toPrecision(3)} %` : r.what === 'block' && r.from === null ? `added (${r.to})` : '',
          ]),
        ),
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
  const errored = model.outcomes.some((o) => o === null)
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

/**
 * Conclusions: what the checks show, the note's own conclusions and
 * recommendation, and the items still open (assumptions to verify, checks not
 * evaluated, the engineering warnings raised).
 */
export function conclusions(model: NoteModel, context: RenderContext): Element {
  const tally = tallyChecks(model.checks)
  const words = tallyWords(tally)
  const failing = failuresFirst(model.checks).filter((c) => !c.informative && c.status !== 'pass')
  const toVerify = model.assumptions.filter((a) => a.verify)
  const warnings = model.blocks.flatMap((b) => (model.outcomes[b.index]?.warnings ?? []).map((w) => ({ block: b, text: w })))
  const open: ElementContent[] = [
    ...toVerify.map((a) => h('li', [`Assumption ${context.assumptionNumbers.get(a.text) ?? ''} is to be verified: `, ...withCitations(a.text, context.references)])),
    ...failing.filter((c) => c.status === 'not-evaluated').map((c) => h('li', `The check “${c.label}” could not be evaluated: ${c.reason ?? 'see the messages'}.`)),
    ...warnings.map((w) => h('li', [h('a', { href: `#${blockAnchor(w.block)}` }, `#${w.block.id ?? w.block.kind}`), `: ${w.text}.`])),
  ]
  return h('section.lw-section', { id: 'conclusions' }, [
    h('h2', 'Conclusions'),
    h('p', [
      h('strong', tally.gate.total === 0 ? 'No acceptance checks are stated. ' : tally.gatePasses ? 'The acceptance checks pass. ' : 'The acceptance checks do not all pass. '),
      tally.gate.total + tally.informative.total > 0 ? `${words.charAt(0).toUpperCase()}${words.slice(1)}.` : '',
    ]),
    failing.length > 0
      ? h('ul', failing.map((c) => h('li', c.status === 'fail' ? `FAIL: ${c.label}: ${c.actual}, limit ${c.limit}.` : `NOT EVALUATED: ${c.label}.`)))
      : null,
    h('p.lw-part-title', 'Conclusions and recommendation of the note'),
    model.conclusions.length > 0
      ? h('ol.lw-conclusions', model.conclusions.map((c) => h('li', withCitations(c.text, context.references))))
      : h('p.lw-missing-source', 'The note states no conclusion or recommendation (a `conclusions` block gives them).'),
    h('p.lw-part-title', 'Open items'),
    open.length > 0 ? h('ul.lw-open-items', open) : h('p', 'None: no assumption awaits verification, every check was evaluated and no warning was raised.'),
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
      model.tool.build ? h('div', [h('dt', 'Build'), h('dd', [h('code', model.tool.build.slice(0, 16)), ' — sha-256 of the program’s code and templates as run, part of the fingerprint'])]) : null,
      h('div', [h('dt', 'Source revision'), h('dd', h('code', commit))]),
      h('div', [h('dt', 'Input'), h('dd', h('code', notePath))]),
      model.dataFiles.length > 0
        ? h('div', [
            h('dt', 'Data files'),
            h('dd', model.dataFiles.flatMap((f, i) => [...(i > 0 ? [h('br')] : []), h('code', f.path), ` — sha-256 ${f.sha256.slice(0, 16)}…, part of the fingerprint`])),
          ])
        : null,
      h('div', [h('dt', 'Outputs'), h('dd', 'this package (HTML, PDF) and results.json beside it')]),
      h('div', [
        h('dt', 'Verification'),
        h('dd', [
          h('p', `${TEST_COUNT === null ? 'The program’s test suite' : `The program’s test suite (${TEST_COUNT} test cases at this source revision)`} checks the calculation core against these outside sources, each marked with how well it is known; the program’s README lists them with their tests:`),
          h(
            'ul.lw-verification',
            VERIFICATION.map((v) => h('li', [v.what, ' — ', v.source, h('span.lw-standing', ` (${v.standing})`)])),
          ),
        ]),
      ]),
    ]),
  ])
}

/** Sign-off: roles with name, date and signature lines, the checker's checklist and the fingerprint. */
export function signOff(model: NoteModel): Element {
  // Until the status is approved the checker and approver are assigned, not signed: no dates.
  const role = (label: string, key: 'prepared' | 'checked' | 'approved') => {
    const person = signedPerson(model, key)
    return h('tr', [
      h('th', { scope: 'row' }, label),
      h('td', person ? (person.signed ? person.name : `${person.name} (assigned)`) : ''),
      h('td.lw-date', person?.date ?? ''),
      h('td.lw-signature', { ariaLabel: `signature of the person who ${label.toLowerCase()}` }, ''),
    ])
  }
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
      h('tbody', [role('Prepared', 'prepared'), role('Checked', 'checked'), role('Approved', 'approved')]),
    ]),
    h('p.lw-part-title', 'Checker’s checklist'),
    h('ul.lw-checklist', checklist.map((item) => h('li', [h('span.lw-box', { ariaHidden: 'true' }, '☐ '), item]))),
    h('p.lw-fingerprint', [
      'Fingerprint ',
      h('code', { title: model.fingerprint }, shortFingerprint(model.fingerprint)),
      ` — sha-256 of the note${model.dataFiles.length > 0 ? ', the data files it reads' : ''} and ${model.tool.name} ${model.tool.version}${model.tool.build ? ` (build ${model.tool.build.slice(0, 12)}: its code and templates)` : ''}; full value `,
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
