import { EigenvalueDecomposition, Matrix } from 'ml-matrix'
import { describe, expect, it } from 'vitest'
import { computeBands } from '../../../../shared/physics/uncertainty/bands'
import { binCovariance, observableCorrelation } from '../../../../shared/physics/uncertainty/covariance'
import type { MemberValues } from '../../../../shared/physics/uncertainty/matrix'
import { expectClose } from '../close'

// Hessian linear-propagation identity (J. Pumplin et al., hep-ph/0101032; see
// shared/physics/README.md, "Hessian sets"): with C = Σ_k λ_k e_k e_kᵀ and members
// p_k± = p₀ ± T√λ_k e_k, a linear observable X = gᵀp has ½√Σ_k(X_k⁺ − X_k⁻)² = T√(gᵀCg)
// exactly, and Σ_k ¼(X_k⁺−X_k⁻)(Y_k⁺−Y_k⁻) = T² gᵀCh.

const nParams = 5
// A fixed, well-conditioned parameter covariance C = A Aᵀ + 0.05·1 (A arbitrary but deterministic).
const a = Matrix.from1DArray(nParams, nParams, Array.from({ length: nParams * nParams }, (_, i) => Math.sin(1.3 * i + 0.7)))
const cov = a.mmul(a.transpose()).add(Matrix.eye(nParams).mul(0.05))
const p0 = [0.8, -1.2, 0.3, 2.0, 0.05]
// Three linear observables (rows g_b).
const g = new Matrix([
  [1, 0.5, -0.2, 0.1, 3],
  [0.3, -2, 0.7, 0, 1],
  [-1, 1, 1, 1, -0.5]
])

function linearMembers(tolerance: number, form: 'pairs' | 'one-sided'): MemberValues {
  const evd = new EigenvalueDecomposition(cov, { assumeSymmetric: true })
  const rows: number[][] = [p0]
  evd.realEigenvalues.forEach((lambda, k) => {
    const e = evd.eigenvectorMatrix.getColumn(k)
    const step = e.map(v => tolerance * Math.sqrt(lambda) * v)
    rows.push(p0.map((p, i) => p + step[i]!))
    if (form === 'pairs') rows.push(p0.map((p, i) => p - step[i]!))
  })
  const x = new Matrix(rows).mmul(g.transpose()) // members × bins
  return { members: x.rows, bins: x.columns, values: Float64Array.from(x.to1DArray()) }
}

describe('Hessian linear-propagation identity', () => {
  const gcg = g.mmul(cov).mmul(g.transpose()) // exact T = 1 covariance of the observables

  it.each([1, 1.645, 10])('T = %s: symmetric formula gives T√(gᵀCg) for every bin', (t) => {
    const band = computeBands(linearMembers(t, 'pairs'), { kind: 'hessian-pairs', prescription: 'hessian-symmetric' })
    for (let b = 0; b < g.rows; b++) expectClose(band.plus[b]!, t * Math.sqrt(gcg.get(b, b)), 1e-12)
  })

  it('asymmetric formula equals the symmetric one for a linear observable', () => {
    const m = linearMembers(2, 'pairs')
    const asym = computeBands(m, { kind: 'hessian-pairs', prescription: 'hessian-asymmetric' })
    for (let b = 0; b < g.rows; b++) {
      expectClose(asym.plus[b]!, 2 * Math.sqrt(gcg.get(b, b)), 1e-12)
      expectClose(asym.minus[b]!, 2 * Math.sqrt(gcg.get(b, b)), 1e-12)
    }
  })

  it('one-sided members p₀ + T√λ_k e_k give the same error', () => {
    const band = computeBands(linearMembers(3, 'one-sided'), { kind: 'hessian-one-sided', prescription: 'one-sided' })
    for (let b = 0; b < g.rows; b++) expectClose(band.plus[b]!, 3 * Math.sqrt(gcg.get(b, b)), 1e-12)
  })

  it('bin-to-bin covariance is T² G C Gᵀ and cos φ is gᵀCh/√(gᵀCg hᵀCh)', () => {
    const m = linearMembers(1.5, 'pairs')
    const c = binCovariance(m, { kind: 'hessian-pairs' })
    expectClose(c.values, Float64Array.from(gcg.mul(1.5 ** 2).to1DArray()), 1e-12)
    const column = (bin: number) => Array.from({ length: m.members }, (_, k) => m.values[k * m.bins + bin]!)
    const expected = gcg.get(0, 2) / Math.sqrt(gcg.get(0, 0) * gcg.get(2, 2))
    expectClose(observableCorrelation(column(0), column(2), { kind: 'hessian-pairs' }), expected, 1e-12)
    expect(Math.abs(expected)).toBeGreaterThan(0.05) // the check is not between two zeros
  })
})
