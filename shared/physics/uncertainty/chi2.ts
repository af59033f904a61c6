/**
 * χ² of a measurement against a set's prediction, with the experimental covariance alone and
 * with the PDF covariance added.
 */
import jStat from 'jstat'
import { CholeskyDecomposition, Matrix } from 'ml-matrix'
import type { SetKind } from '../types'
import { binCovariance } from './covariance'
import { assertMemberValues, assertSquareMatrix, withoutMembers, type MemberValues, type SquareMatrix } from './matrix'
import { replicaMoments } from './replicas'
import { NeumaierSum } from './summation'

/**
 * A measurement of `values.length` points. Errors are one standard deviation, in the unit of the
 * values. Either give `covariance` (the full experimental covariance), or `stat` and/or `syst`
 * (with optional `systCorrelation`) and/or `correlatedSources`, which build
 * C_ij = δ_ij stat_i² + ρ_ij syst_i syst_j + Σ_s β_si β_sj (ρ = identity when not given).
 */
export interface Measurement {
  values: ArrayLike<number>
  /** Uncorrelated (statistical) errors, ≥ 0. */
  stat?: ArrayLike<number>
  /** Systematic errors, ≥ 0; uncorrelated between points unless `systCorrelation` is given. */
  syst?: ArrayLike<number>
  /** Correlation matrix of the systematic errors: symmetric, unit diagonal, entries in [−1, 1]. */
  systCorrelation?: SquareMatrix
  /** Fully correlated systematic sources: each array holds the signed shift β_s of every point. */
  correlatedSources?: readonly ArrayLike<number>[]
  /** Full experimental covariance; excludes all the other error fields. */
  covariance?: SquareMatrix
}

/** Result of a χ² comparison. */
export interface ChiSquareResult {
  /** χ² = (D − T)ᵀ C⁻¹ (D − T), dimensionless. */
  chi2: number
  /** Number of points N. */
  points: number
  /** χ²/N. */
  chi2PerPoint: number
  /** Degrees of freedom used for the p-value (N − fitted parameters). */
  degreesOfFreedom: number
  /** P(χ²_ν ≥ χ²), the probability of a worse agreement by chance; 0 when below ~1e-16. */
  pValue: number
}

/**
 * Experimental covariance of a measurement (see Measurement for the formula). A given
 * `covariance` is checked and copied.
 *
 * Unit: square of the values' unit. Domain: finite non-negative errors of length N; a valid
 * correlation matrix of size N; at least one error source.
 * @throws RangeError naming the field and point of the first problem.
 * @example experimentalCovariance({ values: [1, 2], stat: [0.1, 0.2] }).values // [0.01, 0, 0, 0.04]
 */
export function experimentalCovariance(measurement: Measurement): SquareMatrix {
  const n = measurement.values.length
  if (n === 0) throw new RangeError('The measurement has no points.')
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(measurement.values[i]!)) throw new RangeError(`Measured value at point ${i} is not finite (${measurement.values[i]}).`)
  }
  const { stat, syst, systCorrelation, correlatedSources, covariance } = measurement
  if (covariance !== undefined) {
    if (stat !== undefined || syst !== undefined || systCorrelation !== undefined || correlatedSources !== undefined) {
      throw new RangeError('Give either the full covariance of the measurement or its separate errors, not both.')
    }
    assertSize(covariance, n, 'experimental covariance')
    assertSymmetric(covariance, 'experimental covariance')
    return { size: n, values: Float64Array.from(covariance.values) }
  }
  if (stat === undefined && syst === undefined && (correlatedSources === undefined || correlatedSources.length === 0)) {
    throw new RangeError('The measurement has no errors: give stat, syst, correlated sources or a covariance.')
  }
  if (systCorrelation !== undefined && syst === undefined) {
    throw new RangeError('A correlation matrix of the systematics was given without the systematic errors (syst).')
  }
  const out = new Float64Array(n * n)
  if (stat !== undefined) {
    checkErrors(stat, n, 'statistical error (stat)')
    for (let i = 0; i < n; i++) out[i * n + i] = stat[i]! ** 2
  }
  if (syst !== undefined) {
    checkErrors(syst, n, 'systematic error (syst)')
    if (systCorrelation !== undefined) checkCorrelation(systCorrelation, n)
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const rho = systCorrelation === undefined ? (i === j ? 1 : 0) : systCorrelation.values[i * n + j]!
        out[i * n + j] = out[i * n + j]! + rho * syst[i]! * syst[j]!
      }
    }
  }
  correlatedSources?.forEach((beta, s) => {
    if (beta.length !== n) throw new RangeError(`Correlated source ${s} has ${beta.length} entries but the measurement has ${n} points.`)
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(beta[i]!)) throw new RangeError(`Correlated source ${s} is not finite at point ${i} (${beta[i]}).`)
    }
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[i * n + j] = out[i * n + j]! + beta[i]! * beta[j]!
  })
  return { size: n, values: out }
}

