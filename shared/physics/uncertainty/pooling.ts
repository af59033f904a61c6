/**
 * Monte-Carlo combination of several sets (PDF4LHC recommendations, arXiv:1510.03865; see
 * shared/physics/README.md, "Combining sets"): Hessian sets are turned into replicas, equal
 * numbers of replicas are pooled, the pool gives the band.
 */
import { normalStream, type NormalGenerator } from '../random'
import type { SetKind } from '../types'
import type { Band } from './band'
import { clScaleFactor } from './confidence'
import { eigenvectorDeviations } from './hessian'
import { assertMemberValues, withoutMembers, type MemberValues } from './matrix'
import { replicaCount, replicaMeanSd, replicaMedianInterval, replicaMoments } from './replicas'

/**
 * Replicas from a Hessian set (G. Watt and R. S. Thorne, arXiv:1205.4024):
 * X_r = X₀ + Σ_k d_k R_kr with R_kr independent standard normal deviates and d_k the signed
 * eigenvector shift, ½(X_k⁺ − X_k⁻) for pairs or X_k − X₀ for one-sided sets, rescaled from
 * `clFrom` to 68% CL. For large N their mean tends to X₀ and their standard deviation to the
 * symmetric Hessian error at 68% CL, with statistical accuracy ≈ ΔX/√(2N).
 *
 * Unit: that of the observable. Result: 1 + N members, member 0 = X₀, members 1..N the replicas.
 * Domain: a Hessian member-value matrix without α_s members; N ≥ 1; clFrom in (0, 100).
 * Method: deviates drawn in the order replica 1 eigenvectors 1..K, replica 2 …, from `normals`
 * (normalStream(seed, key) of random.ts for a reproducible stream).
 * @throws RangeError for replicas as input, a member count that does not fit the kind, or N < 1.
 * @example hessianToReplicas(m, 'hessian-pairs', 100, normalStream(1, { purpose: 'synthetic', index: 0 }), 90)
 */
export function hessianToReplicas(
  matrix: MemberValues,
  kind: SetKind,
  replicas: number,
  normals: NormalGenerator,
  clFrom = 68
): MemberValues {
  if (!Number.isInteger(replicas) || replicas < 1) throw new RangeError(`Cannot make ${replicas} replicas: give a whole number ≥ 1.`)
  const shifts = eigenvectorDeviations(matrix, kind)
  const factor = clScaleFactor(clFrom, 68)
  const { members: k, bins } = shifts
  const out = new Float64Array((replicas + 1) * bins)
  out.set(matrix.values.subarray(0, bins))
  for (let r = 1; r <= replicas; r++) {
    const row = out.subarray(r * bins, (r + 1) * bins)
    row.set(matrix.values.subarray(0, bins))
    for (let e = 0; e < k; e++) {
      const weight = normals.next() * factor
      const shift = shifts.values.subarray(e * bins, (e + 1) * bins)
      for (let b = 0; b < bins; b++) row[b] = row[b]! + weight * shift[b]!
    }
  }
  return { members: replicas + 1, bins, values: out }
}

/** One set entering a pooled combination. */
export interface PoolMember {
  matrix: MemberValues
  kind: SetKind
  /** CL of the set's members, percent; default 68. */
  clFrom?: number
  /** [down, up] α_s members, left out of the pool (α_s is combined separately). */
  alphasMembers?: readonly [number, number]
}

/** Result of poolSets. */
export interface PooledSets {
  /** The pool: member 0 = mean of all pooled replicas, then each set's replicas in input order. */
  replicas: MemberValues
  /** Replicas taken from each set. */
  replicasPerSet: number
  /** Mean ± sample standard deviation of the pool, 68% CL. */
  sd: Band
  /** Median and 15.87th–84.13th percentile (1σ) interval of the pool. */
  interval: Band
}

