import { describe, expect, it } from 'vitest'
import { chiSquare, compareWithSet, experimentalCovariance } from '../../../../shared/physics/uncertainty/chi2'
import { memberValuesFromRows } from '../../../../shared/physics/uncertainty/matrix'
import { expectClose } from '../close'

// p-values: for ν = 2, P(χ² ≥ x) = e^{−x/2}; for ν = 1, P = 2(1 − Φ(√x)), e.g. x = 4 ↔ 2σ ↔ 4.55%
// (closed forms of the χ² distribution, PDG review "Statistics", from memory).
describe('χ² with the experimental covariance', () => {
  it.each([
    // diagonal: residuals (1, 2) over errors (1, 2) → 1 + 1 = 2; p = e^{−1}
    { m: { values: [1, 2], stat: [1, 2] }, t: [0, 0], chi2: 2, p: Math.exp(-1) },
    // diagonal, stat ⊕ syst: σ² = 3² + 4² = 25, residual 5 → 1 (ν = 1, p = 2(1 − Φ(1)) = 0.3173105)
    { m: { values: [5], stat: [3], syst: [4] }, t: [0], chi2: 1, p: 0.3173105 },
    // one point two sigma off: χ² = 4, p = 0.0455003
    { m: { values: [2], stat: [1] }, t: [0], chi2: 4, p: 0.0455003 },
    // 2×2 correlated: σ = (1, 2), ρ = ½, r = (1, 1):
    // χ² = (r₁²/σ₁² − 2ρ r₁r₂/(σ₁σ₂) + r₂²/σ₂²)/(1 − ρ²) = (1 − ½ + ¼)/(¾) = 1, p = e^{−½}
    {
      m: { values: [1, 1], covariance: { size: 2, values: new Float64Array([1, 1, 1, 4]) } },
      t: [0, 0], chi2: 1, p: Math.exp(-0.5)
    },
    // the same through syst with a correlation matrix
    {
      m: { values: [1, 1], syst: [1, 2], systCorrelation: { size: 2, values: new Float64Array([1, 0.5, 0.5, 1]) } },
      t: [0, 0], chi2: 1, p: Math.exp(-0.5)
    },
    // stat (1, 1) plus one fully correlated source (1, 1): C = [[2, 1], [1, 2]], C⁻¹ = ⅓[[2, −1], [−1, 2]],
    // r = (1, 1) → ⅓(2 − 1 − 1 + 2) = ⅔
    { m: { values: [1, 1], stat: [1, 1], correlatedSources: [[1, 1]] }, t: [0, 0], chi2: 2 / 3, p: Math.exp(-1 / 3) }
  ])('hand-worked χ² = $chi2', ({ m, t, chi2, p }) => {
    const result = chiSquare(m, t)
    expectClose(result.chi2, chi2, 1e-14)
    expect(result.points).toBe(t.length)
    expectClose(result.chi2PerPoint, chi2 / t.length, 1e-14)
    expectClose(result.pValue, p, 2e-6)
  })

  it('fitted parameters reduce the degrees of freedom', () => {
    // χ² = 2 with ν = 1: p = 2(1 − Φ(√2)) = 0.1572992
    const result = chiSquare({ values: [1, 2], stat: [1, 2] }, [0, 0], { fittedParameters: 1 })
    expect(result.degreesOfFreedom).toBe(1)
    expectClose(result.pValue, 0.1572992, 2e-6)
  })

  it('builds C = diag(stat²) + ρ syst systᵀ', () => {
    const c = experimentalCovariance({ values: [0, 0], stat: [1, 2], syst: [3, 4], systCorrelation: { size: 2, values: new Float64Array([1, -0.5, -0.5, 1]) } })
    // [[1 + 9, −0.5·12], [−6, 4 + 16]]
    expectClose(c.values, [10, -6, -6, 20])
  })
})

