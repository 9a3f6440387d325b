/**
 * Mutations of a note the way real edits go wrong, as plain numbers that
 * fast-check can shrink and a benchmark can replay: shared by the mutation
 * test and the fuzz benchmark.
 */

const NUMBERS = ['NaN', 'Infinity', '-Infinity', '1e308', '1e-308', '-0', '0', '-1', '9'.repeat(40), '1e9', '0.000000001', '1/0', '(', '']
const UNITS = ['mm', 'deg', 'rpm', 'kg', 'N', 'm/s', 'in', 'lbf', 'rad', 'bar', 'J', 'Pa', 'xyz']
const JUNK = ['\u0000', '\u202e', '𝛼', '\uFEFF', '\u200b', '```', '---', '#', ':', ';', '[', '{', '"', '\t', '\r\n', 'é', '🙂']

/** One edit: which kind (0–7), where, with what. */
export interface Edit {
  readonly kind: number
  readonly at: number
  readonly pick: number
}

/** How many mutated notes the test suite builds (with its seed), for the benchmark's report. */
export const MUTATION_RUNS = 60
export const MUTATION_SEED = 20261203

/** Apply one edit to a note's text. */
export function applyEdit(text: string, e: Edit): string {
  const lines = text.split('\n')
  const line = e.at % lines.length
  switch (e.kind) {
    case 0: // truncated
      return text.slice(0, e.at % (text.length + 1))
    case 1: // a line lost
      lines.splice(line, 1)
      return lines.join('\n')
    case 2: // a line doubled
      lines.splice(line, 0, lines[line]!)
      return lines.join('\n')
    case 3: {
      // a number replaced (the n-th number of the note)
      const all = [...text.matchAll(/\d+(?:\.\d+)?/g)]
      if (all.length === 0) return text
      const m = all[e.at % all.length]!
      return text.slice(0, m.index) + NUMBERS[e.pick % NUMBERS.length] + text.slice(m.index! + m[0].length)
    }
    case 4: {
      // a unit swapped
      const all = [...text.matchAll(/\b(mm|deg|rpm|kg|N|m\/s|bar|J|Hz|s)\b/g)]
      if (all.length === 0) return text
      const m = all[e.at % all.length]!
      return text.slice(0, m.index) + UNITS[e.pick % UNITS.length] + text.slice(m.index! + m[0].length)
    }
    case 5: {
      // stray characters
      const at = e.at % (text.length + 1)
      return text.slice(0, at) + JUNK[e.pick % JUNK.length] + text.slice(at)
    }
    case 6: {
      // a fence dropped
      const fences = lines.flatMap((l, i) => (l.startsWith('```') ? [i] : []))
      if (fences.length === 0) return text
      lines.splice(fences[e.at % fences.length]!, 1)
      return lines.join('\n')
    }
    default: {
      // two lines swapped
      const other = e.pick % lines.length
      ;[lines[line], lines[other]] = [lines[other]!, lines[line]!]
      return lines.join('\n')
    }
  }
}

