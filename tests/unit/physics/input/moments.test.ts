import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { complex } from '~/shared/physics/input/complex'
import { multiplyTerms, termMoment, termMomentComplex, termXf, type NumericTerm } from '~/shared/physics/input/moments'
import { gaussLegendre } from '~/shared/physics/quadrature'
import { expectClose } from '../close'

const term = (A: number, a: number, b: number, c: number[] = []): NumericTerm => ({ A, a, b, c: Float64Array.from(c) })

/** ∫₀¹ x^{N−2} F(x) dx by Gauss–Legendre in t = −ln x (independent of the Beta-function formula). */
function quadratureMoment(t: NumericTerm, n: number): number {
  const { nodes, weights } = gaussLegendre(40)
  let sum = 0
  const tMax = 80 / Math.max(0.05, t.a + n - 1)
  const edges = [0, 1e-4, 1e-3, 1e-2, 0.1, 0.5, 1, 2, 4, 8, 16, 32, 64, 128, 256, 512].filter(e => e < tMax).concat([tMax])
  for (let k = 0; k + 1 < edges.length; k++) {
    const lo = edges[k]!
    const hi = edges[k + 1]!
    for (let q = 0; q < nodes.length; q++) {
      const u = 0.5 * (lo + hi) + 0.5 * (hi - lo) * nodes[q]!
      const x = Math.exp(-u)
      sum += 0.5 * (hi - lo) * weights[q]! * Math.pow(x, n - 1) * termXf(t, x)
    }
  }
  return sum
}

describe('exact Mellin moments of A x^a (1−x)^b (1 + Σ c_k x^{k/2})', () => {
  const cases: [string, NumericTerm, number][] = [
    ['u_v of the toy input, N = 1', term(5.1072, 0.8, 3), 1],
    ['gluon-like, N = 2', term(1.7, -0.1, 5), 2],
    ['with √x and x terms, N = 1', term(2.3, 0.6, 3.5, [-1.2, 3.1]), 1],
    ['with √x and x terms, N = 2', term(2.3, 0.6, 3.5, [-1.2, 3.1]), 2],
    ['sea-like with x^{3/2}, N = 2', term(0.2, -0.18, 7.3, [0, 1.5, -0.4]), 2],
    ['complex-plane use, N = 3.7', term(1, 0.3, 2, [0.5]), 3.7]
  ]

  // jstat's Beta carries ~6e-9 relative error (its log-gamma); terms of opposite sign can
  // amplify that tenfold in the sum, hence 1e-7 here; the quadrature check below is at 1e-10.
  it.each(cases)('%s: A Σ c_k B(a + k/2 + N − 1, b + 1) with jstat.betafn', (_label, t, n) => {
    let expected = 0
    ;[1, ...t.c].forEach((ck, k) => { if (ck !== 0) expected += ck * jStat.betafn(t.a + k / 2 + n - 1, t.b + 1) })
    expectClose(termMoment(t, n), t.A * expected, 1e-7)
  })

  it.each(cases)('%s: agrees with direct quadrature of ∫ x^{N−2} (x f) dx', (_label, t, n) => {
    expectClose(termMoment(t, n), quadratureMoment(t, n), 1e-10)
  })

  it.each([
    // hep-ph/0204316 toy input (section on PDF evolution, printed to seven digits): the
    // normalisations are those of the valence number sum rules ∫u_v = 2, ∫d_v = 1.
    ['∫ u_v dx = 2 from 5.107200 x^0.8 (1−x)^3', term(5.1072, 0.8, 3), 2],
    ['∫ d_v dx = 1 from 3.064320 x^0.8 (1−x)^4', term(3.06432, 0.8, 4), 1]
  ])('%s (hep-ph/0204316 toy input)', (_label, t, expected) => {
    expectClose(termMoment(t, 1), expected, 1e-6)
  })

  it('the complex moment on the real axis is the real moment', () => {
    const t = term(2.3, 0.6, 3.5, [-1.2, 3.1])
    const m = termMomentComplex(t, complex(2, 0))
    expectClose(m.re, termMoment(t, 2), 1e-13)
    expect(Math.abs(m.im)).toBeLessThan(1e-15)
  })

  it('products of terms are terms: multiplyTerms equals the pointwise product', () => {
    const f = term(1.3, 0.7, 3, [-0.5, 2])
    const r = term(-0.2, 0, 25, [0, 0, 1.1])
    const p = multiplyTerms([f, r])
    for (const x of [1e-5, 0.01, 0.2, 0.6, 0.95]) expectClose(termXf(p, x), termXf(f, x) * termXf(r, x), 1e-13)
    expect(p.a).toBe(0.7)
    expect(p.b).toBe(28)
  })

  it.each([
    ['a number integral of x^−0.1', () => termMoment(term(1, -0.1, 5), 1), /x → 0/],
    ['b ≤ −1', () => termMoment(term(1, 0.5, -1.2), 2), /x → 1/]
  ])('refuses %s', (_label, f, msg) => {
    expect(f).toThrow(RangeError)
    expect(f).toThrow(msg)
  })
})