/**
 * χ² = (D − T)ᵀ (C_exp + C_pdf)⁻¹ (D − T) of measured values D against a prediction T (PDG review
 * "Statistics", least-squares section), with the p-value P(χ²_ν ≥ χ²) for ν = N − fittedParameters
 * degrees of freedom.
 *
 * Unit: D, T in the same unit; covariances in its square; χ² dimensionless.
 * Domain: prediction of length N; optional PDF covariance N × N (binCovariance at 68% CL);
 * 0 ≤ fittedParameters < N; the total covariance symmetric positive definite.
 * Method: Cholesky factor L of C (ml-matrix), z = L⁻¹(D − T) by forward substitution, χ² = |z|²
 * with compensated summation; p-value 1 − P(ν/2, χ²/2) from jstat (regularised lower incomplete
 * gamma), absolute accuracy ~1e-15.
 * @throws RangeError for size mismatches, non-finite values, or a covariance that is not
 *   positive definite.
 * @example chiSquare({ values: [1, 2], stat: [1, 2] }, [0, 0]).chi2 // 1 + 1 = 2
 */
export function chiSquare(
  measurement: Measurement,
  prediction: ArrayLike<number>,
  options: { pdfCovariance?: SquareMatrix, fittedParameters?: number } = {}
): ChiSquareResult {
  const covariance = experimentalCovariance(measurement)
  const n = covariance.size
  if (prediction.length !== n) {
    throw new RangeError(`The prediction has ${prediction.length} bins but the measurement has ${n} points.`)
  }
  const residual = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(prediction[i]!)) throw new RangeError(`The prediction in bin ${i} is not finite (${prediction[i]}).`)
    residual[i] = measurement.values[i]! - prediction[i]!
  }
  let what = 'experimental covariance'
  if (options.pdfCovariance !== undefined) {
    assertSize(options.pdfCovariance, n, 'PDF covariance')
    assertSymmetric(options.pdfCovariance, 'PDF covariance')
    for (let i = 0; i < n * n; i++) covariance.values[i] = covariance.values[i]! + options.pdfCovariance.values[i]!
    what = 'experimental + PDF covariance'
  }
  const fitted = options.fittedParameters ?? 0
  if (!Number.isInteger(fitted) || fitted < 0 || fitted >= n) {
    throw new RangeError(`The number of fitted parameters must be a whole number from 0 to ${n - 1}; got ${fitted}.`)
  }
  const chi2 = quadraticForm(covariance, residual, what)
  const dof = n - fitted
  return {
    chi2,
    points: n,
    chi2PerPoint: chi2 / n,
    degreesOfFreedom: dof,
    pValue: Math.max(0, 1 - jStat.chisquare.cdf(chi2, dof))
  }
}

/**
 * χ² of a measurement against one set, with and without the set's PDF covariance: the prediction
 * is the central member X₀ for Hessian sets and the replica mean for replica sets; the PDF
 * covariance is binCovariance at 68% CL (α_s members set aside from the prediction and included
 * in the covariance).
 *
 * Unit, domain and errors as chiSquare and binCovariance; the set's bins are the measurement's
 * points, in order.
 * @example compareWithSet(measurement, m, { kind: 'hessian-pairs', clFrom: 90 }).withPdf.chi2
 */
