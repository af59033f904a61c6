import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { memberValuesFromRows, type MemberValues } from '../../../../shared/physics/uncertainty/matrix'
import { normalStream } from '../../../../shared/physics/random'
import { replicaMeanSd, replicaMedianInterval, replicaMoments } from '../../../../shared/physics/uncertainty/replicas'
import { expectClose } from '../close'

describe('mean ± sample standard deviation', () => {
  it('hand-worked: replicas 1, 2, 3, 4 (member 0 = 100 is ignored)', () => {
    // mean 2.5; deviations ∓1.5, ∓0.5 → Σd² = 5 → variance 5/3 → sd √(5/3)
    const band = replicaMeanSd(memberValuesFromRows([[100], [1], [2], [3], [4]]))
    expectClose(band.central[0]!, 2.5)
    expectClose(band.plus[0]!, Math.sqrt(5 / 3))
    expectClose(band.minus[0]!, Math.sqrt(5 / 3))
    // the same with jstat's sample standard deviation
    expectClose(band.plus[0]!, jStat.stdev([1, 2, 3, 4], true), 1e-14)
  })

  it('Welford stays exact with a large common offset (1e9 + small spread)', () => {
    const { mean, variance } = replicaMoments(memberValuesFromRows([[0], [1e9 + 1], [1e9 + 2], [1e9 + 3]]))
    expectClose(mean[0]!, 1e9 + 2)
    expectClose(variance[0]!, 1, 1e-9)
  })

  it('needs two replicas', () => {
    expect(() => replicaMeanSd(memberValuesFromRows([[1], [2]]))).toThrow(/at least 3/)
  })
})

describe('median and central interval', () => {
  // 1σ is the 15.87th to 84.13th percentile: p± = (1 ± erf(1/√2))/2 = 0.158655254 / 0.841344746
  // (erf(1/√2) = 0.682689492, the Gaussian one-sigma content, PDG review "Statistics", table of
  // Gaussian tail areas, from memory).
  const pLo = 0.15865525393145707
  it.each([
    // sorted 1 2 3 4: median 2.5; h = 3·pLo = 0.47597 → Q = 1.47597, and symmetric above
    { replicas: [1, 2, 3, 4], central: 2.5, plus: 1.5 - 3 * pLo, minus: 1.5 - 3 * pLo },
    // skewed, sorted 1 2 3 4 10: median 3; h = 4·pLo = 0.63462 → Q(pLo) = 1.63462;
    // h = 4·(1 − pLo) = 3.36538 → Q = 4 + 0.36538·6 = 6.19228
    { replicas: [1, 2, 3, 10, 4], central: 3, plus: 1 + 6 * (1 - 4 * pLo), minus: 2 - 4 * pLo }
  ])('hand-worked 1σ (68%) interval of $replicas', ({ replicas, central, plus, minus }) => {
    const band = replicaMedianInterval(memberValuesFromRows([[0], ...replicas.map(v => [v])]))
    expectClose(band.central[0]!, central, 1e-14)
    expectClose(band.plus[0]!, plus, 1e-13)
    expectClose(band.minus[0]!, minus, 1e-13)
  })

  it('90% coverage uses the 5th and 95th percentiles', () => {
    // 1..21: Q(0.05) = 1 + 20·0.05 = 2, Q(0.95) = 20, median 11
    const band = replicaMedianInterval(memberValuesFromRows([[0], ...Array.from({ length: 21 }, (_, i) => [i + 1])]), 90)
    expectClose([band.central[0]!, band.plus[0]!, band.minus[0]!], [11, 9, 9], 1e-13)
  })

  it('68% CL is the 15.87–84.13 percentile interval, not 16–84', () => {
    // 1..101: Q(p) = 1 + 100p, so the 1σ interval is [16.8655, 85.1345] about the median 51
    const band = replicaMedianInterval(memberValuesFromRows([[0], ...Array.from({ length: 101 }, (_, i) => [i + 1])]), 68)
    expectClose([band.minus[0]!, band.plus[0]!], [51 - (1 + 100 * pLo), 100 * (1 - pLo) + 1 - 51], 1e-13)
    expect(Math.abs(band.minus[0]! - 34)).toBeGreaterThan(0.1)
  })

  it.each([0, 100, -1])('rejects coverage %s', (coverage) => {
    expect(() => replicaMedianInterval(memberValuesFromRows([[0], [1], [2]]), coverage)).toThrow(RangeError)
  })
})

/** N Gaussian replicas of one bin with mean mu and sd sigma, from seed. */
function gaussianReplicas(n: number, mu: number, sigma: number, seed: number): MemberValues {
  const z = normalStream(seed, { purpose: 'synthetic', index: 0 }).fill(n)
  const values = new Float64Array(n + 1)
  values[0] = mu
  for (let r = 0; r < n; r++) values[r + 1] = mu + sigma * z[r]!
  return { members: n + 1, bins: 1, values }
}

describe('replica statistics converge as 1/√N (fixed seeds)', () => {
  // For Gaussian replicas the error of the mean has sd σ/√N and the sample sd has sd ≈ σ/√(2N)
  // (standard sampling theory, e.g. PDG review "Statistics", section on estimators). Over 200
  // independent batches the RMS error is known to about 1/√(2·200) = 5%, so ±20% is a 4σ margin.
  const batches = 200
  const sizes = [25, 100, 400, 1600]
  const mu = 3
  const sigma = 0.5
  const rms = sizes.map((n) => {
    let meanErr = 0
    let sdErr = 0
    for (let k = 0; k < batches; k++) {
      const band = replicaMeanSd(gaussianReplicas(n, mu, sigma, 1000 * n + k))
      meanErr += (band.central[0]! - mu) ** 2
      sdErr += (band.plus[0]! - sigma) ** 2
    }
    return { n, mean: Math.sqrt(meanErr / batches), sd: Math.sqrt(sdErr / batches) }
  })

  it.each(rms)('N = $n: RMS error of the mean ≈ σ/√N and of the sd ≈ σ/√(2N)', ({ n, mean, sd }) => {
    expect(mean * Math.sqrt(n) / sigma).toBeGreaterThan(0.8)
    expect(mean * Math.sqrt(n) / sigma).toBeLessThan(1.2)
    expect(sd * Math.sqrt(2 * n) / sigma).toBeGreaterThan(0.8)
    expect(sd * Math.sqrt(2 * n) / sigma).toBeLessThan(1.2)
  })

  it('log-log slope of the mean error against N is −½ within 0.05', () => {
    const xs = rms.map(r => Math.log(r.n))
    const ys = rms.map(r => Math.log(r.mean))
    const xm = jStat.mean(xs)
    const ym = jStat.mean(ys)
    const slope = xs.reduce((s, x, i) => s + (x - xm) * (ys[i]! - ym), 0) / xs.reduce((s, x) => s + (x - xm) ** 2, 0)
    expect(Math.abs(slope + 0.5)).toBeLessThan(0.05)
  })
})
