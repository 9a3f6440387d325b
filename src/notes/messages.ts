/**
 * The message catalogue: every problem a note can have, as a rule id and a
 * function that builds the reason in the engineer's words. Code and tests both
 * call these, so the wording lives in one place. Rule ids are documented in the
 * README under "Messages".
 */

/** Source name on every message raised by linkwright. */
export const SOURCE = 'linkwright'

const list = (items: readonly string[]): string => items.map((i) => `\`${i}\``).join(', ')

/** Rule ids with their reason builders. */
export const messages = {
  'front-matter-syntax': (detail: string) => `Cannot read the front matter: ${detail}`,
  'front-matter-field': (field: string, detail: string) => `Unexpected front matter \`${field}\`: ${detail}`,
  'missing-front-matter': (fields: readonly string[]) =>
    `Missing front matter ${list(fields)}: a calculation package needs its identification`,
  'block-syntax': (detail: string) => `Cannot read this block: ${detail}`,
  'unknown-block-kind': (kind: string, known: readonly string[]) =>
    `Unexpected block kind \`${kind}\`, expected one of ${list(known)}`,
  'deprecated-block-kind': (old: string, current: string) =>
    `The block kind \`${old}\` is now called \`${current}\`: rename the fence; the old name is read for one more release`,
  'missing-block-id': (kind: string) => `Missing block id: other blocks refer to a ${kind} block by its id, e.g. \`${kind} #drive\``,
  'invalid-block-id': (id: string, why: string) => `Unexpected block id \`${id}\`: ${why}`,
  'duplicate-block-id': (id: string, line: number) => `Unexpected block id \`${id}\`: already used by the block at line ${line}`,
  'unknown-input': (name: string, kind: string, known: readonly string[]) =>
    `Unexpected input \`${name}\` for a ${kind} block, expected one of ${list(known)}`,
  'duplicate-input': (name: string) => `Unexpected second value for \`${name}\` in the same block`,
  'missing-input': (name: string, label: string, kind: string) => `Missing input \`${name}\` (${label}) for the ${kind} block`,
  'invalid-expression': (text: string, detail: string) => `Cannot evaluate \`${text}\`: ${detail}`,
  'dimension-mismatch': (name: string, label: string, reason: string) => `Unexpected value for \`${name}\` (${label}): ${reason}`,
  'invalid-choice': (name: string, value: string, allowed: readonly string[]) =>
    `Unexpected \`${value}\` for \`${name}\`, expected one of ${list(allowed)}`,
  'unknown-block': (id: string) => `Cannot find a block with the id \`${id}\``,
  'renamed-result': (reference: string, instead: string) =>
    `Cannot use \`${reference}\`: a signed peak could pass a check it should fail, so the extremes now have their own names; write ${instead}`,
  'unknown-result': (id: string, name: string, known: readonly string[]) =>
    `Cannot find \`${name}\` in block \`${id}\`, expected one of ${list(known)}`,
  'dependency-cycle': (path: readonly string[]) =>
    `Cannot evaluate: these blocks depend on each other in a cycle (${path.join(' → ')})`,
  'depends-on-error': (id: string) => `Cannot evaluate: this block uses \`${id}\`, which has errors`,
  'unknown-reference': (key: string) => `Cannot find the reference \`${key}\` among the front matter's \`references\``,
  'check-syntax': (text: string) =>
    `Cannot read the check \`${text}\`: write \`value >= limit\`, \`value <= limit\` (also \`>\`, \`<\`) or \`value = target ± tolerance\``,
  'check-not-evaluable': (text: string, detail: string) => `Cannot evaluate the check \`${text}\`: ${detail}`,
  'table-syntax': (detail: string) => `Cannot build the table: ${detail}`,
  'chart-syntax': (detail: string) => `Cannot build the chart: ${detail}`,
  'drawing-syntax': (detail: string) => `Cannot build the drawing: ${detail}`,
  'unknown-quantity': (name: string, kind: string, known: readonly string[]) =>
    `Unexpected quantity \`${name}\` for a ${kind}, expected one of ${list(known)}`,
  'load-table': (detail: string) => `Cannot read the load table: ${detail}`,
  'data-file': (path: string, detail: string) => `Cannot read the data file \`${path}\`: ${detail}`,
  'wrong-block': (id: string, expected: string) => `Unexpected block \`${id}\`: expected ${expected}`,
  'column-slenderness': (detail: string) => detail,
  'dynamics-warning': (detail: string) => detail,
  'linkage-error': (detail: string) => detail,
  'linkage-warning': (detail: string) => detail,
  'transmission-angle-low': (value: string, at: string, limit: string) =>
    `The transmission angle falls to ${value} at ${at}, below the ${limit} commonly kept as a lower limit`,
  'remote-resource': (url: string) =>
    `Unexpected remote resource \`${url}\`: the package fetches nothing from the network, so it will be missing from the HTML and PDF`,
  'invalid-value-reference': (text: string, detail: string) => `Cannot print the value \`${text}\`: ${detail}`,
  'display-unit': (kind: string, unit: string) => `Unexpected display unit \`${unit}\` for ${kind}`,
  // Raised by the command line about a note's file and its package, at 1:1 of the note.
  'unreadable-note': (reason: string) => `Cannot read this note: ${reason}`,
  'package-folder': (reason: string) => `Not built: ${reason}`,
  'package-write': (folder: string, reason: string) => `Cannot write the package into ${folder}: ${reason}; the previous package is as it was`,
  'pdf-print': (reason: string) => `Cannot print the PDF: ${reason}; the previous package is as it was`,
  'pdf-kept': (folder: string) =>
    `Not replaced: the previous package in ${folder} has a PDF and none could be printed now, so it is kept as it was; install a browser, or build with --no-pdf to replace it with HTML only`,
  'internal-error': (detail: string) => `Cannot build this note: internal error: ${detail}`,
  'revision-compare': (revision: string, detail: string) => `Cannot show the changes since \`${revision}\`: ${detail}; the package is built without them`,
} as const

/** A rule id of the catalogue. */
export type RuleId = keyof typeof messages

/** Where each rule is explained. */
export function ruleUrl(ruleId: RuleId): string {
  return `README.md#rule-${ruleId}`
}
