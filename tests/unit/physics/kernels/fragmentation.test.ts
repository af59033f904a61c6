import { describe, expect, it } from 'vitest'
import {
  annihilationPropagators, annihilationTerm, effectiveCharge2, evaluateTerm, producedFlavours, quarkZCoupling2,
  semiInclusiveQuarkSumTerm, semiInclusiveYieldTerm
} from '../../../../shared/physics/kernels'
import type { Hadron, XfFunction } from '../../../../shared/physics/kernels'
import type { FlavourScheme } from '../../../../shared/physics/types'
import { expectClose } from '../close'
import { SCHEME5, TOY_XF, TOY_ZD_PI_PLUS } from './fragmentation-fixtures'

// Formulas: PDG review "Fragmentation functions in e⁺e⁻, ep and pp collisions" (LO expressions of
// (1/σ_tot) dσ^h/dz and of the semi-inclusive multiplicity) with the electroweak charges of the
// PDG review "Electroweak model and constraints on new physics", as written in
// shared/physics/README.md, "Hadron production". The toy densities are constants per flavour
// (fragmentation-fixtures.ts) so every number is worked by hand; the arithmetic is in the comments.

const table = (t: Readonly<Record<number, number>>): XfFunction => pdg => t[pdg] ?? 0
const SCHEME3: FlavourScheme = { type: 'fixed', nf: 3, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }

describe('e⁺e⁻ → h X: electroweak charges and produced flavours', () => {
  it('photon exchange gives e_q²; on the Z pole χ₁ = 0 and χ₂ = κ² M_Z²/Γ_Z²', () => {
    expect(effectiveCharge2(2, 100, 'photon')).toBeCloseTo(4 / 9, 15)
    expect(effectiveCharge2(-1, 100, 'photon')).toBeCloseTo(1 / 9, 15)
    // κ = G_F M_Z²/(2√2πα) = 1.1663788e-5 · 8315.2513 / (2√2 π / 137.035999) = 0.0969871 / 0.0648428 = 1.4957355
    // χ₂(M_Z²) = κ² M_Z²/Γ_Z² = 2.2372249 · 8315.2513 / 2.4955² = 18603.13 / 6.2275 = 2987.238
    const pole = annihilationPropagators(91.188 ** 2)
    expect(pole.chi1).toBe(0)
    expectClose(pole.chi2, 2987.238, 1e-6)
  })

  it('hand-worked ê_u², ê_d² on the Z pole and at √s = 10.58 GeV', () => {
    // g_V^e = −½ + 2 · 0.23153 = −0.03694, g_V^e² + g_A^e² = 0.0013646 + 0.25 = 0.2513646
    // up: g_V² + g_A² = (½ − 4/3 · 0.23153)² + ¼ = 0.2865931; down: (−½ + 2/3 · 0.23153)² + ¼ = 0.3694716
    // pole: ê_u² = 4/9 + 0.2513646 · 0.2865931 · 2987.238 = 215.6432; ê_d² = 1/9 + 0.2513646 · 0.3694716 · 2987.238 = 277.5421
    expectClose(effectiveCharge2(2, 91.188 ** 2), 215.6432, 1e-6)
    expectClose(effectiveCharge2(1, 91.188 ** 2), 277.5421, 1e-6)
    // s = 111.9364 GeV²: D = (s − M_Z²)² + Γ²M_Z² = 8203.315² + 51783.0 = 6.7346e7,
    // χ₁ = 1.4957355 · 111.9364 · (−8203.315)/D = −0.0203940, χ₂ = 1.4957355² · 111.9364²/D = 4.16236e-4
    // ê_u² = 4/9 − 2 · (2/3) · (−0.03694) · (0.1913067) · (−0.0203940) + 0.2513646 · 0.2865931 · 4.16236e-4 = 0.4442823
    // ê_d² = 1/9 − 2 · (−1/3) · (−0.03694) · (−0.3456533) · (−0.0203940) + 0.2513646 · 0.3694716 · 4.16236e-4 = 0.1109762
    expectClose(effectiveCharge2(2, 10.58 ** 2), 0.4442823, 1e-6)
    expectClose(effectiveCharge2(1, 10.58 ** 2), 0.1109762, 1e-6)
  })

  it.each([
    [3.0, SCHEME5, 3], [3.1, SCHEME5, 4], [10.58, SCHEME5, 5], [91.188, SCHEME5, 5], [400, { ...SCHEME5, nf: 6 as const }, 6], [91.188, SCHEME3, 3]
  ])('√s = %s GeV produces the quarks with 2 m_q < √s (capped by the scheme\'s n_f)', (sqrtS, scheme, n) => {
    // 2 m_c = 3.02 GeV, 2 m_b = 9.84 GeV, 2 m_t = 345 GeV
    expect(producedFlavours(sqrtS, scheme)).toBe(n)
  })
})

