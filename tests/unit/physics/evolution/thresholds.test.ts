import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { evolveModel, planForModel } from '~/shared/physics/evolution/build-set'
import { evolveMellin } from '~/shared/physics/evolution/mellin'
import { bindParameters } from '~/shared/physics/input/bind'
import { thresholdPairs } from '~/shared/physics/evolution/q2-grid'
import { createEvolutionPlan, evolveMember } from '~/shared/physics/evolution/xspace'
import { slotOf } from '~/shared/physics/input/flavours'
import { compileInput } from '~/shared/physics/input/model'
import { parseInputText } from '~/shared/physics/input/parse'
import type { MemberGrid } from '~/shared/physics/types'

const load = (f: string) => parseInputText(readFileSync(`samples/fits/${f}`, 'utf8'), f)
const quillon = compileInput(load('quillon-22.json'))
const toy = compileInput(load('benchmark-toy-input.json'))
const at = (g: MemberGrid, iq: number, ix: number, pdg: number) => g.values[(iq * g.x.length + ix) * g.flavours.length + g.flavours.indexOf(pdg)]!

// LO matching, common practice; see shared/physics/README.md, "Flavour basis and thresholds"
describe('heavy quarks in the variable-flavour scheme (start at zero at μ² = m_h²)', () => {
  const plan = planForModel(quillon, { x: { count: 60, min: 1e-5, max: 0.95 }, q2: { count: 30, maxGeV2: 1e6 } })
  const grid = evolveModel(quillon, plan)
  const pairs = thresholdPairs(grid.q2)

  it('has the charm (1.96), bottom (22.5625) and top (29756.25) thresholds as below/above node pairs', () => {
    expect(pairs.map(p => p.q2GeV2)).toEqual([1.4 ** 2, 4.75 ** 2, 172.5 ** 2])
    expect(grid.flavours).toEqual([-6, -5, -4, -3, -2, -1, 1, 2, 3, 4, 5, 6, 21])
  })

  it.each([[4, 0], [5, 1], [6, 2]])('quark %i and its antiquark are exactly zero up to and at its threshold, positive just above', (pdg, pair) => {
    const { index } = pairs[pair]!
    for (let iq = 0; iq <= index + 1; iq++) {
      for (let ix = 0; ix < grid.x.length; ix++) {
        expect(at(grid, iq, ix, pdg)).toBe(0)
        expect(at(grid, iq, ix, -pdg)).toBe(0)
      }
    }
    for (let ix = 0; ix < grid.x.length - 1; ix++) expect(at(grid, index + 2, ix, pdg)).toBeGreaterThan(0)
  })

  it('is continuous across each threshold at LO: below and above values coincide for every flavour (to rounding)', () => {
    for (const { index } of pairs) {
      for (let k = 0; k < grid.x.length * 13; k++) {
        const below = grid.values[index * grid.x.length * 13 + k]!
        const above = grid.values[(index + 1) * grid.x.length * 13 + k]!
        expect(Math.abs(above - below)).toBeLessThanOrEqual(1e-12 * Math.abs(below) + 1e-16)
      }
    }
  })

  it('keeps the b quark at zero everywhere with fixed n_f = 4, while charm evolves from zero', () => {
    const fixed = createEvolutionPlan({ startScaleGeV2: 2, alphas: quillon.alphas, scheme: { ...quillon.scheme, type: 'fixed', nf: 4 }, x: { count: 40, min: 1e-4, max: 0.9 }, q2: { count: 8, maxGeV2: 1e6 } })
    const x0 = new Float64Array(40 * 13)
    for (let ix = 0; ix < 40; ix++) { x0[ix * 13 + slotOf(21)] = 1; x0[ix * 13 + slotOf(2)] = 0.5 }
    const g = evolveMember(fixed, x0)
    expect(g.q2.length).toBe(8)
    for (let iq = 0; iq < 8; iq++) { expect(at(g, iq, 5, 5)).toBe(0); expect(at(g, iq, 5, 6)).toBe(0) }
    expect(at(g, 7, 5, 4)).toBeGreaterThan(0)
  })

  it('refuses a non-zero input for a flavour that is not active at μ₀²', () => {
    const p = createEvolutionPlan({ startScaleGeV2: 1.69, alphas: quillon.alphas, scheme: quillon.scheme, x: { count: 20, min: 1e-3, max: 0.9 }, q2: { count: 5, maxGeV2: 100 } })
    const x0 = new Float64Array(20 * 13)
    x0[3 * 13 + slotOf(4)] = 0.01
    expect(() => evolveMember(p, x0)).toThrow(/flavour c is not active at μ₀² = 1\.69 GeV²/)
  })
})

describe('a first explicit Q² node exactly on a threshold above μ₀² (the heavy quark starts at zero at μ² = m_h²)', () => {
  // Toy input: μ₀² = 2 GeV², m_b² = 20.25, m_t² = 30625 GeV²; Quillon-22: μ₀² = 1.69, m_c² = 1.96 GeV².
  it.each([
    ['b from m_b² = 20.25 GeV² (toy input)', toy, [20.25, 1e4], 5],
    ['t from m_t² = 30625 GeV² (toy input)', toy, [30625, 1e6], 6],
    ['c from m_c² = 1.96 GeV² (Quillon-22)', quillon, [1.96, 10], 4]
  ] as const)('switches on %s: zero at the node, then as with μ₀² in front and as in Mellin space', (_label, model, nodes, pdg) => {
    const x = { count: 100, min: 1e-6, max: 0.99 }
    const plan = planForModel(model, { x, q2: { nodesGeV2: nodes } })
    const grid = evolveModel(model, plan)
    expect(Array.from(grid.q2)).toEqual(nodes)
    const withStart = evolveModel(model, planForModel(model, { x, q2: { nodesGeV2: [model.startScaleGeV2, ...nodes] } }))
    const last = grid.q2.length - 1
    const lastWithStart = withStart.q2.length - 1
    const xs = [1e-4, 1e-2, 0.1, 0.5].map(v => grid.x.findIndex(n => n >= v))
    const mellin = evolveMellin(bindParameters(model), model, xs.map(ix => ({ x: grid.x[ix]!, q2GeV2: nodes[1]! })))
    xs.forEach((ix, p) => {
      expect(at(grid, 0, ix, pdg)).toBe(0)
      const value = at(grid, last, ix, pdg)
      expect(value).toBeGreaterThan(0)
      // Same steps either way: identical to rounding.
      expect(Math.abs(value / at(withStart, lastWithStart, ix, pdg) - 1)).toBeLessThan(1e-12)
      // Independent method, to the x-space accuracy goal of ≤ 1e-4 relative for x ≤ 0.7
      // (see shared/physics/README.md, "x-space method").
      expect(Math.abs(value / mellin[p * 13 + slotOf(pdg)]! - 1)).toBeLessThan(1e-4)
    })
  })
})
