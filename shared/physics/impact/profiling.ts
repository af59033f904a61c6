/**
 * Hessian profiling of a set by a new measurement (see shared/physics/README.md, section 21.4):
 * the predictions are expanded in the eigenvector parameters z, χ²(z) with the tolerance penalty
 * is minimised, and a profiled set is built from the new minimum and the Hessian there.
 */
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from 'ml-matrix'
import type { ErrorSet, SetHeader } from '../types'
import { computeBands, experimentalCovariance, withoutMembers, type Band, type Measurement, type MemberValues, type SquareMatrix } from '../uncertainty'
import { assertMemberValues } from '../uncertainty/matrix'
import { derivedHeader, type DerivedSetInfo } from './derived-set'

/** Hessian set kinds that can be profiled. */
export type HessianKind = 'hessian-pairs' | 'hessian-one-sided'

/**
 * The expansion of a vector of values (a study's bins, or a whole grid) in the eigenvector
 * parameters z: V(z) = V₀ + Σ_k d_k z_k + Σ_k s_k z_k², where for pairs d_k = ½(V_k⁺ − V_k⁻) and
 * s_k = ½(V_k⁺ + V_k⁻ − 2V₀) (the quadratic term only when asymmetric: C. Schmidt, J. Pumplin and
 * C.-P. Yuan, arXiv:1806.07950), for one-sided sets d_k = V_k − V₀ and no quadratic term
 * (H. Paukkunen and P. Zurita, arXiv:1402.6623). V(±e_k) reproduces the members exactly.
 */
export interface EigenvectorModel {
  /** Number of eigenvectors K. */
  eigenvectors: number
  /** Length L of each vector. */
  length: number
  central: Float64Array
  /** d[k·L + i]. */
  linear: Float64Array
  /** s[k·L + i], or null for a linear model. */
  quadratic: Float64Array | null
}

/**
 * The eigenvector model of one vector per member (central first; for pairs 2k−1 = V_k⁺,
 * 2k = V_k⁻).
 *
 * Unit: that of the values. Domain: pairs need 1 + 2K members, one-sided 1 + K (K ≥ 1), all of
 * equal length; `asymmetric` only for pairs.
 * @throws RangeError for a member count that does not fit the kind, or ragged members.
 * @example eigenvectorModel([[10], [12], [9]], 'hessian-pairs', true).quadratic // [0.5]
 */
export function eigenvectorModel(members: ReadonlyArray<ArrayLike<number>>, kind: HessianKind, asymmetric = false): EigenvectorModel {
  const k = kind === 'hessian-pairs' ? (members.length - 1) / 2 : members.length - 1
  if (!Number.isInteger(k) || k < 1) {
    throw new RangeError(kind === 'hessian-pairs'
      ? `A Hessian set of eigenvector pairs needs the central member plus an even number (at least 2) of members; got ${members.length} members in all.`
      : `A one-sided Hessian set needs the central member plus at least one member; got ${members.length}.`)
  }
  if (asymmetric && kind !== 'hessian-pairs') throw new RangeError('Asymmetric (quadratic) profiling needs eigenvector pairs; a one-sided set has one member per eigenvector.')
  const length = members[0]!.length
  members.forEach((m, i) => {
    if (m.length !== length) throw new RangeError(`Member ${i} has ${m.length} values but member 0 has ${length}.`)
  })
  const central = Float64Array.from(members[0]!)
  const linear = new Float64Array(k * length)
  const quadratic = asymmetric ? new Float64Array(k * length) : null
  for (let e = 0; e < k; e++) {
    const plus = kind === 'hessian-pairs' ? members[2 * e + 1]! : members[e + 1]!
    const minus = kind === 'hessian-pairs' ? members[2 * e + 2]! : null
    for (let i = 0; i < length; i++) {
      linear[e * length + i] = minus === null ? plus[i]! - central[i]! : 0.5 * (plus[i]! - minus[i]!)
      if (quadratic !== null) quadratic[e * length + i] = 0.5 * (plus[i]! + minus![i]! - 2 * central[i]!)
    }
  }
  return { eigenvectors: k, length, central, linear, quadratic }
}

/**
 * V(z) of an eigenvector model (a new Float64Array of length L).
 * @throws RangeError when z has not one entry per eigenvector.
 * @example evaluateModel(eigenvectorModel([[10], [12], [9]], 'hessian-pairs'), [1]) // [11.5]
 */
