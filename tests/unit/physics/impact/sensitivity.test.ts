import { describe, expect, it } from 'vitest'
import { correlationMap, densityValues, predictionErrors, sensitivityMap } from '../../../../shared/physics/impact'
import type { ErrorSet } from '../../../../shared/physics/types'
import { memberValuesFromRows } from '../../../../shared/physics/uncertainty'
import { expectClose } from '../close'

// A Hessian toy with two eigenvectors whose u-quark density is linear in them:
// x·u(x) = f₀(x) + z₁ g₁(x) + z₂ g₂(x), f₀ = 1 − x, g₁ = 0.1x, g₂ = 0.1(1 − x); members f₀ ± g_k.
const X = [0.01, 0.2, 0.5, 0.8, 0.9]
const Q2 = [10, 100, 1000]
function toySet(): ErrorSet {
  const f0 = (x: number) => 1 - x
  const g = [(x: number) => 0.1 * x, (x: number) => 0.1 * (1 - x)]
  const grid = (f: (x: number) => number) => {
    const v = new Float64Array(Q2.length * X.length)
    for (let iq = 0; iq < Q2.length; iq++) X.forEach((x, ix) => { v[iq * X.length + ix] = f(x) })
    return v
  }
  const members = [grid(f0)]
  for (const gk of g) {
    members.push(grid(x => f0(x) + gk(x)))
    members.push(grid(x => f0(x) - gk(x)))
  }
  return {
    header: { name: 'toy', family: 'toy', version: '1', kind: 'hessian-pairs', confidenceLevelPercent: 68, alphasMzCentral: 0.118, order: 'LO', scheme: { type: 'fixed', nf: 3, massesGeV: { charm: 1.3, bottom: 4.5, top: 173 } }, target: { type: 'proton' }, provenance: 'test', memberCount: 5 },
    x: Float64Array.from(X),
    q2: Float64Array.from(Q2),
    flavours: [2],
    members
  }
}

describe('sensitivity maps', () => {
  // Check: for an observable linear in the eigenvector parameters, cos φ with the density is
  // Σ_k d_k^O d_k^f / (|d^O||d^f|) (J. Pumplin et al., hep-ph/0101032; P. M. Nadolsky et al.,
  // arXiv:0802.0007). O = x·u(0.2) + x·u(0.8): d^O = (0.1·0.2 + 0.1·0.8, 0.1·0.8 + 0.1·0.2) = (0.1, 0.1);
  // d^f(x) = (0.1x, 0.1(1 − x)), so cos φ(x) = (x + 1 − x)/(√2 √(x² + (1 − x)²)) = 1/√(2(x² + (1 − x)²)).
  // By hand: x = 0.5 → 1/√(2·0.5) = 1; x = 0.2 → 1/√(2·0.68) = 1/√1.36; x = 0.01 → 1/√(2·0.9802) = 1/√1.9604.
  it('equals the analytic cos φ of a linear observable on a Hessian toy', () => {
    const set = toySet()
    const observable = memberValuesFromRows(set.members.map(m => [m[1]! + m[3]!]))
    const densities = densityValues(set, 2, 100, [0.01, 0.2, 0.5, 0.8])
    const map = correlationMap(observable, densities, 'hessian-pairs')
    expect(map.bins).toBe(1)
    expect(map.points).toBe(4)
    expectClose(map.cosPhi, [1 / Math.sqrt(1.9604), 1 / Math.sqrt(1.36), 1, 1 / Math.sqrt(1.36)], 1e-12)
  })

  it('a density the set does not carry has no spread: NaN', () => {
    const set = toySet()
    const observable = memberValuesFromRows(set.members.map(m => [m[1]!]))
    expect(Number.isNaN(correlationMap(observable, densityValues(set, 21, 100, [0.2]), 'hessian-pairs').cosPhi[0])).toBe(true)
  })

  it('uses the sample correlation for replicas', () => {
    // Replicas 1..4 of a bin: 1, 2, 3, 4; densities at two x: 2, 4, 6, 8 (cos φ = 1) and 4, 3, 2, 1 (−1), by hand.
    const obs = memberValuesFromRows([[0], [1], [2], [3], [4]])
    const dens = memberValuesFromRows([[0, 0], [2, 4], [4, 3], [6, 2], [8, 1]])
    expectClose(correlationMap(obs, dens, 'replicas').cosPhi, [1, -1], 1e-14)
  })

  it('scales cos φ by ΔX/δD for the sensitivity (arXiv:1803.02777)', () => {
    const set = toySet()
    const observable = memberValuesFromRows(set.members.map(m => [m[1]! + m[3]!, m[2]!]))
    const map = correlationMap(observable, densityValues(set, 2, 100, [0.2, 0.5]), 'hessian-pairs')
    const dx = predictionErrors(observable, 'hessian-pairs')
    // ΔX of bin 0: ½√Σ(X⁺ − X⁻)² = √(0.1² + 0.1²) = 0.1√2; bin 1 (x·u(0.5)): √(0.05² + 0.05²) = 0.05√2.
    expectClose(dx, [0.1 * Math.SQRT2, 0.05 * Math.SQRT2], 1e-13)
    const s = sensitivityMap(map, dx, { values: [1.8, 0.5], stat: [0.3, 0.4], syst: [0.4, 0.3] })
    // δD = √(stat² + syst²) = 0.5 for both bins.
    expectClose(s, [map.cosPhi[0]! * 0.1 * Math.SQRT2 / 0.5, map.cosPhi[1]! * 0.1 * Math.SQRT2 / 0.5, map.cosPhi[2]! * 0.05 * Math.SQRT2 / 0.5, map.cosPhi[3]! * 0.05 * Math.SQRT2 / 0.5], 1e-13)
  })

  it('refuses densities of another set and points outside the grid', () => {
    const set = toySet()
    const observable = memberValuesFromRows([[1], [2], [3]])
    expect(() => correlationMap(observable, densityValues(set, 2, 100, [0.2]), 'hessian-pairs')).toThrow(/values for 3 members but the densities for 5/)
    expect(() => densityValues(set, 2, 100, [0.95])).toThrow(/point 0/)
  })
})
