/**
 * Per-bin K-factors: carrying a leading-order shape to a higher-order normalisation (see
 * shared/physics/README.md, section 21.1). K-factors are the user's responsibility: the engine
 * applies them, it does not judge them.
 */
import { addInQuadrature, computeBands, makeBands, sigmaMultiple, type Band, type BandOptions, type MemberValues } from '../uncertainty'
import { assertMemberValues } from '../uncertainty/matrix'

/** K-factors of a study, one per bin. */
export interface KFactors {
  /** K_b, dimensionless, finite and > 0, one per bin. */
  values: ArrayLike<number>
  /** Optional one-standard-deviation uncertainty δK_b of each K_b (dimensionless, ≥ 0). */
  errors?: ArrayLike<number>
  /** Free text on where the K-factors came from (a calculation, a paper); carried to provenance. */
  source?: string
}

/**
 * Checks K-factors against a study of `bins` bins.
 * Domain: `values` and `errors` of length `bins`; every K finite and > 0; every δK finite and ≥ 0.
 * @throws RangeError naming the bin (numbered from 1, as in the study) and the field.
 * @example checkKFactors({ values: [1.2, 1.3] }, 2) // passes
 */
export function checkKFactors(k: KFactors, bins: number): void {
  if (k.values.length !== bins) {
    throw new RangeError(`There are ${k.values.length} K-factors but the study has ${bins} bins: give one K-factor per bin.`)
  }
  for (let b = 0; b < bins; b++) {
    const v = k.values[b]!
    if (!(Number.isFinite(v) && v > 0)) throw new RangeError(`The K-factor of bin ${b + 1} must be a finite number > 0; got ${v}.`)
  }
  if (k.errors === undefined) return
  if (k.errors.length !== bins) {
    throw new RangeError(`There are ${k.errors.length} K-factor uncertainties but the study has ${bins} bins: give one per bin.`)
  }
  for (let b = 0; b < bins; b++) {
    const e = k.errors[b]!
    if (!(Number.isFinite(e) && e >= 0)) throw new RangeError(`The K-factor uncertainty of bin ${b + 1} must be a finite number ≥ 0; got ${e}.`)
  }
}

/**
 * Every member's value multiplied by its bin's K-factor: X'_mb = K_b · X_mb (common practice:
 * a K-factor is the ratio of a higher-order to the leading-order prediction of the bin, taken
 * to be the same for every member of the set).
 *
 * Unit: that of the matrix (K is dimensionless). Domain: as checkKFactors; a well-formed matrix.
 * Result: a new matrix; with every K = 1 it equals the input exactly.
 * @throws RangeError from checkKFactors or for a malformed matrix.
 * @example applyKFactors(memberValuesFromRows([[10, 20], [11, 22]]), { values: [1.5, 1] }).values // [15, 20, 16.5, 22]
 */
export function applyKFactors(matrix: MemberValues, k: KFactors): MemberValues {
  assertMemberValues(matrix)
  checkKFactors(k, matrix.bins)
  const { members, bins } = matrix
  const values = new Float64Array(members * bins)
  for (let m = 0; m < members; m++) {
    for (let b = 0; b < bins; b++) values[m * bins + b] = matrix.values[m * bins + b]! * k.values[b]!
  }
  return { members, bins, values }
}

/**
 * The uncertainty a K-factor's own error puts on a bin: δX'_b = |X'_b| · δK_b / K_b = |X_b| δK_b,
 * with X'_b the K-scaled central value (linear error propagation, common practice). Zero for
 * K-factors given without errors.
 *
 * Unit: that of the observable. Domain: central of length = number of K-factors.
 * @example kFactorErrors([12], { values: [1.2], errors: [0.1] }) // [1] (= 10 × 0.1)
 */
export function kFactorErrors(scaledCentral: ArrayLike<number>, k: KFactors): Float64Array {
  checkKFactors(k, scaledCentral.length)
  const out = new Float64Array(scaledCentral.length)
  if (k.errors === undefined) return out
  for (let b = 0; b < out.length; b++) out[b] = Math.abs(scaledCentral[b]!) * k.errors[b]! / k.values[b]!
  return out
}

