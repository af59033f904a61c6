import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { binCovariance } from '../../../../shared/physics/uncertainty/covariance'
import { hessianSymmetric } from '../../../../shared/physics/uncertainty/hessian'
import { memberValuesFromRows, type MemberValues } from '../../../../shared/physics/uncertainty/matrix'
import { hessianToReplicas, poolSets } from '../../../../shared/physics/uncertainty/pooling'
import { normalStream } from '../../../../shared/physics/random'
import { expectClose } from '../close'

// Two bins, two pairs: ΔX = ½√9.25 and ½√3.25 (hessian.test.ts), correlated bins.
const hessian = memberValuesFromRows([[10, 4], [12, 4.5], [9, 3], [10.5, 5], [11, 4]])

function gaussianReplicaSet(n: number, mu: number, sigma: number, seed: number): MemberValues {
  const z = normalStream(seed, { purpose: 'synthetic', index: 0 }).fill(n)
  return memberValuesFromRows([[mu], ...Array.from(z, v => [mu + sigma * v])])
}

describe('Hessian → replicas (Watt & Thorne arXiv:1205.4024)', () => {
  const n = 4000
  const replicas = hessianToReplicas(hessian, 'hessian-pairs', n, normalStream(2024, { purpose: 'synthetic', index: 0 }))
  const pooled = poolSets([{ matrix: hessian, kind: 'hessian-pairs' }], { replicasPerSet: n, seed: 2024 })

  it('member 0 is X₀ and there are N replicas', () => {
    expect(replicas.members).toBe(n + 1)
    expect(Array.from(replicas.values.subarray(0, 2))).toEqual([10, 4])
  })

  it.each([0, 1])('bin %s: pooled mean ± sd reproduces X₀ ± symmetric ΔX within the statistical accuracy', (bin) => {
    const delta = hessianSymmetric(hessian).plus[bin]!
    // Gaussian sampling: sd of the mean ΔX/√N, of the sd ΔX/√(2N); 4σ margins
    expect(Math.abs(pooled.sd.central[bin]! - hessian.values[bin]!)).toBeLessThan(4 * delta / Math.sqrt(n))
    expect(Math.abs(pooled.sd.plus[bin]! - delta)).toBeLessThan(4 * delta / Math.sqrt(2 * n))
  })

  it('reproduces the Hessian bin-to-bin covariance', () => {
    const target = binCovariance(hessian, { kind: 'hessian-pairs' }).values
    const sampled = binCovariance(replicas, { kind: 'replicas' }).values
    // sd of a sample covariance ≈ √((C₀₀C₁₁ + C₀₁²)/N) (Gaussian sampling theory); 4σ margin
    const sd = Math.sqrt((target[0]! * target[3]! + target[1]! ** 2) / n)
    expect(Math.abs(sampled[1]! - target[1]!)).toBeLessThan(4 * sd)
  })

  it('brings a 90% CL set to 68% first', () => {
    const at90 = poolSets([{ matrix: hessian, kind: 'hessian-pairs', clFrom: 90 }], { replicasPerSet: n, seed: 2024 })
    // same normals, so the ratio is exactly the CL factor 1/1.644854 (printed quantile, from memory)
    expectClose(at90.sd.plus[0]! / pooled.sd.plus[0]!, 1 / 1.644854, 5e-7)
  })

  it('is reproducible for a seed', () => {
    const again = poolSets([{ matrix: hessian, kind: 'hessian-pairs' }], { replicasPerSet: n, seed: 2024 })
    expect(again.replicas.values).toEqual(pooled.replicas.values)
  })

  it('draws the set at position s from its own stream { purpose: \'pooling\', index: s }', () => {
    const direct = hessianToReplicas(hessian, 'hessian-pairs', n, normalStream(2024, { purpose: 'pooling', index: 0 }))
    expect(pooled.replicas.values.subarray(2)).toEqual(direct.values.subarray(2))
    // A second set's replicas do not depend on how many deviates the first set used.
    const onePair = memberValuesFromRows([[1, 1], [2, 1.5], [0, 0.5]])
    const threePairs = memberValuesFromRows([[1, 1], [2, 1.5], [0, 0.5], [1.2, 1], [0.8, 1], [1, 1.1], [1, 0.9]])
    const a = poolSets([{ matrix: onePair, kind: 'hessian-pairs' }, { matrix: hessian, kind: 'hessian-pairs' }], { replicasPerSet: 10, seed: 9 })
    const b = poolSets([{ matrix: threePairs, kind: 'hessian-pairs' }, { matrix: hessian, kind: 'hessian-pairs' }], { replicasPerSet: 10, seed: 9 })
    expect(a.replicas.values.subarray(2 * 11)).toEqual(b.replicas.values.subarray(2 * 11))
    expect(a.replicas.values.subarray(2, 2 * 11)).not.toEqual(b.replicas.values.subarray(2, 2 * 11))
  })
})

