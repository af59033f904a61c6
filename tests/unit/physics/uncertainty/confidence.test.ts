import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { clScaleFactor, sigmaMultiple } from '../../../../shared/physics/uncertainty/confidence'
import { expectClose } from '../close'

describe('two-sided Gaussian quantiles', () => {
  // Printed values: the PDG review "Statistics" table of the area of the tails outside ±δ of a
  // Gaussian (1.645σ ↔ 10%, 1.960σ ↔ 5%, 2.576σ ↔ 1%, 3.29σ ↔ 0.1%) — table and its digits from
  // memory; the 7-digit values are from memory of standard normal tables.
  it.each([
    { cl: 90, z: 1.644854 },
    { cl: 95, z: 1.959964 },
    { cl: 99, z: 2.575829 },
    { cl: 99.9, z: 3.290527 },
    // 68.26895% = erf(1/√2), the one-sigma level (same table: 1σ ↔ 31.73% outside)
    { cl: 68.26894921370859, z: 1 }
  ])('CL $cl% → z = $z (printed table)', ({ cl, z }) => {
    expectClose(sigmaMultiple(cl), z, 0, 6e-7)
  })

  it.each([50, 80, 90, 95, 99, 99.73])('CL %s%: agrees with jstat.normal.inv and inverts jstat.normal.cdf', (cl) => {
    const z = sigmaMultiple(cl)
    expectClose(z, jStat.normal.inv(0.5 + cl / 200, 0, 1), 1e-15)
    // P(|Z| ≤ z) = 2Φ(z) − 1 through the error function, an independent route
    expectClose(2 * jStat.normal.cdf(z, 0, 1) - 1, cl / 100, 1e-13)
  })

  it('reads "68" as one standard deviation (common practice)', () => {
    expect(sigmaMultiple(68)).toBe(1)
  })

  it.each([0, 100, -5, 120, Number.NaN])('rejects CL %s', (cl) => {
    expect(() => sigmaMultiple(cl)).toThrow(RangeError)
  })
})

describe('CL rescaling', () => {
  // see shared/physics/README.md, "Confidence levels"
  it('90% → 68% is 1/1.64485', () => {
    expectClose(clScaleFactor(90, 68), 1 / 1.644854, 0, 3e-7)
  })

  it.each([
    [90, 68], [68, 90], [95, 90], [68, 99], [90, 95]
  ])('round trip %s% → %s% → back is exact to rounding', (a, b) => {
    expectClose(clScaleFactor(a, b) * clScaleFactor(b, a), 1, 1e-15)
    expect(clScaleFactor(a, a)).toBe(1)
  })

  it('composes: 90 → 95 equals 90 → 68 → 95', () => {
    expectClose(clScaleFactor(90, 95), clScaleFactor(90, 68) * clScaleFactor(68, 95), 1e-15)
  })
})
