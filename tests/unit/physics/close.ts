import { expect } from 'vitest'

/**
 * The one float comparison of the engine's tests.
 */

/** |a − b| / max(|b|, floor): the one relative-difference measure these tests report. */
export function relDiff(a: number, b: number, floor = 1e-300): number {
  return Math.abs(a - b) / Math.max(Math.abs(b), floor)
}

/**
 * Asserts |actual − expected| ≤ abs + rel·|expected|, with both numbers (and the relative
 * difference) in the failure message. Arrays are compared element by element, the index named.
 */
export function expectClose(actual: number | ArrayLike<number>, expected: number | ArrayLike<number>, rel = 1e-12, abs = 0): void {
  if (typeof actual === 'number' || typeof expected === 'number') {
    const a = actual as number
    const e = expected as number
    expect(Math.abs(a - e), `${a} vs ${e} (rel ${relDiff(a, e).toExponential(2)}, allowed ${rel}${abs ? ` + abs ${abs}` : ''})`).toBeLessThanOrEqual(abs + rel * Math.abs(e))
    return
  }
  expect(actual.length, 'length').toBe(expected.length)
  for (let i = 0; i < expected.length; i++) {
    const a = actual[i]!
    const e = expected[i]!
    expect(Math.abs(a - e), `entry ${i}: ${a} vs ${e} (allowed ${rel}${abs ? ` + abs ${abs}` : ''})`).toBeLessThanOrEqual(abs + rel * Math.abs(e))
  }
}