describe('χ² with the PDF covariance added', () => {
  // Measurement (1, 1) ± (1, 1) uncorrelated; one Hessian pair X± = ±(1, 1) about X₀ = 0 gives
  // C_pdf = d dᵀ with d = (1, 1); total [[2, 1], [1, 2]] → χ² = ⅔ (as above), without PDF 2.
  const measurement = { values: [1, 1], stat: [1, 1] }
  const set = memberValuesFromRows([[0, 0], [1, 1], [-1, -1]])

  it('hand-worked with and without', () => {
    const result = compareWithSet(measurement, set, { kind: 'hessian-pairs' })
    expectClose(result.experimental.chi2, 2, 1e-14)
    expectClose(result.withPdf.chi2, 2 / 3, 1e-14)
    expect(Array.from(result.prediction)).toEqual([0, 0])
  })

  it('a 90% CL set enters with its 68% covariance', () => {
    // C_pdf = f² d dᵀ, f = 1/1.644854: total [[1 + f², f²], [f², 1 + f²]], r = (1, 1):
    // χ² = 2/(1 + 2f²) (r is an eigenvector with eigenvalue 1 + 2f²)
    const f = 1 / 1.644854 // printed 90% quantile (from memory)
    const result = compareWithSet(measurement, set, { kind: 'hessian-pairs', clFrom: 90 })
    expectClose(result.withPdf.chi2, 2 / (1 + 2 * f * f), 1e-6)
  })

  it('replica sets are compared through their mean', () => {
    // replicas (0, 0), (2, 2): mean (1, 1) → residual 0
    const result = compareWithSet(measurement, memberValuesFromRows([[5, 5], [0, 0], [2, 2]]), { kind: 'replicas' })
    expect(Array.from(result.prediction)).toEqual([1, 1])
    expect(result.experimental.chi2).toBe(0)
    expect(result.withPdf.pValue).toBe(1)
  })
})

describe('bad input', () => {
  it.each([
    { m: { values: [1, 2], stat: [1] }, t: [0, 0], message: /statistical error \(stat\) has 1 entries but the measurement has 2/ },
    { m: { values: [1, 2], stat: [1, 1] }, t: [0], message: /prediction has 1 bins/ },
    { m: { values: [1, 2] }, t: [0, 0], message: /no errors/ },
    { m: { values: [1], stat: [-1] }, t: [0], message: /finite number ≥ 0/ },
    { m: { values: [1, 1], stat: [0, 0] }, t: [0, 0], message: /not positive definite/ },
    { m: { values: [1, 1], covariance: { size: 2, values: new Float64Array([1, 2, 2, 1]) } }, t: [0, 0], message: /not positive definite/ },
    { m: { values: [1, 1], covariance: { size: 2, values: new Float64Array([1, 0.5, 0.4, 1]) } }, t: [0, 0], message: /not symmetric/ },
    { m: { values: [1, 1], covariance: { size: 3, values: new Float64Array(9) } }, t: [0, 0], message: /3 × 3 but the measurement has 2/ },
    { m: { values: [1, 1], stat: [1, 1], covariance: { size: 2, values: new Float64Array([1, 0, 0, 1]) } }, t: [0, 0], message: /not both/ },
    { m: { values: [1, 1], syst: [1, 1], systCorrelation: { size: 2, values: new Float64Array([1, 1.5, 1.5, 1]) } }, t: [0, 0], message: /outside \[−1, 1\]/ },
    { m: { values: [1, 1], syst: [1, 1], systCorrelation: { size: 2, values: new Float64Array([2, 0, 0, 1]) } }, t: [0, 0], message: /1 on its diagonal/ }
  ])('$message', ({ m, t, message }) => {
    expect(() => chiSquare(m, t)).toThrow(RangeError)
    expect(() => chiSquare(m, t)).toThrow(message)
  })

  it('a PDF covariance of the wrong size', () => {
    expect(() => chiSquare({ values: [1], stat: [1] }, [0], { pdfCovariance: { size: 2, values: new Float64Array(4) } })).toThrow(/PDF covariance is 2 × 2/)
  })
})
