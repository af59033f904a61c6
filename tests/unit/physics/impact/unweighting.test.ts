import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { replicaChi2, reweightingWeights, unweightedCopies, unweightedMatrix, unweightedSet, unweightingErrors, weightedMoments } from '../../../../shared/physics/impact'
import { parseSetFile, writeSetFile } from '../../../../shared/physics/sets'
import { memberValuesFromRows, replicaMoments } from '../../../../shared/physics/uncertainty'
import { expectClose } from '../close'
import { DATA, DATA_COVARIANCE, toyReplicas } from './gaussian-toy'

describe('unweighting', () => {
  it('copies replicas by the cumulative weights of arXiv:1108.1758 (hand-worked)', () => {
    // w = (2, 1, 1, 0), N = 4, N′ = 4: P = (0.5, 0.75, 1, 1); positions j/N′ = 0.25, 0.5, 0.75, 1.
    // (0, 0.5] holds 0.25 and 0.5 → 2 copies; (0.5, 0.75] holds 0.75 → 1; (0.75, 1] holds 1 → 1; the last none.
    expect(Array.from(unweightedCopies([2, 1, 1, 0], 4))).toEqual([2, 1, 1, 0])
    // N′ = 8: positions 0.125 … 1 in steps of 0.125: 4 in (0, 0.5], 2 in (0.5, 0.75], 2 in (0.75, 1].
    expect(Array.from(unweightedCopies([2, 1, 1, 0], 8))).toEqual([4, 2, 2, 0])
  })

  it('is deterministic for a seed, totals N′, and stays within one copy of N′w_k/N', () => {
    const weights = [0.3, 2.1, 0.05, 1.2, 0.35]
    const a = unweightedCopies(weights, 37, { seed: 7 })
    expect(Array.from(unweightedCopies(weights, 37, { seed: 7 }))).toEqual(Array.from(a))
    expect(a.reduce((s, v) => s + v, 0)).toBe(37)
    a.forEach((c, k) => expect(Math.abs(c - 37 * weights[k]! / 4)).toBeLessThan(1))
  })

  // Check: the unweighted set reproduces the weighted mean and variance within the statistical
  // error it states (σ/√N′ and σ²√(2/(N′ − 1)), the errors of N′ Gaussian draws, common practice).
  it('keeps the weighted mean and variance within its stated statistical error', () => {
    const { predictions } = toyReplicas(20000)
    const measurement = { values: DATA, covariance: { size: 4, values: Float64Array.from(DATA_COVARIANCE.to1DArray()) } }
    const weights = reweightingWeights(replicaChi2(predictions, measurement), 4)
    const count = 1000
    const unweighted = unweightedMatrix(predictions, unweightedCopies(weights, count, { seed: 3 }))
    expect(unweighted.members).toBe(count + 1)
    const target = weightedMoments(predictions, weights)
    const got = replicaMoments(unweighted)
    const errors = unweightingErrors(predictions, weights, count)
    for (let b = 0; b < 4; b++) {
      expect(Math.abs(got.mean[b]! - target.mean[b]!)).toBeLessThan(3 * errors.mean[b]!)
      expect(Math.abs(got.variance[b]! - target.variance[b]!)).toBeLessThan(3 * errors.variance[b]!)
    }
    // Member 0 is the mean of the new replicas.
    expectClose(unweighted.values.subarray(0, 4), got.mean, 1e-13)
  })

  it('builds a replica set file of the new replicas with provenance', () => {
    const parent = parseSetFile(readFileSync('samples/sets/toy-replicas.sheafset'))
    const n = parent.members.length - 1 - (parent.header.alphasMembers ? 2 : 0)
    const weights = Array.from({ length: n }, (_, k) => (k % 3 === 0 ? 2 : 0.5))
    const set = unweightedSet(parent, unweightedCopies(weights, 30, { seed: 1 }), { name: 'toy-reweighted', provenance: 'Reweighted by test data (N_eff 12.3).' })
    expect(set.header).toMatchObject({ kind: 'replicas', memberCount: 31, replicaCentral: 'mean', name: 'toy-reweighted' })
    expect(set.header.provenance).toMatch(/^Reweighted by test data \(N_eff 12\.3\)\. Parent set: /)
    // The file writer's checks (member 0 is the replica mean, among others) accept it.
    const back = parseSetFile(writeSetFile(set))
    expect(back.members).toHaveLength(31)
    expect(() => unweightedSet(parent, [1, 2], { name: 'x', provenance: '' })).toThrow(/2 copy counts for the \d+ replicas/)
  })

  it.each([
    [[1, 1], 0, /whole number ≥ 1 of replicas; got 0/],
    [[0, 0], 3, /weights sum to 0/],
    [[1, -2], 3, /weight of replica 2 must be a finite number ≥ 0; got -2/]
  ])('refuses weights %j with N′ = %d', (weights, count, message) => {
    expect(() => unweightedCopies(weights, count)).toThrow(message)
  })

  it('refuses an unweighted set of fewer than two replicas', () => {
    expect(() => unweightedMatrix(memberValuesFromRows([[1], [2], [3]]), [1, 0])).toThrow(/would hold 1 replica; at least two/)
  })
})
