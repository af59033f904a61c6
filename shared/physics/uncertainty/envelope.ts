/**
 * Envelope of several sets' bands on the same bins: the simple way to combine families.
 */
import { makeBands, type Band } from './band'

/**
 * Envelope of the individual bands (common practice): per bin, lower = min_s(central_s − minus_s),
 * upper = max_s(central_s + plus_s), central = (lower + upper)/2, plus = minus = (upper − lower)/2.
 * Bring every band to the same CL first (computeBands' clTo).
 *
 * Unit: that of the observable. Domain: at least one band, all with the same number of bins.
 * @throws RangeError for no bands or a bin-count mismatch.
 * @example bandEnvelope([makeBands([10], [1], [1]), makeBands([11], [2], [0.5])]) // central [11], plus [2], minus [2]
 */
export function bandEnvelope(bands: readonly Band[]): Band {
  const first = bands[0]
  if (first === undefined) throw new RangeError('No bands to take the envelope of: give at least one.')
  const n = first.central.length
  const lower = new Float64Array(n).fill(Number.POSITIVE_INFINITY)
  const upper = new Float64Array(n).fill(Number.NEGATIVE_INFINITY)
  bands.forEach((band, s) => {
    if (band.central.length !== n) {
      throw new RangeError(`Band ${s} has ${band.central.length} bins but band 0 has ${n}: an envelope needs the same bins in every set.`)
    }
    for (let b = 0; b < n; b++) {
      lower[b] = Math.min(lower[b]!, band.central[b]! - band.minus[b]!)
      upper[b] = Math.max(upper[b]!, band.central[b]! + band.plus[b]!)
    }
  })
  const central = lower.map((lo, b) => 0.5 * (lo + upper[b]!))
  const half = lower.map((lo, b) => Math.max(0, 0.5 * (upper[b]! - lo)))
  return makeBands(central, half, half)
}
