import { expect } from 'vitest'

/**
 * The one float comparison of these tests: |actual − expected| ≤ abs + rel·|expected|.
 * Arrays are compared element by element with the index in the message.
 */
export function expectClose(actual: number | ArrayLike<number>, expected: number | ArrayLike<number>, rel = 1e-12, abs = 0): void {
  if (typeof actual === 'number' || typeof expected === 'number') {
    const a = actual as number
    const e = expected as number
    expect(Math.abs(a - e), `actual ${a}, expected ${e}`).toBeLessThanOrEqual(abs + rel * Math.abs(e))
    return
  }
  expect(actual.length, 'length').toBe(expected.length)
  for (let i = 0; i < expected.length; i++) {
    const a = actual[i]!
    const e = expected[i]!
    expect(Math.abs(a - e), `entry ${i}: actual ${a}, expected ${e}`).toBeLessThanOrEqual(abs + rel * Math.abs(e))
  }
}
