/**
 * Bin-to-bin covariance and correlation of a set's predictions, and the correlation of two
 * observables.
 */
import type { SetKind } from '../types'
import { alphasShift } from './alphas-members'
import { clScaleFactor } from './confidence'
import { eigenvectorDeviations } from './hessian'
import { withoutMembers, type MemberValues, type SpreadOptions, type SquareMatrix } from './matrix'
import { replicaCount, replicaMoments } from './replicas'

/**
 * Which set the members come from and at which CL the covariance is wanted (entries scale with
 * the square of the CL factor); the α_s members are added as ΔX_αs,i ΔX_αs,j.
 */
export type CovarianceOptions = SpreadOptions

/**
 * Rows D (one per eigenvector or replica, `bins` columns) with covariance = Dᵀ D:
 * Hessian pairs d_kb = ½(X_k⁺ − X_k⁻); one-sided d_kb = X_k − X₀; replicas
 * d_rb = (X_r − mean_b)/√(N − 1). The common factor behind the covariance, the principal
 * components and the χ² with PDF uncertainties.
 *
 * Unit: that of the observable. Domain: a member count that fits `kind` (no α_s members; set
 * them aside with withoutMembers first).
 * @throws RangeError as eigenvectorDeviations / replicaCount.
 * @example deviationRows(memberValuesFromRows([[0], [1], [3]]), 'replicas').values // [-1, 1]
 */
export function deviationRows(matrix: MemberValues, kind: SetKind): MemberValues {
  if (kind !== 'replicas') return eigenvectorDeviations(matrix, kind)
  const n = replicaCount(matrix)
  const { mean } = replicaMoments(matrix)
  const { bins, values } = matrix
  const norm = 1 / Math.sqrt(n - 1)
  const out = new Float64Array(n * bins)
  for (let r = 0; r < n; r++) {
    for (let b = 0; b < bins; b++) out[r * bins + b] = (values[(r + 1) * bins + b]! - mean[b]!) * norm
  }
  return { members: n, bins, values: out }
}

/**
 * Bin-to-bin covariance matrix of a set's predictions (see shared/physics/README.md,
 * "Covariance and correlation"):
 * Hessian pairs C_ij = Σ_k ¼(X_ik⁺ − X_ik⁻)(X_jk⁺ − X_jk⁻); one-sided C_ij = Σ_k (X_ik − X_i0)(X_jk − X_j0);
 * replicas the sample covariance (1/(N−1)) Σ_r (X_ir − X̄_i)(X_jr − X̄_j). With α_s members,
 * + ¼(X_i(α_s⁺) − X_i(α_s⁻))(X_j(α_s⁺) − X_j(α_s⁻)). Entries are rescaled by
 * clScaleFactor(clFrom, clTo)² (and the α_s term by its own factor²).
 * Its diagonal is the square of the symmetric band (hessian-symmetric, one-sided, replica-sd).
 *
 * Unit: square of the observable's unit. Domain: as computeBands. Result: bins × bins, symmetric.
 * Method: the two-pass (mean first) form for replicas; Neumaier-compensated sums over members.
 * Cost O(B² · N): about 1.2 s for 1000 bins × 1000 replicas on the 2-core development machine.
 * @throws RangeError for a malformed matrix or a member count that does not fit the kind.
 * @example binCovariance(m, { kind: 'hessian-pairs', clFrom: 90 }) // at 68% CL
 */
export function binCovariance(matrix: MemberValues, options: CovarianceOptions): SquareMatrix {
  const { kind, clFrom = 68, clTo = 68, alphasMembers } = options
  const pdfMembers = alphasMembers === undefined ? matrix : withoutMembers(matrix, alphasMembers)
  const rows = deviationRows(pdfMembers, kind)
  const factor = clScaleFactor(clFrom, clTo)
  let scaled = rows.values.map(v => v * factor)
  let n = rows.members
  if (alphasMembers !== undefined) {
    const alphasFactor = clScaleFactor(options.alphasCl ?? clFrom, clTo)
    const shift = alphasShift(matrix, alphasMembers).map(v => v * alphasFactor)
    const extended = new Float64Array(scaled.length + shift.length)
    extended.set(scaled)
    extended.set(shift, scaled.length)
    scaled = extended
    n++
  }
  return gram({ members: n, bins: rows.bins, values: scaled })
}

/**
 * Gram matrix Dᵀ D of rows D (members × bins): G_ij = Σ_k D_ki D_kj, the bins × bins covariance
 * when D holds deviationRows.
 *
 * Unit: square of the entries' unit. Method: columns transposed for contiguous access, Neumaier
 * sums; O(B² · K).
 * @example gram(memberValuesFromRows([[1, 2], [3, 4]])).values // [10, 14, 14, 20]
 */
