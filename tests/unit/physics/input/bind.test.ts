import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { bindParameters } from '~/shared/physics/input/bind'
import { sumRuleIntegrals } from '~/shared/physics/input/evaluate'
import { InputError } from '~/shared/physics/input/errors'
import { compileInput } from '~/shared/physics/input/model'
import { parseInputDocument, parseInputText } from '~/shared/physics/input/parse'
import { expectClose } from '../close'

const load = (f: string) => parseInputText(readFileSync(`samples/fits/${f}`, 'utf8'), f)
const quillon = load('quillon-22.json')
const ostrand = load('ostrand-pb24.json')

// see shared/physics/README.md, "Sum rules"
describe('binding parameters and imposing the sum rules', () => {
  const model = compileInput(quillon)

  it.each([
    ['central values', (p: Float64Array) => p],
    ['a_uv raised by 0.05', (p: Float64Array) => p.map((v, i) => (model.parameterNames[i] === 'a_uv' ? v + 0.05 : v))],
    ['every exponent b raised by 0.3', (p: Float64Array) => p.map((v, i) => (model.parameterNames[i]!.startsWith('b_') ? v + 0.3 : v))],
    ['sea normalisations raised by 10%', (p: Float64Array) => p.map((v, i) => (model.parameterNames[i]!.startsWith('A_') ? v * 1.1 : v))]
  ])('∫(u−ū) = 2, ∫(d−d̄) = 1, ∫x Σ f = 1 for %s (exact moments)', (_label, change) => {
    const r = sumRuleIntegrals(bindParameters(model, change(Float64Array.from(model.central))))
    expectClose(r.uValence, 2, 1e-13)
    expectClose(r.dValence, 1, 1e-13)
    expectClose(r.momentum, 1, 1e-13)
    expect(r.sValence).toBe(0)
  })

  it('names the member when a normalisation would be negative', () => {
    const p = Float64Array.from(model.central)
    p[model.parameterNames.indexOf('A_ubar')] = 3 // sea alone then carries more than all the momentum
    expect(() => bindParameters(model, p, 'member 7')).toThrow(/member 7: the momentum sum rule .* needs a normalisation .* ≤ 0 for piece "g"/)
  })

  it('names the member and piece when a valence integral diverges', () => {
    const p = Float64Array.from(model.central)
    p[model.parameterNames.indexOf('a_dv')] = -0.2
    expect(() => bindParameters(model, p, 'member 3')).toThrow(/member 3: piece "dv": .*diverges at x → 0/)
  })

  it('refuses a parameter vector of the wrong length', () => {
    expect(() => bindParameters(model, [1, 2, 3])).toThrow(/3 parameter values given, the fit has 21/)
  })
})

// see shared/physics/README.md, "Nuclear targets and isospin"
describe('nuclear modifications (f^{p/A} = R·f^p)', () => {
  const model = compileInput(ostrand, quillon)
  const base = compileInput(quillon)

  it('multiplies every baseline term by every term of its R, keeps baseline α_s, scheme and μ₀²', () => {
    expect(model.target).toEqual({ type: 'nucleus', z: 82, a: 208 })
    expect(model.startScaleGeV2).toBe(base.startScaleGeV2)
    expect(model.alphas).toEqual(base.alphas)
    expect(model.parameterNames).toHaveLength(10)
    model.pieces.forEach((p, i) => expect(p.terms.length).toBe(base.pieces[i]!.terms.length * 4))
    expect(model.baseline).toEqual({ name: 'Quillon-22', version: '22.1' })
  })

  it('imposes the valence and momentum sum rules on the bound proton', () => {
    const r = sumRuleIntegrals(bindParameters(model))
    expectClose(r.uValence, 2, 1e-13)
    expectClose(r.dValence, 1, 1e-13)
    expectClose(r.momentum, 1, 1e-13)
  })

  it.each([
    ['no baseline', () => compileInput(ostrand, undefined, 'ostrand.json'), /baseline: this nuclear modification needs its baseline input "Quillon-22" \(file quillon-22\.json\)/],
    ['the wrong baseline', () => compileInput(ostrand, load('brindle-mc-1.json'), 'ostrand.json'), /baseline\.name: this document modifies "Quillon-22" but the baseline given is "Brindle-MC-1"/],
    ['an uncovered piece', () => {
      const d = JSON.parse(readFileSync('samples/fits/ostrand-pb24.json', 'utf8'))
      d.modifications[1].appliesTo = ['ubar', 'dbar']
      return compileInput(parseInputDocument(d, 'o.json'), quillon, 'o.json')
    }, /modifications: every baseline piece needs a modification .* uncovered: strange/],
    ['a piece modified twice', () => {
      const d = JSON.parse(readFileSync('samples/fits/ostrand-pb24.json', 'utf8'))
      d.modifications[2].appliesTo = ['g', 'uv']
      return compileInput(parseInputDocument(d, 'o.json'), quillon, 'o.json')
    }, /modifications\[2\]\.appliesTo\[1\]: piece "uv" is already modified by modifications\[0\]/]
  ])('refuses %s', (_label, f, message) => {
    expect(f).toThrow(InputError)
    expect(f).toThrow(message)
  })
})
