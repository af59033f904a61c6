import { describe, expect, it } from 'vitest'
import {
  interpolateFlavours, interpolateMany, interpolateXf, interpolationStencil, interpolationWeights,
  lagrangeWeights, prepareAxes
} from '../../../../shared/physics/interpolation'
import { uniformStream } from '../../../../shared/physics/random'
import type { MemberGrid } from '../../../../shared/physics/types'

// Expected values come from the analytic functions sampled onto the grids here: a bicubic
// Lagrange interpolant reproduces cubic polynomials in (ln x, ln Q²) exactly (any numerical
// analysis text, e.g. Burden & Faires, "Numerical Analysis", §3.1), and approximates smooth
// functions with an error falling as h⁴. The accuracy bounds are the measured ones, with margin.

function logNodes(n: number, lo: number, hi: number): number[] {
  return Array.from({ length: n }, (_, i) => (i === 0 ? lo : i === n - 1 ? hi : Math.exp(Math.log(lo) + (Math.log(hi) - Math.log(lo)) * i / (n - 1))))
}

/** The x grid of the accuracy statement: 40 log-spaced nodes in [1e-5, 0.1), 20 linear in [0.1, 0.95]. */
function accuracyXNodes(): Float64Array {
  const xs = logNodes(41, 1e-5, 0.1).slice(0, 40)
  for (let i = 0; i < 20; i++) xs.push(0.1 + (0.95 - 0.1) * i / 19)
  return Float64Array.from(xs)
}

function sample(x: Float64Array, q2: Float64Array, fns: Array<(x: number, q2: number, iq: number) => number>): MemberGrid {
  const nf = fns.length
  const values = new Float64Array(x.length * q2.length * nf)
  for (let iq = 0; iq < q2.length; iq++) {
    for (let ix = 0; ix < x.length; ix++) {
      fns.forEach((f, s) => { values[(iq * x.length + ix) * nf + s] = f(x[ix]!, q2[iq]!, iq) })
    }
  }
  return { x, q2, flavours: fns.map((_, i) => [21, 2, -2][i]!), values }
}

const pseudoRandom = uniformStream(12345, { purpose: 'synthetic', index: 0 })

describe('Lagrange weights', () => {
  it('are the textbook cubic weights at the midpoint of equal spacing', () => {
    // Four-point midpoint weights −1/16, 9/16, 9/16, −1/16 (Abramowitz & Stegun, Table 25.1).
    const w = lagrangeWeights([0, 1, 2, 3], 0, 4, 1.5, new Float64Array(4))
    expect(Array.from(w)).toEqual([-1 / 16, 9 / 16, 9 / 16, -1 / 16])
  })

  it('reduce to δ at a node', () => {
    const w = lagrangeWeights([0.1, 0.4, 0.5, 0.9], 0, 4, 0.5, new Float64Array(4))
    expect(Array.from(w, v => Math.abs(v))).toEqual([0, 0, 1, 0])
  })
})