describe('e⁺e⁻ → h X: (1/σ_tot) dσ^h/dz', () => {
  const zd = table(TOY_ZD_PI_PLUS)

  it('hand-worked value at z = 0.5, √s = 10.58 GeV, photon exchange, five flavours', () => {
    // Σ e_q² (zD_q + zD_q̄) = 4/9 (0.5 + 0.2) + 1/9 (0.2 + 0.5) + 1/9 (0.2 + 0.2) + 4/9 (0.02 + 0.02) + 1/9 (0.01 + 0.01)
    //                      = (2.8 + 0.7 + 0.4 + 0.16 + 0.02)/9 = 4.08/9; Σ e_q² = 11/9; ÷ z: 2 · 4.08/11 = 0.7418182
    const t = annihilationTerm(0.5, 10.58, { exchange: 'photon', scheme: SCHEME5 })
    expectClose(evaluateTerm(t, zd), 8.16 / 11, 1e-14)
    expect(t.mu2GeV2).toBeCloseTo(10.58 ** 2, 10)
  })

  it('with a three-flavour set only u, d, s are produced', () => {
    // (2.8 + 0.7 + 0.4)/9 over 6/9, ÷ z = 0.5: 2 · 3.9/6 = 1.3
    expectClose(evaluateTerm(annihilationTerm(0.5, 91.188, { exchange: 'photon', scheme: SCHEME3 }), zd), 1.3, 1e-14)
  })

  it('hand-worked value on the Z pole with γ/Z exchange', () => {
    // Σ ê² = 2 · 215.6432 + 3 · 277.5421 = 1263.913; w_u = 0.1706156, w_d = 0.2195896
    // 2 · [w_u (0.7 + 0.04) + w_d (0.7 + 0.4 + 0.02)] = 2 · (0.1262555 + 0.2459404) = 0.7443918
    expectClose(evaluateTerm(annihilationTerm(0.5, 91.188, { scheme: SCHEME5 }), zd), 0.7443918, 1e-6)
  })

  it('on the Z pole the flavour weights are the hadronic branching fractions Γ(Z → qq̄)/Γ(Z → hadrons) up to the photon (independent check)', () => {
    // Γ_q ∝ g_V^q² + g_A^q² (widths.ts); the photon and γ/Z terms add e_q² ≈ 0.2 % of ê_q² on the pole.
    const t = annihilationTerm(0.3, 91.188, { scheme: SCHEME5 })
    const sum = [1, 2, 3, 4, 5].reduce((s, q) => s + quarkZCoupling2(q), 0)
    for (const q of [1, 2, 3, 4, 5]) expectClose(t.weights.get(q)!, quarkZCoupling2(q) / sum, 2e-3)
    expect([...t.weights.values()].reduce((a, b) => a + b, 0)).toBeCloseTo(2, 14)
  })

  it('refuses z outside (0, 1) and a non-positive √s', () => {
    expect(() => annihilationTerm(1, 10, { scheme: SCHEME5 })).toThrow('z = 1 must lie in (0, 1)')
    expect(() => annihilationTerm(0.5, 0, { scheme: SCHEME5 })).toThrow('√s = 0 GeV must be positive')
  })
})

