import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { normalStream } from '../../../../shared/physics/random'
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

// The engine's quantile is Hyndman–Fan definition 7 (R. J. Hyndman and Y. Fan, Am. Stat. 50 (1996)
// 361): h = (n − 1)p on 0-based order statistics. jstat, a well-known statistics package, offers it
// as jStat.quantiles(sample, p, 1, 1) — its plotting-position parameters (α, β) = (1, 1), which is
// type 7 in Hyndman–Fan's table (jstat's default (3/8, 3/8) is type 9 and is NOT what we use) —
// and as jStat.percentile(sample, p) (inclusive), an index k = (n − 1)p + 1 on 1-based order
// statistics, the same rule.
// jstat's published type declarations leave these two functions out; their signatures as in its source.
const stats = jStat as unknown as {
  quantiles: (sample: number[], p: number[], alphap?: number, betap?: number) => number[]
  percentile: (sample: number[], p: number, exclusive?: boolean) => number
}

describe('the percentile convention agrees with jstat (Hyndman–Fan type 7)', () => {
  const samples = [
    [1, 2, 3, 4],
    [1, 2, 3, 10, 4],
    Array.from(normalStream(11, { purpose: 'synthetic', index: 3 }).fill(101)),
    Array.from(normalStream(12, { purpose: 'synthetic', index: 4 }).fill(37), v => Math.exp(v))
  ]
  // 1σ, 90% and 95% CL endpoints, the median and a few others
  const ps = [0.15865525393145707, 0.8413447460685429, 0.05, 0.95, 0.025, 0.975, 0.5, 0.3, 0]
  it.each(samples.map((s, i) => ({ i, s })))('sample $i: every p matches jStat.quantiles(…, 1, 1)', ({ s }) => {
    const sorted = sortedCopy(s)
    expectClose(quantilesOfSorted(sorted, ps), stats.quantiles(s, ps, 1, 1), 1e-14, 1e-15)
  })

  it.each(samples.map((s, i) => ({ i, s })))('sample $i: matches jStat.percentile (inclusive) below the top order statistic', ({ s }) => {
    // jStat.percentile returns x(n−2) for k(n − 1) + 1 ≥ n − 1 without interpolating, so only
    // probabilities whose index stays below the last interval are compared.
    for (const p of ps.filter(p => (s.length - 1) * p + 1 < s.length - 1)) {
      expectClose(sampleQuantile(s, p), stats.percentile(s, p, false), 1e-14, 1e-15)
    }
  })

  it('differs from jstat\'s default type 9, so the comparison can fail', () => {
    const s = samples[2]!
    expect(Math.abs(sampleQuantile(s, 0.05) - stats.quantiles(s, [0.05])[0]!)).toBeGreaterThan(1e-6)
  })
})
