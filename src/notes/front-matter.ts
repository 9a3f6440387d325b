/**
 * Front matter: the package's identification, people, revision history,
 * references and display settings, read from YAML and checked field by field.
 */
import type { Position } from 'unist'
import type { VFile } from 'vfile'
import { LineCounter, isMap, parseDocument, visit, type Node as YamlNode, type Pair } from 'yaml'

/** Most alias expansions read in a front matter (yaml's own bound on repeated aliases). */
const MAX_ALIASES = 50
import { messages } from './messages.js'
import { KINDS, unitFitsKind, type QuantityKind } from './quantity.js'
import { reportError, reportWarning } from './report.js'
import type { DisplayUnits, NoteMeta, NoteStatus, Person, Revision } from './types.js'

const STATUSES: readonly NoteStatus[] = ['draft', 'for review', 'approved']
const DATE = /^\d{4}-\d{2}-\d{2}$/
const REFERENCE_KEY = /^[A-Za-z0-9][A-Za-z0-9_.:-]*$/

/** Settings when the front matter is missing or broken. */
export const emptyMeta: NoteMeta = {
  title: 'Untitled design note',
  number: '—',
  revision: '—',
  project: null,
  purpose: null,
  scope: null,
  exclusions: [],
  status: 'draft',
  date: null,
  paper: 'A4',
  units: { system: 'SI', overrides: {} },
  digits: 5,
  people: { prepared: null, checked: null, approved: null },
  revisions: [],
  references: new Map(),
}

/**
 * Read the front matter text (without the `---` lines).
 * @param firstLine line of the note where the YAML text starts
 */
