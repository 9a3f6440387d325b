/**
 * Bad input never crashes: random notes made of plausible and broken pieces
 * (front matter, block fences, values, expressions, directives, HTML) always
 * give a package or positioned messages, never an exception.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { build } from '../helpers/note.js'

const kinds = ['slider-crank', 'eccentric', 'four-bar', 'design-inputs', 'given', 'checks', 'table', 'chart', 'drawing', 'assumptions', 'slidercrank']
const names = ['crank', 'rod', 'offset', 'speed', 'ground', 'input', 'coupler', 'output', 'of', 'series', 'quantities', 'every', 'show', 'x', 'at_most', 'eccentricity', 'strap', 'sheave_diameter', 'shaft_diameter', 'path_radius', 'rotation', 'bogus']
const values = [
  '40 mm', '-3 mm', '0 mm', '150 mm', '1e308 m', '60 rpm', '2 Hz', '12 kg', 'a.crank', 'drive.stroke', 'drive.stroke >= 10 mm',
  'drive.stroke = 80 mm ± 1 mm', 'velocity, acceleration', 'position', '30 deg', '0 deg', 'cw', 'straight', '200 mm', 'f(x) = x',
  '[1, 2', '(((', '', 'NaN mm', 'Infinity mm', 'dead centres, 60 deg', '±5 m/s^2', 'drive', ': :', '"quoted"', '1/0 mm',
]
const ids = ['drive', 'a', 'mm', 'drive', 'other', '']

const block = fc
  .tuple(
    fc.constantFrom(...kinds),
    fc.constantFrom(...ids),
    fc.array(fc.tuple(fc.constantFrom(...names), fc.constantFrom(...values), fc.option(fc.constantFrom('[alpha] p. 3', '[nope]', 'DWG 1'))), { maxLength: 8 }),
  )
  .map(([kind, id, lines]) => {
    const body = lines.map(([n, v, s]) => (s ? `${n}: ${v} ; ${s}` : `${n}: ${v}`)).join('\n')
    return `\`\`\`${kind}${id ? ` #${id}` : ''}\n${body}\n\`\`\`\n`
  })

const prose = fc.constantFrom(
  'Plain text.',
  'Value :value[drive.stroke] and :value[nothing.here]{unit=in}.',
  ':cite[alpha] and :cite[nope].',
  '<script>alert(1)</script><img src=x onerror=y>',
  '$\\frac{a}{b$',
  '# Heading\n\n## Sub',
  '| a | b |\n|---|---|\n| 1 | 2 |',
  '::leaf[x]\n\n:::box\ninside\n:::',
)

const front = fc.constantFrom(
  '',
  '---\ntitle: T\nnumber: N\nrevision: A\nstatus: draft\nreferences:\n  alpha: A book\n---\n',
  '---\ntitle: [\n---\n',
  '---\nunits: {system: US, length: kg}\ndigits: 40\npaper: A3\n---\n',
)

describe('random notes', () => {
  it('should always give a package or positioned messages, never an exception', async () => {
    await fc.assert(
      fc.asyncProperty(front, fc.array(fc.oneof(block, prose), { maxLength: 6 }), async (head, parts) => {
        const markdown = `${head}\n${parts.join('\n\n')}\n`
        // Front matter is added by the helper unless the note has its own.
        const { file, built } = await build(markdown.startsWith('---') ? markdown : `---\ntitle: T\nnumber: N\nrevision: A\nstatus: draft\n---\n${markdown}`)
        for (const message of file.messages) {
          expect(message.line ?? 0, message.reason).toBeGreaterThan(0)
          expect(message.ruleId, message.reason).toBeTruthy()
        }
        if (built.ok) expect(built.html).toContain('id="sign-off"')
        else expect(file.messages.some((m) => m.fatal === true)).toBe(true)
      }),
      { numRuns: 300, seed: 4242 },
    )
  })
})
