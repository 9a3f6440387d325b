/**
 * The README is part of the tool: every message links to its rule's anchor
 * there, and CI runs the same test command the README gives.
 */
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { messages } from '../../src/notes/messages.js'

const root = join(import.meta.dirname, '..', '..')
const readme = readFileSync(join(root, 'README.md'), 'utf8')

describe('the README', () => {
  it('should explain every rule id a message can carry, at the anchor the message links to', () => {
    const missing = Object.keys(messages).filter((rule) => !readme.includes(`<a id="rule-${rule}"></a>`))
    expect(missing).toEqual([])
  })

  it('should give the test command that CI runs', () => {
    const ci = readFileSync(join(root, '.ci/run'), 'utf8').trim().split('\n')
    const command = ci[ci.length - 1]!.trim()
    expect(readme).toMatch(new RegExp(`^${command.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\s+#`, 'm'))
  })
})
