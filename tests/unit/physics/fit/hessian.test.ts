import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { hessianMembers } from '~/shared/physics/fit/hessian'
import { expectClose } from '../close'

// A correlated 5-parameter covariance (invented for the test).
const sigma = [0.02, 0.1, 0.3, 0.05, 0.7]
const rho = [
  [1, 0.6, -0.3, 0.1, 0],
  [0.6, 1, -0.5, 0.2, 0.1],
  [-0.3, -0.5, 1, 0, 0.4],
  [0.1, 0.2, 0, 1, -0.2],
  [0, 0.1, 0.4, -0.2, 1]
]
const cov = rho.map((r, i) => r.map((v, j) => v * sigma[i]! * sigma[j]!))
const p0 = [0.7, 3.4, -1, 2.5, 0.2]

// see shared/physics/README.md, "Members from a fit"
describe('Hessian eigenvector pairs p_k^± = p₀ ± T√λ_k e_k', () => {
  it.each([
    // For X linear in p, ½√(Σ_k (X_k⁺ − X_k⁻)²) = T√(gᵀCg) exactly (the Hessian
    // method of Pumplin et al., hep-ph/0101032).
    [1, [1, 0, 0, 0, 0]], [1, [0.3, -2, 0.5, 1, 0.1]], [1.6448536, [2, 1, -1, 0.5, -0.3]], [3, [0, 0, 0, 0, 1]]
  ])('reproduces T√(gᵀCg) for a linear observable (T = %f, g = %j)', (t, g) => {
    const { members } = hessianMembers(p0, cov, t)
    const x = (p: ArrayLike<number>) => g.reduce((s, gi, i) => s + gi * p[i]!, 0)
    let sum = 0
    for (let k = 0; k < members.length; k += 2) sum += (x(members[k]!) - x(members[k + 1]!)) ** 2
    let gcg = 0
    g.forEach((gi, i) => g.forEach((gj, j) => { gcg += gi * cov[i]![j]! * gj }))
    expectClose(0.5 * Math.sqrt(sum), t * Math.sqrt(gcg), 1e-12)
  })

  it('rebuilds the covariance: Σ_k (p_k⁺ − p_k⁻)(p_k⁺ − p_k⁻)ᵀ / (4T²) = C', () => {
    const t = 1.7
    const { members } = hessianMembers(p0, cov, t)
    for (let i = 0; i < 5; i++) {
      for (let j = 0; j < 5; j++) {
        let c = 0
        for (let k = 0; k < members.length; k += 2) c += (members[k]![i]! - members[k + 1]![i]!) * (members[k]![j]! - members[k + 1]![j]!)
        expectClose(c / (4 * t * t), cov[i]![j]!, 1e-10, 1e-16)
      }
    }
  })

  it('orders pairs by descending eigenvalue with a fixed eigenvector sign', () => {
    const h = hessianMembers(p0, cov, 1)
    for (let k = 1; k < h.eigenvalues.length; k++) expect(h.eigenvalues[k]!).toBeLessThanOrEqual(h.eigenvalues[k - 1]!)
    for (const e of h.eigenvectors) {
      const big = e.reduce((b, v, i) => (Math.abs(v) > Math.abs(e[b]!) ? i : b), 0)
      expect(e[big]!).toBeGreaterThan(0)
    }
    expect(h.members).toHaveLength(10)
  })

  it('gives 21 pairs for the 21-parameter demo fit Quillon-22', () => {
    const d = JSON.parse(readFileSync('samples/fits/quillon-22.json', 'utf8'))
    const h = hessianMembers(d.parameters.map((p: { value: number }) => p.value), d.covariance, d.members.tolerance)
    expect(h.members).toHaveLength(42)
  })

  it.each([
    ['T ≤ 0', () => hessianMembers(p0, cov, 0), /tolerance T/],
    ['a non-positive-definite covariance', () => hessianMembers([0, 0], [[1, 2], [2, 1]], 1), /not positive definite/],
    ['a size mismatch', () => hessianMembers([0, 0, 0], cov, 1), /5 rows but there are 3 parameters/]
  ])('refuses %s', (_label, f, message) => {
    expect(f).toThrow(RangeError)
    expect(f).toThrow(message)
  })
})
