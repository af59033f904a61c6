import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { complex } from '~/shared/physics/input/complex'
import {
  EULER_GAMMA, beta, betaComplex, digammaComplex, harmonicS1, lnBeta, lnGamma, lnGammaComplex
} from '~/shared/physics/input/special-functions'
import { expectClose } from '../close'

describe('ln Γ for real arguments', () => {
  it.each([
    // Γ(n) = (n − 1)! (DLMF 5.4.1); Γ(1/2) = √π, Γ(3/2) = √π/2 (DLMF 5.4.6 with 5.5.1)
    [1, 0], [2, 0], [5, Math.log(24)], [11, Math.log(3628800)], [21, Math.log(2432902008176640000)],
    [0.5, 0.5 * Math.log(Math.PI)], [1.5, Math.log(Math.sqrt(Math.PI) / 2)]
  ])('ln Γ(%f) = %f', (x, expected) => {
    expectClose(lnGamma(x), expected, 1e-14, 3e-15)
  })

  it.each([0.05, 0.3, 0.8, 1.7, 3.2, 7.5, 19.9, 55.5, 170.3])('agrees with jstat.gammaln at x = %f (jstat uses the Numerical Recipes 6-term Lanczos form, good to a few 1e-9)', (x) => {
    expectClose(lnGamma(x), jStat.gammaln(x), 1e-8, 1e-8)
  })

  it('refuses x ≤ 0', () => {
    expect(() => lnGamma(0)).toThrow(RangeError)
    expect(() => lnGamma(-1.5)).toThrow(/x > 0/)
  })
})

describe('Euler Beta function B(p, q) (the moments of parametrised terms)', () => {
  const pairs = [[0.8, 4], [1.8, 4], [0.9, 6], [0.5, 0.5], [2.3, 7.1], [0.05, 12], [10, 10], [40, 3.5]]
  // jstat's Beta goes through its Numerical Recipes log-gamma, whose error reaches ~6e-9 for
  // arguments below 1 (B(½, ½) comes out as 3.14159267); 2e-8 is the bound of that comparison.
  it.each(pairs)('B(%f, %f) agrees with jstat.betafn and ln B with jstat.betaln', (p, q) => {
    expectClose(beta(p, q), jStat.betafn(p, q), 2e-8)
    expectClose(lnBeta(p, q), jStat.betaln(p, q), 2e-8, 2e-8)
  })

  it.each([
    // B(p, q) = Γ(p)Γ(q)/Γ(p+q): B(2, 3) = 1·2/24 = 1/12; B(½, ½) = π (DLMF 5.12.1)
    [2, 3, 1 / 12], [0.5, 0.5, Math.PI], [1, 7, 1 / 7]
  ])('B(%f, %f) = %f exactly', (p, q, expected) => {
    expectClose(beta(p, q), expected, 1e-14)
  })

  it('refuses a divergent Beta integral', () => {
    expect(() => beta(-0.1, 3)).toThrow(/p > 0 and q > 0/)
  })
})

describe('ln Γ and ψ for complex arguments (Mellin contours)', () => {
  it.each([0.3, 1, 2.5, 10, 60])('|Γ(iy)|² = π/(y sinh πy) at y = %f (DLMF 5.4.3)', (y) => {
    const l = lnGammaComplex(complex(0, y))
    expectClose(2 * l.re, Math.log(Math.PI / (y * Math.sinh(Math.PI * y))), 1e-12, 1e-12)
  })

  it.each([0.4, 3, 25, 150])('|Γ(½ + iy)|² = π/cosh πy at y = %f (DLMF 5.4.4)', (y) => {
    const l = lnGammaComplex(complex(0.5, y))
    // ln(π/cosh πy) without overflow: ln π − πy − ln((1 + e^{−2πy})/2)
    const expected = Math.log(Math.PI) - Math.PI * y - Math.log((1 + Math.exp(-2 * Math.PI * y)) / 2)
    expectClose(2 * l.re, expected, 1e-12, 1e-11)
  })

  it.each([[2.5, 0], [0.3, 0], [7, 0]])('matches the real ln Γ on the real axis at %f', (x) => {
    const l = lnGammaComplex(complex(x, 0))
    expectClose(l.re, lnGamma(x), 1e-13, 1e-14)
    expect(Math.abs(l.im)).toBeLessThan(1e-14)
  })

  it.each([
    [complex(-30.2, 40.1)], [complex(-300, 300)], [complex(0.2, -5)], [complex(4, 2)]
  ])('satisfies Γ(z+1) = z Γ(z) at %o, also left of Re z = ½ (DLMF 5.5.1)', (z) => {
    const a = lnGammaComplex(complex(z.re + 1, z.im))
    const b = lnGammaComplex(z)
    const lnz = { re: Math.log(Math.hypot(z.re, z.im)), im: Math.atan2(z.im, z.re) }
    expectClose(a.re, b.re + lnz.re, 1e-12, 1e-10)
    const dIm = a.im - b.im - lnz.im
    expect(Math.abs(dIm - 2 * Math.PI * Math.round(dIm / (2 * Math.PI)))).toBeLessThan(1e-9)
  })

  it.each([
    // ψ(1) = −γ_E (DLMF 5.4.12), ψ(½) = −γ_E − 2 ln 2 (DLMF 5.4.13)
    [1, -EULER_GAMMA], [0.5, -EULER_GAMMA - 2 * Math.LN2]
  ])('ψ(%f) = %f', (x, expected) => {
    const v = digammaComplex(complex(x, 0))
    expectClose(v.re, expected, 1e-14, 1e-15)
  })

  it.each([0.2, 1, 4, 30, 200])('Im ψ(iy) = 1/(2y) + (π/2) coth(πy) and Im ψ(½ + iy) = (π/2) tanh(πy) at y = %f (DLMF 5.4.17–18)', (y) => {
    expectClose(digammaComplex(complex(0, y)).im, 1 / (2 * y) + (Math.PI / 2) / Math.tanh(Math.PI * y), 1e-13)
    expectClose(digammaComplex(complex(0.5, y)).im, (Math.PI / 2) * Math.tanh(Math.PI * y), 1e-13)
  })

  it.each([[complex(-40.5, 35)], [complex(2, -3)], [complex(-0.7, 0.01)]])('satisfies ψ(z+1) = ψ(z) + 1/z at %o (DLMF 5.5.2)', (z) => {
    const a = digammaComplex(complex(z.re + 1, z.im))
    const b = digammaComplex(z)
    const d = z.re * z.re + z.im * z.im
    expectClose(a.re, b.re + z.re / d, 1e-12, 1e-12)
    expectClose(a.im, b.im - z.im / d, 1e-12, 1e-12)
  })

  it.each([1, 2, 3, 10, 25])('S₁(%i) is the harmonic number Σ 1/k', (n) => {
    let h = 0
    for (let k = 1; k <= n; k++) h += 1 / k
    expectClose(harmonicS1(complex(n)).re, h, 1e-14)
  })

  it('complex Beta reduces to the real one on the real axis', () => {
    const b = betaComplex(complex(1.7), complex(5))
    expectClose(b.re, beta(1.7, 5), 1e-13)
    expect(Math.abs(b.im)).toBeLessThan(1e-16)
  })

  it('refuses the poles of Γ', () => {
    expect(() => lnGammaComplex(complex(-2, 0))).toThrow(/pole/)
    expect(() => digammaComplex(complex(0, 0))).toThrow(RangeError)
  })
})
