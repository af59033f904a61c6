/**
 * Predictions that read two error sets (see shared/physics/README.md, 15.1 "Two sets in one
 * prediction"): how their members are varied, and the bands and correlations of a prediction
 * whose two sets are varied apart.
 */
import type { SetHeader } from '../types'
import { isFragmentation } from '../fragmentation/species'
import { makeBands, type Band } from './band'
import { binCovariance, correlationFromCovariance, type CovarianceOptions } from './covariance'
import { addBandsInQuadrature } from './in-quadrature'
import type { MemberValues, SquareMatrix } from './matrix'

/**
 * How a prediction on two sets varies their members:
 * - 'central': only the first set varies; the second is held at its central member (the
 *   uncertainty of the second set is left out — the behaviour when nothing else applies);
 * - 'paired': member k of one set with member k of the other (both sets come from one family
 *   with the same member layout, so member k of each is the same variation of the same fit
 *   parameters: a ratio's correlated uncertainty);
 * - 'apart': the first set's members with the second at its central member, then the second
 *   set's members with the first at its central member (independent sets, e.g. parton densities
 *   × fragmentation functions); the two bands are combined in quadrature.
 */
export type TwoSetVariation = 'central' | 'paired' | 'apart'

type HeaderFields = Pick<SetHeader, 'family' | 'kind' | 'memberCount' | 'alphasMembers' | 'density'>

/**
 * True when two sets may be varied member by member: same family, same kind and member count,
 * the same α_s members (or none), and the same kind of density (both parton or both
 * fragmentation).
 * @example pairable(carbonHeader, leadHeader) // true for two nuclei of one family
 */
export function pairable(a: HeaderFields, b: HeaderFields): boolean {
  const sameAlphas = (a.alphasMembers ?? []).join(',') === (b.alphasMembers ?? []).join(',')
  return a.family === b.family && a.kind === b.kind && a.memberCount === b.memberCount && sameAlphas
    && isFragmentation(a) === isFragmentation(b)
}

/**
 * The variation of a two-set prediction: 'paired' for two sets of one family with the same
 * member layout; otherwise 'apart' when either set holds fragmentation functions (they always
 * vary, independently of the parton densities) or when `varySecond` asks for it; else 'central'.
 * Without a second set it is 'central'.
 * @example twoSetVariation(protonHeader, pionFragmentationHeader, false) // 'apart'
 */
export function twoSetVariation(main: HeaderFields, second: HeaderFields | null | undefined, varySecond = false): TwoSetVariation {
  if (!second) return 'central'
  if (pairable(main, second)) return 'paired'
  if (varySecond || isFragmentation(main) || isFragmentation(second)) return 'apart'
  return 'central'
}

/** The words every label, export and provenance text uses for a variation. */
export function variationText(v: TwoSetVariation): string {
  if (v === 'paired') return 'correlated: members paired'
  if (v === 'apart') return 'sets varied apart, combined in quadrature'
  return 'second set at its central member'
}

/**
 * Splits the member values of an apart run into its two parts. The stored layout is the first
 * set's `mainMembers` rows (member 0 = both centrals, then the first set's members with the second
 * at its central member), followed by the second set's members 1 … `secondMembers` − 1 with the
 * first at its central member; the second part gets row 0 as its central member.
 * @throws RangeError when the matrix does not hold mainMembers + secondMembers − 1 rows.
 * @example splitApart({ members: 4, bins: 1, values: [10, 11, 9, 12] }, 3, 2).second.values // [10, 12]
 */
export function splitApart(matrix: MemberValues, mainMembers: number, secondMembers: number): { main: MemberValues, second: MemberValues } {
  const { bins, values } = matrix
  if (mainMembers < 1 || secondMembers < 1 || matrix.members !== mainMembers + secondMembers - 1) {
    throw new RangeError(`An apart run of ${mainMembers} + ${secondMembers} members holds ${mainMembers + secondMembers - 1} rows; this one has ${matrix.members}`)
  }
  const main = { members: mainMembers, bins, values: values.slice(0, mainMembers * bins) }
  const second = new Float64Array(secondMembers * bins)
  second.set(values.subarray(0, bins))
  second.set(values.subarray(mainMembers * bins, matrix.members * bins), bins)
  return { main, second: { members: secondMembers, bins, values: second } }
}

/**
 * The band of an apart prediction: central of the first set's band, half-widths
 * plus = √(plus₁² + plus₂²) and minus = √(minus₁² + minus₂²) — the two sets' uncertainties are
 * independent (common practice; e.g. the PDF and fragmentation uncertainties of semi-inclusive
 * cross-sections are added in quadrature). Each part is taken at the same CL before combining.
 * @example combineApart(makeBands([10], [3], [1]), makeBands([10], [4], [2])).plus // [5]
 */
export function combineApart(main: Band, second: Band): Band {
  // Replica bands may centre on their mean, which differs between the parts: the combined band
  // sits on the first set's central value.
  return addBandsInQuadrature([main, makeBands(main.central, second.plus, second.minus)])
}

/**
 * Bin-to-bin covariance and correlation of an apart prediction: C = C₁ + C₂ (independent
 * variations add their covariances; common practice), each from its own set's members and CL
 * options, with the correlation C_ij/√(C_ii C_jj).
 */
export function apartCovariance(parts: { main: MemberValues, second: MemberValues }, options: { main: CovarianceOptions, second: CovarianceOptions }): { main: SquareMatrix, second: SquareMatrix, total: SquareMatrix, correlation: SquareMatrix } {
  const main = binCovariance(parts.main, options.main)
  const second = binCovariance(parts.second, options.second)
  const values = main.values.map((v, i) => v + second.values[i]!)
  const total = { size: main.size, values }
  return { main, second, total, correlation: correlationFromCovariance(total) }
}
