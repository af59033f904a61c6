/**
 * Ratios and asymmetries of two observables computed member by member, never as a ratio of bands
 * (see shared/physics/README.md, "Ratios and asymmetries"). Inputs are members × bins matrices,
 * row-major (Float64Array), as returned by evaluatePlan; a matrix with a single row is broadcast
 * against the other's members (e.g. a fixed baseline central member against a nuclear set's
 * members).
 */

export type CombineOp = 'ratio' | 'asymmetry'

/**
 * Element-wise a/b (ratio) or (a − b)/(a + b) (asymmetry) of two members × bins matrices.
 * Units: a and b in the same unit; result dimensionless. Domain: equal bin counts; member counts
 * equal or one of them 1; a zero denominator gives a RangeError naming member and bin.
 * @example combineByMember(new Float64Array([2, 3]), new Float64Array([1, 1]), 2, 'ratio') // [2, 3]
 */
export function combineByMember(a: Float64Array, b: Float64Array, bins: number, op: CombineOp): Float64Array {
  if (!(bins > 0) || a.length % bins !== 0 || b.length % bins !== 0) {
    throw new RangeError(`cannot combine matrices of ${a.length} and ${b.length} values as rows of ${bins} bins`)
  }
  const ma = a.length / bins
  const mb = b.length / bins
  if (ma !== mb && ma !== 1 && mb !== 1) {
    throw new RangeError(`cannot combine ${ma} members with ${mb} members: give equal member counts or a single member on one side`)
  }
  const members = Math.max(ma, mb)
  const out = new Float64Array(members * bins)
  for (let k = 0; k < members; k++) {
    const ra = (ma === 1 ? 0 : k) * bins
    const rb = (mb === 1 ? 0 : k) * bins
    for (let i = 0; i < bins; i++) {
      const u = a[ra + i]!
      const v = b[rb + i]!
      const den = op === 'ratio' ? v : u + v
      if (den === 0) throw new RangeError(`member ${k}, bin ${i + 1}: the ${op === 'ratio' ? 'denominator' : 'sum'} is zero`)
      out[k * bins + i] = op === 'ratio' ? u / den : (u - v) / den
    }
  }
  return out
}