describe('bicubic interpolation in (ln x, ln Q²)', () => {
  const x = Float64Array.from(logNodes(30, 1e-5, 0.9))
  const q2 = Float64Array.from(logNodes(15, 2, 1e5))

  it('reproduces a cubic polynomial in ln x and ln Q² to rounding, also at the edges', () => {
    const cubic = (xx: number, qq: number) => {
      const u = Math.log(xx)
      const v = Math.log(qq)
      return 1 + 0.3 * u - 0.02 * u * u + 0.001 * u ** 3 + 0.5 * v - 0.01 * v ** 3 + 0.002 * u * v * v
    }
    const grid = sample(x, q2, [cubic])
    for (const [xx, qq] of [[1e-5, 2], [3e-5, 2.5], [0.01, 100], [0.5, 9e4], [0.9, 1e5], [2.2e-3, 47]] as Array<[number, number]>) {
      expect(interpolateXf(grid, 21, xx, qq)).toBeCloseTo(cubic(xx, qq), 12)
    }
  })

  it('meets the accuracy stated in the doc comment on a PDF-like function', () => {
    const xg = accuracyXNodes()
    const qg = Float64Array.from(logNodes(24, 2, 1e4))
    const f = (xx: number, qq: number) => xx ** -0.2 * (1 - xx) ** 3 * (1 + 0.3 * Math.log(qq))
    const grid = sample(xg, qg, [f])
    const worst = (xMax: number) => {
      let w = 0
      for (let k = 0; k < 3000; k++) {
        const xx = Math.exp(Math.log(1e-5) + (Math.log(xMax) - Math.log(1e-5)) * pseudoRandom())
        const qq = Math.exp(Math.log(2) + (Math.log(1e4) - Math.log(2)) * pseudoRandom())
        w = Math.max(w, Math.abs(interpolateXf(grid, 21, xx, qq) / f(xx, qq) - 1))
      }
      return w
    }
    // Measured (doc comment of interpolationStencil): 1.4e-5, 9e-5, 3.2e-4, 2e-3.
    expect(worst(0.1)).toBeLessThan(2e-5)
    expect(worst(0.5)).toBeLessThan(1.2e-4)
    expect(worst(0.8)).toBeLessThan(4e-4)
    expect(worst(0.9)).toBeLessThan(2.5e-3)
  })

  it('converges as h⁴: doubling the nodes divides the error by about 16', () => {
    const f = (xx: number) => Math.exp(0.4 * Math.log(xx)) * (1 + Math.sin(Math.log(xx)))
    const err = (n: number) => {
      const grid = sample(Float64Array.from(logNodes(n, 1e-4, 0.5)), Float64Array.of(10, 20, 40, 80), [(xx: number) => f(xx)])
      let w = 0
      for (let k = 1; k < 200; k++) {
        const xx = Math.exp(Math.log(1e-3) + (Math.log(0.1) - Math.log(1e-3)) * k / 200)
        w = Math.max(w, Math.abs(interpolateXf(grid, 21, xx, 30) - f(xx)))
      }
      return w
    }
    const ratio = err(20) / err(40)
    expect(ratio).toBeGreaterThan(10)
    expect(ratio).toBeLessThan(25)
  })
})

describe('heavy-flavour thresholds', () => {
  // Q² nodes with m_c² = 2.25 GeV² repeated: the charm density is 0 below and jumps above.
  const q2 = Float64Array.of(1, 1.5, 2.25, 2.25, 4, 8, 16, 32)
  const x = Float64Array.from(logNodes(10, 1e-3, 0.8))
  const charm = (xx: number, qq: number, iq: number) => (iq <= 2 ? 0 : 0.1 + Math.log(qq / 2.25) * (1 + 0.1 * Math.log(xx)))
  const light = (xx: number, qq: number) => xx * (1 + Math.log(qq))
  const grid = sample(x, q2, [light, charm])

  it('finds the sub-grids between repeated nodes', () => {
    expect(prepareAxes(grid).runs).toEqual([[0, 2], [3, 7]])
  })

  it('never mixes nodes across the threshold: below it the charm is exactly 0, above it the upper sub-grid is used', () => {
    expect(interpolateXf(grid, 2, 0.01, 2.0)).toBe(0)
    expect(interpolateXf(grid, 2, 0.01, 2.249999)).toBe(0)
    // Exactly at the threshold the point belongs to the sub-grid above.
    expect(interpolateXf(grid, 2, 0.01, 2.25)).toBeCloseTo(0.1, 12)
    // Above: the charm function is a polynomial of low degree in (ln x, ln Q²), reproduced exactly.
    expect(interpolateXf(grid, 2, 0.05, 3)).toBeCloseTo(0.1 + Math.log(3 / 2.25) * (1 + 0.1 * Math.log(0.05)), 12)
    const s = interpolationStencil(prepareAxes(grid), 0.05, 2.0)
    expect(s.q2Start).toBe(0)
    expect(s.q2Count).toBe(3)
  })

  it('a sub-grid of fewer than 4 nodes interpolates at lower order within itself', () => {
    // light(x, Q²) is linear in ln Q²: the 3-node lower sub-grid reproduces it.
    expect(interpolateXf(grid, 21, 0.02, 1.8)).toBeCloseTo(light(0.02, 1.8), 3)
  })
})

