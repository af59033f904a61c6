/**
 * Member-value matrices: the values of one observable (or one bin of a study) for every member of
 * an error set. Everything else in `uncertainty/` takes this shape as input.
 */
import type { SetKind } from '../types'

/**
 * Values of `bins` observables for `members` members of one error set, row-major:
 * `values[m * bins + b]` is bin b evaluated with member m. Member 0 is the central member. For
 * Hessian pairs, members 2k−1 and 2k are X_k⁺ and X_k⁻ (k = 1..N); for one-sided Hessian sets,
 * member k is X_k; for replica sets, members 1..N are the replicas (member 0 may be a central fit
 * or the replica mean; the replica prescriptions ignore it). Unit: whatever the observable's is
 * (pb, dimensionless …); every result derived from it carries the same unit.
 */
export interface MemberValues {
  /** Number of members including the central member 0; ≥ 1. */
  members: number
  /** Number of bins (observables); ≥ 1. */
  bins: number
  /** Row-major values, length members × bins, all finite. */
  values: Float64Array
}

/**
 * Where a member-value matrix comes from and at which confidence level a result is wanted: the
 * options bands (computeBands) and covariances (binCovariance …) share. CLs are in percent;
 * 68 means one standard deviation.
 */
export interface SpreadOptions {
  /** Kind of the set the members come from. */
  kind: SetKind
  /** CL of the set's members (SetHeader.confidenceLevelPercent); default 68. */
  clFrom?: number
  /**
   * CL of the result wanted; default 68. A band scales with z(clTo)/z(clFrom), a covariance with
   * its square.
   */
  clTo?: number
  /** [down, up] α_s variation members, set aside from the PDF members and added in quadrature. */
  alphasMembers?: readonly [number, number]
  /** CL of the α_s(M_Z) variation behind those members; default `clFrom`. */
  alphasCl?: number
}

/**
 * A square bins × bins matrix (a bin-to-bin covariance or correlation), row-major:
 * `values[i * size + j]`.
 */
export interface SquareMatrix {
  /** Number of rows = number of columns. */
  size: number
  /** Row-major entries, length size². */
  values: Float64Array
}

/**
 * Builds a member-value matrix from one row per member (central first).
 *
 * Domain: at least one row, every row the same non-zero length, every value finite.
 * Method: copies into a new Float64Array (the input rows are not kept).
 * @throws RangeError naming the member and bin of the first bad entry.
 * @example memberValuesFromRows([[10, 20], [11, 21], [9, 19]]) // 3 members × 2 bins
 */
export function memberValuesFromRows(rows: ArrayLike<ArrayLike<number>>): MemberValues {
  if (rows.length === 0) throw new RangeError('No members given: need at least the central member 0.')
  const bins = rows[0]!.length
  if (bins === 0) throw new RangeError('Member 0 has no bins: need at least one bin.')
  const values = new Float64Array(rows.length * bins)
  for (let m = 0; m < rows.length; m++) {
    const row = rows[m]!
    if (row.length !== bins) {
      throw new RangeError(`Member ${m} has ${row.length} bins but member 0 has ${bins}: every member needs the same bins.`)
    }
    for (let b = 0; b < bins; b++) values[m * bins + b] = row[b]!
  }
  const matrix = { members: rows.length, bins, values }
  assertMemberValues(matrix)
  return matrix
}

/**
 * Checks that `matrix` is a well-formed member-value matrix: integer members ≥ `minMembers`,
 * integer bins ≥ 1, `values.length` = members × bins, every value finite.
 *
 * @param what  how to name the matrix in the message (e.g. 'set 2').
 * @throws RangeError naming the member and bin of the first bad entry.
 * @example assertMemberValues({ members: 2, bins: 1, values: new Float64Array([1, 2]) }) // passes
 */
