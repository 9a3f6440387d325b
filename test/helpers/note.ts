import { readFileSync } from 'node:fs'
import { VFile } from 'vfile'
import { buildNote, type BuiltNote } from '../../src/build.js'
import type { DataReader } from '../../src/notes/block-kinds/kind.js'
import { readNote } from '../../src/notes/note.js'
import { TOOL } from '../../src/version.js'

const template = readFileSync(new URL('../../templates/package.html', import.meta.url), 'utf8')

/** Front matter that passes, for notes written in tests. */
export const FRONT = `---
title: Test note
number: T-001
revision: A
status: draft
date: 2026-01-05
references:
  alpha: Alpha handbook, 2nd ed.
---
`

/** Build a note given as text (front matter added unless it has its own). */
export async function build(markdown: string, path = 'test.md', readData: DataReader | null = null): Promise<{ file: VFile; built: BuiltNote }> {
  const value = markdown.startsWith('---') ? markdown : FRONT + markdown
  const file = new VFile({ path, value })
  const built = await buildNote(file, { tool: TOOL, notePath: path, template, commit: 'test', readData })
  return { file, built }
}

/** Read (evaluate) a note given as text without rendering. */
export function read(markdown: string, readData: DataReader | null = null) {
  const value = markdown.startsWith('---') ? markdown : FRONT + markdown
  const file = new VFile({ path: 'test.md', value })
  return { file, ...readNote(file, TOOL, { readData }) }
}

/** Messages as `line:column severity rule` strings, sorted. */
export function brief(file: VFile): string[] {
  return file.messages
    .map((m) => `${m.line}:${m.column} ${m.fatal === true ? 'error' : 'warning'} ${m.ruleId}`)
    .sort()
}

/** Line of the front matter's end, so tests can count lines of the body. */
export const BODY_LINE = FRONT.split('\n').length
