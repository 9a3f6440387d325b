/**
 * results.json: every block's inputs and results and every check, with each
 * quantity in SI base units (`si`) and as displayed, for other tools and CI.
 * The schema is documented in the README; keys are stable.
 */
import { createHash } from 'node:crypto'
import type { VFile } from 'vfile'
import { displayValue } from './display.js'
import { KINDS } from './quantity.js'
import type { NoteModel } from './note.js'
import type { NamedValue } from './types.js'
import { CAUTION } from './caution.js'
import { extremesValues } from './block-kinds/extremes.js'
import { tallyChecks } from './tally.js'

/** Identifier and version of this layout. */
export const RESULTS_SCHEMA = 'linkwright-results/1'

interface JsonValue {
  label: string
  si?: number | null
  siUnit?: string
  value?: string | boolean | null
  display: string
  displayUnit: string
  kind: string
  reason?: string
  expression?: string
  source?: string | null
  given?: boolean
}

/** Build the results document of a note (deterministic key order). */
export function resultsDocument(model: NoteModel, file: VFile, notePath: string, date: string | null): unknown {
  const { meta } = model
  const json = (v: NamedValue, extra: Partial<JsonValue> = {}): JsonValue => {
    const shown = displayValue(v.value, meta.units, meta.digits)
    const base = { label: v.label, display: shown.number, displayUnit: shown.unit }
    switch (v.value.type) {
      case 'quantity':
        return { ...base, kind: v.value.kind, si: finite(v.value.si), siUnit: KINDS[v.value.kind].si, ...extra }
      case 'other':
        return { ...base, kind: 'other', si: finite(v.value.si), siUnit: v.value.siUnit, ...extra }
      case 'text':
        return { ...base, kind: 'text', value: v.value.text, ...extra }
      case 'flag':
        return { ...base, kind: 'flag', value: v.value.flag, ...extra }
      case 'none':
        return { ...base, kind: 'none', value: null, reason: v.value.reason, ...extra }
    }
  }
  const tally = tallyChecks(model.checks)
  return {
    schema: RESULTS_SCHEMA,
    tool: { name: model.tool.name, version: model.tool.version, ...(model.tool.build ? { build: model.tool.build } : {}) },
    fingerprint: model.fingerprint,
    // The note's own digest (line endings normalised), so a later check can tell an edited note from a changed tool.
    noteSha256: createHash('sha256').update(String(file.value).replace(/\r\n?/g, '\n')).digest('hex'),
    dataFiles: model.dataFiles.map((f) => ({ path: f.path, sha256: f.sha256 })),
    note: notePath,
    document: {
      title: meta.title,
      number: meta.number,
      revision: meta.revision,
      status: meta.status,
      date,
      units: meta.units.system,
    },
    blocks: model.blocks.map((block) => {
      const outcome = model.outcomes[block.index]
      return {
        id: block.id,
        kind: block.kind,
        line: block.place.start.line,
        evaluated: outcome !== null,
        inputs: Object.fromEntries(
          (outcome?.inputs ?? []).map((i) => [i.name, json(i, { expression: i.expression, source: i.source, given: i.given })]),
        ),
        results: Object.fromEntries([...(outcome?.results ?? []), ...extremesValues(outcome?.extremes ?? [])].map((r) => [r.name, json(r)])),
        warnings: outcome?.warnings ?? [],
      }
    }),
    checks: model.checks.map((c) => ({
      block: c.blockId,
      label: c.label,
      condition: c.condition,
      status: c.status === 'pass' ? 'PASS' : c.status === 'fail' ? 'FAIL' : 'NOT EVALUATED',
      informative: c.informative,
      operator: c.operator,
      actual: { si: finite(c.actualSI), display: c.actual },
      limit: { si: finite(c.limitSI), display: c.limit },
      margin: c.margin,
      ...(c.reason ? { reason: c.reason } : {}),
      source: c.source,
      line: c.line,
    })),
    summary: {
      checks: tally.gate.total,
      passed: tally.gate.pass,
      failed: tally.gate.fail,
      notEvaluated: tally.gate.notEvaluated,
      informative: { checks: tally.informative.total, passed: tally.informative.pass, failed: tally.informative.fail, notEvaluated: tally.informative.notEvaluated },
      gatePasses: tally.gatePasses,
      errors: file.messages.filter((m) => m.fatal === true).length,
      warnings: file.messages.filter((m) => m.fatal === false).length,
    },
    caution: CAUTION,
    messages: file.messages.map((m) => ({
      line: m.line ?? null,
      column: m.column ?? null,
      severity: m.fatal === true ? 'error' : m.fatal === false ? 'warning' : 'info',
      rule: m.ruleId ?? null,
      reason: m.reason,
    })),
  }
}

/** JSON has no NaN or Infinity: write null. */
function finite(value: number | null): number | null {
  return value !== null && Number.isFinite(value) ? value : null
}