describe('pooling two sets (PDF4LHC recommendations, arXiv:1510.03865)', () => {
  // Set A: Hessian, one pair, X₀ = 10, ΔX = 1. Set B: Gaussian replicas of mean 12, sd 1.
  // The equal-weight mixture has mean 11 and variance ½(1 + 1) + ¼(12 − 10)² = 2 (law of total
  // variance, common practice); its 16% and 84% points solve ½Φ(x − 10) + ½Φ(x − 12) = p.
  const n = 3000
  const a = memberValuesFromRows([[10], [11], [9]])
  const b = gaussianReplicaSet(n + 500, 12, 1, 77)
  const pool = poolSets([{ matrix: a, kind: 'hessian-pairs' }, { matrix: b, kind: 'replicas' }], { replicasPerSet: n, seed: 5 })

  const mixtureQuantile = (p: number) => {
    let lo = 0
    let hi = 22
    for (let i = 0; i < 100; i++) {
      const mid = 0.5 * (lo + hi)
      if (0.5 * jStat.normal.cdf(mid, 10, 1) + 0.5 * jStat.normal.cdf(mid, 12, 1) < p) lo = mid
      else hi = mid
    }
    return 0.5 * (lo + hi)
  }

  it('takes equal numbers from each set, member 0 the pool mean', () => {
    expect(pool.replicas.members).toBe(2 * n + 1)
    expect(pool.replicasPerSet).toBe(n)
    expectClose(pool.replicas.values[0]!, pool.sd.central[0]!, 1e-14)
    // the replica set's replicas are its first n, unchanged
    expect(pool.replicas.values[n + 1]).toBe(b.values[1])
  })

  it('mean 11 ± √2 within the statistical accuracy of 2N replicas', () => {
    const m = 2 * n
    expect(Math.abs(pool.sd.central[0]! - 11)).toBeLessThan(4 * Math.sqrt(2 / m))
    // sd of the sample sd for this mixture (kurtosis 2.5 rather than 3) is below √2/√(2m); 4σ
    expect(Math.abs(pool.sd.plus[0]! - Math.SQRT2)).toBeLessThan(4 * Math.SQRT2 / Math.sqrt(2 * m))
  })

  it('16th–84th percentile interval matches the mixture quantiles', () => {
    const lo = mixtureQuantile(0.16)
    const hi = mixtureQuantile(0.84)
    // quantile sd √(p(1−p)/m)/f(x) with the mixture density f ≈ 0.18 there: ≈ 0.026; 0.1 is a 4σ margin
    expect(Math.abs(pool.interval.central[0]! - pool.interval.minus[0]! - lo)).toBeLessThan(0.1)
    expect(Math.abs(pool.interval.central[0]! + pool.interval.plus[0]! - hi)).toBeLessThan(0.1)
  })

  it.each([
    { sets: [], message: /at least one/ },
    { sets: [{ matrix: a, kind: 'hessian-pairs' as const }, { matrix: gaussianReplicaSet(10, 0, 1, 1), kind: 'replicas' as const }], message: /has 10 replicas but 3000/ },
    { sets: [{ matrix: a, kind: 'hessian-pairs' as const }, { matrix: memberValuesFromRows([[1, 2], [1, 2], [1, 2]]), kind: 'hessian-pairs' as const }], message: /has 2 bins but set 0 has 1/ }
  ])('rejects: $message', ({ sets, message }) => {
    expect(() => poolSets(sets, { replicasPerSet: n, seed: 1 })).toThrow(message)
  })

  it.each([-1, 0.5, 2 ** 53])('rejects the seed %s, even when no set needs random numbers', (seed) => {
    expect(() => poolSets([{ matrix: b, kind: 'replicas' }], { replicasPerSet: 10, seed })).toThrow(/seed must be a whole number/)
  })
})
