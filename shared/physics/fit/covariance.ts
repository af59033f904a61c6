/**
 * Checks of a parameter covariance matrix before members are built from it: square, finite,
 * symmetric and positive definite.
 */
import { CholeskyDecomposition, Matrix } from 'ml-matrix'

/** A covariance given as rows (number[][]) or as an ml-matrix Matrix. */
export type CovarianceLike = readonly (readonly number[])[] | Matrix

/**
 * The covariance as an ml-matrix `Matrix` after checking it is an n×n (n = `size` when given)
 * finite, symmetric, positive-definite matrix.
 *
 * Symmetry: |C_ij − C_ji| ≤ 1e-10·√(C_ii C_jj) (relative to the scale of the entries).
 * Positive definiteness: the Cholesky factorisation exists and every pivot exceeds
 * 1e-14·max C_ii (a covariance with a zero or negative eigenvalue has a degenerate or
 * unphysical parameter combination and cannot give Hessian members or replicas).
 * @throws RangeError naming the offending row/column or pivot.
 * @example checkedCovariance([[4, 1], [1, 9]]) // Matrix 2×2
 */
export function checkedCovariance(cov: CovarianceLike, size?: number): Matrix {
  const rows = cov instanceof Matrix ? cov.to2DArray() : cov.map(r => [...r])
  const n = rows.length
  if (n === 0) throw new RangeError('the covariance matrix is empty')
  if (size !== undefined && n !== size) {
    throw new RangeError(`the covariance has ${n} rows but there are ${size} parameters`)
  }
  rows.forEach((r, i) => {
    if (r.length !== n) throw new RangeError(`covariance row ${i} has ${r.length} entries; a ${n}×${n} matrix is needed`)
    r.forEach((v, j) => {
      if (!Number.isFinite(v)) throw new RangeError(`covariance entry C[${i}][${j}] = ${v} is not a finite number`)
    })
  })
  for (let i = 0; i < n; i++) {
    if (!(rows[i]![i]! > 0)) {
      throw new RangeError(`covariance diagonal C[${i}][${i}] = ${rows[i]![i]} must be > 0 (a variance)`)
    }
  }
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const a = rows[i]![j]!
      const b = rows[j]![i]!
      if (Math.abs(a - b) > 1e-10 * Math.sqrt(rows[i]![i]! * rows[j]![j]!)) {
        throw new RangeError(`the covariance is not symmetric: C[${i}][${j}] = ${a} but C[${j}][${i}] = ${b}`)
      }
    }
  }
  // Symmetrise exactly so downstream decompositions see a symmetric matrix.
  const m = new Matrix(n, n)
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) m.set(i, j, 0.5 * (rows[i]![j]! + rows[j]![i]!))
  }
  const chol = new CholeskyDecomposition(m)
  const maxDiag = Math.max(...rows.map((r, i) => r[i]!))
  if (!chol.isPositiveDefinite()) {
    throw new RangeError('the covariance is not positive definite (some combination of parameters has zero or negative variance); check for duplicated or fully correlated parameters')
  }
  const l = chol.lowerTriangularMatrix
  for (let i = 0; i < n; i++) {
    const pivot = l.get(i, i) ** 2
    if (!(pivot > 1e-14 * maxDiag)) {
      throw new RangeError(`the covariance is numerically singular at parameter ${i} (Cholesky pivot ${pivot.toExponential(3)} ≤ 1e-14 × the largest variance); check for fully correlated parameters`)
    }
  }
  return m
}
