import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { buildNuclearFamily } from '~/shared/physics/evolution/build-family'
import { buildErrorSet } from '~/shared/physics/evolution/build-set'
import { compileInput } from '~/shared/physics/input/model'
import { parseInputText } from '~/shared/physics/input/parse'
import { kernelLabel } from '~/shared/physics/kernels/registry'
import { evaluateDirect } from '~/shared/physics/study/direct'
import { buildPlan, evaluatePlan } from '~/shared/physics/study/plan'
import { parseStudySpec } from '~/shared/physics/study/spec'
import { computeBands } from '~/shared/physics/uncertainty/bands'
import { expectClose } from '../close'
import { centralOnly, unitModification } from '../nuclear-fixtures'

const text = (f: string) => readFileSync(`samples/fits/${f}`, 'utf8')
const quillon = parseInputText(text('quillon-22.json'), 'quillon-22.json')
const coarse = { x: { count: 40, min: 1e-5, max: 0.95 }, q2: { count: 10, maxGeV2: 1e5 } }
const bins = [{ x: 1e-3, q2: 10 }, { x: 0.1, q2: 10 }, { x: 0.6, q2: 100 }]

describe('ratios of two targets of one nuclear family, member by member', () => {
  // The band of a ratio is the band of the member-by-member ratios (shared/physics/README.md,
  // "Ratios and asymmetries"; common practice): members k of the deuteron and of iron come from
  // the same fit parameters, so the ratio's band keeps their correlation.
  it('F₂^Fe/F₂^D: each member is the ratio of the two sets\' members k; the correlated band is narrower than the bands in quadrature', async () => {
    const [deuteron, iron] = await buildNuclearFamily(parseInputText(text('ostrand-25.json'), 'ostrand-25.json'), quillon, [{ z: 1, a: 2 }, { z: 26, a: 56 }], coarse)
    const spec = parseStudySpec({ kernel: 'nuclear-ratio', options: { base: 'dis-nc-f2', nucleus: { z: 26, a: 56 }, denominator: 'deuteron' }, bins })
    expect(kernelLabel(spec.kernel, spec.options)).toMatch(/over the deuteron of the main set/)
    const ratio = evaluatePlan(buildPlan(spec, deuteron!, { second: iron! }), deuteron!.members, iron!.members)
    expect(ratio.length).toBe(23 * bins.length)
    // The two sides on their own sets with the single F₂ kernel (direct evaluation, no plan).
    const f2 = (set: typeof iron, target: object) => evaluateDirect(parseStudySpec({ kernel: 'dis-nc-f2', options: { target }, bins }), set!)
    const num = f2(iron, { type: 'nucleus', z: 26, a: 56 })
    const den = f2(deuteron, { type: 'nucleus', z: 1, a: 2 })
    expectClose(ratio, num.map((v, i) => v / den[i]!), 1e-12)
    const band = (values: Float64Array) => computeBands({ members: 23, bins: bins.length, values }, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', clFrom: 68, clTo: 68 })
    const correlated = band(ratio)
    // As if numerator and denominator were independent: relative errors in quadrature.
    const nb = band(num)
    const db = band(den)
    for (let b = 0; b < bins.length; b++) {
      const r0 = ratio[b]!
      const independent = r0 * Math.hypot(nb.plus[b]! / num[b]!, db.plus[b]! / den[b]!)
      console.info(`F₂^Fe/F₂^D at x = ${bins[b]!.x}, Q² = ${bins[b]!.q2}: ${r0.toFixed(5)} ± ${correlated.plus[b]!.toExponential(2)} (member by member) vs ± ${independent.toExponential(2)} (in quadrature)`)
      expect(correlated.plus[b]!).toBeLessThan(independent)
    }
  })

  it('with a modification of 1 everywhere, carbon over the deuteron and iron over p + n (isoscalar) are exactly 1 and the isospin effect of iron respectively', async () => {
    const one = unitModification()
    const request = centralOnly()
    const set = async (z: number, a: number) => buildErrorSet(compileInput(one, quillon, 'unit.json', { nucleus: { z, a } }), request, coarse)
    const [d, c, fe] = [await set(1, 2), await set(6, 12), await set(26, 56)]
    const carbon = parseStudySpec({ kernel: 'nuclear-ratio', options: { base: 'dis-nc-f2', nucleus: { z: 6, a: 12 }, denominator: 'deuteron' }, bins })
    expect(Array.from(evaluatePlan(buildPlan(carbon, d, { second: c }), d.members, c.members))).toEqual([1, 1, 1])
    // Iron over an isoscalar nucleon: (26 F₂ᵖ + 30 F₂ⁿ)/56 over ½(F₂ᵖ + F₂ⁿ), the neutron excess alone (README, "Nuclear targets and isospin").
    const iso = parseStudySpec({ kernel: 'nuclear-ratio', options: { base: 'dis-nc-f2', nucleus: { z: 26, a: 56 }, denominator: 'isoscalar' }, bins })
    const r = evaluatePlan(buildPlan(iso, d, { second: fe }), d.members, fe.members)
    const p = evaluateDirect(parseStudySpec({ kernel: 'dis-nc-f2', options: { target: { type: 'proton' } }, bins }), d)
    const n = evaluateDirect(parseStudySpec({ kernel: 'dis-nc-f2', options: { target: { type: 'neutron' } }, bins }), d)
    expectClose(r, p.map((pv, i) => ((26 * pv + 30 * n[i]!) / 56) / (0.5 * (pv + n[i]!))), 1e-12)
  })

  it('σ_νFe/σ_νN per nucleon: the charged-current cross-section as a nuclear-ratio base, over an isoscalar nucleon', async () => {
    const model = compileInput(quillon)
    const proton = await buildErrorSet(model, centralOnly(model.central), coarse)
    const points = [{ x: 0.1, y: 0.5 }, { x: 0.4, y: 0.3 }]
    const spec = parseStudySpec({ kernel: 'nuclear-ratio', options: { base: 'dis-cc-d2sigma', beam: 'neutrino', beamEnergyGeV: 100, nucleus: { z: 26, a: 56 }, denominator: 'isoscalar' }, bins: points })
    const r = evaluatePlan(buildPlan(spec, proton), proton.members)
    // Without a nuclear set both sides read the free proton: the iron neutron excess over p + n.
    const sigma = (target: object) => evaluateDirect(parseStudySpec({ kernel: 'dis-cc-d2sigma', options: { beam: 'neutrino', beamEnergyGeV: 100, target }, bins: points }), proton)
    const p = sigma({ type: 'proton' })
    const n = sigma({ type: 'neutron' })
    expectClose(r, p.map((pv, i) => ((26 * pv + 30 * n[i]!) / 56) / (0.5 * (pv + n[i]!))), 1e-12)
  })
})
