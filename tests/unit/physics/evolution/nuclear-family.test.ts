import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { buildNuclearFamily } from '~/shared/physics/evolution/build-family'
import { buildErrorSet, evolveModel, planForModel } from '~/shared/physics/evolution/build-set'
import { nucleusSumRules } from '~/shared/physics/evolution/nuclear-sum-rules'
import { bindParameters } from '~/shared/physics/input/bind'
import { sumRuleIntegrals } from '~/shared/physics/input/evaluate'
import { memberVectors } from '~/shared/physics/input/feasibility'
import { compileInput } from '~/shared/physics/input/model'
import { parseInputDocument, parseInputText } from '~/shared/physics/input/parse'
import { writeSetFile } from '~/shared/physics/sets/write'
import { buildPlan, evaluatePlan } from '~/shared/physics/study/plan'
import { parseStudySpec } from '~/shared/physics/study/spec'
import type { ErrorSet } from '~/shared/physics/types'
import { centralOnly, unitModification } from '../nuclear-fixtures'

const text = (f: string) => readFileSync(`samples/fits/${f}`, 'utf8')
const load = (f: string) => parseInputText(text(f), f)
const quillon = load('quillon-22.json')
const pb24 = load('ostrand-pb24.json')
const family = load('ostrand-25.json')
const coarse = { x: { count: 40, min: 1e-5, max: 0.95 }, q2: { count: 10, maxGeV2: 1e5 } }
const NUCLEI = [{ z: 1, a: 2 }, { z: 6, a: 12 }, { z: 18, a: 40 }, { z: 26, a: 56 }, { z: 82, a: 208 }]

const sameValues = (a: ErrorSet, b: ErrorSet) => a.members.length === b.members.length && a.members.every((m, k) => m.every((v, i) => Object.is(v, b.members[k]![i])))