export function readFrontMatter(text: string | null, firstLine: number, file: VFile): NoteMeta {
  if (text === null) {
    reportError(file, 'missing-front-matter', messages['missing-front-matter'](['title', 'number', 'revision', 'status']), {
      line: 1,
      column: 1,
    })
    return emptyMeta
  }
  const lineCounter = new LineCounter()
  const doc = parseDocument(text, { lineCounter, prettyErrors: false })
  const place = (node: YamlNode | null | undefined): Position | undefined => {
    if (!node?.range) return undefined
    const start = lineCounter.linePos(node.range[0])
    const end = lineCounter.linePos(node.range[1])
    return {
      start: { line: firstLine + start.line - 1, column: start.col },
      end: { line: firstLine + end.line - 1, column: end.col },
    }
  }
  if (doc.errors.length > 0) {
    for (const error of doc.errors) {
      const start = lineCounter.linePos(error.pos[0])
      reportError(file, 'front-matter-syntax', messages['front-matter-syntax'](error.message.replace(/ at line \d+, column \d+:?[\s\S]*$/, '')), {
        line: firstLine + start.line - 1,
        column: start.col,
      })
    }
    return emptyMeta
  }
  if (!isMap(doc.contents)) {
    reportError(file, 'front-matter-syntax', messages['front-matter-syntax']('expected `field: value` lines'), { line: firstLine, column: 1 })
    return emptyMeta
  }
  const pairs = new Map<string, Pair<YamlNode, YamlNode>>()
  for (const pair of doc.contents.items as Pair<YamlNode, YamlNode>[]) pairs.set(String((pair.key as { value?: unknown }).value), pair)
  let raw: Record<string, unknown>
  try {
    // Aliases may repeat a value a few times; an alias bomb is refused, not expanded.
    raw = (doc.toJS({ maxAliasCount: MAX_ALIASES }) ?? {}) as Record<string, unknown>
  } catch (error) {
    let first: YamlNode | null = null
    visit(doc, {
      Alias: (_, node) => {
        first ??= node as YamlNode
      },
    })
    const where = place(first)?.start ?? { line: firstLine, column: 1 }
    reportError(file, 'front-matter-syntax', messages['front-matter-syntax'](`its aliases (\`*name\`) expand too far (${error instanceof Error ? error.message : String(error)}); write the values out`), where)
    return emptyMeta
  }
  // A dotted field (`people.prepared.date`) is found through the maps; else its nearest parent; else the front matter's first line.
  const at = (field: string): Position => {
    const [head, ...rest] = field.split('.')
    let node: YamlNode | null | undefined = pairs.get(head!)?.value ?? pairs.get(head!)?.key
    for (const key of rest) {
      if (!isMap(node)) break
      const pair: Pair<YamlNode, YamlNode> | undefined = (node.items as Pair<YamlNode, YamlNode>[]).find((p) => String((p.key as { value?: unknown }).value) === key)
      if (!pair) break
      node = pair.value ?? pair.key
    }
    return place(node) ?? { start: { line: firstLine, column: 1 }, end: { line: firstLine, column: 1 } }
  }
  const bad = (field: string, detail: string): void => {
    reportError(file, 'front-matter-field', messages['front-matter-field'](field, detail), at(field))
  }
  const text_ = (field: string): string | null => {
    const value = raw[field]
    if (value === undefined || value === null || value === '') return null
    if (typeof value === 'string' || typeof value === 'number') return String(value).trim()
    bad(field, 'expected a line of text')
    return null
  }

  const missing = ['title', 'number', 'revision', 'status'].filter((f) => text_(f) === null)
  if (missing.length > 0) {
    reportError(file, 'missing-front-matter', messages['missing-front-matter'](missing), { line: firstLine, column: 1 })
  }
  let status: NoteStatus = 'draft'
  const statusText = text_('status')
  if (statusText !== null) {
    const normal = statusText.toLowerCase().replace(/[-_]/g, ' ')
    if ((STATUSES as readonly string[]).includes(normal)) status = normal as NoteStatus
    else bad('status', `expected one of ${STATUSES.map((s) => `\`${s}\``).join(', ')}, got \`${statusText}\``)
  }
  const date = readDate(text_('date'), 'date', bad, true)
  const paperText = text_('paper')
  let paper: 'A4' | 'Letter' = 'A4'
  if (paperText !== null) {
    if (/^a4$/i.test(paperText)) paper = 'A4'
    else if (/^(us )?letter$/i.test(paperText)) paper = 'Letter'
    else bad('paper', `expected \`A4\` or \`Letter\`, got \`${paperText}\``)
  }
  let digits = 5
  if (raw.digits !== undefined) {
    if (typeof raw.digits === 'number' && Number.isInteger(raw.digits) && raw.digits >= 2 && raw.digits <= 10) digits = raw.digits
    else bad('digits', 'expected a whole number of significant digits from 2 to 10')
  }
  const people = readPeople(raw.people, bad)
  // A signature date before approval would read as signed: the package shows the role as assigned only.
  if (status !== 'approved') {
    for (const role of ['checked', 'approved'] as const) {
      if (people[role]?.date) {
        const peopleNode = pairs.get('people')?.value
        const rolePair = isMap(peopleNode) ? (peopleNode.items as Pair<YamlNode, YamlNode>[]).find((p) => String((p.key as { value?: unknown }).value) === role) : undefined
        reportWarning(file, 'front-matter-field', messages['front-matter-field'](`people.${role}.date`, `the status is \`${status}\`, so the package shows ${people[role]!.name} as assigned to ${role === 'checked' ? 'check' : 'approve'}, not as having signed; the date is printed once the status is \`approved\``), place(rolePair?.key ?? null) ?? at('people'))
      }
    }
  }
  const revisions = readRevisions(raw.revisions, bad)
  const references = readReferences(raw.references, bad)
  const units = readUnits(raw.units, bad, (kind, unit) => reportError(file, 'display-unit', messages['display-unit'](KINDS[kind].words, unit), at(`units.${kind}`)))
  const known = new Set(['title', 'number', 'revision', 'project', 'purpose', 'scope', 'exclusions', 'status', 'date', 'paper', 'units', 'digits', 'people', 'revisions', 'references'])
  const exclusions: string[] = []
  if (raw.exclusions !== undefined && raw.exclusions !== null) {
    const list = Array.isArray(raw.exclusions) ? raw.exclusions : [raw.exclusions]
    for (const item of list) {
      if (typeof item === 'string' && item.trim() !== '') exclusions.push(item.trim())
      else bad('exclusions', 'expected a line of text or a list of them')
    }
  }
  for (const [field, pair] of pairs) {
    if (!known.has(field)) {
      reportWarning(file, 'front-matter-field', messages['front-matter-field'](field, `not a field linkwright reads; expected one of ${[...known].map((k) => `\`${k}\``).join(', ')}`), place(pair.key))
    }
  }
  return {
    title: text_('title') ?? emptyMeta.title,
    number: text_('number') ?? emptyMeta.number,
    revision: text_('revision') ?? emptyMeta.revision,
    project: text_('project'),
    purpose: text_('purpose'),
    scope: text_('scope'),
    exclusions,
    status,
    date,
    paper,
    units,
    digits,
    people,
    revisions,
    references,
  }
}

type Bad = (field: string, detail: string) => void

function readDate(value: unknown, field: string, bad: Bad, allowGit = false): string | null {
  if (value === undefined || value === null || value === '') return null
  const text = String(value).trim()
  if (allowGit && text === 'git') return 'git'
  if (DATE.test(text) && !Number.isNaN(Date.parse(text))) return text
  bad(field, `expected a date as YYYY-MM-DD${allowGit ? ' (or `git` for the last commit date of the note)' : ''}, got \`${text}\``)
  return null
}

