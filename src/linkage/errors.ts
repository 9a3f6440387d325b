/**
 * Typed errors of the linkage core. Each carries a stable `code` that the note
 * layer maps to a positioned message, and `details` in SI units so that a caller
 * can re-phrase the numbers in its own display units.
 */

/** Stable error codes of the linkage core. */
export type LinkageErrorCode =
  | 'invalid-length'
  | 'invalid-number'
  | 'invalid-choice'
  | 'cannot-assemble'
  | 'sheave-does-not-enclose-shaft'
  | 'invalid-coupler-point'

/** A linkage that cannot be built or analysed as given. */
export class LinkageError extends Error {
  /** Stable machine-readable code. */
  readonly code: LinkageErrorCode
  /** The numbers behind the message, in SI units (m, rad, s). */
  readonly details: Readonly<Record<string, number | string>>

  constructor(code: LinkageErrorCode, message: string, details: Readonly<Record<string, number | string>> = {}) {
    super(message)
    this.name = 'LinkageError'
    this.code = code
    this.details = details
  }
}

/** Length in metres printed as millimetres for a message (the workshop unit). */
export function mm(metres: number): string {
  return `${formatNumber(metres * 1000)} mm`
}

/** Angle in radians printed as degrees for a message. */
export function deg(radians: number): string {
  return `${formatNumber((radians * 180) / Math.PI)}°`
}

function formatNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value)
  // Clear rounding dust (a wall of 1e-15 mm is a wall of 0 mm), then six significant figures.
  const cleaned = Math.abs(value) < 1e-9 ? 0 : value
  return String(Number(cleaned.toPrecision(6)))
}

/**
 * Refuse a length that is not a finite positive number.
 * @param name the link's name in the trade's words, e.g. "connecting rod"
 */
export function requireLength(name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new LinkageError('invalid-number', `The ${name} length must be a finite number, got ${String(value)}`, { name })
  }
  if (!(value > 0)) {
    throw new LinkageError('invalid-length', `The ${name} length must be greater than zero, got ${mm(value)}`, {
      name,
      value,
    })
  }
}

/** Refuse a value that is not a finite number (offsets, speeds, angles). */
export function requireFinite(name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new LinkageError('invalid-number', `The ${name} must be a finite number, got ${String(value)}`, { name })
  }
}

/** Stable codes of the engineering cautions the core raises. */
export type LinkageWarningCode =
  | 'crank-cannot-turn'
  | 'input-cannot-turn'
  | 'dead-points-need-stored-energy'
  | 'change-point-linkage'

/** An engineering caution about a linkage that can still be analysed. */
export interface LinkageWarning {
  readonly code: LinkageWarningCode
  readonly message: string
  /** The numbers behind the message, in SI units. */
  readonly details: Readonly<Record<string, number | string>>
}
