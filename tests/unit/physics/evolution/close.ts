import { expect } from 'vitest'

/** |a − b| / max(|b|, floor): the one relative-difference measure these tests use. */
export function relDiff(a: number, b: number, floor = 1e-300): number {
  return Math.abs(a - b) / Math.max(Math.abs(b), floor)
}

/** Asserts |actual − expected| ≤ rel·|expected| + abs, with both numbers in the failure message. */
export function expectClose(actual: number, expected: number, rel: number, abs = 0): void {
  const ok = Math.abs(actual - expected) <= rel * Math.abs(expected) + abs
  expect(ok, `${actual} vs ${expected} (rel ${relDiff(actual, expected).toExponential(2)}, allowed ${rel}${abs ? ` + abs ${abs}` : ''})`).toBe(true)
}