function readPeople(value: unknown, bad: Bad): NoteMeta['people'] {
  const result: { prepared: Person | null; checked: Person | null; approved: Person | null } = {
    prepared: null,
    checked: null,
    approved: null,
  }
  if (value === undefined || value === null) return result
  if (typeof value !== 'object' || Array.isArray(value)) {
    bad('people', 'expected `prepared`, `checked` and `approved`, each a name or `{name, date}`')
    return result
  }
  for (const [role, entry] of Object.entries(value as Record<string, unknown>)) {
    if (role !== 'prepared' && role !== 'checked' && role !== 'approved') {
      bad('people', `expected the roles \`prepared\`, \`checked\` and \`approved\`, got \`${role}\``)
      continue
    }
    if (typeof entry === 'string') result[role] = { name: entry.trim(), date: null }
    else if (entry && typeof entry === 'object') {
      const { name, date } = entry as Record<string, unknown>
      // An empty name is a role not yet signed: its lines stay blank in the sign-off.
      if (name === undefined || name === null || name === '') continue
      if (typeof name !== 'string') bad('people', `expected a name for \`${role}\``)
      else result[role] = { name: name.trim(), date: readDate(date, `people.${role}.date`, bad) }
    } else if (entry !== null) bad('people', `expected a name or \`{name, date}\` for \`${role}\``)
  }
  if (result.prepared && result.checked && result.prepared.name === result.checked.name) {
    bad('people', `the checker must be someone other than the preparer (both are ${result.prepared.name})`)
  }
  return result
}

function readRevisions(value: unknown, bad: Bad): Revision[] {
  if (value === undefined || value === null) return []
  if (!Array.isArray(value)) {
    bad('revisions', 'expected a list of `{revision, date, description}`')
    return []
  }
  const list: Revision[] = []
  for (const item of value) {
    const { revision, date, description } = (item ?? {}) as Record<string, unknown>
    if (revision === undefined || description === undefined) {
      bad('revisions', 'expected each revision to have `revision`, `date` and `description`')
      continue
    }
    list.push({ revision: String(revision), date: readDate(date, 'revisions', bad) ?? '', description: String(description) })
  }
  return list
}

function readReferences(value: unknown, bad: Bad): Map<string, string> {
  const map = new Map<string, string>()
  if (value === undefined || value === null) return map
  if (typeof value !== 'object' || Array.isArray(value)) {
    bad('references', 'expected `key: full citation` lines')
    return map
  }
  for (const [key, citation] of Object.entries(value as Record<string, unknown>)) {
    if (!REFERENCE_KEY.test(key)) bad('references', `expected a key of letters, digits and - _ . :, got \`${key}\``)
    else if (typeof citation !== 'string' || citation.trim() === '') bad('references', `expected a full citation for \`${key}\``)
    else map.set(key, citation.trim())
  }
  return map
}

function readUnits(value: unknown, bad: Bad, badUnit: (kind: QuantityKind, unit: string) => void): DisplayUnits {
  if (value === undefined || value === null) return { system: 'SI', overrides: {} }
  if (typeof value === 'string') {
    if (value === 'SI' || value === 'US') return { system: value, overrides: {} }
    bad('units', `expected \`SI\` or \`US\`, got \`${value}\``)
    return { system: 'SI', overrides: {} }
  }
  if (typeof value !== 'object' || Array.isArray(value)) {
    bad('units', 'expected `SI`, `US`, or `{system, <quantity>: <unit>}`')
    return { system: 'SI', overrides: {} }
  }
  const fields = value as Record<string, unknown>
  let system: 'SI' | 'US' = 'SI'
  if (fields.system !== undefined) {
    if (fields.system === 'SI' || fields.system === 'US') system = fields.system
    else bad('units', `expected \`system: SI\` or \`system: US\`, got \`${String(fields.system)}\``)
  }
  const overrides: Partial<Record<QuantityKind, string>> = {}
  for (const [kind, unit] of Object.entries(fields)) {
    if (kind === 'system') continue
    if (!(kind in KINDS) || KINDS[kind as QuantityKind].si === '') {
      bad('units', `expected a quantity among ${Object.keys(KINDS).filter((k) => KINDS[k as QuantityKind].si !== '').map((k) => `\`${k}\``).join(', ')}, got \`${kind}\``)
      continue
    }
    if (typeof unit !== 'string' || !unitFitsKind(unit, kind as QuantityKind)) {
      badUnit(kind as QuantityKind, String(unit))
      continue
    }
    overrides[kind as QuantityKind] = unit
  }
  return { system, overrides }
}