export function evaluateModel(model: EigenvectorModel, z: ArrayLike<number>): Float64Array {
  const { eigenvectors: k, length, central, linear, quadratic } = model
  if (z.length !== k) throw new RangeError(`z has ${z.length} entries but the set has ${k} eigenvectors.`)
  const out = Float64Array.from(central)
  for (let e = 0; e < k; e++) {
    const ze = z[e]!
    if (ze === 0) continue
    const z2 = ze * ze
    for (let i = 0; i < length; i++) {
      out[i] = out[i]! + linear[e * length + i]! * ze + (quadratic === null ? 0 : quadratic[e * length + i]! * z2)
    }
  }
  return out
}

/** Options of {@link profile}. */
export interface ProfilingOptions {
  kind: HessianKind
  /**
   * Tolerance T: the set's members sit at Δχ² = T² of its global fit. For a Sheaf-built set this
   * is the Gaussian multiple of the set's CL (1 at 68%, 1.6449 at 90%: sigmaMultiple).
   */
  tolerance: number
  /** Keep the quadratic terms of asymmetric pairs (arXiv:1806.07950); default false. */
  asymmetric?: boolean
  /** [down, up] α_s members, set aside before profiling (they are not eigenvectors). */
  alphasMembers?: readonly [number, number]
  /** CL of the set's members, percent, for the bands (default 68). */
  clPercent?: number
}

/** Result of {@link profile}. */
export interface ProfilingResult {
  eigenvectors: number
  tolerance: number
  asymmetric: boolean
  points: number
  /** Shifts z_k* of the minimum, in units where the members sit at z_k = ±1. */
  shifts: Float64Array
  /** χ² of the data with the central member (z = 0). */
  chi2Before: number
  /** At the minimum: the data part, the penalty T²Σz_k², and their sum. */
  chi2After: { data: number, penalty: number, total: number }
  /** Gauss–Newton iterations (0 for a linear model, solved exactly). */
  iterations: number
  /** ½ × the Hessian of χ² at the minimum (Gauss–Newton), H = J̃ᵀJ̃ + T²·1, K × K. */
  hessian: SquareMatrix
  /** Eigenvalues λ_j of H, increasing (the least constrained direction first). */
  eigenvalues: Float64Array
  /** New eigenvector displacements δz_j = T v_j/√λ_j (Δχ² = T² along each), row j. */
  directions: Float64Array[]
  /** Prediction before (central member) and after (V(z*)). */
  predictionBefore: Float64Array
  predictionAfter: Float64Array
  /** The study's values for every member of the profiled set: V(z*), then V(z* ± δz_j). */
  profiledValues: MemberValues
  /** Symmetric Hessian bands at 68% CL before and after. */
  bandBefore: Band
  bandAfter: Band
}

/**
 * Profiles a Hessian set by a measurement (H. Paukkunen and P. Zurita, arXiv:1402.6623): with the
 * predictions V(z) of the eigenvector model, minimises
 * χ²(z) = (D − V(z))ᵀ C⁻¹ (D − V(z)) + T²·Σ_k z_k²,
 * C the full experimental covariance. For a linear model the minimum solves
 * (AᵀC⁻¹A + T²·1) z = AᵀC⁻¹(D − V₀) exactly; with the quadratic terms it is reached by
 * Gauss–Newton steps with step halving from that point (at most 200). The new eigenvectors come
 * from diagonalising H = JᵀC⁻¹J + T²·1 (J = ∂V/∂z at the minimum): δz_j = T v_j/√λ_j moves χ² by
 * T², so the profiled set keeps the parent's tolerance and CL.
 *
 * Unit: values and data in the observable's unit; χ² and z dimensionless.
 * Domain: a Hessian member-value matrix whose bins are the measurement's points in order; T > 0.
 * Accuracy: the linear solution to rounding (Cholesky of H, which is positive definite since
 * T > 0); checked against the closed-form Gaussian update to 1e-10.
 * @throws RangeError for a size mismatch, T ≤ 0, or a covariance that is not positive definite.
 * @example profile(m, data, { kind: 'hessian-pairs', tolerance: 1.6448536 }).shifts
 */