export function assertMemberValues(matrix: MemberValues, minMembers = 1, what = 'member-value matrix'): void {
  const { members, bins, values } = matrix
  if (!Number.isInteger(members) || members < minMembers) {
    throw new RangeError(`The ${what} has ${members} members; at least ${minMembers} (central member 0 included) are needed.`)
  }
  if (!Number.isInteger(bins) || bins < 1) {
    throw new RangeError(`The ${what} has ${bins} bins; at least one bin is needed.`)
  }
  if (values.length !== members * bins) {
    throw new RangeError(`The ${what} holds ${values.length} values but ${members} members × ${bins} bins need ${members * bins}.`)
  }
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i]!)) {
      throw new RangeError(`The ${what} has a non-finite value (${values[i]}) at member ${Math.floor(i / bins)}, bin ${i % bins}.`)
    }
  }
}

/**
 * The matrix without the listed members (e.g. the α_s variation members), keeping the order of
 * the others. Member 0 cannot be removed.
 *
 * Domain: indices integers in 1..members−1, no repeats.
 * @throws RangeError for an index out of range, a repeat, or member 0.
 * @example withoutMembers(m, [7, 8]) // members 0..6 and 9.. of m, renumbered 0..members−3
 */
export function withoutMembers(matrix: MemberValues, indices: readonly number[]): MemberValues {
  const drop = new Set<number>()
  for (const k of indices) {
    if (!Number.isInteger(k) || k < 1 || k >= matrix.members) {
      throw new RangeError(`Member ${k} cannot be set aside: members run from 1 to ${matrix.members - 1} (member 0 is the central one).`)
    }
    if (drop.has(k)) throw new RangeError(`Member ${k} is listed twice among the members to set aside.`)
    drop.add(k)
  }
  const { bins } = matrix
  const members = matrix.members - drop.size
  const values = new Float64Array(members * bins)
  let row = 0
  for (let m = 0; m < matrix.members; m++) {
    if (drop.has(m)) continue
    values.set(matrix.values.subarray(m * bins, (m + 1) * bins), row * bins)
    row++
  }
  return { members, bins, values }
}

/**
 * The values of one bin for every member, as a new array of length `members`.
 *
 * Domain: 0 ≤ bin < bins.
 * @throws RangeError for a bin out of range.
 * @example binColumn(memberValuesFromRows([[1, 2], [3, 4]]), 1) // Float64Array [2, 4]
 */
export function binColumn(matrix: MemberValues, bin: number): Float64Array {
  assertBinIndex(matrix, bin)
  const out = new Float64Array(matrix.members)
  for (let m = 0; m < matrix.members; m++) out[m] = matrix.values[m * matrix.bins + bin]!
  return out
}

/**
 * Throws unless `bin` is an integer in 0..bins−1.
 * @example assertBinIndex(m, 0)
 */
export function assertBinIndex(matrix: MemberValues, bin: number): void {
  if (!Number.isInteger(bin) || bin < 0 || bin >= matrix.bins) {
    throw new RangeError(`Bin ${bin} does not exist: bins run from 0 to ${matrix.bins - 1}.`)
  }
}

/**
 * Checks a square matrix: integer size ≥ 1, size² finite entries.
 * @throws RangeError naming the first bad entry (row, column).
 * @example assertSquareMatrix({ size: 1, values: new Float64Array([2]) }, 'PDF covariance')
 */
export function assertSquareMatrix(matrix: SquareMatrix, what: string): void {
  const { size, values } = matrix
  if (!Number.isInteger(size) || size < 1) throw new RangeError(`The ${what} has size ${size}; it needs at least one row.`)
  if (values.length !== size * size) {
    throw new RangeError(`The ${what} holds ${values.length} entries but a ${size} × ${size} matrix needs ${size * size}.`)
  }
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i]!)) {
      throw new RangeError(`The ${what} has a non-finite entry (${values[i]}) at row ${Math.floor(i / size)}, column ${i % size}.`)
    }
  }
}
