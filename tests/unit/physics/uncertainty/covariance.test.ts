import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { computeBands } from '../../../../shared/physics/uncertainty/bands'
import { binCorrelation, binCovariance, correlationFromCovariance, gram, observableCorrelation } from '../../../../shared/physics/uncertainty/covariance'
import { memberValuesFromRows } from '../../../../shared/physics/uncertainty/matrix'
import { expectClose } from '../close'

// Same two-bin, two-pair matrix as hessian.test.ts: d = ½(X⁺ − X⁻) is bin 0 (1.5, −0.25), bin 1 (0.75, 0.5).
const pairs = memberValuesFromRows([[10, 4], [12, 4.5], [9, 3], [10.5, 5], [11, 4]])

// see shared/physics/README.md, "Covariance and correlation"
describe('bin-to-bin covariance', () => {
  it('Hessian pairs Σ_k ¼(X_ik⁺ − X_ik⁻)(X_jk⁺ − X_jk⁻), hand-worked', () => {
    // C₀₀ = 1.5² + 0.25² = 2.3125; C₁₁ = 0.75² + 0.5² = 0.8125; C₀₁ = 1.5·0.75 − 0.25·0.5 = 1
    const c = binCovariance(pairs, { kind: 'hessian-pairs' })
    expectClose(c.values, [2.3125, 1, 1, 0.8125], 1e-15)
    // diagonal = (symmetric ΔX)²
    const band = computeBands(pairs, { kind: 'hessian-pairs', prescription: 'hessian-symmetric' })
    expectClose([c.values[0]!, c.values[3]!], [band.plus[0]! ** 2, band.plus[1]! ** 2], 1e-14)
  })

  it('one-sided Σ_k (X_ik − X_i0)(X_jk − X_j0), hand-worked', () => {
    // shifts: member 1 (1, 2), member 2 (−1, 1) → C = [[2, 1], [1, 5]]
    const c = binCovariance(memberValuesFromRows([[0, 0], [1, 2], [-1, 1]]), { kind: 'hessian-one-sided' })
    expectClose(c.values, [2, 1, 1, 5])
  })

  it('replicas: sample covariance, hand-worked and against jstat', () => {
    // replicas (1, 2), (2, 1), (3, 6): means (2, 3), deviations (−1,−1), (0,−2), (1,3)
    // C₀₀ = 2/2 = 1, C₁₁ = 14/2 = 7, C₀₁ = 4/2 = 2
    const c = binCovariance(memberValuesFromRows([[0, 0], [1, 2], [2, 1], [3, 6]]), { kind: 'replicas' })
    expectClose(c.values, [1, 2, 2, 7], 1e-15)
    expectClose(c.values[1]!, jStat.covariance([1, 2, 3], [2, 1, 6]), 1e-15)
  })

  it('scales with the square of the CL factor and includes α_s as a rank-one term', () => {
    // one pair d = (1, 2) plus α_s members with ½(up − down) = (0.5, −0.5)
    const m = memberValuesFromRows([[0, 0], [1, 2], [-1, -2], [-0.5, 0.5], [0.5, -0.5]])
    const c = binCovariance(m, { kind: 'hessian-pairs', alphasMembers: [3, 4] })
    // [[1, 2], [2, 4]] + [[0.25, −0.25], [−0.25, 0.25]]
    expectClose(c.values, [1.25, 1.75, 1.75, 4.25])
    const c68 = binCovariance(m, { kind: 'hessian-pairs', clFrom: 90, alphasMembers: [3, 4] })
    const f = 1 / 1.644854 // 90% → 68%, printed quantile (from memory)
    expectClose(c68.values, [1.25 * f * f, 1.75 * f * f, 1.75 * f * f, 4.25 * f * f], 1e-6)
  })

  it('gram is Dᵀ D', () => {
    expectClose(gram(memberValuesFromRows([[1, 2], [3, 4]])).values, [10, 14, 14, 20])
  })
})

describe('correlations', () => {
  it('Hessian cos φ of the two bins (Pumplin et al. hep-ph/0101032), hand-worked', () => {
    // cos φ = Σ(X⁺−X⁻)(Y⁺−Y⁻)/(4ΔXΔY) = 1/√(2.3125·0.8125)
    const rho = binCorrelation(pairs, { kind: 'hessian-pairs' })
    expectClose(rho.values, [1, 1 / Math.sqrt(2.3125 * 0.8125), 1 / Math.sqrt(2.3125 * 0.8125), 1], 1e-14)
    const x = [10, 12, 9, 10.5, 11]
    const y = [4, 4.5, 3, 5, 4]
    // the formula written out: Σ (3·1.5 + (−0.5)·1) / (4 · ½√9.25 · ½√3.25)
    expectClose(observableCorrelation(x, y, { kind: 'hessian-pairs' }), (3 * 1.5 - 0.5 * 1) / (4 * 0.5 * Math.sqrt(9.25) * 0.5 * Math.sqrt(3.25)), 1e-14)
  })

  it('replicas: the Pearson coefficient, hand-worked and against jstat', () => {
    // from the covariance above: 2/√(1·7)
    const r = observableCorrelation([0, 1, 2, 3], [0, 2, 1, 6], { kind: 'replicas' })
    expectClose(r, 2 / Math.sqrt(7), 1e-14)
    expectClose(r, jStat.corrcoeff([1, 2, 3], [2, 1, 6]), 1e-14)
  })

  it.each([
    // fully correlated, anti-correlated and orthogonal one-sided shifts
    { x: [0, 1, 2], y: [0, 2, 4], expected: 1 },
    { x: [0, 1, 2], y: [5, 4, 3], expected: -1 },
    { x: [0, 1, 0], y: [0, 0, 1], expected: 0 }
  ])('one-sided cos φ of $x and $y = $expected', ({ x, y, expected }) => {
    expectClose(observableCorrelation(x, y, { kind: 'hessian-one-sided' }), expected, 0, 1e-15)
  })

  it('a bin without PDF dependence has undefined (NaN) correlations', () => {
    const rho = correlationFromCovariance({ size: 2, values: new Float64Array([1, 0, 0, 0]) })
    expect(rho.values[0]).toBe(1)
    expect(rho.values[1]).toBeNaN()
  })

  it('refuses observables from different sets', () => {
    expect(() => observableCorrelation([1, 2, 3], [1, 2], { kind: 'replicas' })).toThrow(/same set/)
  })
})