export function profile(matrix: MemberValues, measurement: Measurement, options: ProfilingOptions): ProfilingResult {
  assertMemberValues(matrix, 2, 'Hessian member-value matrix')
  const { kind, tolerance: t } = options
  if (!(Number.isFinite(t) && t > 0)) throw new RangeError(`The tolerance T must be a finite number > 0; got ${t}.`)
  if (matrix.bins !== measurement.values.length) {
    throw new RangeError(`The set's prediction has ${matrix.bins} bins but the measurement has ${measurement.values.length} points.`)
  }
  const pdf = options.alphasMembers === undefined ? matrix : withoutMembers(matrix, options.alphasMembers)
  const rows = Array.from({ length: pdf.members }, (_, m) => pdf.values.subarray(m * pdf.bins, (m + 1) * pdf.bins))
  const model = eigenvectorModel(rows, kind, options.asymmetric ?? false)
  const n = pdf.bins
  const k = model.eigenvectors
  const l = choleskyRows(experimentalCovariance(measurement))
  const data = Float64Array.from(measurement.values)

  // Whitened pieces: r̃(z) = L⁻¹(D − V(z)), J̃ = L⁻¹ ∂V/∂z.
  const whitenedResidual = (z: ArrayLike<number>) => {
    const v = evaluateModel(model, z)
    return forward(l, v.map((x, i) => data[i]! - x))
  }
  const whitenedJacobian = (z: ArrayLike<number>) => {
    const columns: Float64Array[] = []
    for (let e = 0; e < k; e++) {
      const col = new Float64Array(n)
      for (let i = 0; i < n; i++) {
        col[i] = model.linear[e * n + i]! + (model.quadratic === null ? 0 : 2 * model.quadratic[e * n + i]! * z[e]!)
      }
      columns.push(forward(l, col))
    }
    return columns
  }
  const chi2Of = (z: ArrayLike<number>) => {
    const r = whitenedResidual(z)
    let data2 = 0
    for (let i = 0; i < n; i++) data2 += r[i]! * r[i]!
    let penalty = 0
    for (let e = 0; e < k; e++) penalty += z[e]! * z[e]!
    return { data: data2, penalty: t * t * penalty, total: data2 + t * t * penalty }
  }
  const normalEquations = (z: Float64Array) => {
    const jac = whitenedJacobian(z)
    const r = whitenedResidual(z)
    const h = Matrix.zeros(k, k)
    const g = new Float64Array(k)
    for (let a = 0; a < k; a++) {
      for (let b = a; b < k; b++) {
        let s = 0
        for (let i = 0; i < n; i++) s += jac[a]![i]! * jac[b]![i]!
        h.set(a, b, s + (a === b ? t * t : 0))
        h.set(b, a, h.get(a, b))
      }
      let s = 0
      for (let i = 0; i < n; i++) s += jac[a]![i]! * r[i]!
      g[a] = s - t * t * z[a]!
    }
    return { h, g }
  }
  const solve = (h: Matrix, g: Float64Array) => {
    const cholesky = new CholeskyDecomposition(h)
    return Float64Array.from(cholesky.solve(Matrix.columnVector(Array.from(g))).getColumn(0))
  }

  // Linear step from z = 0: exact for a linear model.
  let z = new Float64Array(k)
  const first = normalEquations(z)
  z = solve(first.h, first.g)
  let iterations = 0
  if (model.quadratic !== null) {
    let current = chi2Of(z).total
    for (; iterations < 200; iterations++) {
      const { h, g } = normalEquations(z)
      const step = solve(h, g)
      let scale = 1
      let next = z.map((v, e) => v + step[e]!)
      let value = chi2Of(next).total
      while (value > current && scale > 1e-6) {
        scale /= 2
        next = z.map((v, e) => v + scale * step[e]!)
        value = chi2Of(next).total
      }
      if (value > current) break
      const stepNorm = Math.sqrt(step.reduce((s, v) => s + v * v, 0)) * scale
      z = next
      const change = current - value
      current = value
      if (change <= 1e-13 * (1 + current) && stepNorm <= 1e-9 * (1 + Math.sqrt(z.reduce((s, v) => s + v * v, 0)))) break
    }
  }

  const { h } = normalEquations(z)
  const evd = new EigenvalueDecomposition(h, { assumeSymmetric: true })
  const order = evd.realEigenvalues.map((v, i) => [v, i] as const).sort((a, b) => a[0] - b[0])
  const eigenvalues = Float64Array.from(order.map(([v]) => v))
  const vectors = evd.eigenvectorMatrix
  const directions = order.map(([lambda, i]) => {
    const v = Float64Array.from(vectors.getColumn(i))
    let big = 0
    for (let e = 1; e < k; e++) if (Math.abs(v[e]!) > Math.abs(v[big]!)) big = e
    const sign = v[big]! < 0 ? -1 : 1
    return v.map(x => (sign * t * x) / Math.sqrt(lambda))
  })

  const points = profiledPoints(z, directions)
  const values = new Float64Array(points.length * n)
  points.forEach((p, m) => values.set(evaluateModel(model, p), m * n))
  const profiledValues: MemberValues = { members: points.length, bins: n, values }
  const cl = options.clPercent ?? 68
  const bandOf = (m: MemberValues, kindOf: HessianKind) => {
    const b = computeBands(m, { kind: kindOf, prescription: kindOf === 'hessian-pairs' ? 'hessian-symmetric' : 'one-sided', clFrom: cl, clTo: 68 })
    return { central: b.central, plus: b.plus, minus: b.minus, relPlus: b.relPlus, relMinus: b.relMinus }
  }
  const hessian = new Float64Array(k * k)
  for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) hessian[a * k + b] = h.get(a, b)
  return {
    eigenvectors: k,
    tolerance: t,
    asymmetric: model.quadratic !== null,
    points: n,
    shifts: z,
    chi2Before: chi2Of(new Float64Array(k)).data,
    chi2After: chi2Of(z),
    iterations,
    hessian: { size: k, values: hessian },
    eigenvalues,
    directions,
    predictionBefore: model.central.slice(),
    predictionAfter: evaluateModel(model, z),
    profiledValues,
    bandBefore: bandOf(pdf, kind),
    bandAfter: bandOf(profiledValues, 'hessian-pairs')
  }
}

