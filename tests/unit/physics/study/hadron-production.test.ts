import { describe, expect, it } from 'vitest'
import { studyObservable } from '../../../../shared/bins/observable'
import { KERNEL_IDS } from '../../../../shared/physics/kernels/registry'
import { checkReach } from '../../../../shared/physics/study/expand'
import { evaluateDirect } from '../../../../shared/physics/study/direct'
import { buildPlan, evaluatePlan } from '../../../../shared/physics/study/plan'
import { checkStudySpec, parseStudySpec } from '../../../../shared/physics/study/spec'
import { expectClose } from '../close'
import { constantSet, SCHEME5, TOY_XF, TOY_ZD_K_PLUS, TOY_ZD_PI_PLUS } from '../kernels/fragmentation-fixtures'

// Studies of the hadron-production kernels on sets that are constant per flavour at every node
// (interpolation exact), so each bin is worked by hand; formulas as in
// tests/unit/physics/kernels/fragmentation.test.ts (PDG review "Fragmentation functions in e⁺e⁻,
// ep and pp collisions"). The ranges test that a bin is the ratio of the two integrals.

const pdf = constantSet(TOY_XF, { members: 3 })
const pion = constantSet(TOY_ZD_PI_PLUS, { hadron: 'pi+' })
const kaon = constantSet(TOY_ZD_K_PLUS, { hadron: 'K+', members: 3 })
const context = { scheme: SCHEME5 }