export function gram(rows: MemberValues): SquareMatrix {
  const { members: n, bins } = rows
  const columns = new Float64Array(n * bins)
  for (let k = 0; k < n; k++) {
    for (let b = 0; b < bins; b++) columns[b * n + k] = rows.values[k * bins + b]!
  }
  const out = new Float64Array(bins * bins)
  for (let i = 0; i < bins; i++) {
    const oi = i * n
    for (let j = i; j < bins; j++) {
      const oj = j * n
      let sum = 0
      let compensation = 0
      for (let k = 0; k < n; k++) {
        const x = columns[oi + k]! * columns[oj + k]!
        const t = sum + x
        compensation += Math.abs(sum) >= Math.abs(x) ? (sum - t) + x : (x - t) + sum
        sum = t
      }
      out[i * bins + j] = out[j * bins + i] = sum + compensation
    }
  }
  return { size: bins, values: out }
}

/**
 * Correlation matrix ρ_ij = C_ij / √(C_ii C_jj) of a covariance matrix. For Hessian sets this is
 * cos φ of Pumplin et al. (see shared/physics/README.md, "Covariance and correlation"), for
 * replicas the Pearson coefficient. Entries of a bin with zero variance (no PDF dependence) are
 * NaN.
 *
 * Unit: dimensionless, in [−1, 1] up to rounding (clamped). Domain: a covariance matrix.
 * @throws RangeError for a negative diagonal entry.
 * @example correlationFromCovariance({ size: 2, values: new Float64Array([4, 2, 2, 9]) }).values // [1, 1/3, 1/3, 1]
 */
export function correlationFromCovariance(covariance: SquareMatrix): SquareMatrix {
  const { size, values } = covariance
  const sd = new Float64Array(size)
  for (let i = 0; i < size; i++) {
    const v = values[i * size + i]!
    if (v < 0) throw new RangeError(`Bin ${i} has a negative variance (${v}); this is not a covariance matrix.`)
    sd[i] = Math.sqrt(v)
  }
  const out = new Float64Array(size * size)
  for (let i = 0; i < size; i++) {
    for (let j = 0; j < size; j++) {
      const denominator = sd[i]! * sd[j]!
      out[i * size + j] = denominator === 0
        ? Number.NaN
        : i === j ? 1 : Math.min(1, Math.max(-1, values[i * size + j]! / denominator))
    }
  }
  return { size, values: out }
}

/**
 * Bin-to-bin correlation matrix of a set's predictions: correlationFromCovariance of
 * binCovariance (the CL options cancel except through the α_s term's relative weight).
 *
 * Unit: dimensionless. Domain and errors as binCovariance.
 * @example binCorrelation(m, { kind: 'replicas' }).values[0 * m.bins + 1] // ρ of bins 0 and 1
 */
export function binCorrelation(matrix: MemberValues, options: CovarianceOptions): SquareMatrix {
  return correlationFromCovariance(binCovariance(matrix, options))
}

/**
 * Correlation of two observables X and Y given their values for every member of one set:
 * Hessian pairs cos φ = Σ_k (X_k⁺ − X_k⁻)(Y_k⁺ − Y_k⁻) / (4 ΔX ΔY) (J. Pumplin et al.,
 * hep-ph/0101032), one-sided Σ_k (X_k − X₀)(Y_k − Y₀)/(ΔX ΔY), replicas the Pearson
 * coefficient of members 1..N. cos φ ≈ 1: strongly correlated; ≈ 0: independent; ≈ −1:
 * anti-correlated.
 *
 * Unit: dimensionless, in [−1, 1]. Domain: x and y of equal length fitting `kind`; neither
 * constant over the members (else NaN).
 * @throws RangeError on a length mismatch or a member count that does not fit the kind.
 * @example observableCorrelation([10, 11, 9], [5, 5.5, 4.5], { kind: 'hessian-pairs' }) // 1
 */
export function observableCorrelation(x: ArrayLike<number>, y: ArrayLike<number>, options: CovarianceOptions): number {
  if (x.length !== y.length) {
    throw new RangeError(`The two observables have values for ${x.length} and ${y.length} members; they must come from the same set.`)
  }
  const values = new Float64Array(2 * x.length)
  for (let m = 0; m < x.length; m++) {
    values[2 * m] = x[m]!
    values[2 * m + 1] = y[m]!
  }
  return binCorrelation({ members: x.length, bins: 2, values }, options).values[1]!
}
