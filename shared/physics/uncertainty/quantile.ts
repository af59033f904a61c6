/**
 * Sample quantiles of a finite sample.
 */

/**
 * Sample quantile by linear interpolation between order statistics (definition 7 of
 * R. J. Hyndman and Y. Fan, "Sample quantiles in statistical packages", Am. Stat. 50 (1996) 361;
 * the default of R and NumPy, common practice): with the sample sorted as x₍₀₎ ≤ … ≤ x₍ₙ₋₁₎ and
 * h = (n − 1)·p, Q(p) = x₍⌊h⌋₎ + (h − ⌊h⌋)(x₍⌊h⌋₊₁₎ − x₍⌊h⌋₎). Q(0) is the minimum, Q(1) the
 * maximum, Q(½) the median.
 *
 * Unit: that of the sample; p dimensionless. Domain: non-empty sample of finite values,
 * 0 ≤ p ≤ 1. Does not modify `sample`.
 * Method: sorts a copy (O(n log n)); exact up to one rounding in the interpolation.
 * @throws RangeError for an empty sample, a non-finite value or p outside [0, 1].
 * @example sampleQuantile([1, 2, 3, 4], 0.5) // 2.5
 * @example sampleQuantile([1, 2, 3, 4], 0.16) // 1.48 (h = 0.48)
 */
export function sampleQuantile(sample: ArrayLike<number>, p: number): number {
  return quantilesOfSorted(sortedCopy(sample), [p])[0]!
}

/**
 * A sorted copy of `sample` (ascending), for computing several quantiles with one sort.
 * @throws RangeError for an empty sample or a non-finite value.
 * @example sortedCopy([3, 1, 2]) // Float64Array [1, 2, 3]
 */
export function sortedCopy(sample: ArrayLike<number>): Float64Array {
  if (sample.length === 0) throw new RangeError('A quantile of an empty sample is undefined: need at least one value.')
  const sorted = Float64Array.from(sample)
  for (let i = 0; i < sorted.length; i++) {
    if (!Number.isFinite(sorted[i]!)) throw new RangeError(`Sample value ${i} is not finite (${sorted[i]}).`)
  }
  return sorted.sort()
}

/**
 * Quantiles Q(p) (definition as sampleQuantile) of a sample already sorted ascending.
 *
 * Domain: non-empty sorted sample; each p in [0, 1]. The sort order is not re-checked.
 * @throws RangeError for an empty sample or a p outside [0, 1].
 * @example quantilesOfSorted(new Float64Array([1, 2, 3, 4]), [0, 0.5, 1]) // [1, 2.5, 4]
 */
export function quantilesOfSorted(sorted: ArrayLike<number>, probabilities: readonly number[]): Float64Array {
  const n = sorted.length
  if (n === 0) throw new RangeError('A quantile of an empty sample is undefined: need at least one value.')
  const out = new Float64Array(probabilities.length)
  probabilities.forEach((p, i) => {
    if (!(p >= 0 && p <= 1)) throw new RangeError(`A quantile probability must lie in [0, 1]; got ${p}.`)
    const h = (n - 1) * p
    const lo = Math.floor(h)
    const hi = Math.min(lo + 1, n - 1)
    const a = sorted[lo]!
    out[i] = a + (h - lo) * (sorted[hi]! - a)
  })
  return out
}
