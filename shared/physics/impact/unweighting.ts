/**
 * Unweighting: turning reweighted replicas into an ordinary replica set of equal weights (see
 * shared/physics/README.md, section 21.3).
 */
import { uniformStream } from '../random'
import type { ErrorSet, SetHeader } from '../types'
import type { MemberValues } from '../uncertainty'
import { replicaCount } from '../uncertainty/replicas'
import { derivedHeader, type DerivedSetInfo } from './derived-set'
import { weightedMoments } from './reweighting'

/** Options of {@link unweightedCopies}. */
export interface UnweightingOptions {
  /**
   * Seed of the random offset u of the sampling positions (stream 'unweighting', index 0 of
   * random.ts). Without a seed u = 0, which is exactly the deterministic prescription of
   * R. D. Ball et al., arXiv:1108.1758.
   */
  seed?: number
}

/**
 * How many copies of each replica the unweighted set holds (R. D. Ball et al., arXiv:1108.1758):
 * with the cumulative probabilities P_k = (1/N) Σ_{j≤k} w_j (P₀ = 0, P_N = 1), replica k is copied
 * once for every sampling position t_j = (j − u)/N′, j = 1..N′, that falls in (P_{k−1}, P_k]. With
 * u = 0 this is the paper's θ-function formula; with u drawn from the seed it is the same
 * systematic sampling with a random phase (common practice), still deterministic for a fixed seed.
 * Σ_k copies_k = N′, and copies_k differs from N′ w_k/N by less than 1.
 *
 * Unit: counts. Domain: N ≥ 1 weights ≥ 0 with a positive sum; N′ a whole number ≥ 1.
 * @throws RangeError for bad weights or N′.
 * @example unweightedCopies([2, 1, 1, 0], 4) // [2, 1, 1, 0]
 */
export function unweightedCopies(weights: ArrayLike<number>, count: number, options: UnweightingOptions = {}): Int32Array {
  if (!Number.isInteger(count) || count < 1) throw new RangeError(`The unweighted set needs a whole number ≥ 1 of replicas; got ${count}.`)
  const n = weights.length
  if (n === 0) throw new RangeError('No weights given.')
  let total = 0
  for (let k = 0; k < n; k++) {
    const w = weights[k]!
    if (!(Number.isFinite(w) && w >= 0)) throw new RangeError(`The weight of replica ${k + 1} must be a finite number ≥ 0; got ${w}.`)
    total += w
  }
  if (!(total > 0)) throw new RangeError('The weights sum to 0: there is nothing to unweight.')
  const u = options.seed === undefined ? 0 : uniformStream(options.seed, { purpose: 'unweighting', index: 0 })()
  const copies = new Int32Array(n)
  let cumulative = 0
  let j = 1
  for (let k = 0; k < n; k++) {
    cumulative += weights[k]!
    const upper = k === n - 1 ? 1 : cumulative / total
    while (j <= count && (j - u) / count <= upper) {
      copies[k] = copies[k]! + 1
      j++
    }
  }
  return copies
}

/**
 * Member-value matrix of the unweighted replicas: replica k repeated copies_k times, in replica
 * order, with member 0 their mean.
 *
 * Unit: that of the matrix. Domain: a replica matrix with one count per replica, at least two
 * unweighted replicas.
 * @throws RangeError on a count mismatch.
 * @example unweightedMatrix(memberValuesFromRows([[2], [1], [3]]), [2, 0]).values // [1, 1, 1]
 */
export function unweightedMatrix(matrix: MemberValues, copies: ArrayLike<number>): MemberValues {
  const n = replicaCount(matrix)
  const rows = replicaRows(n, copies)
  const { bins } = matrix
  const values = new Float64Array((rows.length + 1) * bins)
  rows.forEach((k, r) => values.set(matrix.values.subarray(k * bins, (k + 1) * bins), (r + 1) * bins))
  for (let b = 0; b < bins; b++) {
    let s = 0
    for (let r = 1; r <= rows.length; r++) s += values[r * bins + b]!
    values[b] = s / rows.length
  }
  return { members: rows.length + 1, bins, values }
}

