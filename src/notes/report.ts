/**
 * Raise positioned messages on a note's vfile: errors stop the block they are
 * in (fatal = true, never thrown), warnings are engineering cautions.
 */
import type { Point, Position } from 'unist'
import type { VFile } from 'vfile'
import type { VFileMessage } from 'vfile-message'
import { SOURCE, ruleUrl, type RuleId } from './messages.js'

/** A place in the note: a span or a point. */
export type Place = Position | Point | undefined

/**
 * Record an error: the note fails, the other blocks and notes go on. A
 * `depends-on-error` is the follow-on of a mistake reported at its own place:
 * it is recorded as information, so that the error count is the count of mistakes.
 */
export function reportError(file: VFile, ruleId: RuleId, reason: string, place: Place, cause?: unknown): VFileMessage {
  const message = file.message(reason, { place, ruleId, source: SOURCE, cause: cause instanceof Error ? cause : undefined })
  message.fatal = ruleId === 'depends-on-error' ? undefined : true
  message.url = ruleUrl(ruleId)
  return message
}

/** Record a warning: the package is built and shows it. */
export function reportWarning(file: VFile, ruleId: RuleId, reason: string, place: Place): VFileMessage {
  const message = file.message(reason, { place, ruleId, source: SOURCE })
  message.fatal = false
  message.url = ruleUrl(ruleId)
  return message
}

/** True when the file has any error. */
export function hasErrors(file: VFile): boolean {
  return file.messages.some((m) => m.fatal === true)
}
