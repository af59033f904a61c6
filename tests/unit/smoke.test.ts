import { describe, expect, it } from 'vitest'

describe('toolchain', () => {
  it('runs TypeScript tests with typed arrays', () => {
    expect(Array.from(new Float64Array([1, 2]).map(v => v * 2))).toEqual([2, 4])
  })
})
