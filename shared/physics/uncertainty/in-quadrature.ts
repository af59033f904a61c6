/**
 * Adding independent uncertainties in quadrature (nuclear ⊕ baseline, PDF ⊕ α_s).
 */
import { makeBands, type Band } from './band'
import { NeumaierSum } from './summation'

/**
 * Combines the bands of independent uncertainty sources on the same observable:
 * plus = √(Σ_s plus_s²), minus = √(Σ_s minus_s²), central from the first band. This is how a
 * nuclear set's own uncertainty and that of its free-proton baseline are combined when the set
 * does not supply them jointly (see shared/physics/README.md, "Nuclear targets and isospin").
 *
 * Unit: that of the observable. Domain: at least one band, all with the same number of bins and
 * central values agreeing within `relativeTolerance` (they describe the same prediction);
 * the default 1e-9 allows for rounding between two evaluation paths.
 * @throws RangeError for no bands, a bin-count mismatch, or central values that disagree.
 * @example addBandsInQuadrature([makeBands([10], [3], [3]), makeBands([10], [4], [0])]).plus // [5]
 */
export function addBandsInQuadrature(bands: readonly Band[], relativeTolerance = 1e-9): Band {
  const first = bands[0]
  if (first === undefined) throw new RangeError('Nothing to combine: give at least one band.')
  const n = first.central.length
  bands.forEach((band, s) => {
    if (band.central.length !== n) {
      throw new RangeError(`Band ${s} has ${band.central.length} bins but band 0 has ${n}: combine bands of the same bins only.`)
    }
    for (let b = 0; b < n; b++) {
      const a = first.central[b]!
      const c = band.central[b]!
      if (Math.abs(a - c) > relativeTolerance * Math.max(Math.abs(a), Math.abs(c))) {
        throw new RangeError(`Bin ${b}: band ${s} has central value ${c} but band 0 has ${a}; independent uncertainties can only be combined on the same prediction.`)
      }
    }
  })
  const combine = (pick: (band: Band) => Float64Array) => Float64Array.from({ length: n }, (_, b) => {
    const s = new NeumaierSum()
    for (const band of bands) s.add(pick(band)[b]! ** 2)
    return Math.sqrt(s.value)
  })
  return makeBands(first.central, combine(band => band.plus), combine(band => band.minus))
}

/**
 * Adds a symmetric per-bin uncertainty (e.g. the α_s error) in quadrature to both sides of a
 * band: plus' = √(plus² + e²), minus' = √(minus² + e²).
 *
 * Unit: `extra` in the observable's unit. Domain: one non-negative finite value per bin.
 * @throws RangeError on a length mismatch or a negative or non-finite value.
 * @example addInQuadrature(makeBands([10], [3], [0]), [4]) // plus [5], minus [4]
 */
export function addInQuadrature(bands: Band, extra: ArrayLike<number>): Band {
  const n = bands.central.length
  if (extra.length !== n) throw new RangeError(`The extra uncertainty has ${extra.length} bins but the band has ${n}.`)
  for (let b = 0; b < n; b++) {
    if (!(extra[b]! >= 0 && Number.isFinite(extra[b]!))) {
      throw new RangeError(`Bin ${b}: an uncertainty must be a finite non-negative number; got ${extra[b]}.`)
    }
  }
  return makeBands(
    bands.central,
    bands.plus.map((p, b) => Math.hypot(p, extra[b]!)),
    bands.minus.map((m, b) => Math.hypot(m, extra[b]!))
  )
}