describe('semi-inclusive DIS multiplicity M^h at x = 0.1, z = 0.4, Q² = 10 GeV²', () => {
  const xf = table(TOY_XF)
  const zd = table(TOY_ZD_PI_PLUS)
  const multiplicity = (target: Hadron, combination?: 'same' | 'conjugate' | 'difference') =>
    evaluateTerm(semiInclusiveYieldTerm(0.1, 0.4, 10, { target, combination }), xf, zd) / evaluateTerm(semiInclusiveQuarkSumTerm(0.1, 0.4, 10, { target }), xf)

  // Proton: Σ e² xq zD = 4/9 (0.6 · 0.5 + 0.1 · 0.2) + 1/9 (0.3 · 0.2 + 0.12 · 0.5 + 0.05 · 0.2 + 0.05 · 0.2) = (1.28 + 0.14)/9 = 1.42/9
  //         Σ e² xq    = 4/9 (0.6 + 0.1) + 1/9 (0.3 + 0.12 + 0.05 + 0.05) = (2.8 + 0.52)/9 = 3.32/9
  //         M^{π⁺} = (1.42/9)/(x z) ÷ (3.32/9)/x = 1.42/(0.4 · 3.32) = 1.0692771
  // π⁻ by charge conjugation (D_u^{π⁻} = D_ū^{π⁺} = 0.2, D_ū^{π⁻} = 0.5, D_d^{π⁻} = 0.5, D_d̄^{π⁻} = 0.2):
  //         4/9 (0.6 · 0.2 + 0.1 · 0.5) + 1/9 (0.3 · 0.5 + 0.12 · 0.2 + 0.01 + 0.01) = (0.68 + 0.194)/9 = 0.874/9 → M^{π⁻} = 0.874/1.328 = 0.6581325
  // Neutron (u ↔ d): 4/9 (0.3 · 0.5 + 0.12 · 0.2) + 1/9 (0.6 · 0.2 + 0.1 · 0.5 + 0.02) = 0.886/9 over 4/9 · 0.42 + 1/9 · 0.8 = 2.48/9 → 0.886/0.992
  // Deuteron per nucleon: ½(1.42 + 0.886)/9 over ½(3.32 + 2.48)/9 → 1.153/(0.4 · 2.9) = 0.9939655
  it.each([
    ['proton', { type: 'proton' } as Hadron, 1.42 / 1.328],
    ['neutron', { type: 'neutron' } as Hadron, 0.886 / 0.992],
    ['deuteron (Z = 1, A = 2)', { type: 'nucleus', z: 1, a: 2 } as Hadron, 1.153 / 1.16],
    ['isoscalar', { type: 'isoscalar' } as Hadron, 1.153 / 1.16]
  ])('M^{π⁺} on a %s target', (_name, target, expected) => {
    expectClose(multiplicity(target), expected, 1e-14)
  })

  it('π⁻ by charge conjugation, the ratio M^{π⁺}/M^{π⁻} and the difference M^{π⁺} − M^{π⁻}', () => {
    const proton: Hadron = { type: 'proton' }
    expectClose(multiplicity(proton, 'conjugate'), 0.874 / 1.328, 1e-14)
    expectClose(multiplicity(proton) / multiplicity(proton, 'conjugate'), 1.42 / 0.874, 1e-14)
    // (1.42 − 0.874)/1.328 = 0.546/1.328 = 0.4111446
    expectClose(multiplicity(proton, 'difference'), 0.546 / 1.328, 1e-13)
  })

  it('takes both densities at μ_F² = Q² and refuses points outside the domain', () => {
    const t = semiInclusiveYieldTerm(0.1, 0.4, 10)
    expect([t.x1, t.x2, t.mu2GeV2]).toEqual([0.1, 0.4, 10])
    expect(() => semiInclusiveYieldTerm(0.1, 1.2, 10)).toThrow('z = 1.2 must lie in (0, 1)')
    expect(() => semiInclusiveQuarkSumTerm(0, 0.4, 10)).toThrow('x = 0 must lie in (0, 1)')
  })
})
