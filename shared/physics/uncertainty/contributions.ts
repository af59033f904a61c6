/**
 * Per-eigenvector contributions to the Hessian uncertainty of one bin (which eigenvector drives
 * it), for a bar chart.
 */
import type { SetKind } from '../types'
import { clScaleFactor } from './confidence'
import { eigenvectorDeviations } from './hessian'
import { assertBinIndex, withoutMembers, type MemberValues } from './matrix'
import { NeumaierSum } from './summation'

/** Contributions of every eigenvector to one bin's symmetric Hessian uncertainty. */
export interface EigenvectorContributions {
  /** Eigenvector numbers 1..N, in the set's order. */
  eigenvector: Int32Array
  /**
   * Signed shift of the bin along each eigenvector at the requested CL: ½(X_k⁺ − X_k⁻) for pairs,
   * X_k − X₀ for one-sided sets. Unit: that of the observable.
   */
  signed: Float64Array
  /** Share of the total variance, signed_k² / Σ_j signed_j²; sums to 1 (NaN if the total is 0). */
  fraction: Float64Array
  /** The symmetric uncertainty √(Σ_k signed_k²) these add up to, in the observable's unit. */
  total: number
}

/**
 * Contribution of each eigenvector k to bin `bin` (standard diagnostic; see
 * shared/physics/README.md, "Eigenvector contributions"): the signed shift d_k and its squared
 * fraction d_k²/Σ_j d_j² of the symmetric uncertainty squared.
 *
 * Unit: signed and total in the observable's unit; fraction dimensionless.
 * Domain: a Hessian set (kind 'hessian-pairs' or 'hessian-one-sided'; replicas have no
 * eigenvectors — reduce them with reduceReplicasToHessian first); 0 ≤ bin < bins; optional α_s
 * members are left out; CLs in percent (default 68 → 68).
 * Method: Neumaier-compensated sum of squares.
 * @throws RangeError for replicas, a bad bin, or a member count that does not fit the kind.
 * @example eigenvectorContributions(memberValuesFromRows([[10], [13], [7], [10.5], [9.5]]), 0, { kind: 'hessian-pairs' }) // signed [3, 0.5], fraction [36/37, 1/37]
 */
export function eigenvectorContributions(
  matrix: MemberValues,
  bin: number,
  options: { kind: SetKind, clFrom?: number, clTo?: number, alphasMembers?: readonly [number, number] }
): EigenvectorContributions {
  assertBinIndex(matrix, bin)
  const pdfMembers = options.alphasMembers === undefined ? matrix : withoutMembers(matrix, options.alphasMembers)
  const rows = eigenvectorDeviations(pdfMembers, options.kind)
  const factor = clScaleFactor(options.clFrom ?? 68, options.clTo ?? 68)
  const n = rows.members
  const signed = new Float64Array(n)
  const total = new NeumaierSum()
  for (let k = 0; k < n; k++) {
    signed[k] = rows.values[k * rows.bins + bin]! * factor
    total.add(signed[k]! ** 2)
  }
  const variance = total.value
  return {
    eigenvector: Int32Array.from({ length: n }, (_, k) => k + 1),
    signed,
    fraction: signed.map(d => variance === 0 ? Number.NaN : d * d / variance),
    total: Math.sqrt(variance)
  }
}
