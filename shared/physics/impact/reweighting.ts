/**
 * Bayesian reweighting of a replica set by a new measurement (see shared/physics/README.md,
 * section 21.2): each replica's χ² against the data with the full experimental covariance, the
 * weights, the effective number of replicas, the reweighted predictions and bands, and the
 * χ² profile P(α).
 */
import { CholeskyDecomposition, Matrix } from 'ml-matrix'
import { experimentalCovariance, makeBands, NeumaierSum, type Band, type Measurement, type MemberValues } from '../uncertainty'
import { assertMemberValues } from '../uncertainty/matrix'
import { replicaCount } from '../uncertainty/replicas'

/**
 * How a replica's χ² becomes its weight:
 * - 'chi2-pdf': w_k ∝ χ_k^{n−1} e^{−χ_k²/2}, the probability density of χ for n points
 *   (R. D. Ball et al., arXiv:1012.0836, eq. for w_k), the default;
 * - 'likelihood': w_k ∝ e^{−χ_k²/2}, the Gaussian likelihood (W. T. Giele and S. Keller,
 *   hep-ph/9803393), which is the exact Bayesian update of a Gaussian prior by Gaussian data.
 */
export type WeightForm = 'chi2-pdf' | 'likelihood'

/** The weight forms, for option parsing. */
export const WEIGHT_FORMS: readonly WeightForm[] = ['chi2-pdf', 'likelihood']

/**
 * Whitening by the Cholesky factor of the experimental covariance C = L Lᵀ of a measurement:
 * χ²(T) = |L⁻¹(D − T)|². Built once and applied to every replica.
 */
interface Whitener {
  points: number
  chi2: (prediction: ArrayLike<number>, offset: number) => number
}

function whitener(measurement: Measurement): Whitener {
  const covariance = experimentalCovariance(measurement)
  const n = covariance.size
  const rows = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) =>
    0.5 * (covariance.values[i * n + j]! + covariance.values[j * n + i]!)))
  const cholesky = new CholeskyDecomposition(new Matrix(rows))
  if (!cholesky.isPositiveDefinite()) {
    throw new RangeError('The experimental covariance is not positive definite: check for zero errors, a duplicated point, or a correlation matrix that is not a valid one.')
  }
  const l = cholesky.lowerTriangularMatrix.to2DArray()
  const data = Float64Array.from(measurement.values)
  const z = new Float64Array(n)
  return {
    points: n,
    chi2(prediction, offset) {
      const total = new NeumaierSum()
      for (let i = 0; i < n; i++) {
        const row = l[i]!
        let s = data[i]! - prediction[offset + i]!
        for (let j = 0; j < i; j++) s -= row[j]! * z[j]!
        z[i] = s / row[i]!
        total.add(z[i]! * z[i]!)
      }
      return total.value
    }
  }
}

/**
 * χ²_k = (D − X_k)ᵀ C⁻¹ (D − X_k) of every replica k = 1..N against a measurement, with C its
 * full experimental covariance (experimentalCovariance; the same χ² as chiSquare without a PDF
 * covariance).
 *
 * Unit: dimensionless. Domain: a replica matrix (member 0 then N ≥ 2 replicas) whose bins are the
 * measurement's points, in order; a positive definite covariance.
 * Method: one Cholesky factorisation (ml-matrix), then forward substitution per replica with
 * compensated sums; O(n³ + N n²).
 * @throws RangeError for a bin-count mismatch or a covariance that is not positive definite.
 * @example replicaChi2(m, { values: [1, 2], stat: [0.1, 0.1] }) // one χ² per replica
 */
export function replicaChi2(matrix: MemberValues, measurement: Measurement): Float64Array {
  const n = replicaCount(matrix)
  if (matrix.bins !== measurement.values.length) {
    throw new RangeError(`The set's prediction has ${matrix.bins} bins but the measurement has ${measurement.values.length} points.`)
  }
  const w = whitener(measurement)
  const out = new Float64Array(n)
  for (let k = 1; k <= n; k++) out[k - 1] = w.chi2(matrix.values, k * matrix.bins)
  return out
}

