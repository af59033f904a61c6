import { describe, expect, it } from 'vitest'
import { gammaGG, gammaGQ, gammaQG, gammaQQ } from '~/shared/physics/evolution/anomalous-dimensions'
import { convolutionMatrices } from '~/shared/physics/evolution/convolution'
import { gaussLegendre } from '~/shared/physics/quadrature'
import { CA, CF, TR, pggDelta } from '~/shared/physics/evolution/splitting'
import { xNodes } from '~/shared/physics/evolution/x-grid'
import { complex } from '~/shared/physics/input/complex'
import { expectClose } from '../close'

// SU(3) colour factors with N_c = 3: C_F = (N_c² − 1)/(2N_c) = 4/3, C_A = N_c = 3, T_R = 1/2
// (SU(N) group theory, e.g. Ellis–Stirling–Webber, "QCD and Collider Physics", ch. 1 — chapter
// from memory). The reference integrals below use these literal values, not the engine's.
const cf = 4 / 3
const ca = 3
const tr = 1 / 2

describe('colour factors and the δ(1 − z) coefficient of P_gg', () => {
  it('C_F = 4/3, C_A = 3, T_R = 1/2', () => {
    expect([CF, CA, TR]).toEqual([cf, ca, tr])
  })

  it.each([[3, 27 / 6], [4, 25 / 6], [5, 23 / 6], [6, 21 / 6]])('(11 C_A − 4 n_f T_R)/6 = β₀/2 with n_f = %i: %f (hand-worked: (33 − 2n_f)/6)', (nf, expected) => {
    expectClose(pggDelta(nf), expected, 1e-15)
  })
})

describe('LO anomalous dimensions γ(N) = ∫ z^{N−1} P(z) dz (Ellis–Stirling–Webber ch. 4)', () => {
  it('conserve quark number: γ_qq(1) = 0', () => {
    expect(Math.abs(gammaQQ(complex(1)).re)).toBeLessThan(1e-14)
  })

  it.each([3, 4, 5, 6])('conserve momentum at N = 2 with n_f = %i: γ_qq + γ_gq = 0 and 2n_f γ_qg + γ_gg = 0', (nf) => {
    const n = complex(2)
    expect(Math.abs(gammaQQ(n).re + gammaGQ(n).re)).toBeLessThan(1e-14)
    expect(Math.abs(2 * nf * gammaQG(n).re + gammaGG(n, nf).re)).toBeLessThan(1e-14)
  })

  it.each([
    // Hand-worked from the formulas: γ_qq(2) = C_F(3/2 + 1/6 − 3) = −16/9; γ_gq(2) = C_F·8/6 = 16/9;
    // γ_qg(2) = T_R·8/24 = 1/6; γ_gg(2) = 2C_A(1/2 + 1/12 − 3/2) + (33 − 2n_f)/6 = −n_f/3.
    ['γ_qq(2)', gammaQQ(complex(2)).re, -16 / 9],
    ['γ_gq(2)', gammaGQ(complex(2)).re, 16 / 9],
    ['γ_qg(2)', gammaQG(complex(2)).re, 1 / 6],
    ['γ_gg(2), n_f = 4', gammaGG(complex(2), 4).re, -4 / 3]
  ])('%s = %f', (_label, value, expected) => {
    expectClose(value, expected, 1e-14)
  })

  it('agree with a direct numerical Mellin transform of the splitting functions at complex N', () => {
    const n = complex(2.7, 1.3)
    const { nodes, weights } = gaussLegendre(80)
    // ∫₀¹ z^{N−1} g(z) dz on [0,1] by Gauss–Legendre in z = u² (smooths z^{N−1} at 0)
    const mellin = (g: (z: number) => number, sub = 0) => {
      let re = 0
      let im = 0
      for (let q = 0; q < nodes.length; q++) {
        const u = 0.5 * (1 + nodes[q]!)
        const z = u * u
        const w = 0.5 * weights[q]! * 2 * u
        const mod = Math.pow(z, n.re - 1)
        const ph = n.im * Math.log(z)
        const val = g(z)
        re += w * (mod * Math.cos(ph) * val - sub * val)
        im += w * mod * Math.sin(ph) * val
      }
      return { re, im }
    }
    const gq = mellin(z => cf * (1 + (1 - z) ** 2) / z)
    const qg = mellin(z => tr * (z * z + (1 - z) ** 2))
    const a = gammaGQ(n)
    const b = gammaQG(n)
    expectClose(gq.re, a.re, 1e-9, 1e-12)
    expectClose(gq.im, a.im, 1e-9, 1e-12)
    expectClose(qg.re, b.re, 1e-9, 1e-12)
    expectClose(qg.im, b.im, 1e-9, 1e-12)
  })
})

describe('x-space convolution matrices (plus distributions exact)', () => {
  const x = xNodes({ count: 150, min: 1e-6, max: 0.99 })
  const m = convolutionMatrices(x, 7)
  const n = x.length
  const S = (y: number) => 5.1072 * y ** 0.8 * (1 - y) ** 3
  const G = (y: number) => 1.7 * y ** -0.1 * (1 - y) ** 5
  const gl = gaussLegendre(64)
  // ∫_x^1 f(z) dz by Gauss–Legendre in t = −ln z on 300 equal panels (independent reference).
  const integ = (f: (z: number) => number, a: number) => {
    const tMax = -Math.log(a)
    let s = 0
    for (let k = 0; k < 300; k++) {
      const lo = (tMax * k) / 300
      const hi = (tMax * (k + 1)) / 300
      for (let q = 0; q < 64; q++) {
        const z = Math.exp(-(0.5 * (lo + hi) + 0.5 * (hi - lo) * gl.nodes[q]!))
        s += 0.5 * (hi - lo) * gl.weights[q]! * z * f(z)
      }
    }
    return s
  }
  const apply = (mat: Float64Array, f: (y: number) => number, i: number) => {
    let s = 0
    for (let k = 0; k < n; k++) s += mat[i * n + k]! * f(x[k]!)
    return s
  }

  it.each([10, 60, 100, 125, 140])('reproduce ∫_x^1 dz P(z) F(x/z) at node %i to 1e-7', (i) => {
    const xi = x[i]!
    const qq = integ(z => cf * ((1 + z * z) * S(xi / z) - 2 * S(xi)) / (1 - z), xi) + cf * (2 * Math.log1p(-xi) + 1.5) * S(xi)
    const gq = integ(z => cf * (1 + (1 - z) ** 2) / z * S(xi / z), xi)
    const qg = integ(z => tr * (z * z + (1 - z) ** 2) * G(xi / z), xi)
    const gg = integ(z => 2 * ca * ((z * G(xi / z) - G(xi)) / (1 - z) + ((1 - z) / z + z * (1 - z)) * G(xi / z)), xi) + 2 * ca * Math.log1p(-xi) * G(xi)
    expectClose(apply(m.qq, S, i), qq, 1e-7)
    expectClose(apply(m.gq, S, i), gq, 1e-7)
    expectClose(apply(m.qg, G, i), qg, 1e-7)
    expectClose(apply(m.gg, G, i), gg, 1e-7)
  })

  it('are cached per grid and degree', () => {
    expect(convolutionMatrices(x, 7)).toBe(m)
    expect(convolutionMatrices(x, 5)).not.toBe(m)
  })
})
