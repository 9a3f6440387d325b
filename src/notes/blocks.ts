/**
 * Finding calculation blocks: fenced code whose info string is a block kind,
 * then `#id` and an optional title, e.g. ```` ```slider-crank #pusher Pusher drive ````.
 * A fence with an `#id` but an unknown kind is an error; other code stays code.
 */
import type { Code, Root } from 'mdast'
import type { Position } from 'unist'
import { visit } from 'unist-util-visit'
import type { VFile } from 'vfile'
import { blockKinds } from './block-kinds/index.js'
import { readBody } from './body.js'
import { messages } from './messages.js'
import { math } from './quantity.js'
import { reportError, reportWarning } from './report.js'
import { DESIGN_INPUTS, DESIGN_INPUTS_OLD_NAME } from './block-kinds/design-inputs.js'
import type { CalcBlock } from './types.js'

const ID = /^[A-Za-z][A-Za-z0-9_]*$/

/** Block kinds renamed, still read (with a warning) for one release: old name → new. */
const RENAMED_KINDS: ReadonlyMap<string, string> = new Map([[DESIGN_INPUTS_OLD_NAME, DESIGN_INPUTS]])
const RESERVED = new Set(['true', 'false', 'null', 'undefined', 'end', 'in', 'to', 'and', 'or', 'not', 'xor', 'mod'])

/** A calculation block with the code node it came from. */
export interface FoundBlock {
  readonly block: CalcBlock
  readonly node: Code
}

/** Find and read every calculation block of a note, in document order. */
export function findBlocks(tree: Root, file: VFile): FoundBlock[] {
  const found: FoundBlock[] = []
  const seen = new Map<string, number>()
  visit(tree, 'code', (node: Code) => {
    const meta = (node.meta ?? '').trim()
    const idMatch = /^#(\S+)\s*(.*)$/.exec(meta)
    let kind = node.lang ?? ''
    const renamed = RENAMED_KINDS.get(kind)
    if (renamed && idMatch) {
      reportWarning(file, 'deprecated-block-kind', messages['deprecated-block-kind'](kind, renamed), node.position)
      kind = renamed
    }
    if (!blockKinds.has(kind)) {
      if (idMatch) reportError(file, 'unknown-block-kind', messages['unknown-block-kind'](kind, [...blockKinds.keys()]), node.position)
      return
    }
    const place = node.position as Position
    let id: string | null = idMatch ? idMatch[1]! : null
    const title = (idMatch ? idMatch[2]! : meta).trim() || null
    if (id !== null) {
      const problem = idProblem(id)
      if (problem) {
        reportError(file, 'invalid-block-id', messages['invalid-block-id'](id, problem), place)
        id = null
      } else if (seen.has(id)) {
        reportError(file, 'duplicate-block-id', messages['duplicate-block-id'](id, seen.get(id)!), place)
        id = null
      } else {
        seen.set(id, place.start.line)
      }
    } else if (blockKinds.get(kind)!.needsId) {
      reportError(file, 'missing-block-id', messages['missing-block-id'](kind), place)
    }
    const body = readBody(node.value, { line: place.start.line + 1, indent: place.start.column - 1 })
    for (const problem of body.problems) reportError(file, 'block-syntax', messages['block-syntax'](problem.reason), problem.place)
    found.push({ node, block: { kind, id, title, index: found.length, place, body } })
  })
  return found
}

/** Why an id cannot be used, or null. Ids are names in expressions, so units and functions are out. */
function idProblem(id: string): string | null {
  if (!ID.test(id)) return 'an id starts with a letter and holds only letters, digits and _ (it is used in expressions as id.name)'
  if (RESERVED.has(id)) return 'it is a word of the expression language'
  if (id in math) return 'it is the name of a function or constant of the expression language'
  if (math.Unit.isValuelessUnit(id)) return 'it is the name of a unit'
  return null
}
