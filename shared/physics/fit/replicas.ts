/**
 * Monte-Carlo replicas of a fit's parameters (see shared/physics/README.md, "Members from a
 * fit"): p_r = p₀ + L z_r with C = L Lᵀ (Cholesky, ml-matrix) and z_r a vector of independent
 * standard normal deviates from the engine's generator (random.ts), stream
 * { purpose: 'fit-replicas', index: r } of the seed for replica r.
 */
import { CholeskyDecomposition } from 'ml-matrix'
import { checkedCovariance, type CovarianceLike } from './covariance'
import { standardNormals } from '../random'

/**
 * `count` replica parameter vectors p_r = p₀ + L z_r, r = 0..count−1.
 *
 * Reproducibility: replica r depends only on (seed, r, C): the same seed gives the same replicas
 * on any machine, and the first N replicas of a larger draw are the N replicas of a smaller one.
 * Statistics: the sample mean and covariance converge to p₀ and C as 1/√count.
 * @param seed integer 0 ≤ seed ≤ 2⁵³ − 1.
 * @throws RangeError for a bad covariance (see checkedCovariance), count < 1 or a bad seed.
 * @example replicaParameters([0.8, 3], [[1e-4, 0], [0, 4e-2]], 100, 2024)[0]
 */
export function replicaParameters(central: ArrayLike<number>, covariance: CovarianceLike, count: number, seed: number): Float64Array[] {
  if (!Number.isInteger(count) || count < 1 || count > 100000) throw new RangeError(`the replica count must be an integer 1..100000; got ${count}`)
  const n = central.length
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(central[i])) throw new RangeError(`central parameter ${i} is ${central[i]}`)
  }
  const l = new CholeskyDecomposition(checkedCovariance(covariance, n)).lowerTriangularMatrix
  const lower = Array.from({ length: n }, (_, i) => Float64Array.from({ length: i + 1 }, (_, j) => l.get(i, j)))
  const out: Float64Array[] = []
  for (let r = 0; r < count; r++) {
    const z = standardNormals(seed, { purpose: 'fit-replicas', index: r }, n)
    const p = new Float64Array(n)
    for (let i = 0; i < n; i++) {
      let s = central[i]!
      const row = lower[i]!
      for (let j = 0; j <= i; j++) s += row[j]! * z[j]!
      p[i] = s
    }
    out.push(p)
  }
  return out
}