/**
 * Reweighting weights from the replicas' χ² values for a measurement of n points, normalised so
 * that Σ_k w_k = N (R. D. Ball et al., arXiv:1012.0836): 'chi2-pdf' w_k ∝ (χ_k²)^{(n−1)/2}
 * e^{−χ_k²/2}, 'likelihood' w_k ∝ e^{−χ_k²/2} (see WeightForm).
 *
 * Unit: dimensionless. Domain: N ≥ 1 finite χ² ≥ 0; n ≥ 1.
 * Method: in logarithms, the largest subtracted before exponentiating, so that no weight
 * overflows and the largest is never lost to underflow.
 * @throws RangeError for a negative or non-finite χ², or a bad point count.
 * @example reweightingWeights([1, 4], 1, 'likelihood') // [2e^{−1/2}, 2e^{−2}]/(e^{−1/2} + e^{−2})
 */
export function reweightingWeights(chi2: ArrayLike<number>, points: number, form: WeightForm = 'chi2-pdf'): Float64Array {
  const n = chi2.length
  if (n === 0) throw new RangeError('No replicas to weigh.')
  if (!Number.isInteger(points) || points < 1) throw new RangeError(`The number of data points must be a whole number ≥ 1; got ${points}.`)
  const logW = new Float64Array(n)
  let max = -Infinity
  for (let k = 0; k < n; k++) {
    const c = chi2[k]!
    if (!(Number.isFinite(c) && c >= 0)) throw new RangeError(`The χ² of replica ${k + 1} must be a finite number ≥ 0; got ${c}.`)
    logW[k] = -0.5 * c + (form === 'chi2-pdf' && points > 1 ? 0.5 * (points - 1) * Math.log(c) : 0)
    if (logW[k]! > max) max = logW[k]!
  }
  if (max === -Infinity) throw new RangeError('Every replica has χ² = 0, so the χ^{n−1} weights all vanish; use the likelihood weights.')
  const w = logW.map(v => Math.exp(v - max))
  const sum = w.reduce((a, b) => a + b, 0)
  return w.map(v => (v * n) / sum)
}

/**
 * Effective number of replicas after reweighting, N_eff = exp{(1/N) Σ_k w_k ln(N/w_k)} (the
 * Shannon entropy of the weights; R. D. Ball et al., arXiv:1012.0836), with w_k ln(N/w_k) → 0
 * for w_k = 0. N_eff = N for equal weights and 1 when one replica carries all the weight.
 *
 * Unit: a number of replicas. Domain: weights ≥ 0 summing to N (reweightingWeights'
 * normalisation; any other sum is renormalised first).
 * @throws RangeError for negative or non-finite weights, or weights summing to 0.
 * @example effectiveReplicas([2, 1, 1, 0]) // 2^{3/2} ≈ 2.828
 */
export function effectiveReplicas(weights: ArrayLike<number>): number {
  const n = weights.length
  const total = sumWeights(weights)
  const s = new NeumaierSum()
  for (let k = 0; k < n; k++) {
    const w = (weights[k]! * n) / total
    if (w > 0) s.add(w * Math.log(n / w))
  }
  return Math.exp(s.value / n)
}

function sumWeights(weights: ArrayLike<number>): number {
  if (weights.length === 0) throw new RangeError('No weights given.')
  let total = 0
  for (let k = 0; k < weights.length; k++) {
    const w = weights[k]!
    if (!(Number.isFinite(w) && w >= 0)) throw new RangeError(`The weight of replica ${k + 1} must be a finite number ≥ 0; got ${w}.`)
    total += w
  }
  if (!(total > 0)) throw new RangeError('The weights sum to 0: no replica is compatible with the data.')
  return total
}

