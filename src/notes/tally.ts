/**
 * Counting acceptance checks the one way every output says them: the gate
 * (checks that decide the package) and the informative ones apart, with the
 * checks that could not be evaluated counted, never dropped.
 */
import type { CheckOutcome } from './block-kinds/kind.js'

/** Counts of one group of checks. */
export interface CheckCounts {
  readonly total: number
  readonly pass: number
  readonly fail: number
  readonly notEvaluated: number
}

/** The gate and the informative checks. */
export interface CheckTally {
  readonly gate: CheckCounts
  readonly informative: CheckCounts
  /** True when every gate check was evaluated and passes. */
  readonly gatePasses: boolean
}

function count(checks: readonly CheckOutcome[]): CheckCounts {
  return {
    total: checks.length,
    pass: checks.filter((c) => c.status === 'pass').length,
    fail: checks.filter((c) => c.status === 'fail').length,
    notEvaluated: checks.filter((c) => c.status === 'not-evaluated').length,
  }
}

/** Tally a note's checks. */
export function tallyChecks(checks: readonly CheckOutcome[]): CheckTally {
  const gate = count(checks.filter((c) => !c.informative))
  const informative = count(checks.filter((c) => c.informative))
  return { gate, informative, gatePasses: gate.fail === 0 && gate.notEvaluated === 0 }
}

/** The tally in words, e.g. "5 of 6 checks pass, 1 could not be evaluated; 1 informative check (FAIL)". */
export function tallyWords(tally: CheckTally): string {
  const { gate, informative } = tally
  const parts: string[] = []
  if (gate.total === 0) parts.push('no acceptance checks')
  else {
    const tail = [gate.fail > 0 ? `${gate.fail} FAIL` : '', gate.notEvaluated > 0 ? `${gate.notEvaluated} could not be evaluated` : ''].filter(Boolean)
    parts.push(`${gate.pass} of ${gate.total} checks pass${tail.length > 0 ? ` (${tail.join(', ')})` : ''}`)
  }
  if (informative.total > 0) {
    const words = [informative.pass > 0 ? `${informative.pass} PASS` : '', informative.fail > 0 ? `${informative.fail} FAIL` : '', informative.notEvaluated > 0 ? `${informative.notEvaluated} not evaluated` : ''].filter(Boolean)
    parts.push(`${informative.total} informative check${informative.total === 1 ? '' : 's'}, not part of the gate (${words.join(', ')})`)
  }
  return parts.join('; ')
}

/** Sort for display: gate before informative; within each, FAIL, then not evaluated, then PASS; then as written. */
export function failuresFirst(checks: readonly CheckOutcome[]): CheckOutcome[] {
  const rank = { fail: 0, 'not-evaluated': 1, pass: 2 } as const
  return [...checks].sort((p, q) => Number(p.informative) - Number(q.informative) || rank[p.status] - rank[q.status] || p.line - q.line)
}
