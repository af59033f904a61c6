/**
 * Hessian prescriptions: eigenvector pairs (symmetric and asymmetric) and one-sided eigenvectors.
 */
import type { SetKind } from '../types'
import { makeBands, type Band } from './band'
import { assertMemberValues, type MemberValues } from './matrix'
import { NeumaierSum } from './summation'

/**
 * Number of eigenvectors N of a Hessian member-value matrix: (members − 1)/2 for pairs,
 * members − 1 for one-sided sets.
 *
 * Domain: kind 'hessian-pairs' needs an odd number of members ≥ 3 (central + N pairs, members
 * 2k−1 = X_k⁺, 2k = X_k⁻); 'hessian-one-sided' needs ≥ 2 members.
 * @throws RangeError when the member count does not fit the kind, or for kind 'replicas'.
 * @example eigenvectorCount({ members: 5, bins: 1, values }, 'hessian-pairs') // 2
 */
export function eigenvectorCount(matrix: MemberValues, kind: SetKind): number {
  if (kind === 'hessian-pairs') {
    assertMemberValues(matrix, 1, 'Hessian member-value matrix')
    if (matrix.members < 3 || (matrix.members - 1) % 2 !== 0) {
      throw new RangeError(`A Hessian set of eigenvector pairs needs the central member plus an even number (at least 2) of members; got ${matrix.members} members in all.`)
    }
    return (matrix.members - 1) / 2
  }
  if (kind === 'hessian-one-sided') {
    assertMemberValues(matrix, 2, 'one-sided Hessian member-value matrix')
    return matrix.members - 1
  }
  throw new RangeError('Replica sets have no eigenvectors: reduce them to a Hessian set first (reduceReplicasToHessian).')
}

/**
 * Signed displacement of each bin along each eigenvector, d_kb:
 * ½(X_k⁺ − X_k⁻) for eigenvector pairs, X_k − X₀ for one-sided eigenvectors. This is the
 * linearised response of bin b to eigenvector k that the symmetric formula, the bin-to-bin
 * covariance, the per-eigenvector contributions and the Hessian → replica conversion all use.
 *
 * Unit: that of the observable. Result: rows k = 0..N−1 (eigenvector k+1), `bins` columns.
 * @throws RangeError as eigenvectorCount.
 * @example eigenvectorDeviations(memberValuesFromRows([[10], [12], [9]]), 'hessian-pairs').values // [1.5]
 */
export function eigenvectorDeviations(matrix: MemberValues, kind: SetKind): MemberValues {
  const n = eigenvectorCount(matrix, kind)
  const { bins, values } = matrix
  const out = new Float64Array(n * bins)
  for (let k = 0; k < n; k++) {
    for (let b = 0; b < bins; b++) {
      out[k * bins + b] = kind === 'hessian-pairs'
        ? 0.5 * (values[(2 * k + 1) * bins + b]! - values[(2 * k + 2) * bins + b]!)
        : values[(k + 1) * bins + b]! - values[b]!
    }
  }
  return { members: n, bins, values: out }
}

/** √(Σ_k d_kb²) per bin, with compensated summation. */
function rootSumSquaresPerBin(deviations: MemberValues): Float64Array {
  const out = new Float64Array(deviations.bins)
  for (let b = 0; b < deviations.bins; b++) {
    const s = new NeumaierSum()
    for (let k = 0; k < deviations.members; k++) {
      const d = deviations.values[k * deviations.bins + b]!
      s.add(d * d)
    }
    out[b] = Math.sqrt(s.value)
  }
  return out
}

/**
 * Symmetric Hessian error from eigenvector pairs: ΔX = ½ √(Σ_k (X_k⁺ − X_k⁻)²), central X₀,
 * plus = minus = ΔX (J. Pumplin et al., hep-ph/0101032; see shared/physics/README.md,
 * "Hessian sets").
 *
 * Unit: that of the observable; the band is at the CL of the set's members (rescale with
 * clScaleFactor). Domain: central + N pairs, members 2k−1 = X_k⁺ and 2k = X_k⁻.
 * Method: Neumaier-compensated sum of squares; exact for an observable linear in the parameters.
 * @throws RangeError for a malformed matrix or a member count that is not 1 + 2N.
 * @example hessianSymmetric(memberValuesFromRows([[10], [12], [9]])).plus // [1.5]
 */
export function hessianSymmetric(matrix: MemberValues): Band {
  const delta = rootSumSquaresPerBin(eigenvectorDeviations(matrix, 'hessian-pairs'))
  return makeBands(matrix.values.subarray(0, matrix.bins), delta, delta)
}

/**
 * Asymmetric Hessian errors from eigenvector pairs (P. Nadolsky and Z. Sullivan,
 * hep-ph/0110378; J. M. Campbell, J. W. Huston and W. J. Stirling, hep-ph/0611148):
 * ΔX⁺ = √(Σ_k max(X_k⁺ − X₀, X_k⁻ − X₀, 0)²), ΔX⁻ = √(Σ_k max(X₀ − X_k⁺, X₀ − X_k⁻, 0)²).
 *
 * Unit and domain as hessianSymmetric. Method: compensated sums of squares.
 * @throws RangeError for a malformed matrix or a member count that is not 1 + 2N.
 * @example hessianAsymmetric(memberValuesFromRows([[10], [12], [9]])) // plus [2], minus [1]
 */
export function hessianAsymmetric(matrix: MemberValues): Band {
  const n = eigenvectorCount(matrix, 'hessian-pairs')
  const { bins, values } = matrix
  const plus = new Float64Array(bins)
  const minus = new Float64Array(bins)
  for (let b = 0; b < bins; b++) {
    const x0 = values[b]!
    const up = new NeumaierSum()
    const down = new NeumaierSum()
    for (let k = 0; k < n; k++) {
      const dp = values[(2 * k + 1) * bins + b]! - x0
      const dm = values[(2 * k + 2) * bins + b]! - x0
      const u = Math.max(dp, dm, 0)
      const d = Math.max(-dp, -dm, 0)
      up.add(u * u)
      down.add(d * d)
    }
    plus[b] = Math.sqrt(up.value)
    minus[b] = Math.sqrt(down.value)
  }
  return makeBands(values.subarray(0, bins), plus, minus)
}

/**
 * Symmetric error from one-sided eigenvectors: ΔX = √(Σ_k (X_k − X₀)²), central X₀,
 * plus = minus = ΔX (common practice; see shared/physics/README.md, "Hessian sets").
 *
 * Unit: that of the observable, at the CL of the set. Domain: central + N ≥ 1 members.
 * Method: compensated sum of squares.
 * @throws RangeError for a malformed matrix.
 * @example hessianOneSided(memberValuesFromRows([[10], [13], [6]])).plus // [5]
 */
export function hessianOneSided(matrix: MemberValues): Band {
  const delta = rootSumSquaresPerBin(eigenvectorDeviations(matrix, 'hessian-one-sided'))
  return makeBands(matrix.values.subarray(0, matrix.bins), delta, delta)
}
