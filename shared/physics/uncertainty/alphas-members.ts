/**
 * α_s variation members: the uncertainty from α_s(M_Z), combined with the PDF error apart.
 */
import { assertMemberValues, type MemberValues } from './matrix'

/**
 * Signed half-difference ½(X(α_s⁺) − X(α_s⁻)) per bin between the members computed with the upper
 * and lower α_s(M_Z) value. Its magnitude is the α_s uncertainty ΔX_αs (see
 * shared/physics/README.md, "α_s members"); the sign gives the direction, which the bin-to-bin
 * covariance needs.
 *
 * Unit: that of the observable. Domain: `members` = [down, up], two distinct member indices in
 * 1..members−1 (the convention of SetHeader.alphasMembers).
 * @throws RangeError for indices out of range or equal.
 * @example alphasShift(memberValuesFromRows([[10], [9], [12]]), [1, 2]) // [1.5]
 */
export function alphasShift(matrix: MemberValues, members: readonly [number, number]): Float64Array {
  assertMemberValues(matrix, 3, 'member-value matrix with α_s members')
  const [down, up] = members
  for (const k of members) {
    if (!Number.isInteger(k) || k < 1 || k >= matrix.members) {
      throw new RangeError(`α_s member ${k} does not exist: members run from 1 to ${matrix.members - 1}.`)
    }
  }
  if (down === up) throw new RangeError(`The α_s down and up members must differ; both are ${down}.`)
  const { bins, values } = matrix
  const out = new Float64Array(bins)
  for (let b = 0; b < bins; b++) out[b] = 0.5 * (values[up * bins + b]! - values[down * bins + b]!)
  return out
}

/**
 * α_s uncertainty ΔX_αs = ½|X(α_s⁺) − X(α_s⁻)| per bin (PDF4LHC recommendations,
 * arXiv:1510.03865; see shared/physics/README.md, "α_s members"), to be added in quadrature to
 * the PDF uncertainty (addInQuadrature). It is at the CL of the α_s(M_Z) variation the set used.
 *
 * Unit: that of the observable. Domain and errors as alphasShift.
 * @example alphasVariationError(memberValuesFromRows([[10], [12], [9]]), [1, 2]) // [1.5]
 */
export function alphasVariationError(matrix: MemberValues, members: readonly [number, number]): Float64Array {
  return alphasShift(matrix, members).map(Math.abs)
}
