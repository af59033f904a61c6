/**
 * The band type every prescription returns, its JSON and per-bin forms, and small operations on it.
 */

/**
 * Per-bin uncertainty band, one entry per bin in each field. The band runs from central − minus
 * to central + plus; `plus` and `minus` are non-negative magnitudes. `relPlus` and `relMinus` are
 * plus/|central| and minus/|central| (dimensionless), undefined where central is 0.
 * Unit of central, plus, minus: that of the observable.
 *
 * One type in several holdings of the numbers (`V` for central/plus/minus, `R` for the relative
 * widths):
 * - `Band` (= Band<Float64Array>): the engine's form; an undefined relative width is NaN.
 * - {@link BandJson}: plain arrays as sent and stored as JSON; an undefined relative width is null.
 * - {@link BandRow}: one bin as plain numbers (NaN where undefined).
 * - {@link BandView}: any of the array forms, for code that only reads a band (exports, figures).
 */
export interface Band<V = Float64Array, R = V> {
  central: V
  plus: V
  minus: V
  relPlus: R
  relMinus: R
}

/** A band as JSON: plain arrays, null where a relative width is undefined (central 0). */
export type BandJson = Band<number[], Array<number | null>>

/** One bin of a band, as a plain object (for tables and charts). */
export type BandRow = Band<number>

/** Any array form of a band (engine or JSON), for readers that index it and never write. */
export type BandView = Band<ArrayLike<number>, ArrayLike<number | null>>

/**
 * Assembles a band from central values and half-widths, computing the relative widths. Copies
 * its inputs.
 *
 * Domain: three arrays of the same non-zero length; plus and minus ≥ 0.
 * @throws RangeError on a length mismatch or a negative half-width.
 * @example makeBands([10], [1], [2]) // relPlus [0.1], relMinus [0.2]
 */
export function makeBands(central: ArrayLike<number>, plus: ArrayLike<number>, minus: ArrayLike<number>): Band {
  const n = central.length
  if (n === 0) throw new RangeError('A band needs at least one bin.')
  if (plus.length !== n || minus.length !== n) {
    throw new RangeError(`Band arrays differ in length: central ${n}, plus ${plus.length}, minus ${minus.length}.`)
  }
  const out: Band = {
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
export function scaleBands(bands: Band, factor: number): Band {
  if (!Number.isFinite(factor) || factor < 0) {
    throw new RangeError(`A band can only be scaled by a finite non-negative factor; got ${factor}.`)
  }
  return makeBands(bands.central, bands.plus.map(v => v * factor), bands.minus.map(v => v * factor))
}

/**
 * The band as one plain object per bin.
 * @example bandRows(makeBands([10], [1], [2])) // [{ central: 10, plus: 1, minus: 2, relPlus: 0.1, relMinus: 0.2 }]
 */
export function bandRows(bands: Band): BandRow[] {
  return Array.from(bands.central, (central, b) => ({
    central,
    plus: bands.plus[b]!,
    minus: bands.minus[b]!,
    relPlus: bands.relPlus[b]!,
    relMinus: bands.relMinus[b]!
  }))
}

const jsonNumber = (v: number) => (Number.isFinite(v) ? v : null)

/**
 * The band in its JSON form: plain arrays, and null for a relative width that is undefined
 * (NaN in the engine's form, where central is 0). Only the five band fields are copied.
 * @example bandToJson(makeBands([10, 0], [1, 1], [2, 2])).relPlus // [0.1, null]
 */
export function bandToJson(band: Band): BandJson {
  return {
    central: Array.from(band.central),
    plus: Array.from(band.plus),
    minus: Array.from(band.minus),
    relPlus: Array.from(band.relPlus, jsonNumber),
    relMinus: Array.from(band.relMinus, jsonNumber)
  }
}
