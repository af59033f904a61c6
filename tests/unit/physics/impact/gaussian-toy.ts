// A linear Gaussian toy shared by the profiling, reweighting and unweighting checks: three
// parameters p with a Gaussian prior N(0, Σ), four data points D = c + A p + noise with a full
// covariance C. Made-up numbers; the closed-form posterior is that of C. M. Bishop, "Pattern
// Recognition and Machine Learning" (Springer 2006), §2.3.3, eqs. (2.113)–(2.117):
// Σ_post = (Σ⁻¹ + AᵀC⁻¹A)⁻¹, μ_post = Σ_post AᵀC⁻¹ (D − c).
import { EigenvalueDecomposition, inverse, Matrix } from 'ml-matrix'
import { normalStream } from '../../../../shared/physics/random'
import { memberValuesFromRows, type MemberValues } from '../../../../shared/physics/uncertainty'

export const PRIOR = new Matrix([[1.0, 0.3, -0.2], [0.3, 0.5, 0.1], [-0.2, 0.1, 0.8]])
export const A = new Matrix([[2, 0.5, 0], [1, -1, 0.3], [0, 0.7, 1.5], [0.4, 0.2, -0.6]])
export const C_OFFSET = [10, 8, 6, 4]
export const DATA_COVARIANCE = new Matrix([[0.25, 0.05, 0, 0.02], [0.05, 0.36, 0.04, 0], [0, 0.04, 0.16, 0.03], [0.02, 0, 0.03, 0.2]])
export const DATA = [11.1, 8.4, 6.9, 3.7]

/** Closed-form Gaussian posterior of p (Bishop §2.3.3). */
export function posterior(): { mean: number[], covariance: number[][] } {
  const ci = inverse(DATA_COVARIANCE)
  const precision = inverse(PRIOR).add(A.transpose().mmul(ci).mmul(A))
  const covariance = inverse(precision)
  const residual = Matrix.columnVector(DATA.map((d, i) => d - C_OFFSET[i]!))
  const mean = covariance.mmul(A.transpose()).mmul(ci).mmul(residual).getColumn(0)
  return { mean, covariance: covariance.to2DArray() }
}

/** The prediction c + A p for a parameter vector. */
export function predict(p: ArrayLike<number>): number[] {
  return C_OFFSET.map((c, i) => c + A.getRow(i).reduce((s, a, j) => s + a * p[j]!, 0))
}

/**
 * Hessian members of the prior in parameter space (J. Pumplin et al., hep-ph/0101032):
 * Σ = Σ_k λ_k e_k e_kᵀ, p_k^± = ±T√λ_k e_k, members [0, p_1⁺, p_1⁻, …].
 */
export function hessianParameterMembers(tolerance: number): number[][] {
  const evd = new EigenvalueDecomposition(PRIOR, { assumeSymmetric: true })
  const out: number[][] = [[0, 0, 0]]
  evd.realEigenvalues.forEach((lambda, k) => {
    const e = evd.eigenvectorMatrix.getColumn(k)
    out.push(e.map(v => tolerance * Math.sqrt(lambda) * v))
    out.push(e.map(v => -tolerance * Math.sqrt(lambda) * v))
  })
  return out
}

/** The Cholesky factor L of the prior (Σ = LLᵀ), to draw replicas p = Lξ. */
export function priorFactor(): number[][] {
  const l = [[0, 0, 0], [0, 0, 0], [0, 0, 0]]
  const s = PRIOR.to2DArray()
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j <= i; j++) {
      let v = s[i]![j]!
      for (let k = 0; k < j; k++) v -= l[i]![k]! * l[j]![k]!
      l[i]![j] = i === j ? Math.sqrt(v) : v / l[j]![j]!
    }
  }
  return l
}

/** N replicas of the toy prior p = Lξ (ξ from the 'synthetic' stream, seed 2026), as parameter and prediction matrices. */
export function toyReplicas(n: number, seed = 2026): { parameters: MemberValues, predictions: MemberValues } {
  const l = priorFactor()
  const xi = normalStream(seed, { purpose: 'synthetic', index: 11 })
  const p: number[][] = [[0, 0, 0]]
  for (let r = 0; r < n; r++) {
    const z = [xi.next(), xi.next(), xi.next()]
    p.push(l.map(row => row.reduce((s, v, j) => s + v * z[j]!, 0)))
  }
  return { parameters: memberValuesFromRows(p), predictions: memberValuesFromRows(p.map(predict)) }
}
