import { readFileSync } from 'node:fs'
import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { gridSumRules, integrateX } from '~/shared/physics/evolution/sum-rules'
import { evolveModel, planForModel } from '~/shared/physics/evolution/build-set'
import { bindParameters } from '~/shared/physics/input/bind'
import { sumRuleIntegrals } from '~/shared/physics/input/evaluate'
import { compileInput } from '~/shared/physics/input/model'
import { parseInputText } from '~/shared/physics/input/parse'
import { expectClose } from '../close'

const load = (f: string) => parseInputText(readFileSync(`samples/fits/${f}`, 'utf8'), f)
const quillon = load('quillon-22.json')

describe('integrals over x grids', () => {
  it('integrate power shapes: ∫ x^0.8(1−x)^3/x dx = B(0.8, 4) and ∫ x^−0.1(1−x)^5 dx = B(0.9, 6) (jstat.betafn)', () => {
    const x = Float64Array.from({ length: 120 }, (_, i) => 1 / (1 + Math.exp(-(Math.log(1e-10 / (1 - 1e-10)) + (Math.log(0.99 / 0.01) - Math.log(1e-10 / (1 - 1e-10))) * i / 119))))
    expectClose(integrateX(x, x.map(v => v ** 0.8 * (1 - v) ** 3), 0), jStat.betafn(0.8, 4), 1e-7)
    expectClose(integrateX(x, x.map(v => v ** -0.1 * (1 - v) ** 5), 1), jStat.betafn(0.9, 6), 1e-7)
  })
})

// see shared/physics/README.md, "Sum rules"
describe('momentum and valence sum rules after evolution, grid 130 nodes from 1e-10', () => {
  const fits = [
    ['toy input of hep-ph/0204316', compileInput(load('benchmark-toy-input.json'))],
    ['Quillon-22 central', compileInput(quillon)],
    ['Ostrand-Pb24 central (bound proton)', compileInput(load('ostrand-pb24.json'), quillon)]
  ] as const
  const q2 = [10, 100, 1e4, 1e6, 1e8]

  it.each(fits)('%s: ∫x(Σ+g), ∫(u−ū), ∫(d−d̄) keep their μ₀² values to 1e-6 at Q² = 10 … 1e8 GeV², ∫(s−s̄) = 0', (_label, model) => {
    const plan = planForModel(model, { x: { count: 130, min: 1e-10, max: 0.99 }, q2: { nodesGeV2: [model.startScaleGeV2, ...q2] } })
    const grid = evolveModel(model, plan)
    // The rules at μ₀² from exact moments (the toy input's printed digits give 0.99999998).
    const start = sumRuleIntegrals(bindParameters(model))
    for (let iq = 0; iq < grid.q2.length; iq++) {
      const r = gridSumRules(grid, iq)
      expectClose(r.momentum, start.momentum, 1e-6)
      expectClose(r.uValence, start.uValence, 1e-6)
      expectClose(r.dValence, start.dValence, 1e-6)
      expect(Math.abs(r.sValence)).toBeLessThan(1e-12)
    }
    const last = gridSumRules(grid, grid.q2.length - 1)
    console.info(`${_label} at 1e8 GeV²: momentum − start = ${(last.momentum - start.momentum).toExponential(2)}, u-valence − 2 = ${(last.uValence - 2).toExponential(2)}`)
  })
})
