import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { planForModel } from '~/shared/physics/evolution/build-set'
import { q2Nodes, thresholdPairs } from '~/shared/physics/evolution/q2-grid'
import { xNodes } from '~/shared/physics/evolution/x-grid'
import { compileInput } from '~/shared/physics/input/model'
import { parseInputText } from '~/shared/physics/input/parse'
import type { FlavourScheme } from '~/shared/physics/types'
import { expectClose } from '../close'

const vfns: FlavourScheme = { type: 'variable', nf: 6, massesGeV: { charm: Math.SQRT2, bottom: 4.5, top: 175 } }

describe('x nodes', () => {
  it('run from min to max, strictly increasing, log-spaced at small x and in 1 − x near 1', () => {
    const x = xNodes({ count: 100, min: 1e-6, max: 0.99 })
    expect(x[0]).toBe(1e-6)
    expect(x[99]).toBe(0.99)
    for (let i = 1; i < 100; i++) expect(x[i]!).toBeGreaterThan(x[i - 1]!)
    const du = Math.log(x[1]! / x[0]!)
    expectClose(Math.log(x[2]! / x[1]!), du, 1e-4)
    expectClose(Math.log((1 - x[97]!) / (1 - x[98]!)), du, 0.02)
  })

  it.each([
    [{ count: 5, min: 1e-4, max: 0.9 }, /8\.\.2000/],
    [{ count: 50, min: 0.5, max: 0.1 }, /0 < min < max < 1/],
    [{ nodes: [0.1, 0.2, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7] }, /increase strictly/],
    [{ nodes: [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 1] }, /\(0, 1\)/]
  ])('refuse %j', (spec, message) => {
    expect(() => xNodes(spec)).toThrow(message)
  })
})

describe('Q² nodes with heavy-quark thresholds', () => {
  it('double each interior threshold (below, then above) and keep the requested distinct count', () => {
    const q2 = q2Nodes({ count: 40, maxGeV2: 1e8 }, 2, vfns)
    // m_c² = 2 = μ₀² is not interior (charm is active from the start); m_b² and m_t² are.
    expect(q2.length).toBe(42)
    expect(thresholdPairs(q2).map(p => p.q2GeV2)).toEqual([20.25, 30625])
    expect(q2[0]).toBe(2)
    expect(q2[41]).toBe(1e8)
    for (let i = 1; i < q2.length; i++) expect(q2[i]! >= q2[i - 1]!).toBe(true)
  })

  it('insert the threshold pair into explicit nodes', () => {
    expect(Array.from(q2Nodes({ nodesGeV2: [2, 10, 100, 1e4] }, 2, vfns))).toEqual([2, 10, 20.25, 20.25, 100, 1e4])
    expect(Array.from(q2Nodes({ nodesGeV2: [2, 20.25, 100] }, 2, vfns))).toEqual([2, 20.25, 20.25, 100])
  })

  it('leave a fixed-flavour grid without pairs', () => {
    expect(thresholdPairs(q2Nodes({ count: 10, maxGeV2: 1e6 }, 2, { ...vfns, type: 'fixed', nf: 4 }))).toEqual([])
  })

  it.each([
    [{ nodesGeV2: [1, 10] }, /below the starting scale/],
    [{ nodesGeV2: [10, 5] }, /must increase/],
    [{ nodesGeV2: [10, 10] }, /not a heavy-quark threshold/],
    [{ count: 3, maxGeV2: 1e8 }, /count in 4\.\.2000/]
  ])('refuse %j', (spec, message) => {
    expect(() => q2Nodes(spec, 2, vfns)).toThrow(message)
  })
})

describe('the evolution plan of a fit', () => {
  it('Quillon-22 on 100 x × 40 Q² values: 43 Q² nodes, the charm, bottom and top thresholds doubled', () => {
    // μ₀² = 1.69 GeV² lies below m_c² = 1.96 GeV² (samples/fits/quillon-22.json), so all three
    // thresholds are interior: 40 distinct values + 3 repeated nodes.
    const model = compileInput(parseInputText(readFileSync('samples/fits/quillon-22.json', 'utf8'), 'quillon-22.json'))
    const plan = planForModel(model, { x: { count: 100, min: 1e-6, max: 0.99 }, q2: { count: 40, maxGeV2: 1e8 } })
    expect(plan.x.length).toBe(100)
    expect(plan.q2.length).toBe(43)
    expect(thresholdPairs(plan.q2).map(p => p.q2GeV2)).toEqual([1.4 ** 2, 4.75 ** 2, 172.5 ** 2])
  })
})
