/**
 * Monte-Carlo replica prescriptions: mean ± sample standard deviation, and the median with a
 * central percentile interval.
 */
import { makeBands, type Band } from './band'
import { assertMemberValues, type MemberValues } from './matrix'
import { coverageFraction } from './confidence'
import { quantilesOfSorted } from './quantile'

/**
 * Number of replicas N of a replica member-value matrix (members 1..N; member 0 is not a replica).
 * @throws RangeError unless there are at least `min` replicas.
 * @example replicaCount({ members: 101, bins: 3, values }) // 100
 */
export function replicaCount(matrix: MemberValues, min = 2): number {
  assertMemberValues(matrix, 1 + min, 'replica member-value matrix')
  return matrix.members - 1
}

/**
 * Per-bin mean and sample variance of the replicas (members 1..N):
 * mean = (1/N) Σ_r X_r, variance = (1/(N−1)) Σ_r (X_r − mean)².
 *
 * Unit: mean in the observable's unit, variance in its square. Domain: N ≥ 2 replicas.
 * Method: Welford's one-pass update (B. P. Welford, Technometrics 4 (1962) 419), run for all
 * bins at once replica by replica; stable for replicas with a large common offset.
 * @throws RangeError for fewer than two replicas or a malformed matrix.
 * @example replicaMoments(memberValuesFromRows([[0], [1], [2], [3]])) // mean [2], variance [1]
 */
export function replicaMoments(matrix: MemberValues): { mean: Float64Array, variance: Float64Array } {
  const n = replicaCount(matrix)
  const { bins, values } = matrix
  const mean = new Float64Array(bins)
  const m2 = new Float64Array(bins)
  for (let r = 1; r <= n; r++) {
    const offset = r * bins
    for (let b = 0; b < bins; b++) {
      const x = values[offset + b]!
      const delta = x - mean[b]!
      mean[b] = mean[b]! + delta / r
      m2[b] = m2[b]! + delta * (x - mean[b]!)
    }
  }
  const variance = m2.map(v => Math.max(v, 0) / (n - 1))
  return { mean, variance }
}

/**
 * Replica band from the mean and sample standard deviation: central = mean of members 1..N,
 * plus = minus = √(variance) with the 1/(N−1) normalisation (common practice; see
 * shared/physics/README.md, "Replica sets").
 *
 * Unit: that of the observable. Domain: N ≥ 2 replicas. Method: replicaMoments (Welford).
 * The statistical accuracy of the sd itself is about sd/√(2(N−1)) for Gaussian replicas.
 * @throws RangeError for fewer than two replicas.
 * @example replicaMeanSd(memberValuesFromRows([[0], [1], [2], [3]])) // central [2], plus [1], minus [1]
 */
export function replicaMeanSd(matrix: MemberValues): Band {
  const { mean, variance } = replicaMoments(matrix)
  const sd = variance.map(Math.sqrt)
  return makeBands(mean, sd, sd)
}

/**
 * Replica band from the median and the central interval at confidence level `clPercent`, read
 * from the replicas' own percentiles (no Gaussian assumption): with c = coverageFraction(CL) and
 * p± = (1 ± c)/2, central = Q(½), plus = Q(p₊) − Q(½), minus = Q(½) − Q(p₋), Q the sample
 * quantile of members 1..N by linear interpolation between order statistics (sampleQuantile;
 * Hyndman–Fan definition 7). 90 gives the 5th and 95th percentiles; 68 means one Gaussian σ and
 * gives the 15.87th and 84.13th (see shared/physics/README.md, "Replica sets" and "Confidence
 * levels"; common practice for skewed replica distributions).
 *
 * Unit: that of the observable. Domain: N ≥ 2 replicas, 0 < clPercent < 100.
 * Method: one sort per bin, O(B · N log N).
 * @throws RangeError for fewer than two replicas or a CL outside (0, 100).
 * @example replicaMedianInterval(memberValuesFromRows([[0], [1], [2], [3], [4], [5]]), 90) // central [3], plus [1.8], minus [1.8]
 */
export function replicaMedianInterval(matrix: MemberValues, clPercent = 68): Band {
  if (!(clPercent > 0 && clPercent < 100)) {
    throw new RangeError(`The confidence level of a replica interval must be a percentage strictly between 0 and 100; got ${clPercent}.`)
  }
  const n = replicaCount(matrix)
  const { bins, values } = matrix
  const c = coverageFraction(clPercent)
  const probabilities = [(1 - c) / 2, 0.5, (1 + c) / 2]
  const central = new Float64Array(bins)
  const plus = new Float64Array(bins)
  const minus = new Float64Array(bins)
  const column = new Float64Array(n)
  for (let b = 0; b < bins; b++) {
    for (let r = 0; r < n; r++) column[r] = values[(r + 1) * bins + b]!
    const [lo, median, hi] = quantilesOfSorted(column.sort(), probabilities)
    central[b] = median!
    plus[b] = Math.max(hi! - median!, 0)
    minus[b] = Math.max(median! - lo!, 0)
  }
  return makeBands(central, plus, minus)
}
