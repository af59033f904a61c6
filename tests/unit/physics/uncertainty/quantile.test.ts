import { describe, expect, it } from 'vitest'
import { quantilesOfSorted, sampleQuantile, sortedCopy } from '../../../../shared/physics/uncertainty/quantile'
import { expectClose } from '../close'

// Hyndman & Fan (Am. Stat. 50 (1996) 361) definition 7, h = (n − 1)p. Hand-worked below and
// cross-checked with Python's statistics.quantiles(method='inclusive'), the same definition.
describe('sample quantile, linear interpolation between order statistics', () => {
  it.each([
    // sorted 1 2 3 4: p = 0.16 → h = 0.48 → 1 + 0.48·1
    { sample: [1, 2, 3, 4], p: 0.16, expected: 1.48 },
    { sample: [1, 2, 3, 4], p: 0.5, expected: 2.5 },
    // p = 0.84 → h = 2.52 → 3 + 0.52·1
    { sample: [1, 2, 3, 4], p: 0.84, expected: 3.52 },
    // unsorted input, sorted 1 2 3 4 10: p = 0.84 → h = 3.36 → 4 + 0.36·6
    { sample: [1, 2, 3, 10, 4], p: 0.84, expected: 6.16 },
    { sample: [1, 2, 3, 10, 4], p: 0.16, expected: 1.64 },
    { sample: [7], p: 0.3, expected: 7 },
    { sample: [5, -1], p: 0, expected: -1 },
    { sample: [5, -1], p: 1, expected: 5 }
  ])('Q($p) of $sample = $expected', ({ sample, p, expected }) => {
    expectClose(sampleQuantile(sample, p), expected, 1e-14)
  })

  it('several quantiles from one sort', () => {
    expectClose(quantilesOfSorted(sortedCopy([4, 3, 2, 1]), [0, 0.5, 1]), [1, 2.5, 4])
  })

  it('leaves the sample alone', () => {
    const sample = [3, 1, 2]
    sampleQuantile(sample, 0.5)
    expect(sample).toEqual([3, 1, 2])
  })

  it.each([
    { sample: [], p: 0.5, message: /empty/ },
    { sample: [1, Number.NaN], p: 0.5, message: /not finite/ },
    { sample: [1, 2], p: 1.5, message: /\[0, 1\]/ }
  ])('rejects $sample at p = $p', ({ sample, p, message }) => {
    expect(() => sampleQuantile(sample, p)).toThrow(message)
  })
})
