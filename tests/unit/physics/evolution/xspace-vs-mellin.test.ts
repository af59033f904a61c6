import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { evolveMellin } from '~/shared/physics/evolution/mellin'
import { createEvolutionPlan, evolveMember } from '~/shared/physics/evolution/xspace'
import { bindParameters } from '~/shared/physics/input/bind'
import { evaluateXf } from '~/shared/physics/input/evaluate'
import { EVOLVED_FLAVOURS } from '~/shared/physics/input/flavours'
import { partonName } from '~/shared/physics/partons'
import { compileInput, type InputModel } from '~/shared/physics/input/model'
import { parseInputText } from '~/shared/physics/input/parse'
import type { FlavourScheme } from '~/shared/physics/types'
import { relDiff } from '../close'

// The two methods share only α_s and the input's parameters: x space discretises the
// convolutions on the grid and steps exp(sM); Mellin space solves each moment exactly (exact
// Beta-function moments, complex anomalous dimensions) and inverts along a contour.
const load = (f: string) => parseInputText(readFileSync(`samples/fits/${f}`, 'utf8'), f)
const toy = compileInput(load('benchmark-toy-input.json'))
const quillon = compileInput(load('quillon-22.json'))

function compare(model: InputModel, scheme: FlavourScheme, q2List: number[]) {
  const setup = { startScaleGeV2: model.startScaleGeV2, alphas: model.alphas, scheme }
  const plan = createEvolutionPlan({ ...setup, x: { count: 100, min: 1e-6, max: 0.99 }, q2: { nodesGeV2: [model.startScaleGeV2, ...q2List] } })
  const bound = bindParameters(model)
  const grid = evolveMember(plan, evaluateXf(bound, plan.x))
  const nx = grid.x.length
  const xs: number[] = []
  for (let ix = 0; ix < nx; ix += 6) if (grid.x[ix]! >= 1e-5 && grid.x[ix]! <= 0.7) xs.push(ix)
  let worst = { rel: 0, where: '' }
  for (const q2 of q2List) {
    const iq = grid.q2.lastIndexOf(q2)
    const ref = evolveMellin(bound, setup, xs.map(ix => ({ x: grid.x[ix]!, q2GeV2: q2 })))
    xs.forEach((ix, p) => {
      EVOLVED_FLAVOURS.forEach((pdg, s) => {
        const b = ref[p * 13 + s]!
        const a = grid.values[(iq * nx + ix) * 13 + s]!
        if (b === 0 && a === 0) return
        const r = relDiff(a, b)
        if (r > worst.rel) worst = { rel: r, where: `${partonName(pdg)} at x = ${grid.x[ix]!.toExponential(3)}, Q² = ${q2}` }
      })
    })
  }
  return worst
}

const masses = toy.scheme.massesGeV
describe('x-space evolution against Mellin-space evolution, 1e-5 ≤ x ≤ 0.7, default grid (100 nodes, degree 7)', () => {
  it.each([
    ['toy input, fixed n_f = 3', toy, { type: 'fixed', nf: 3, massesGeV: masses }],
    ['toy input, fixed n_f = 4', toy, { type: 'fixed', nf: 4, massesGeV: masses }],
    ['toy input, fixed n_f = 5', toy, { type: 'fixed', nf: 5, massesGeV: masses }],
    ['toy input, variable flavour (c at μ₀, b at 20.25, t at 30625 GeV²)', toy, toy.scheme],
    ['Quillon-22 central, variable flavour (c at 1.96 GeV² just above μ₀²)', quillon, quillon.scheme]
  ] as [string, InputModel, FlavourScheme][])('%s: every flavour agrees to ≤ 1e-4 relative at Q² = 5, 1e2, 1e4, 1e6 GeV²', (_label, model, scheme) => {
    const worst = compare(model, scheme, [5, 100, 1e4, 1e6])
    console.info(`x space vs Mellin, ${_label}: worst relative difference ${worst.rel.toExponential(2)} (${worst.where})`)
    expect(worst.rel).toBeLessThanOrEqual(1e-4)
  })
})

describe('Mellin inversion on its own', () => {
  it.each([1e-7, 1e-4, 0.01, 0.2, 0.5, 0.7])('returns the input at μ₀² (no evolution) to 1e-11 at x = %f, every flavour', (x) => {
    const bound = bindParameters(quillon)
    const inverse = evolveMellin(bound, { startScaleGeV2: quillon.startScaleGeV2, alphas: quillon.alphas, scheme: quillon.scheme }, [{ x, q2GeV2: quillon.startScaleGeV2 }])
    const direct = evaluateXf(bound, [x])
    for (let s = 0; s < 13; s++) expect(Math.abs(inverse[s]! - direct[s]!)).toBeLessThanOrEqual(1e-11 * Math.abs(direct[s]!) + 1e-300)
  })

  it('refuses points below μ₀² or outside (0, 1)', () => {
    const bound = bindParameters(toy)
    const setup = { startScaleGeV2: 2, alphas: toy.alphas, scheme: toy.scheme }
    expect(() => evolveMellin(bound, setup, [{ x: 0.1, q2GeV2: 1 }])).toThrow(/below μ₀²/)
    expect(() => evolveMellin(bound, setup, [{ x: 1, q2GeV2: 10 }])).toThrow(/\(0, 1\)/)
  })
})