describe('semi-inclusive multiplicities as studies (parton densities main, fragmentation second)', () => {
  // Point: M^{π⁺}(0.1, 0.4, 10) = 1.42/(0.4 · 3.32) (kernels test). z from 0.2 to 0.6 integrated:
  // numerator (1.42/9)/x · ∫ dz/z = (1.42/9)/x · ln 3, denominator (3.32/9)/x · 0.4, so the bin is
  // 1.42 ln 3/(3.32 · 0.4) = 1.1747210; x from 0.05 to 0.2 changes nothing (both sides go as 1/x).
  const spec = parseStudySpec({
    kernel: 'sidis-multiplicity', options: { target: { type: 'proton' } },
    bins: [{ x: 0.1, z: 0.4, q2: 10 }, { x: 0.1, zMin: 0.2, zMax: 0.6, q2: 10 }, { xMin: 0.05, xMax: 0.2, z: 0.4, q2Min: 5, q2Max: 50 }]
  })
  const expected = [1.42 / 1.328, 1.42 * Math.log(3) / 1.328, 1.42 / 1.328]

  it('plan and direct evaluation give the hand-worked bins, each member of the parton set against the central fragmentation member', () => {
    const values = evaluatePlan(buildPlan(spec, pdf, { ...context, second: pion }), pdf.members, pion.members)
    expect(values.length).toBe(3 * 3)
    // The multiplicity does not depend on the normalisation of the parton densities: every member (scaled by 1 + 0.01 k) gives the same.
    for (let k = 0; k < 3; k++) expectClose(values.subarray(3 * k, 3 * k + 3), expected, 2e-8)
    expectClose(evaluateDirect(spec, pdf, { ...context, second: pion }).subarray(0, 3), expected, 2e-8)
  })

  it('rangeMode average gives the same ratio (the widths cancel)', () => {
    const avg = parseStudySpec({ ...spec, rangeMode: 'average' })
    expectClose(evaluateDirect(avg, pdf, { ...context, second: pion }).subarray(0, 3), expected, 2e-8)
  })

  it('charge ratio and charge difference from one π⁺ set', () => {
    const bins = [{ x: 0.1, z: 0.4, q2: 10 }]
    const ratio = parseStudySpec({ kernel: 'sidis-charge-ratio', bins })
    const difference = parseStudySpec({ kernel: 'sidis-charge-difference', bins })
    // 1.42/0.874 and 0.546/1.328 (kernels test)
    expectClose(evaluateDirect(ratio, pdf, { ...context, second: pion })[0]!, 1.42 / 0.874, 1e-12)
    expectClose(evaluateDirect(difference, pdf, { ...context, second: pion })[0]!, 0.546 / 1.328, 1e-12)
  })

  it('a z beyond the fragmentation grid is named as z of the second set', () => {
    const far = parseStudySpec({ kernel: 'sidis-multiplicity', bins: [{ x: 0.1, z: 0.95, q2: 10 }] })
    const [issue] = checkReach(far, { main: pdf, second: pion }, context)
    expect(issue?.message).toMatch(/^bin 1: z = 0\.95 .*above the set's largest z node 0\.9/)
  })
})

describe('e⁺e⁻ studies (fragmentation set main)', () => {
  it('(1/σ_tot) dσ^h/dz at a point and averaged over a z range, photon exchange', () => {
    // Point z = 0.5, √s = 10.58: 8.16/11 (kernels test). z from 0.2 to 0.6 averaged:
    // (4.08/11) · ln 3/0.4 = 1.0187132.
    const spec = parseStudySpec({ kernel: 'epem-hadron', options: { exchange: 'photon' }, rangeMode: 'average', bins: [{ sqrtS: 10.58, z: 0.5 }, { sqrtS: 10.58, zMin: 0.2, zMax: 0.6 }] })
    expectClose(evaluateDirect(spec, pion, context), [8.16 / 11, 4.08 / 11 * Math.log(3) / 0.4], 2e-8)
    // A point keeps the name, a range averaged over is written ⟨…⟩; both dimensionless.
    expect(studyObservable(spec)).toMatchObject({ perBin: ['(1/σ_tot) dσ^h/dz', '⟨(1/σ_tot) dσ^h/dz⟩'], unit: null })
  })

  it('K⁺/π⁺ from two fragmentation sets, member by member', () => {
    // Σ e² (zD_q + zD_q̄) for K⁺: (4 · 0.35 + 0.1 + 0.35 + 4 · 0.1 + 0.1)/9 = 2.35/9; for π⁺ 4.08/9; ratio 0.5759804
    const spec = parseStudySpec({ kernel: 'epem-species-ratio', options: { exchange: 'photon' }, bins: [{ sqrtS: 10.58, z: 0.5 }] })
    const values = evaluatePlan(buildPlan(spec, kaon, { ...context, second: pion }), kaon.members, pion.members)
    for (let k = 0; k < 3; k++) expectClose(values[k]!, 2.35 / 4.08 * (1 + 0.01 * k), 1e-12)
  })

  it('needs the set\'s flavour scheme', () => {
    const spec = parseStudySpec({ kernel: 'epem-hadron', bins: [{ sqrtS: 91.2, z: 0.5 }] })
    expect(() => evaluateDirect(spec, pion)).toThrow('flavour scheme')
  })
})

describe('spec checks and names of the hadron-production kernels', () => {
  it('offers the multiplicities but not their building blocks', () => {
    expect(KERNEL_IDS).toEqual(expect.arrayContaining(['epem-hadron', 'epem-species-ratio', 'sidis-multiplicity', 'sidis-charge-ratio', 'sidis-charge-difference']))
    expect(KERNEL_IDS).not.toContain('sidis-yield')
    const r = checkStudySpec({ kernel: 'sidis-yield', bins: [{ x: 0.1, z: 0.4, q2: 10 }] })
    expect(r.ok).toBe(false)
  })

  it('locates a missing z, a z out of range and a column the kernel does not have', () => {
    const r = checkStudySpec({ kernel: 'sidis-multiplicity', bins: [{ x: 0.1, q2: 10 }, { x: 0.1, z: 1.5, q2: 10 }, { sqrtS: 10, z: 0.3 }] })
    expect(r.ok).toBe(false)
    const messages = r.ok ? [] : r.issues.map(i => i.message)
    expect(messages).toContain('bin 1: missing hadron momentum fraction z: give z, or zMin and zMax')
    expect(messages).toContain('bin 2, column z: z must be in (0, 1)')
    expect(messages).toContain('bin 3, column sqrtS: this kernel has no variable sqrtS; its variables are x, z, q2')
  })

  it.each([
    ['sidis-multiplicity', { x: 0.1, z: 0.4, q2: 10 }, 'M^h'],
    ['sidis-charge-ratio', { x: 0.1, zMin: 0.2, zMax: 0.3, q2: 10 }, 'M^h/M^h̄'],
    ['sidis-charge-difference', { x: 0.1, z: 0.4, q2: 10 }, 'M^h − M^h̄'],
    ['epem-hadron', { sqrtS: 91.2, z: 0.4 }, '(1/σ_tot) dσ^h/dz'],
    ['epem-species-ratio', { sqrtS: 91.2, z: 0.4 }, 'R^{h/h′}']
  ])('%s is named %s, dimensionless', (kernel, bin, name) => {
    expect(studyObservable({ kernel, options: {}, bins: [bin] })).toMatchObject({ name, unit: null })
  })
})