/**
 * Weighted mean and variance of every bin over replicas 1..N: mean_b = Σ_k w_k X_kb / Σ_k w_k and
 * var_b = Σ_k w_k (X_kb − mean_b)² / (V₁ − V₂/V₁) with V₁ = Σ w_k, V₂ = Σ w_k² (the unbiased
 * estimator for reliability weights, common practice); with equal weights these are the sample
 * mean and the 1/(N−1) sample variance of replicaMoments. Member 0 is ignored.
 *
 * Unit: mean in the observable's unit, variance in its square. Domain: N ≥ 2 replicas, N weights
 * ≥ 0, at least two of them non-zero (else the variance is 0).
 * @throws RangeError for a weight count that differs from the replica count.
 * @example weightedMoments(memberValuesFromRows([[0], [1], [3]]), [1, 1]) // mean [2], variance [2]
 */
export function weightedMoments(matrix: MemberValues, weights: ArrayLike<number>): { mean: Float64Array, variance: Float64Array } {
  const n = replicaCount(matrix)
  if (weights.length !== n) throw new RangeError(`There are ${weights.length} weights for ${n} replicas: give one weight per replica.`)
  const v1 = sumWeights(weights)
  let v2 = 0
  for (let k = 0; k < n; k++) v2 += weights[k]! ** 2
  const { bins, values } = matrix
  const mean = new Float64Array(bins)
  const variance = new Float64Array(bins)
  const denominator = v1 - v2 / v1
  for (let b = 0; b < bins; b++) {
    const s = new NeumaierSum()
    for (let k = 0; k < n; k++) s.add(weights[k]! * values[(k + 1) * bins + b]!)
    const m = s.value / v1
    const q = new NeumaierSum()
    for (let k = 0; k < n; k++) q.add(weights[k]! * (values[(k + 1) * bins + b]! - m) ** 2)
    mean[b] = m
    variance[b] = denominator > 0 ? q.value / denominator : 0
  }
  return { mean, variance }
}

/**
 * The reweighted band: weighted mean ± weighted standard deviation (weightedMoments) of every bin,
 * at the CL of the replicas (68% for replica sets built by Sheaf). Works for any study on the
 * set the weights came from: the weights belong to the replicas, not to the study.
 *
 * Unit: that of the observable. Domain and errors as weightedMoments.
 * @example weightedBand(m, weights).central // the reweighted predictions
 */
export function weightedBand(matrix: MemberValues, weights: ArrayLike<number>): Band {
  const { mean, variance } = weightedMoments(matrix, weights)
  const sd = variance.map(Math.sqrt)
  return makeBands(mean, sd, sd)
}

/**
 * The χ² profile P(α) of R. D. Ball et al., arXiv:1012.0836 (from memory): the probability
 * density of a factor α rescaling the experimental errors, given the replicas' χ² values,
 * P(α) ∝ (1/α) Σ_k (χ_k²/α²)^{(n−1)/2} e^{−χ_k²/(2α²)}, normalised to unit area over the given α
 * grid (trapezoidal rule). A peak near α = 1 says that the data and the set agree within the
 * quoted errors; a peak well above 1 that the errors are underestimated or the set disagrees.
 *
 * Unit: P in 1/α (α dimensionless). Domain: α values > 0 in increasing order, at least two;
 * χ² ≥ 0; n ≥ 1.
 * Method: logarithms with the largest term subtracted, as reweightingWeights.
 * @throws RangeError for a bad α grid.
 * @example chi2Profile([15, 16, 14], 15, [0.5, 1, 1.5, 2]).density // four values, area 1
 */
