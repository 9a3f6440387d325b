/**
 * What differs between two results documents of one note (results.json, or
 * one computed now): the note, its data files, the tool, inputs (from → to, as
 * shown), results (as shown, with the relative change in SI), checks whose
 * status changed, and blocks added or removed. Shared by `verify` and
 * `compare`, for the terminal and as JSON.
 */

/** The parts of a results document the comparison reads. */
export interface ResultsDoc {
  fingerprint?: string
  noteSha256?: string
  tool?: { name?: string; version?: string; build?: string }
  dataFiles?: { path: string; sha256: string }[]
  blocks?: {
    id: string | null
    kind?: string
    inputs?: Record<string, { si?: number | null; value?: unknown; display?: string; displayUnit?: string; expression?: string }>
    results?: Record<string, { si?: number | null; value?: unknown; display?: string; displayUnit?: string }>
  }[]
  checks?: { block: string | null; label: string; status: string }[]
}

/** One difference. */
export interface Change {
  readonly what: 'note' | 'data' | 'tool' | 'block' | 'input' | 'result' | 'check'
  readonly name: string
  readonly from: string | null
  readonly to: string | null
  /** Relative change of an SI value, when both are numbers. */
  readonly relative?: number
}

/** Bits of what differs. */
export const DIFFERS = { note: 1, data: 2, tool: 4, results: 8 } as const

type Value = { si?: number | null; value?: unknown; display?: string; displayUnit?: string }

const shown = (v: Value | undefined): string | null => (v ? `${v.display ?? String(v.value ?? v.si ?? '')}${v.displayUnit ? ` ${v.displayUnit}` : ''}` : null)

/** The same value, or one that prints the same (an angle of extreme that moved by rounding noise is not a change to review). */
function same(a: Value, b: Value): boolean {
  if (a.display !== undefined && a.display === b.display && a.displayUnit === b.displayUnit) return true
  return typeof a.si === 'number' && typeof b.si === 'number' ? a.si === b.si : JSON.stringify(a.value ?? a.si) === JSON.stringify(b.value ?? b.si)
}

function byKey(doc: ResultsDoc, part: 'inputs' | 'results'): Map<string, Value> {
  return new Map((doc.blocks ?? []).flatMap((b) => Object.entries(b[part] ?? {}).map(([name, v]) => [`${b.id ?? '?'}.${name}`, v] as const)))
}

/** The differences from `a` (then) to `b` (now), in a stable order, and their bits. */
export function diffResults(a: ResultsDoc, b: ResultsDoc): { changes: Change[]; bits: number } {
  const changes: Change[] = []
  let bits = 0
  if (a.noteSha256 !== b.noteSha256) {
    bits |= DIFFERS.note
    changes.push({ what: 'note', name: 'note', from: a.noteSha256?.slice(0, 12) ?? null, to: b.noteSha256?.slice(0, 12) ?? null })
  }
  const [d0, d1] = [new Map((a.dataFiles ?? []).map((f) => [f.path, f.sha256])), new Map((b.dataFiles ?? []).map((f) => [f.path, f.sha256]))]
  for (const path of [...new Set([...d0.keys(), ...d1.keys()])].sort()) {
    if (d0.get(path) === d1.get(path)) continue
    bits |= DIFFERS.data
    changes.push({ what: 'data', name: path, from: d0.get(path)?.slice(0, 12) ?? null, to: d1.get(path)?.slice(0, 12) ?? null })
  }
  const [t0, t1] = [a.tool ?? {}, b.tool ?? {}]
  if (t0.version !== t1.version || t0.build !== t1.build) {
    bits |= DIFFERS.tool
    const words = (t: typeof t0) => `${t.name ?? '?'} ${t.version ?? '?'}${t.build ? ` (build ${t.build.slice(0, 12)})` : ''}`
    changes.push({ what: 'tool', name: 'tool', from: words(t0), to: words(t1) })
  }
  const ids = (doc: ResultsDoc) => new Map((doc.blocks ?? []).filter((x) => x.id).map((x) => [x.id!, x.kind ?? '']))
  const [i0, i1] = [ids(a), ids(b)]
  for (const id of [...new Set([...i0.keys(), ...i1.keys()])]) {
    if (i0.has(id) && i1.has(id)) continue
    bits |= DIFFERS.results
    changes.push({ what: 'block', name: id, from: i0.has(id) ? i0.get(id)! : null, to: i1.has(id) ? i1.get(id)! : null })
  }
  for (const part of ['inputs', 'results'] as const) {
    const [m0, m1] = [byKey(a, part), byKey(b, part)]
    for (const key of new Set([...m0.keys(), ...m1.keys()])) {
      const [x, y] = [m0.get(key), m1.get(key)]
      const id = key.slice(0, key.indexOf('.'))
      // A whole block added or removed is one change, not one per value.
      if ((!x || !y) && (!i0.has(id) || !i1.has(id))) continue
      if (x && y && same(x, y)) continue
      bits |= DIFFERS.results
      const relative = x && y && typeof x.si === 'number' && typeof y.si === 'number' && x.si !== 0 ? (y.si - x.si) / Math.abs(x.si) : undefined
      changes.push({ what: part === 'inputs' ? 'input' : 'result', name: key, from: shown(x), to: shown(y), ...(relative !== undefined ? { relative } : {}) })
    }
  }
  const checkKey = (c: { block: string | null; label: string }) => `${c.block ?? '?'}: ${c.label}`
  const [c0, c1] = [new Map((a.checks ?? []).map((c) => [checkKey(c), c.status])), new Map((b.checks ?? []).map((c) => [checkKey(c), c.status]))]
  for (const key of new Set([...c0.keys(), ...c1.keys()])) {
    if (c0.get(key) === c1.get(key)) continue
    bits |= DIFFERS.results
    changes.push({ what: 'check', name: key, from: c0.get(key) ?? null, to: c1.get(key) ?? null })
  }
  return { changes, bits }
}

/** One change as a line for the terminal. */
export function changeLine(c: Change): string {
  switch (c.what) {
    case 'note':
      return 'note: edited'
    case 'data':
      return `data file ${c.name}: ${c.from === null ? 'read now, not then' : c.to === null ? 'read then, not now' : 'changed'}`
    case 'tool':
      return `tool: ${c.from} → ${c.to}`
    case 'block':
      return `block #${c.name}: ${c.from === null ? `added (${c.to})` : `removed (${c.from})`}`
    case 'check':
      return `check ${c.name}: ${c.from ?? 'new'} → ${c.to ?? 'gone'}`
    default: {
      const rel = c.relative !== undefined ? ` (${c.relative >= 0 ? '+' : ''}${(c.relative * 100).toPrecision(3)} %)` : ''
      return `${c.what} ${c.name}: ${c.from ?? 'new'} → ${c.to ?? 'gone'}${rel}`
    }
  }
}