/** z*, then z* + δz_j and z* − δz_j for each new eigenvector j (the profiled set's members). */
function profiledPoints(z: Float64Array, directions: Float64Array[]): Float64Array[] {
  const out = [z.slice()]
  for (const d of directions) {
    out.push(z.map((v, e) => v + d[e]!))
    out.push(z.map((v, e) => v - d[e]!))
  }
  return out
}

/** Rows of the Cholesky factor L of a covariance (C = L Lᵀ). */
function choleskyRows(covariance: SquareMatrix): number[][] {
  const n = covariance.size
  const rows = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) =>
    0.5 * (covariance.values[i * n + j]! + covariance.values[j * n + i]!)))
  const cholesky = new CholeskyDecomposition(new Matrix(rows))
  if (!cholesky.isPositiveDefinite()) {
    throw new RangeError('The experimental covariance is not positive definite: check for zero errors, a duplicated point, or a correlation matrix that is not a valid one.')
  }
  return cholesky.lowerTriangularMatrix.to2DArray()
}

/** L⁻¹ v by forward substitution. */
function forward(l: number[][], v: ArrayLike<number>): Float64Array {
  const n = v.length
  const out = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    const row = l[i]!
    let s = v[i]!
    for (let j = 0; j < i; j++) s -= row[j]! * out[j]!
    out[i] = s / row[i]!
  }
  return out
}

/**
 * The members of the profiled set for any vectors that follow the parent's eigenvector model —
 * the grids of a set, or parameters in a test: V(z*), then V(z* ± δz_j) for j = 1..K, with the
 * model of the parent's members (linear, or quadratic when the result was asymmetric).
 *
 * Unit: that of the vectors. Domain: the parent's members (α_s members already set aside) and a
 * result of {@link profile} with as many eigenvectors.
 * @throws RangeError when the member count does not match the result's eigenvectors.
 * @example profiledMembers(set.members, 'hessian-pairs', result) // 1 + 2K grids
 */
export function profiledMembers(members: ReadonlyArray<ArrayLike<number>>, kind: HessianKind, result: ProfilingResult): Float64Array[] {
  const model = eigenvectorModel(members, kind, result.asymmetric)
  if (model.eigenvectors !== result.eigenvectors) {
    throw new RangeError(`The set has ${model.eigenvectors} eigenvectors but the profiling result has ${result.eigenvectors}.`)
  }
  return profiledPoints(result.shifts, result.directions).map(p => evaluateModel(model, p))
}

/**
 * The profiled set: a Hessian set of eigenvector pairs on the parent's grid, with the new central
 * member V(z*) and the new pairs V(z* ± δz_j) of every grid value (profiledMembers), the parent's
 * CL (members at Δχ² = T²), scheme, target and α_s(M_Z); α_s members are not carried over.
 *
 * Unit: grids hold x·f as the parent. Domain: a Hessian parent set and its profiling result.
 * @throws RangeError for a replica set or a result of another set.
 * @example profiledSet(parent, result, { name: 'quillon-22-profiled', provenance: 'by data.csv' })
 */
export function profiledSet(parent: ErrorSet, result: ProfilingResult, info: DerivedSetInfo): ErrorSet {
  const kind = parent.header.kind
  if (kind === 'replicas') throw new RangeError(`Only a Hessian set can be profiled; '${parent.header.name}' is a replica set (reweight it instead).`)
  const alphas = new Set(parent.header.alphasMembers ?? [])
  const members = parent.members.filter((_, m) => !alphas.has(m))
  const out = profiledMembers(members, kind, result)
  const header: SetHeader = { ...derivedHeader(parent.header, info), kind: 'hessian-pairs', memberCount: out.length }
  return { header, x: parent.x.slice(), q2: parent.q2.slice(), flavours: [...parent.flavours], members: out }
}
