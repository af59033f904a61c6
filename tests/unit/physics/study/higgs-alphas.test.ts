import { describe, expect, it } from 'vitest'
import { makeAlphas } from '../../../../shared/physics/alphas'
import { toyErrorSet, toyQ2Nodes, toyXNodes } from '../../../../shared/physics/sets'
import { buildPlan, evaluatePlan, memberAlphasFunctions, parseStudySpec, scaleVariation } from '../../../../shared/physics/study'
import { computeBands } from '../../../../shared/physics/uncertainty'
import type { ErrorSet, FlavourScheme } from '../../../../shared/physics/types'
import { expectClose } from '../close'

// gg → H at LO is σ₀ x₁g x₂g with σ₀ ∝ α_s(μ_R²)² (H. M. Georgi et al., Phys. Rev. Lett. 40 (1978)
// 692, from memory; shared/physics/README.md, "Higgs"). A toy set whose α_s members carry the
// central densities but α_s(M_Z) = 0.116 and 0.120 must therefore give exactly
// (α_s(M_H)^±/α_s(M_H)⁰)² times the central value.

const scheme: FlavourScheme = { type: 'variable', nf: 5, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const base = toyErrorSet({
  kind: 'hessian-pairs', errorMembers: 1, x: toyXNodes(30, 1e-5, 0.95),
  q2: toyQ2Nodes({ q2MinGeV2: 1, q2MaxGeV2: 1e5, count: 20, thresholdsGeV2: [1.51 ** 2, 4.92 ** 2] }), scheme
})
// members: 0 central, 1–2 the eigenvector pair, 3 α_s down (0.116), 4 α_s up (0.120), both with
// the central densities
const set: ErrorSet = {
  ...base,
  members: [...base.members, base.members[0]!, base.members[0]!],
  header: { ...base.header, memberCount: 5, alphasMembers: [3, 4], alphasMz: [0.118, 0.118, 0.118, 0.116, 0.120] }
}

// Hand-worked one-loop running from M_Z to M_H with n_f = 5 (m_b < M_Z < M_H < m_t), ESW ch. 2 /
// PDG "Quantum chromodynamics": 1/α_s(M_H²) = 1/α_s(M_Z²) + (β₀/4π) ln(M_H²/M_Z²), β₀ = 11 − 2·5/3
// = 23/3. M_Z = 91.188 GeV, M_H = 125.2 GeV (the engine's constants, PDG): ln(M_H²/M_Z²) =
// 2 · 0.316989 = 0.633978; (23/3)/(4π) = 0.610094; shift = 0.610094 · 0.633978 = 0.386786
// α_s⁰(M_H) = 1/(8.474576 + 0.386786) = 1/8.861362 = 0.112849
// α_s⁺(M_H) = 1/(8.333333 + 0.386786) = 1/8.720120 = 0.114677
// α_s⁻(M_H) = 1/(8.620690 + 0.386786) = 1/9.007476 = 0.111019
const shift = (23 / 3) / (4 * Math.PI) * Math.log((125.2 / 91.188) ** 2)
const asMH = (asMZ: number) => 1 / (1 / asMZ + shift)
const ratioUp = (asMH(0.120) / asMH(0.118)) ** 2
const ratioDown = (asMH(0.116) / asMH(0.118)) ** 2

describe('gg → H: each member runs with its own α_s(M_Z)', () => {
  const centralAlphas = makeAlphas({ value: 0.118, scaleGeV2: 91.188 ** 2 }, scheme)
  const spec = parseStudySpec({ kernel: 'higgs-ggf', options: { sqrtSGeV: 13000 }, bins: [{ y: 0 }, { yMin: 0.5, yMax: 1.5 }] })

  it('the hand-worked running is what the printed digits say', () => {
    expectClose(shift, 0.386786, 2e-6)
    expectClose([asMH(0.118), asMH(0.120), asMH(0.116)], [0.112849, 0.114677, 0.111019], 5e-6)
    // (0.114677/0.112849)² = 1.032657, (0.111019/0.112849)² = 0.967820
    expectClose([ratioUp, ratioDown], [1.032657, 0.967820], 5e-6)
  })

  it('α_s members scale by (α_s(M_H)^±/α_s(M_H)⁰)², and the α_s part of the band is no longer 0', () => {
    const plan = buildPlan(spec, set, { alphas: centralAlphas })
    const v = evaluatePlan(plan, set.members, undefined, { memberAlphas: memberAlphasFunctions(set.header) })
    const nBins = 2
    for (let b = 0; b < nBins; b++) {
      expectClose(v[3 * nBins + b]! / v[b]!, ratioDown, 1e-12)
      expectClose(v[4 * nBins + b]! / v[b]!, ratioUp, 1e-12)
    }
    const band = computeBands({ members: 5, bins: 2, values: v }, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', alphasMembers: [3, 4] })
    // ½|X⁺ − X⁻| = ½ X⁰ (ratioUp − ratioDown)
    expectClose(band.alphas![0]!, 0.5 * v[0]! * (ratioUp - ratioDown), 1e-12)
    expect(band.alphas![0]!).toBeGreaterThan(0.03 * v[0]!)
  })

  it('without per-member α_s every member uses the central value (the old behaviour)', () => {
    const plan = buildPlan(spec, set, { alphas: centralAlphas })
    const v = evaluatePlan(plan, set.members)
    expectClose(v[4 * 2]!, v[0]!, 1e-15)
  })

  it('evaluating in chunks gives the same as all at once (the worker evaluates chunks)', () => {
    const plan = buildPlan(spec, set, { alphas: centralAlphas })
    const all = memberAlphasFunctions(set.header)
    const whole = evaluatePlan(plan, set.members, undefined, { memberAlphas: all })
    const tail = evaluatePlan(plan, set.members.slice(3), undefined, { memberAlphas: all.slice(3) })
    expectClose(tail, whole.subarray(3 * 2), 0, 0)
    expect(() => evaluatePlan(plan, set.members, undefined, { memberAlphas: all.slice(1) })).toThrow(/one per member/)
  })

  it('μ_R = κ_R M_H moves α_s only: κ_R = 2 scales by (α_s(4M_H²)/α_s(M_H²))²', () => {
    const at2 = parseStudySpec({ ...spec, renormalisationScaleFactor: 2 })
    const v1 = evaluatePlan(buildPlan(spec, set, { alphas: centralAlphas }), [set.members[0]!])
    const v2 = evaluatePlan(buildPlan(at2, set, { alphas: centralAlphas }), [set.members[0]!])
    // The set's scheme stops at n_f = 5, so β₀ = 23/3 all the way:
    // 1/α_s(4M_H²) = 1/α_s(M_H²) + (23/3)/(4π) ln 4 = 8.861362 + 0.845770 = 9.707132;
    // (8.861362/9.707132)² = 0.833334
    const invMH = 1 / asMH(0.118)
    const inv2MH = invMH + (23 / 3) / (4 * Math.PI) * Math.log(4)
    expectClose(v2[0]! / v1[0]!, (invMH / inv2MH) ** 2, 1e-12)
    expectClose(v2[0]! / v1[0]!, 0.833334, 1e-6)
  })

  it('scale variation of gg → H is the 7-point μ_F, μ_R variation; μ_R moves α_s, μ_F the densities', () => {
    const v = scaleVariation(spec, set, set.members[0]!, { alphas: centralAlphas })
    expect(v.variation).toBe('7-point μ_F, μ_R')
    // common practice: (κ_F, κ_R) ∈ {(1,1), (½,½), (½,1), (1,½), (1,2), (2,1), (2,2)}
    expect(v.points).toEqual([{ muF: 1, muR: 1 }, { muF: 0.5, muR: 0.5 }, { muF: 0.5, muR: 1 }, { muF: 1, muR: 0.5 }, { muF: 1, muR: 2 }, { muF: 2, muR: 1 }, { muF: 2, muR: 2 }])
    const nominal = v.nominal[0]!
    // (1, 2): μ_F fixed, so the ratio is (α_s(4M_H²)/α_s(M_H²))² = 0.833334 (worked above)
    expectClose(v.pointValues[4 * 2]! / nominal, 0.833334, 1e-6)
    // (1, ½): 1/α_s(M_H²/4) = 8.861362 − 0.845770 = 8.015593 → (8.861362/8.015593)² = 1.222165
    const invMH = 1 / asMH(0.118)
    expectClose(v.pointValues[3 * 2]! / nominal, (invMH / (invMH - (23 / 3) / (4 * Math.PI) * Math.log(4))) ** 2, 1e-12)
    expectClose(v.pointValues[3 * 2]! / nominal, 1.222165, 1e-6)
    // the band is the envelope: μ_R = M_H/2 alone already raises σ by 22 %
    expect(v.up[0]!).toBeGreaterThanOrEqual(v.pointValues[3 * 2]! - nominal)
    expect(v.down[0]!).toBeGreaterThanOrEqual(nominal - v.pointValues[4 * 2]!)
    // the μ_F-only rows (κ_R = 1) are kept for the 3-row view
    expect(v.kappas).toEqual([0.5, 1, 2])
    expect(v.values[2 * 2]).toBe(v.pointValues[5 * 2])
    expect(v.values[0]).toBe(v.pointValues[2 * 2])
  })

  it('a kernel without α_s keeps the 3-point μ_F variation', () => {
    const w = scaleVariation(parseStudySpec({ kernel: 'w-plus', options: { sqrtSGeV: 13000 }, bins: [{ y: 0 }] }), set, set.members[0]!)
    expect(w.variation).toBe('3-point μ_F')
    expect(w.points).toHaveLength(3)
  })
})
