import { expect } from 'vitest'

/** Tolerances: relative to |expected|, or absolute, whichever is larger. */
export interface Tolerance {
  readonly rel?: number
  readonly abs?: number
}

/**
 * Assert |actual − expected| ≤ max(rel·|expected|, abs), recursing into arrays
 * and plain objects, with a message that names the path and both numbers.
 */
export function expectClose(actual: unknown, expected: unknown, tolerance: Tolerance, path = 'value'): void {
  const rel = tolerance.rel ?? 0
  const abs = tolerance.abs ?? 0
  if (typeof expected === 'number') {
    expect(typeof actual, `${path} should be a number`).toBe('number')
    const a = actual as number
    const allowed = Math.max(rel * Math.abs(expected), abs)
    const diff = Math.abs(a - expected)
    if (!(diff <= allowed)) {
      expect.fail(`${path}: expected ${expected} ± ${allowed}, got ${a} (off by ${diff})`)
    }
    return
  }
  if (Array.isArray(expected)) {
    expect(Array.isArray(actual) || ArrayBuffer.isView(actual), `${path} should be an array`).toBe(true)
    const list = actual as ArrayLike<unknown>
    expect(list.length, `${path}.length`).toBe(expected.length)
    expected.forEach((e, i) => {
      expectClose(list[i], e, tolerance, `${path}[${i}]`)
    })
    return
  }
  if (expected && typeof expected === 'object') {
    for (const [key, value] of Object.entries(expected)) {
      expectClose((actual as Record<string, unknown>)[key], value, tolerance, `${path}.${key}`)
    }
    return
  }
  expect(actual, path).toEqual(expected)
}

/** Degrees to radians. */
export const rad = (degrees: number): number => (degrees * Math.PI) / 180
/** Radians to degrees. */
export const deg = (radians: number): number => (radians * 180) / Math.PI

/**
 * Assert a value against a number printed in a table or book: within half a unit
 * of the last printed digit (e.g. '146.969385' allows ±5e-7).
 */
export function expectPrinted(actual: number, printed: string, path = 'value'): void {
  const expected = Number(printed)
  const mantissa = printed.replace(/^-/, '').split(/e/i)
  const decimals = mantissa[0]!.includes('.') ? mantissa[0]!.split('.')[1]!.length : 0
  const exponent = mantissa[1] ? Number(mantissa[1]) : 0
  const half = 0.5 * 10 ** (exponent - decimals)
  expectClose(actual, expected, { abs: half * (1 + 1e-9) }, `${path} (printed ${printed})`)
}
