import { describe, expect, it } from 'vitest'
import { etaGammaZ, gammaZWeights, ncTerm } from '../../../../shared/physics/kernels'
import type { XfFunction } from '../../../../shared/physics/kernels'
import { evaluateTerm } from '../../../../shared/physics/kernels/terms'
import { checkStudySpec } from '../../../../shared/physics/study'
import { expectClose } from '../close'

// Neutral-current DIS with γ, γ/Z interference and Z exchange at LO, unpolarised leptons
// (PDG 2024 review "Structure functions", the NC structure functions F₂^{γZ}, F₂^Z, xF₃^{γZ},
// xF₃^Z with the propagator ratios η_γZ and η_Z = η_γZ²; equation numbers not quoted, from
// memory). Constants as in shared/physics/constants.ts: G_F = 1.1663788e-5 GeV⁻², M_Z = 91.188 GeV,
// α = 1/137.035999084, sin²θ_eff = 0.23153.

const toy: Record<number, number> = { 2: 0.3, [-2]: 0.1, 1: 0.2, [-1]: 0.12, 21: 1 }
const xf: XfFunction = pdg => toy[pdg] ?? 0

describe('γ/Z exchange in neutral-current DIS', () => {
  it('hand-worked η_γZ at Q² = M_Z²: G_F M_Z²/(2√2πα) · ½', () => {
    // G_F M_Z² = 1.1663788e-5 · 8315.251 = 0.0969873; 2√2πα = 8.885766 / 137.035999 = 0.0648426
    // ratio 1.495736; at Q² = M_Z² times ½ → 0.747868
    expectClose(etaGammaZ(91.188 ** 2), 0.747868, 2e-6)
  })

  it('hand-worked σ_r for e⁻p and e⁺p at x = 0.1, Q² = 10⁴ GeV², √s = 318 GeV (u, d, ū, d̄ only)', () => {
    // η_γZ = 1.495736 · 10⁴/(10⁴ + 8315.251) = 1.495736 · 0.545993 = 0.816661; η_Z = 0.666935
    // electron: g_V^e = −½ + 2·0.23153 = −0.03694, g_A^e = −½; g_V^e² + g_A^e² = 0.251365
    // u: e = 2/3, g_V = ½ − (4/3)0.23153 = 0.191293, g_A = ½; g_V² + g_A² = 0.286593
    // d: e = −1/3, g_V = −½ + (2/3)0.23153 = −0.345647, g_A = −½; g_V² + g_A² = 0.369472
    // F̃₂ weight A_q = e² − g_V^e η_γZ 2e g_V + (g_V^e² + g_A^e²) η_Z (g_V² + g_A²):
    //  u: 0.444444 + 0.03694·0.816661·0.255057 + 0.251365·0.666935·0.286593
    //     = 0.444444 + 0.007695 + 0.048046 = 0.500185
    //  d: 0.111111 + 0.03694·0.816661·0.230431 + 0.251365·0.666935·0.369472
    //     = 0.111111 + 0.006952 + 0.061941 = 0.180004
    // xF̃₃ weight B_q = −g_A^e η_γZ 2e g_A + 2g_V^e g_A^e η_Z 2 g_V g_A:
    //  u: 0.5·0.816661·0.666667 + 0.03694·0.666935·0.191293 = 0.272220 + 0.004713 = 0.276933
    //  d: 0.5·0.816661·0.333333 + 0.03694·0.666935·0.345647 = 0.136110 + 0.008516 = 0.144626
    // F̃₂ = 0.500185·(0.3 + 0.1) + 0.180004·(0.2 + 0.12) = 0.200074 + 0.057601 = 0.257675
    // xF̃₃ = 0.276933·(0.3 − 0.1) + 0.144626·(0.2 − 0.12) = 0.055387 + 0.011570 = 0.066957
    // y = Q²/(x s) = 10⁴/(0.1 · 101124) = 0.988885; Y₊ = 1 + 0.011115² = 1.000124; Y₋ = 0.999876
    // σ_r^∓ = 0.257675 ± 0.999752 · 0.066957 = 0.324615 (e⁻), 0.190735 (e⁺)
    const at = { sqrtSGeV: 318, exchange: 'gamma-z' as const }
    const eMinus = evaluateTerm(ncTerm('reduced', 0.1, 1e4, { ...at, lepton: 'electron' }), xf)
    const ePlus = evaluateTerm(ncTerm('reduced', 0.1, 1e4, { ...at, lepton: 'positron' }), xf)
    expectClose(eMinus, 0.324615, 2e-5)
    expectClose(ePlus, 0.190735, 2e-5)
    // F̃₂ alone (F2 observable) and the photon-only F₂ = 4/9·0.4 + 1/9·0.32 = 0.213333
    expectClose(evaluateTerm(ncTerm('F2', 0.1, 1e4, at), xf), 0.257675, 2e-5)
    expectClose(evaluateTerm(ncTerm('F2', 0.1, 1e4), xf), 0.213333, 2e-6)
  })

  it('limit Q² ≪ M_Z²: γ/Z gives the photon-only result (Q² = 10 GeV², to 10⁻³)', () => {
    const photon = evaluateTerm(ncTerm('reduced', 0.01, 10, { sqrtSGeV: 318 }), xf)
    const both = evaluateTerm(ncTerm('reduced', 0.01, 10, { sqrtSGeV: 318, exchange: 'gamma-z', lepton: 'positron' }), xf)
    expect(Math.abs(both / photon - 1)).toBeLessThan(1e-3)
    expect(both).not.toBe(photon)
    // the weights tend to e_q² and 0
    expectClose(gammaZWeights(1e-3).f2.get(2)!, 4 / 9, 1e-6)
    expect(Math.abs(gammaZWeights(1e-3).xf3.get(1)!)).toBeLessThan(1e-6)
  })

  it('the cross-section form uses the same combination times 2πα² Y₊/(x Q⁴)', () => {
    const o = { sqrtSGeV: 318, exchange: 'gamma-z' as const, lepton: 'electron' as const }
    const r = ncTerm('reduced', 0.1, 1e4, o)
    const d = ncTerm('d2sigma', 0.1, 1e4, o)
    expect(d.weights).toEqual(r.weights)
    const y = 1e4 / (0.1 * 318 ** 2)
    expectClose(d.factor, 2 * Math.PI / 137.035999084 ** 2 / (0.1 * 1e8) * (1 + (1 - y) ** 2) * 3.893793721e8, 1e-9)
  })

  it('photon exchange stays the default; γ/Z in a cross-section needs the lepton, located at options.lepton', () => {
    expect(() => ncTerm('reduced', 0.1, 1e4, { sqrtSGeV: 318, exchange: 'gamma-z' })).toThrow(/lepton/)
    const r = checkStudySpec({ kernel: 'dis-nc-reduced', options: { sqrtSGeV: 318, exchange: 'gamma-z' }, bins: [{ x: 0.1, q2: 1e4 }] })
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.issues[0]!.message).toMatch(/^option lepton: γ\/Z exchange needs the lepton/)
    expect(checkStudySpec({ kernel: 'dis-nc-reduced', options: { sqrtSGeV: 318, exchange: 'gamma-z', lepton: 'positron' }, bins: [{ x: 0.1, q2: 1e4 }] }).ok).toBe(true)
  })
})