/** The parent replica (1..N) of every unweighted replica. */
function replicaRows(n: number, copies: ArrayLike<number>): number[] {
  if (copies.length !== n) throw new RangeError(`There are ${copies.length} copy counts for ${n} replicas: give one per replica.`)
  const rows: number[] = []
  for (let k = 0; k < n; k++) for (let c = 0; c < copies[k]!; c++) rows.push(k + 1)
  if (rows.length < 2) throw new RangeError(`The unweighted set would hold ${rows.length} replica; at least two are needed.`)
  return rows
}

/**
 * Statistical error of unweighting, one standard deviation per bin, for N′ unweighted replicas of
 * a weighted distribution with variance σ_b²: σ_b/√N′ on the mean and σ_b²·√(2/(N′ − 1)) on the
 * variance (the errors of a sample of N′ independent Gaussian draws, common practice; systematic
 * sampling does at least as well).
 *
 * Unit: the observable's unit (mean) and its square (variance). Domain: as weightedMoments; N′ ≥ 2.
 * @example unweightingErrors(m, weights, 1000).mean // per-bin error of the unweighted mean
 */
export function unweightingErrors(matrix: MemberValues, weights: ArrayLike<number>, count: number): { mean: Float64Array, variance: Float64Array } {
  if (!Number.isInteger(count) || count < 2) throw new RangeError(`The unweighted set needs a whole number ≥ 2 of replicas; got ${count}.`)
  const { variance } = weightedMoments(matrix, weights)
  return {
    mean: variance.map(v => Math.sqrt(v / count)),
    variance: variance.map(v => v * Math.sqrt(2 / (count - 1)))
  }
}

/**
 * The unweighted replica set built from a parent replica set: replica k's grid copied copies_k
 * times, member 0 the mean of the new replicas (replicaCentral 'mean'), the parent's grid,
 * scheme, target, α_s(M_Z) and CL. α_s members of the parent are not carried over (they are not
 * replicas).
 *
 * Unit: grids hold x·f as the parent. Domain: a replica set, one count per replica (members
 * 1..N, α_s members excluded: give them zero copies or pass a set without them).
 * @throws RangeError for a set that is not a replica set or a count mismatch.
 * @example unweightedSet(parent, unweightedCopies(weights, 100, { seed: 1 }), { name: 'parent-rw', provenance: 'by data.csv' })
 */
export function unweightedSet(parent: ErrorSet, copies: ArrayLike<number>, info: DerivedSetInfo): ErrorSet {
  if (parent.header.kind !== 'replicas') throw new RangeError(`Only a replica set can be unweighted; '${parent.header.name}' is of kind ${parent.header.kind}.`)
  const alphas = new Set(parent.header.alphasMembers ?? [])
  const replicaIndices = parent.members.map((_, m) => m).filter(m => m > 0 && !alphas.has(m))
  if (copies.length !== replicaIndices.length) {
    throw new RangeError(`There are ${copies.length} copy counts for the ${replicaIndices.length} replicas of '${parent.header.name}': give one per replica.`)
  }
  const rows = replicaRows(replicaIndices.length, copies).map(r => replicaIndices[r - 1]!)
  const size = parent.members[0]!.length
  const mean = new Float64Array(size)
  for (const r of rows) {
    const m = parent.members[r]!
    for (let t = 0; t < size; t++) mean[t] = mean[t]! + m[t]!
  }
  for (let t = 0; t < size; t++) mean[t] = mean[t]! / rows.length
  const header: SetHeader = {
    ...derivedHeader(parent.header, info),
    memberCount: rows.length + 1,
    replicaCentral: 'mean'
  }
  return { header, x: parent.x.slice(), q2: parent.q2.slice(), flavours: [...parent.flavours], members: [mean, ...rows.map(r => parent.members[r]!.slice())] }
}