describe('outside the grid', () => {
  const x = Float64Array.from(logNodes(8, 1e-3, 0.7))
  const q2 = Float64Array.from(logNodes(6, 2, 200))
  const grid = sample(x, q2, [(xx, qq) => xx * qq])

  it.each([
    ['x below the grid', 1e-4, 10, 'x = 0.0001'],
    ['x above the grid', 0.8, 10, 'x = 0.8'],
    ['Q² below the grid', 0.01, 1, 'Q² = 1'],
    ['Q² above the grid', 0.01, 300, 'Q² = 300'],
    ['x ≥ 1', 1, 10, 'outside the grid']
  ])('%s: RangeError by default', (_n, xx, qq, text) => {
    expect(() => interpolateXf(grid, 21, xx, qq)).toThrow(RangeError)
    expect(() => interpolateXf(grid, 21, xx, qq)).toThrow(text)
  })

  it('freezes at the edge when asked and reports which points were outside', () => {
    const r = interpolateMany(grid, 21, [1e-4, 0.01, 0.9, 0.01], [10, 10, 10, 1000], { outside: 'freeze' })
    expect(r.outsideIndices).toEqual([0, 2, 3])
    expect(r.values[0]).toBeCloseTo(interpolateXf(grid, 21, 1e-3, 10), 14)
    expect(r.values[3]).toBeCloseTo(interpolateXf(grid, 21, 0.01, 200), 14)
  })

  it('names the point in a batch that is outside', () => {
    expect(() => interpolateMany(grid, 21, [0.01, 2e-4], [10, 10])).toThrow('point 1')
  })

  it('accepts points a few ulps beyond an edge (quadrature rounding) as on the edge', () => {
    expect(interpolateXf(grid, 21, 0.7 * (1 + 1e-15), 10)).toBe(interpolateXf(grid, 21, 0.7, 10))
  })
})

describe('interpolation weights for plans', () => {
  const x = Float64Array.from(logNodes(12, 1e-4, 0.8))
  const q2 = Float64Array.from(logNodes(9, 2, 1e4))
  const grid = sample(x, q2, [(xx, qq) => Math.sqrt(xx) * Math.log(qq), (xx, qq) => xx * (1 - xx) * qq ** 0.1, (xx, qq) => (1 - xx) ** 3 * Math.log(qq)])

  it('give at most 16 (node, weight) pairs summing to 1 that reproduce the interpolated values', () => {
    for (const [xx, qq] of [[3e-4, 2.5], [0.01, 100], [0.79, 9e3]] as Array<[number, number]>) {
      const w = interpolationWeights(grid, xx, qq)
      expect(w.nodes.length).toBeLessThanOrEqual(16)
      expect(w.weights.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 13)
      const all = interpolateFlavours(grid, xx, qq)
      for (let slot = 0; slot < 3; slot++) {
        let sum = 0
        w.nodes.forEach((n, k) => { sum += w.weights[k]! * grid.values[n * 3 + slot]! })
        expect(sum).toBeCloseTo(all[slot]!, 14)
        expect(sum).toBeCloseTo(interpolateXf(grid, grid.flavours[slot]!, xx, qq), 14)
      }
    }
  })

  it('a flavour the grid does not carry is zero', () => {
    expect(interpolateXf(grid, 5, 0.01, 100)).toBe(0)
  })

  it('refuses a member whose length does not match the grid', () => {
    expect(() => interpolateXf({ ...grid, values: new Float64Array(5) }, 21, 0.01, 10)).toThrow('the grid needs')
  })
})
