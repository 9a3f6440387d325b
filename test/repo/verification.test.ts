/**
 * The package's verification statement lists the outside checks of the test
 * suite: each must name its source, say how well it is known, and point at a
 * test file that really holds it.
 */
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { VERIFICATION } from '../../src/verification.js'

const root = join(import.meta.dirname, '..', '..')

describe('the verification statement', () => {
  it('should point every outside check at a test file that holds it', () => {
    expect(VERIFICATION.length).toBeGreaterThan(10)
    for (const check of VERIFICATION) {
      const text = readFileSync(join(root, check.test), 'utf8')
      expect(text, `${check.test} should hold “${check.mark}” (${check.what})`).toContain(check.mark)
      expect(check.source.length).toBeGreaterThan(10)
    }
  })
})
