/**
 * Hessian eigenvector members from a fit's parameter covariance (J. Pumplin et al.,
 * hep-ph/0101032; see shared/physics/README.md, "Members from a fit"): with
 * C = Σ_k λ_k e_k e_kᵀ (eigen-decomposition) and tolerance T (Δχ² = T²),
 *   p_k^± = p₀ ± T √λ_k e_k,   k = 1..n.
 * For an observable linear in the parameters, X(p) = X₀ + gᵀ(p − p₀), the symmetric Hessian
 * formula ½√(Σ_k (X_k⁺ − X_k⁻)²) then equals T √(gᵀ C g) exactly.
 */
import { EigenvalueDecomposition } from 'ml-matrix'
import { checkedCovariance, type CovarianceLike } from './covariance'

/** Hessian members and the eigen-decomposition they came from. */
export interface HessianMembers {
  /** 2n parameter vectors: members[2k] = p_{k+1}⁺, members[2k+1] = p_{k+1}⁻ (largest λ first). */
  members: Float64Array[]
  /** Eigenvalues λ_k of the covariance, descending (units: parameter² ). */
  eigenvalues: Float64Array
  /** Unit eigenvectors e_k, same order; sign fixed so the largest-magnitude component is positive. */
  eigenvectors: Float64Array[]
  tolerance: number
}

/**
 * Hessian eigenvector pairs p_k^± = p₀ ± T√λ_k e_k from the covariance (ml-matrix
 * EigenvalueDecomposition, symmetric algorithm).
 * @param central p₀, the fit's central parameter vector.
 * @param covariance the parameter covariance C (n×n, symmetric positive definite).
 * @param tolerance T > 0; Δχ² = T². T = 1 gives 68% CL spreads for Gaussian errors;
 *   T = 1.644854 (the 95th percentile of the unit normal) quotes 90% CL.
 * @throws RangeError for a bad covariance (see checkedCovariance), a size mismatch or T ≤ 0.
 * @example hessianMembers([1, 2], [[0.04, 0], [0, 0.01]], 1).members[0] // [1.2, 2]
 */
export function hessianMembers(central: ArrayLike<number>, covariance: CovarianceLike, tolerance: number): HessianMembers {
  if (!(tolerance > 0) || !Number.isFinite(tolerance)) throw new RangeError(`the Hessian tolerance T must be a finite number > 0; got ${tolerance}`)
  const n = central.length
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(central[i])) throw new RangeError(`central parameter ${i} is ${central[i]}`)
  }
  const c = checkedCovariance(covariance, n)
  const evd = new EigenvalueDecomposition(c, { assumeSymmetric: true })
  const values = evd.realEigenvalues
  const vectors = evd.eigenvectorMatrix
  const order = values.map((v, i) => [v, i] as const).sort((a, b) => b[0] - a[0]).map(([, i]) => i)
  const eigenvalues = new Float64Array(n)
  const eigenvectors: Float64Array[] = []
  const members: Float64Array[] = []
  order.forEach((col, k) => {
    const lambda = values[col]!
    if (!(lambda > 0)) throw new RangeError(`the covariance has a non-positive eigenvalue λ = ${lambda}; it is not positive definite`)
    eigenvalues[k] = lambda
    const e = Float64Array.from({ length: n }, (_, i) => vectors.get(i, col))
    let big = 0
    for (let i = 1; i < n; i++) if (Math.abs(e[i]!) > Math.abs(e[big]!)) big = i
    if (e[big]! < 0) e.forEach((v, i) => { e[i] = -v })
    eigenvectors.push(e)
    const step = tolerance * Math.sqrt(lambda)
    members.push(Float64Array.from({ length: n }, (_, i) => central[i]! + step * e[i]!))
    members.push(Float64Array.from({ length: n }, (_, i) => central[i]! - step * e[i]!))
  })
  return { members, eigenvalues, eigenvectors, tolerance }
}
