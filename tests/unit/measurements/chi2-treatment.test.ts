// χ² of a stored measurement as the comparison computes it (engineMeasurement → the engine's
// chiSquare), checked against three points worked by hand. χ² = rᵀ C⁻¹ r, r = D − T.
import { describe, expect, it } from 'vitest'
import { engineMeasurement, measurementTreatment, type MeasurementData } from '#shared/measurements/csv'
import { chiSquare } from '#shared/physics/uncertainty'

const D = [10, 12, 9]
const T = [11, 11, 11] // r = D − T = (−1, 1, −2), rᵀr = 6
const RHO = [[1, 0.5, 0], [0.5, 1, 0], [0, 0, 1]]
const base: MeasurementData = { values: D, stat: [1, 1, 1], syst: [1, 1, 1], sources: [], correlation: RHO, correlationOf: 'syst' }
const chi2 = (d: MeasurementData) => chiSquare(engineMeasurement(d), T).chi2

describe('χ² of three points with a correlation matrix, by hand', () => {
  it('matrix on the systematic errors: 10/3', () => {
    // C = diag(stat²) + ρ ∘ (syst systᵀ) = [[2, 0.5, 0], [0.5, 2, 0], [0, 0, 2]].
    // Upper 2×2 block: det = 4 − 0.25 = 3.75, inverse = [[2, −0.5], [−0.5, 2]] / 3.75;
    // r₁₂ = (−1, 1): 2·1 + 2·1 − 2·0.5·(−1)·1 = 2 + 2 + 1 = 5, / 3.75 = 4/3.
    // Third point: (−2)² / 2 = 2. χ² = 4/3 + 2 = 10/3 = 3.3333…
    expect(chi2(base)).toBeCloseTo(10 / 3, 12)
  })
  it('the same matrix on the statistical errors (syst uncorrelated): the same C, 10/3', () => {
    expect(chi2({ ...base, correlationOf: 'stat' })).toBeCloseTo(10 / 3, 12)
  })
  it('the same matrix on the total errors: 4 (the mistake the upload form used to make)', () => {
    // σ² = 1 + 1 = 2: C = 2ρ = [[2, 1, 0], [1, 2, 0], [0, 0, 2]]. Block det = 3, inverse [[2, −1], [−1, 2]] / 3;
    // (−1, 1): 2 + 2 + 2 = 6, / 3 = 2. Third point: 4 / 2 = 2. χ² = 4.
    expect(chi2({ ...base, correlationOf: 'total' })).toBeCloseTo(4, 12)
  })
  it('no matrix, syst fully correlated between points: 5', () => {
    // C = I + J (J all ones); C⁻¹ = I − J/4 (Sherman–Morrison). χ² = rᵀr − (Σr)²/4 = 6 − 4/4 = 5.
    expect(chi2({ ...base, correlation: null, systCombination: 'fully-correlated' })).toBeCloseTo(5, 12)
  })
  it('no matrix, everything uncorrelated: 3', () => {
    // C = 2I: χ² = 6 / 2 = 3.
    expect(chi2({ ...base, correlation: null })).toBeCloseTo(3, 12)
  })
  it('one shift source b = (1, 0, 1) with stat only: 3', () => {
    // C = I + b bᵀ; C⁻¹ = I − b bᵀ / (1 + bᵀb) = I − b bᵀ / 3. bᵀr = −1 − 2 = −3. χ² = 6 − 9/3 = 3.
    expect(chi2({ ...base, syst: null, correlation: null, sources: [{ name: 'lumi', shifts: [1, 0, 1] }] })).toBeCloseTo(3, 12)
  })
  it('says in words how the errors combine', () => {
    expect(measurementTreatment(base)).toEqual(['The correlation matrix applies to the systematic errors.', 'Statistical errors are uncorrelated between points.'])
    expect(measurementTreatment({ ...base, correlation: null, systCombination: 'fully-correlated' })).toContain('Systematic errors are fully correlated between points.')
  })
})