export function chi2Profile(chi2: ArrayLike<number>, points: number, alphas: ArrayLike<number>): { alpha: Float64Array, density: Float64Array, mostProbableAlpha: number } {
  if (alphas.length < 2) throw new RangeError('The α grid of the χ² profile needs at least two values.')
  for (let i = 0; i < alphas.length; i++) {
    if (!(Number.isFinite(alphas[i]!) && alphas[i]! > 0) || (i > 0 && !(alphas[i]! > alphas[i - 1]!))) {
      throw new RangeError(`The α grid must hold increasing numbers > 0; value ${i + 1} is ${alphas[i]}.`)
    }
  }
  const logs = new Float64Array(alphas.length)
  for (let i = 0; i < alphas.length; i++) {
    const a2 = alphas[i]! ** 2
    const terms = Array.from(chi2, c => -Math.log(alphas[i]!) + (points > 1 ? 0.5 * (points - 1) * Math.log(c / a2) : 0) - c / (2 * a2))
    const top = Math.max(...terms)
    logs[i] = top + Math.log(terms.reduce((s, t) => s + Math.exp(t - top), 0))
  }
  const max = Math.max(...logs)
  const density = logs.map(v => Math.exp(v - max))
  let area = 0
  for (let i = 1; i < alphas.length; i++) area += 0.5 * (density[i]! + density[i - 1]!) * (alphas[i]! - alphas[i - 1]!)
  let best = 0
  for (let i = 0; i < alphas.length; i++) {
    density[i] = density[i]! / area
    if (density[i]! > density[best]!) best = i
  }
  return { alpha: Float64Array.from(alphas), density, mostProbableAlpha: alphas[best]! }
}

/** Options of {@link reweight}. */
export interface ReweightOptions {
  form?: WeightForm
  /**
   * Warn when N_eff/N falls below this fraction (default 0.1: with fewer than a tenth of the
   * replicas effectively left, the reweighted band rests on too few of them — our choice, in the
   * spirit of the caution of arXiv:1012.0836).
   */
  warnFraction?: number
  /** Warn when N_eff falls below this count whatever N is (default 10, our choice). */
  warnCount?: number
}

/** Result of {@link reweight}. */
export interface ReweightResult {
  form: WeightForm
  replicas: number
  points: number
  /** χ²_k of each replica (experimental covariance only). */
  chi2: Float64Array
  /** w_k, Σ w_k = N. */
  weights: Float64Array
  effectiveReplicas: number
  /** Text of the warning when N_eff is small compared with N, else null. */
  warning: string | null
  /** Mean ± sd of the replicas before reweighting, and after. */
  before: Band
  after: Band
  /** χ² of the replica mean against the data, before and after (experimental covariance only). */
  chi2Before: number
  chi2After: number
}

/**
 * Reweights the replicas of one set by a measurement: replicaChi2, reweightingWeights,
 * effectiveReplicas, and the bands before and after (see each for formula, unit and domain).
 *
 * @throws RangeError as its parts.
 * @example reweight(m, measurement).effectiveReplicas
 */
export function reweight(matrix: MemberValues, measurement: Measurement, options: ReweightOptions = {}): ReweightResult {
  assertMemberValues(matrix, 3, 'replica member-value matrix')
  const form = options.form ?? 'chi2-pdf'
  const chi2 = replicaChi2(matrix, measurement)
  const points = measurement.values.length
  const weights = reweightingWeights(chi2, points, form)
  const nEff = effectiveReplicas(weights)
  const n = chi2.length
  const fraction = options.warnFraction ?? 0.1
  const count = options.warnCount ?? 10
  const warning = nEff < fraction * n || nEff < count
    ? `Only ${nEff.toFixed(1)} of ${n} replicas are effectively left after reweighting (N_eff below ${Math.max(fraction * n, count).toFixed(0)}): the reweighted band rests on too few replicas; use more replicas or a full refit.`
    : null
  const equal = new Float64Array(n).fill(1)
  const before = weightedBand(matrix, equal)
  const after = weightedBand(matrix, weights)
  const w = whitener(measurement)
  return {
    form,
    replicas: n,
    points,
    chi2,
    weights,
    effectiveReplicas: nEff,
    warning,
    before,
    after,
    chi2Before: w.chi2(before.central, 0),
    chi2After: w.chi2(after.central, 0)
  }
}