/**
 * Monte-Carlo pooling of several sets on the same bins (PDF4LHC recommendations,
 * J. Butterworth et al., arXiv:1510.03865): `replicasPerSet` replicas from each set —
 * the first ones of a replica set (rescaled about the mean of all its replicas to 68% CL if
 * clFrom ≠ 68), or
 * Watt–Thorne replicas of a Hessian set (hessianToReplicas) — pooled with equal weight, then
 * mean ± sd and the 1σ percentile interval (15.87–84.13 %) of the pool.
 *
 * Unit: that of the observable. Domain: at least one set; every set with the same bins;
 * replica sets with at least `replicasPerSet` replicas; replicasPerSet ≥ 2; seed an integer
 * 0 ≤ seed ≤ 2⁵³ − 1. α_s members are left out of the pool.
 * Method: each set draws from its own normal stream, normalStream(seed, { purpose: 'pooling',
 * index: s }) for the set at position s, so the same inputs and seed give the same pool and a
 * set's replicas do not depend on the sets before it. Statistical accuracy of the band ≈ 1/√(2·M)
 * relative for a pool of M replicas.
 * @throws RangeError naming the offending set.
 * @example poolSets([{ matrix: a, kind: 'hessian-pairs', clFrom: 90 }, { matrix: b, kind: 'replicas' }], { replicasPerSet: 300, seed: 1 })
 */
export function poolSets(sets: readonly PoolMember[], options: { replicasPerSet: number, seed: number }): PooledSets {
  const { replicasPerSet, seed } = options
  if (sets.length === 0) throw new RangeError('No sets to pool: give at least one.')
  if (!Number.isInteger(replicasPerSet) || replicasPerSet < 2) {
    throw new RangeError(`Pooling needs at least 2 replicas per set; got ${replicasPerSet}.`)
  }
  if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`The pooling seed must be a whole number from 0 to 2^53 − 1; got ${seed}.`)
  const bins = sets[0]!.matrix.bins
  const total = replicasPerSet * sets.length
  const values = new Float64Array((total + 1) * bins)
  sets.forEach((set, s) => {
    assertMemberValues(set.matrix, 2, `set ${s}`)
    if (set.matrix.bins !== bins) {
      throw new RangeError(`Set ${s} has ${set.matrix.bins} bins but set 0 has ${bins}: pooled sets must share the bins.`)
    }
    const pdf = set.alphasMembers === undefined ? set.matrix : withoutMembers(set.matrix, set.alphasMembers)
    const part = set.kind === 'replicas'
      ? firstReplicas(pdf, replicasPerSet, set.clFrom ?? 68, s)
      : hessianToReplicas(pdf, set.kind, replicasPerSet, normalStream(seed, { purpose: 'pooling', index: s }), set.clFrom ?? 68)
    values.set(part.values.subarray(bins), (1 + s * replicasPerSet) * bins)
  })
  const pooled: MemberValues = { members: total + 1, bins, values }
  values.set(replicaMoments(pooled).mean)
  return { replicas: pooled, replicasPerSet, sd: replicaMeanSd(pooled), interval: replicaMedianInterval(pooled, 68) }
}

/** Members 0..count of a replica set, the replicas rescaled about the set's replica mean to 68% CL. */
function firstReplicas(matrix: MemberValues, count: number, clFrom: number, index: number): MemberValues {
  const available = replicaCount(matrix)
  if (available < count) {
    throw new RangeError(`Set ${index} has ${available} replicas but ${count} are to be pooled from each set: lower the number per set.`)
  }
  const { bins } = matrix
  const head: MemberValues = { members: count + 1, bins, values: matrix.values.slice(0, (count + 1) * bins) }
  const factor = clScaleFactor(clFrom, 68)
  if (factor === 1) return head
  const { mean } = replicaMoments(matrix)
  const values = head.values.map((v, i) => i < bins ? v : mean[i % bins]! + (v - mean[i % bins]!) * factor)
  return { ...head, values }
}
