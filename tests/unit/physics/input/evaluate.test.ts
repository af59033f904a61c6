import { readFileSync } from 'node:fs'
import jStat from 'jstat'
import { describe, expect, it } from 'vitest'
import { hessianMembers } from '~/shared/physics/fit/hessian'
import { replicaParameters } from '~/shared/physics/fit/replicas'
import { xNodes } from '~/shared/physics/evolution/x-grid'
import { bindParameters } from '~/shared/physics/input/bind'
import { evaluateXf, minimumXf, sumRuleIntegrals } from '~/shared/physics/input/evaluate'
import { slotOf } from '~/shared/physics/input/flavours'
import { compileInput, type InputModel } from '~/shared/physics/input/model'
import { parseInputText } from '~/shared/physics/input/parse'
import { expectClose } from '../close'

const load = (f: string) => parseInputText(readFileSync(`samples/fits/${f}`, 'utf8'), f)

describe('x·f at μ₀² on any x grid', () => {
  const toy = bindParameters(compileInput(load('benchmark-toy-input.json')))
  // hep-ph/0204316 toy input: xu_v = 5.1072 x^0.8 (1−x)^3, xd_v = 3.06432 x^0.8 (1−x)^4,
  // xg = 1.7 x^−0.1 (1−x)^5, xd̄ = 0.1939875 x^−0.1 (1−x)^6, xū = (1−x) xd̄, xs = xs̄ = 0.2 x(ū + d̄).
  const toyXf = (x: number) => {
    const dbar = 0.1939875 * x ** -0.1 * (1 - x) ** 6
    const ubar = (1 - x) * dbar
    const s = 0.2 * (ubar + dbar)
    return { u: 5.1072 * x ** 0.8 * (1 - x) ** 3 + ubar, d: 3.06432 * x ** 0.8 * (1 - x) ** 4 + dbar, ubar, dbar, s, g: 1.7 * x ** -0.1 * (1 - x) ** 5 }
  }

  it.each([1e-7, 1e-4, 0.01, 0.1, 0.3, 0.5, 0.7, 0.9])('reproduces the toy input formulas at x = %f for every flavour', (x) => {
    const v = evaluateXf(toy, [x])
    const e = toyXf(x)
    expectClose(v[slotOf(2)]!, e.u, 1e-14)
    expectClose(v[slotOf(1)]!, e.d, 1e-14)
    expectClose(v[slotOf(-2)]!, e.ubar, 1e-14)
    expectClose(v[slotOf(-1)]!, e.dbar, 1e-14)
    expectClose(v[slotOf(3)]!, e.s, 1e-12)
    expectClose(v[slotOf(-3)]!, e.s, 1e-12)
    expectClose(v[slotOf(21)]!, e.g, 1e-14)
    for (const heavy of [4, -4, 5, -5, 6, -6]) expect(v[slotOf(heavy)]).toBe(0)
  })

  it('refuses x outside (0, 1)', () => {
    expect(() => evaluateXf(toy, [0.5, 1])).toThrow(/node 1 is x = 1/)
  })
})

describe('demo fits in samples/fits (invented): physically sensible for every member at μ₀²', () => {
  const quillon = load('quillon-22.json')
  const fits: [string, InputModel][] = [
    ['quillon-22.json', compileInput(quillon)],
    ['brindle-mc-1.json', compileInput(load('brindle-mc-1.json'))],
    ['ostrand-pb24.json', compileInput(load('ostrand-pb24.json'), quillon)],
    ['minimal-input.json', compileInput(load('minimal-input.json'))]
  ]
  const x = xNodes({ count: 120, min: 1e-6, max: 0.99 })
  const seaAndGluon = [-3, -2, -1, 1, 2, 3, 21].map(slotOf)

  it.each(fits)('%s: sum rules hold and the gluon and sea are positive on 1e-6…0.99 for all members', (_f, model) => {
    const spec = model.members!
    const vectors = spec.type === 'hessian'
      ? hessianMembers(model.central, model.covariance!, spec.tolerance).members
      : replicaParameters(model.central, model.covariance!, spec.count, spec.seed)
    for (const [k, v] of [model.central, ...vectors].entries()) {
      const b = bindParameters(model, v, `member ${k}`)
      const r = sumRuleIntegrals(b)
      expectClose(r.uValence, 2, 1e-12)
      expectClose(r.momentum, 1, 1e-12)
      expect(minimumXf(b, x, seaAndGluon), `member ${k}`).toBeGreaterThan(0)
    }
  })

  it('the Hessian demo fit has at least 20 free parameters and quotes 90% CL with T = Φ⁻¹(0.95)', () => {
    const model = fits[0]![1]
    expect(model.parameterNames.length).toBeGreaterThanOrEqual(20)
    expect(model.members).toMatchObject({ type: 'hessian', confidenceLevelPercent: 90 })
    // Φ⁻¹(0.95) (two-sided 90% Gaussian interval; see shared/physics/README.md, "Confidence levels"), from jstat
    expectClose((model.members as { tolerance: number }).tolerance, jStat.normal.inv(0.95, 0, 1), 1e-7)
    expect(fits[1]![1].members).toMatchObject({ type: 'replicas', count: 100 })
  })
})
