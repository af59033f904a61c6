import { describe, expect, it } from 'vitest'
import { applyKFactors, checkKFactors, kFactorBands, kFactorErrors } from '../../../../shared/physics/impact'
import { binCorrelation, computeBands, memberValuesFromRows, type Prescription } from '../../../../shared/physics/uncertainty'
import type { SetKind } from '../../../../shared/physics/types'
import { expectClose } from '../close'

// Three bins; a Hessian set of 2 pairs and a replica set of 5 replicas (made-up numbers).
const hessian = memberValuesFromRows([[10, 20, 5], [11, 21, 5.5], [9, 18.5, 4.8], [10.5, 20, 5.2], [10, 19, 4.9]])
const replicas = memberValuesFromRows([[10, 20, 5], [9, 19, 5.1], [11, 22, 4.8], [10, 20, 5.3], [10.5, 19.5, 4.7], [9.5, 19.5, 5.1]])
const cases: Array<[SetKind, Prescription, typeof hessian]> = [
  ['hessian-pairs', 'hessian-symmetric', hessian],
  ['hessian-pairs', 'hessian-asymmetric', hessian],
  ['replicas', 'replica-sd', replicas],
  ['replicas', 'replica-68-interval', replicas]
]

describe('K-factors', () => {
  // Check (common practice): K = 1 in every bin is the identity, so every number is unchanged.
  it.each(cases)('K = 1 leaves every value and band of a %s set (%s) unchanged', (kind, prescription, m) => {
    const ones = { values: [1, 1, 1] }
    expect(Array.from(applyKFactors(m, ones).values)).toEqual(Array.from(m.values))
    const plain = computeBands(m, { kind, prescription, clFrom: 90 })
    const withK = kFactorBands(m, ones, { kind, prescription, clFrom: 90 })
    expect(Array.from(withK.pdf.central)).toEqual(Array.from(plain.central))
    expect(Array.from(withK.pdf.plus)).toEqual(Array.from(plain.plus))
    expect(Array.from(withK.pdf.minus)).toEqual(Array.from(plain.minus))
    expect(Array.from(withK.kFactorError)).toEqual([0, 0, 0])
  })

  // Check: every prescription is homogeneous of degree 1 in the members (a common factor K > 0
  // multiplies every deviation, every percentile and the mean), so a constant K scales the band
  // by K and leaves the relative band and the bin-to-bin correlation (a ratio of covariances,
  // K² over K²) unchanged — common practice.
  it.each(cases)('a constant K scales the band of a %s set (%s) and keeps the relative band and correlations', (kind, prescription, m) => {
    const k = 1.37
    const plain = computeBands(m, { kind, prescription })
    const withK = kFactorBands(m, { values: [k, k, k] }, { kind, prescription }).pdf
    expectClose(withK.central, plain.central.map(v => v * k), 1e-14)
    expectClose(withK.plus, plain.plus.map(v => v * k), 1e-13)
    expectClose(withK.minus, plain.minus.map(v => v * k), 1e-13)
    expectClose(withK.relPlus, plain.relPlus, 1e-13)
    expectClose(withK.relMinus, plain.relMinus, 1e-13)
    const scaled = applyKFactors(m, { values: [k, k, k] })
    expectClose(binCorrelation(scaled, { kind }).values, binCorrelation(m, { kind }).values, 1e-13, 1e-15)
  })

  it('reports the K-factor uncertainty apart and adds it in quadrature only on request', () => {
    const k = { values: [1.2, 1.5, 1], errors: [0.06, 0, 0.1] }
    const result = kFactorBands(hessian, k, { kind: 'hessian-pairs', prescription: 'hessian-symmetric' })
    // δX' = |X'| δK/K = |K X₀| δK/K = |X₀| δK, by hand: 10 × 0.06 = 0.6, 20 × 0 = 0, 5 × 0.1 = 0.5.
    expectClose(result.kFactorError, [0.6, 0, 0.5], 1e-14)
    expect(result.combined).toBeUndefined()
    const both = kFactorBands(hessian, k, { kind: 'hessian-pairs', prescription: 'hessian-symmetric' }, true)
    // Symmetric Hessian of bin 0 scaled by 1.2: ½√((11 − 9)² + (10.5 − 10)²)·1.2 = ½√4.25·1.2 (hep-ph/0101032),
    // then √(ΔX² + 0.6²).
    const delta0 = 0.5 * Math.sqrt(4.25) * 1.2
    expectClose(both.combined!.plus[0]!, Math.hypot(delta0, 0.6), 1e-14)
    expectClose(both.pdf.plus[0]!, delta0, 1e-14)
  })

  it('brings the K-factor error to the band\'s CL', () => {
    const k = { values: [1, 1, 1], errors: [0.1, 0.1, 0.1] }
    const at90 = kFactorBands(hessian, k, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', clTo: 90 }, true)
    // δX at 68% is 10 × 0.1 = 1 in bin 0; at 90% it is 1.6448536… × 1 (two-sided Gaussian quantile, PDG "Statistics" table).
    expectClose(at90.combined!.plus[0]!, Math.hypot(at90.pdf.plus[0]!, 1.6448536269514724), 1e-12)
  })

  it.each([
    [{ values: [1, 1] }, /2 K-factors but the study has 3 bins/],
    [{ values: [1, 0, 1] }, /K-factor of bin 2 must be a finite number > 0; got 0/],
    [{ values: [1, 1, Number.NaN] }, /K-factor of bin 3 must be a finite number > 0; got NaN/],
    [{ values: [1, 1, 1], errors: [0, -1, 0] }, /uncertainty of bin 2 must be a finite number ≥ 0; got -1/],
    [{ values: [1, 1, 1], errors: [0, 0] }, /2 K-factor uncertainties but the study has 3 bins/]
  ])('refuses bad K-factors with the bin named: %j', (k, message) => {
    expect(() => checkKFactors(k, 3)).toThrow(message)
    expect(() => applyKFactors(hessian, k)).toThrow(RangeError)
    expect(() => kFactorErrors([1, 2, 3], k)).toThrow(message)
  })
})