/** What the K-factor uncertainty adds to a PDF band of K-scaled members ({@link kFactorReportOf}). */
export interface KFactorReport {
  /** δX'_b of kFactorErrors, one standard deviation (68% CL), reported apart from the PDF band. */
  kFactorError: Float64Array
  /** δX'_b brought to the band's CL by z(clTo) (a Gaussian multiple, as δK is given at 68% CL). */
  kFactorErrorAtCl: Float64Array
  /** The PDF band with kFactorErrorAtCl added in quadrature, only when asked for. */
  combined?: Band
}

/**
 * The K-factor uncertainty of a PDF band already computed from K-scaled members: δX' at 68% CL
 * and at the band's CL `clTo`, and, with `addInQuadratureToo`, the band with it added in
 * quadrature to both half-widths (√(ΔX² + δX'²); common practice for independent uncertainties).
 *
 * Unit: that of the observable. Domain: a band of as many bins as K-factors; 0 < clTo < 100.
 * @example kFactorReportOf(band, { values: [1.2], errors: [0.1] }, 68, true).combined
 */
export function kFactorReportOf(pdf: Band<ArrayLike<number>, unknown>, k: KFactors, clTo = 68, addInQuadratureToo = false): KFactorReport {
  const kFactorError = kFactorErrors(pdf.central, k)
  const factor = sigmaMultiple(clTo)
  const kFactorErrorAtCl = kFactorError.map(v => v * factor)
  if (!addInQuadratureToo) return { kFactorError, kFactorErrorAtCl }
  return { kFactorError, kFactorErrorAtCl, combined: addInQuadrature(makeBands(pdf.central, pdf.plus, pdf.minus), kFactorErrorAtCl) }
}

/** Result of {@link kFactorBands}. */
export interface KFactorBands {
  /** The PDF band of the K-scaled members (the prescription and CL of the options). */
  pdf: Band
  /** δX'_b of kFactorErrors, one standard deviation (68% CL), reported apart from the PDF band. */
  kFactorError: Float64Array
  /** The PDF band with the K-factor error added in quadrature, only when asked for. */
  combined?: Band
}

/**
 * Bands of a study with K-factors: the members are scaled first (applyKFactors), then the PDF
 * band is computed as computeBands would; the K-factor uncertainty stays a separate column and,
 * with `addKFactorErrorInQuadrature`, is also added in quadrature to both half-widths
 * (√(ΔX² + δX'²); the K error is brought to the band's CL by z(clTo), as it is given at 68%).
 *
 * Unit: that of the observable. Domain: as computeBands and checkKFactors.
 * @example kFactorBands(m, { values: [1.1] }, { kind: 'replicas', prescription: 'replica-sd' }).pdf
 */
export function kFactorBands(matrix: MemberValues, k: KFactors, options: BandOptions, addKFactorErrorInQuadrature = false): KFactorBands {
  const scaled = applyKFactors(matrix, k)
  const result = computeBands(scaled, options)
  const pdf: Band = { central: result.central, plus: result.plus, minus: result.minus, relPlus: result.relPlus, relMinus: result.relMinus }
  const report = kFactorReportOf(pdf, k, options.clTo ?? 68, addKFactorErrorInQuadrature)
  return { pdf, kFactorError: report.kFactorError, ...(report.combined ? { combined: report.combined } : {}) }
}

/**
 * Per-bin rows other than members (a scale variation's values, nominal value and half-widths),
 * each multiplied by its bin's K-factor as {@link applyKFactors} does for members. The K-factor
 * is taken to be the same at every scale choice (common practice for a fixed table of K-factors;
 * a scale-dependent K would need its own table per scale).
 *
 * Unit: that of the rows. Domain: every row of length = number of K-factors; K as checkKFactors;
 * non-finite entries (a bin the variation could not reach) stay non-finite.
 * @example applyKFactorsToRows([[10, 20]], { values: [1.5, 1] }) // [[15, 20]]
 */
export function applyKFactorsToRows(rows: ReadonlyArray<ArrayLike<number>>, k: KFactors): number[][] {
  return rows.map((r, i) => {
    if (r.length !== k.values.length) throw new RangeError(`Row ${i + 1} has ${r.length} bins but there are ${k.values.length} K-factors.`)
    checkKFactors(k, r.length)
    return Array.from(r, (v, b) => v * k.values[b]!)
  })
}
