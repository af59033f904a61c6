/**
 * The band type every prescription returns, and small operations on it.
 */

/**
 * Per-bin uncertainty band, one entry per bin in each array. The band runs from
 * central − minus to central + plus; `plus` and `minus` are non-negative magnitudes. `relPlus`
 * and `relMinus` are plus/|central| and minus/|central| (dimensionless; NaN where central is 0).
 * Unit of central, plus, minus: that of the observable.
 */
export interface Bands {
  central: Float64Array
  plus: Float64Array
  minus: Float64Array
  relPlus: Float64Array
  relMinus: Float64Array
}

/** One bin of a Bands, as a plain object (for tables, JSON and charts). */
export interface BandRow {
  central: number
  plus: number
  minus: number
  relPlus: number
  relMinus: number
}

/**
 * Assembles a Bands from central values and half-widths, computing the relative widths. Copies
 * its inputs.
 *
 * Domain: three arrays of the same non-zero length; plus and minus ≥ 0.
 * @throws RangeError on a length mismatch or a negative half-width.
 * @example makeBands([10], [1], [2]) // relPlus [0.1], relMinus [0.2]
 */
export function makeBands(central: ArrayLike<number>, plus: ArrayLike<number>, minus: ArrayLike<number>): Bands {
  const n = central.length
  if (n === 0) throw new RangeError('A band needs at least one bin.')
  if (plus.length !== n || minus.length !== n) {
    throw new RangeError(`Band arrays differ in length: central ${n}, plus ${plus.length}, minus ${minus.length}.`)
  }
  const out: Bands = {
    central: Float64Array.from(central),
    plus: Float64Array.from(plus),
    minus: Float64Array.from(minus),
    relPlus: new Float64Array(n),
    relMinus: new Float64Array(n)
  }
  for (let b = 0; b < n; b++) {
    if (!(out.plus[b]! >= 0) || !(out.minus[b]! >= 0)) {
      throw new RangeError(`Bin ${b}: band half-widths must be non-negative numbers (plus ${out.plus[b]}, minus ${out.minus[b]}).`)
    }
    const scale = Math.abs(out.central[b]!)
    out.relPlus[b] = scale === 0 ? Number.NaN : out.plus[b]! / scale
    out.relMinus[b] = scale === 0 ? Number.NaN : out.minus[b]! / scale
  }
  return out
}

/**
 * The same band with both half-widths multiplied by `factor` (e.g. a CL rescaling factor);
 * the central values are unchanged.
 *
 * Domain: factor finite and ≥ 0.
 * @throws RangeError for a negative or non-finite factor.
 * @example scaleBands(makeBands([10], [1], [2]), 0.5).plus // [0.5]
 */
export function scaleBands(bands: Bands, factor: number): Bands {
  if (!Number.isFinite(factor) || factor < 0) {
    throw new RangeError(`A band can only be scaled by a finite non-negative factor; got ${factor}.`)
  }
  return makeBands(bands.central, bands.plus.map(v => v * factor), bands.minus.map(v => v * factor))
}

/**
 * The band as one plain object per bin.
 * @example bandRows(makeBands([10], [1], [2])) // [{ central: 10, plus: 1, minus: 2, relPlus: 0.1, relMinus: 0.2 }]
 */
export function bandRows(bands: Bands): BandRow[] {
  return Array.from(bands.central, (central, b) => ({
    central,
    plus: bands.plus[b]!,
    minus: bands.minus[b]!,
    relPlus: bands.relPlus[b]!,
    relMinus: bands.relMinus[b]!
  }))
}