export function compareWithSet(
  measurement: Measurement,
  matrix: MemberValues,
  options: { kind: SetKind, clFrom?: number, alphasMembers?: readonly [number, number], alphasCl?: number, fittedParameters?: number }
): { prediction: Float64Array, experimental: ChiSquareResult, withPdf: ChiSquareResult } {
  assertMemberValues(matrix, 2, 'set')
  if (matrix.bins !== measurement.values.length) {
    throw new RangeError(`The set's prediction has ${matrix.bins} bins but the measurement has ${measurement.values.length} points.`)
  }
  const pdf = options.alphasMembers === undefined ? matrix : withoutMembers(matrix, options.alphasMembers)
  const prediction = options.kind === 'replicas' ? replicaMoments(pdf).mean : matrix.values.slice(0, matrix.bins)
  const pdfCovariance = binCovariance(matrix, { ...options, clTo: 68 })
  return {
    prediction,
    experimental: chiSquare(measurement, prediction, { fittedParameters: options.fittedParameters }),
    withPdf: chiSquare(measurement, prediction, { pdfCovariance, fittedParameters: options.fittedParameters })
  }
}

/** rᵀ C⁻¹ r by Cholesky; C is symmetrised first (it has passed a symmetry check). */
function quadraticForm(covariance: SquareMatrix, residual: Float64Array, what: string): number {
  const n = covariance.size
  const rows = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) =>
    0.5 * (covariance.values[i * n + j]! + covariance.values[j * n + i]!)))
  const cholesky = new CholeskyDecomposition(new Matrix(rows))
  if (!cholesky.isPositiveDefinite()) {
    throw new RangeError(`The ${what} is not positive definite: check for zero errors, a duplicated point, or a correlation matrix that is not a valid one.`)
  }
  const l = cholesky.lowerTriangularMatrix
  const z = new Float64Array(n)
  const total = new NeumaierSum()
  for (let i = 0; i < n; i++) {
    const s = new NeumaierSum()
    s.add(residual[i]!)
    for (let j = 0; j < i; j++) s.add(-l.get(i, j) * z[j]!)
    z[i] = s.value / l.get(i, i)
    total.add(z[i]! ** 2)
  }
  return total.value
}

function assertSize(matrix: SquareMatrix, n: number, what: string): void {
  assertSquareMatrix(matrix, what)
  if (matrix.size !== n) throw new RangeError(`The ${what} is ${matrix.size} × ${matrix.size} but the measurement has ${n} points.`)
}

function assertSymmetric(matrix: SquareMatrix, what: string): void {
  const { size: n, values } = matrix
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const a = values[i * n + j]!
      const b = values[j * n + i]!
      if (Math.abs(a - b) > 1e-10 * Math.max(Math.abs(a), Math.abs(b), Math.sqrt(Math.abs(values[i * n + i]! * values[j * n + j]!)))) {
        throw new RangeError(`The ${what} is not symmetric: entry (${i}, ${j}) is ${a} but (${j}, ${i}) is ${b}.`)
      }
    }
  }
}

function checkErrors(errors: ArrayLike<number>, n: number, what: string): void {
  if (errors.length !== n) throw new RangeError(`The ${what} has ${errors.length} entries but the measurement has ${n} points.`)
  for (let i = 0; i < n; i++) {
    if (!(Number.isFinite(errors[i]!) && errors[i]! >= 0)) {
      throw new RangeError(`The ${what} at point ${i} must be a finite number ≥ 0; got ${errors[i]}.`)
    }
  }
}

function checkCorrelation(correlation: SquareMatrix, n: number): void {
  const what = 'correlation matrix of the systematics'
  assertSize(correlation, n, what)
  assertSymmetric(correlation, what)
  for (let i = 0; i < n; i++) {
    if (Math.abs(correlation.values[i * n + i]! - 1) > 1e-12) {
      throw new RangeError(`The ${what} must have 1 on its diagonal; entry (${i}, ${i}) is ${correlation.values[i * n + i]}.`)
    }
    for (let j = 0; j < n; j++) {
      const rho = correlation.values[i * n + j]!
      if (rho < -1 || rho > 1) throw new RangeError(`The ${what} has entry (${i}, ${j}) = ${rho}, outside [−1, 1].`)
    }
  }
}