describe('a nuclear family: one modification fit and covariance, members for any nucleus', () => {
  it('an A-independent modification built as a family for its own nucleus reproduces the single-nucleus set byte for byte', async () => {
    const single = await buildErrorSet(compileInput(pb24, quillon), undefined, coarse)
    const [viaFamily] = await buildNuclearFamily(pb24, quillon, [{ z: 82, a: 208, name: 'Ostrand-Pb24' }], coarse)
    expect(Buffer.from(writeSetFile(viaFamily!)).equals(Buffer.from(writeSetFile(single)))).toBe(true)
    // Carried to carbon, the same R gives the same numbers; the header says which nucleus and that R does not depend on A.
    const [carbon] = await buildNuclearFamily(pb24, quillon, [{ z: 6, a: 12 }], coarse)
    expect(sameValues(carbon!, single)).toBe(true)
    expect(carbon!.header.target).toEqual({ type: 'nucleus', z: 6, a: 12 })
    expect(carbon!.header.name).toBe('Ostrand-Pb24-C12')
    expect(carbon!.header.provenance).toMatch(/nucleus Z = 6, A = 12 from family Ostrand .*A-dependence: none/)
    // The same document with every coefficient written as an A-dependence that is a constant: bit for bit again.
    const doc = JSON.parse(text('ostrand-pb24.json'))
    for (const m of doc.modifications) for (const t of m.terms) if (typeof t.A === 'string') t.A = { ofA: [{ k: t.A }] }
    const [constant] = await buildNuclearFamily(parseInputDocument(doc, 'constant.json'), quillon, [{ z: 26, a: 56 }], coarse)
    expect(sameValues(constant!, single)).toBe(true)
    expect(constant!.header.provenance).toMatch(/A-dependence \(δ = \(A − 2Z\)\/A\): modifications\[0\]\.terms\[1\]\.A = shadow_v/)
  })

  it('builds several nuclei in one call with progress over all members; member k of every nucleus is the same parameter vector', async () => {
    const progress: Array<[number, number, number]> = []
    const sets = await buildNuclearFamily(family, quillon, [{ z: 6, a: 12 }, { z: 82, a: 208 }], { ...coarse, onProgress: (d, t, i) => { progress.push([d, t, i]) } })
    expect(sets.map(s => s.header.name)).toEqual(['Ostrand-25-C12', 'Ostrand-25-Pb208'])
    expect(sets.map(s => s.header.family)).toEqual(['Ostrand', 'Ostrand'])
    expect(progress).toHaveLength(46)
    expect(progress[22]).toEqual([23, 46, 0])
    expect(progress[45]).toEqual([46, 46, 1])
    // The A-dependence makes the two nuclei differ (shadowing ∝ A^0.15 at the central values).
    expect(sameValues(sets[0]!, sets[1]!)).toBe(false)
    expect(sets[1]!.header.provenance).toMatch(/shadow_v·A\^\(gamma_A\)/)
  })

  it('valence, momentum, baryon-number and charge sum rules per nucleus to 1e-6 after evolution, every member, Q² = μ₀² … 1e8 GeV²', () => {
    // Per bound nucleon ∫(u − ū) = (2Z + N)/A, ∫(d − d̄) = (Z + 2N)/A, ∫x Σf = 1 (ESW ch. 4, from
    // memory; PDG "Structure functions", quark-parton model); the bound neutron from the bound
    // proton by isospin (common practice); the nucleus carries baryon number A and charge Z with
    // quark charges ⅔, −⅓ and baryon number ⅓ per quark (PDG, "Quark model").
    const grid = { x: { count: 130, min: 1e-10, max: 0.99 } }
    for (const nucleus of NUCLEI) {
      const model = compileInput(family, quillon, 'ostrand-25.json', { nucleus })
      const plan = planForModel(model, { ...grid, q2: { nodesGeV2: [model.startScaleGeV2, 10, 100, 1e4, 1e6, 1e8] } })
      const start = sumRuleIntegrals(bindParameters(model))
      expect(Math.abs(start.uValence - 2) + Math.abs(start.dValence - 1) + Math.abs(start.momentum - 1)).toBeLessThan(1e-13)
      const vectors = [model.central, ...memberVectors(model, model.members!).map(m => m.params)]
      expect(vectors).toHaveLength(23)
      let worst = 0
      let figures = ''
      for (const params of vectors) {
        const g = evolveModel(model, plan, params)
        for (let iq = 0; iq < g.q2.length; iq++) {
          const r = nucleusSumRules(g, nucleus, iq)
          expect(r.worst, `Z = ${nucleus.z}, A = ${nucleus.a}, Q² = ${r.q2GeV2}`).toBeLessThan(1e-6)
          worst = Math.max(worst, r.worst)
          if (params === model.central && iq === g.q2.length - 1) {
            figures = `u_v = ${r.perNucleon.uValence.toFixed(9)} (want ${r.expected.uValence.toFixed(9)}), d_v = ${r.perNucleon.dValence.toFixed(9)}, momentum = ${r.perNucleon.momentum.toFixed(9)}, baryon number = ${r.baryonNumber.toFixed(6)}, charge = ${r.charge.toFixed(6)}`
          }
        }
      }
      console.info(`sum rules Z = ${nucleus.z}, A = ${nucleus.a} at 1e8 GeV²: ${figures}; worst deviation over members and Q²: ${worst.toExponential(2)}`)
    }
  }, 60_000)

  it('a modification of 1 everywhere gives bound protons equal to the free proton and nuclear ratios of exactly 1', async () => {
    const one = unitModification()
    const request = centralOnly()
    const baseline = await buildErrorSet(compileInput(quillon), centralOnly(compileInput(quillon).central), coarse)
    for (const nucleus of [{ z: 26, a: 56 }, { z: 82, a: 208 }]) {
      const set = await buildErrorSet(compileInput(one, quillon, 'unit.json', { nucleus }), request, coarse)
      expect(sameValues(set, baseline)).toBe(true)
      // F₂ per nucleon over the free nucleons (Z·p + N·n)/A of the same nucleus (README, "Nuclear targets and isospin").
      const spec = parseStudySpec({ kernel: 'nuclear-ratio', options: { base: 'dis-nc-f2', nucleus, denominator: 'isospin' }, bins: [{ x: 1e-3, q2: 10 }, { x: 0.1, q2: 100 }, { x: 0.6, q2: 1e4 }] })
      const r = evaluatePlan(buildPlan(spec, baseline, { second: set }), baseline.members, set.members)
      expect(Array.from(r)).toEqual([1, 1, 1])
    }
  })
})
