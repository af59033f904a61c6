import { describe, expect, it } from 'vitest'
import { gaussLegendre, gaussLegendreOn, integrateGaussLegendre } from '../../../../shared/physics/quadrature'

// Exactness of the n-point Gauss–Legendre rule for degree ≤ 2n − 1 and its failure at 2n:
// Abramowitz & Stegun, "Handbook of Mathematical Functions", §25.4.29. Exact integrals of
// monomials: ∫_{−1}^{1} t^k dt = 2/(k + 1) for even k, 0 for odd k.

const exact = (k: number) => (k % 2 === 1 ? 0 : 2 / (k + 1))

describe('Gauss–Legendre quadrature', () => {
  it.each([1, 2, 3, 4, 5, 8, 12, 16, 24, 32])('the %i-point rule integrates t^k exactly for k ≤ 2n − 1', (n) => {
    for (let k = 0; k <= 2 * n - 1; k++) {
      expect(integrateGaussLegendre(t => t ** k, -1, 1, n)).toBeCloseTo(exact(k), 14)
    }
  })

  it.each([1, 2, 3, 5, 8])('the %i-point rule is not exact for t^(2n)', (n) => {
    expect(Math.abs(integrateGaussLegendre(t => t ** (2 * n), -1, 1, n) - exact(2 * n))).toBeGreaterThan(1e-6)
  })

  it.each([
    // A&S Table 25.4: n = 2 nodes ±0.577350269189626, weights 1; n = 3 nodes 0, ±0.774596669241483, weights 8/9, 5/9.
    [2, [-0.577350269189626, 0.577350269189626], [1, 1]],
    [3, [-0.774596669241483, 0, 0.774596669241483], [5 / 9, 8 / 9, 5 / 9]]
  ])('the %i-point nodes and weights match the published table', (n, nodes, weights) => {
    const r = gaussLegendre(n as number)
    ;(nodes as number[]).forEach((v, i) => expect(r.nodes[i]).toBeCloseTo(v, 14))
    ;(weights as number[]).forEach((v, i) => expect(r.weights[i]).toBeCloseTo(v, 14))
  })

  it('nodes are symmetric, increasing, and weights sum to 2 up to high order', () => {
    for (const n of [7, 50, 200]) {
      const r = gaussLegendre(n)
      let sum = 0
      for (let i = 0; i < n; i++) {
        sum += r.weights[i]!
        expect(r.nodes[i]! + r.nodes[n - 1 - i]!).toBe(0)
        if (i > 0) expect(r.nodes[i]!).toBeGreaterThan(r.nodes[i - 1]!)
      }
      expect(sum).toBeCloseTo(2, 13)
    }
  })

  it('maps onto [a, b]: ∫_0^π sin = 2 with 12 points to 1e-13', () => {
    expect(integrateGaussLegendre(Math.sin, 0, Math.PI, 12)).toBeCloseTo(2, 13)
    expect(gaussLegendreOn(4, 2, 5).weights.reduce((a, b) => a + b, 0)).toBeCloseTo(3, 14)
  })

  it.each([0, -1, 2.5, 1000])('refuses order %s', (n) => {
    expect(() => gaussLegendre(n)).toThrow(RangeError)
  })

  it('refuses an empty or reversed range', () => {
    expect(() => gaussLegendreOn(4, 1, 1)).toThrow('lower < upper')
  })
})
