import { describe, expect, it } from 'vitest'
import { CKM, GAMMA_W_GEV, GAMMA_Z_GEV, HBARC2_PB_GEV2, MW_GEV, MZ_GEV, PROTON_MASS_GEV, ckmSquared } from '../../../../shared/physics/constants'
import { wHadronicWidthGeV, wLeptonicWidthGeV, zChargedLeptonWidthGeV, zHadronicWidthGeV, zNeutrinoWidthGeV } from '../../../../shared/physics/kernels'
import { expectClose } from '../close'

// Most constants are PDG 2024 values quoted from memory (constants.ts); these tests check them
// against relations that hold independently of the recalled digits, and check the LO
// couplings through the partial widths they imply. The few confirmed on stored PDG pages are
// checked against the printed digits.

describe('physical constants', () => {
  it.each([
    ['M_Z (GeV)', MZ_GEV, 91.1880, 'PDG Live "Z" listing, Z MASS 91.1880 ± 0.0020 GeV, pdglive.lbl.gov/Particle.action?node=S044'],
    ['Γ_Z (GeV)', GAMMA_Z_GEV, 2.4955, 'PDG Live "Z" listing, Z WIDTH 2.4955 ± 0.0023 GeV, pdglive.lbl.gov/Particle.action?node=S044'],
    ['m_p (GeV)', PROTON_MASS_GEV, 0.93827208816, 'PDG 2022 Table 1.1 "Physical Constants": m_p = 938.272 088 16(29) MeV'],
    ['(ħc)² (GeV² mb)', HBARC2_PB_GEV2 / 1e9, 0.3893793721, 'PDG 2022 Table 1.1 "Physical Constants": (ħc)² = 0.389 379 372 1 GeV² mbarn']
  ])('%s is the printed value %f (%s)', (_label, value, printed) => {
    expectClose(value, printed, 1e-12)
  })

  it('(ħc)² in pb GeV² equals the square of ħc = 197.326 980 4 MeV fm (PDG 2022 Table 1.1 "Physical Constants", exact since the 2019 SI), with 1 fm² = 10 mb and 1 mb = 10⁹ pb', () => {
    // (0.1973269804 GeV fm)² · 10 mb/fm² · 10⁹ pb/mb = 3.893793721e8 pb GeV²; the ten printed
    // digits of ħc fix (ħc)² to about 1e-10, so the check is two-sided at 1e-9.
    expectClose(HBARC2_PB_GEV2, 0.1973269804 ** 2 * 10 * 1e9, 1e-9)
    expectClose(HBARC2_PB_GEV2, 3.893793721e8, 1e-9)
  })

  it('the CKM rows of the PDG 2024 global fit are unitary to 1e-5 (review "CKM quark-mixing matrix": the fit imposes unitarity)', () => {
    for (const row of ['u', 'c', 't'] as const) {
      const sum = (['d', 's', 'b'] as const).reduce((s, col) => s + CKM[`${row}${col}`] ** 2, 0)
      expect(Math.abs(sum - 1)).toBeLessThan(1e-5)
    }
  })

  it('M_W/M_Z agrees with the PDG W/Z mass ratio 0.88147 ± 0.00013 (pdglive, W/Z mass ratio from the world averages) within 2σ', () => {
    expect(Math.abs(MW_GEV / MZ_GEV - 0.88147)).toBeLessThan(2 * 0.00013)
  })

  it('ckmSquared: PDG magnitudes squared, the unit matrix with diagonal, RangeError for a non-(up, down) pair', () => {
    expect(ckmSquared(2, 3)).toBeCloseTo(0.22501 ** 2, 15)
    expect(ckmSquared(-4, 3)).toBeCloseTo(0.97349 ** 2, 15)
    expect(ckmSquared(2, 1, true)).toBe(1)
    expect(ckmSquared(2, 3, true)).toBe(0)
    expect(() => ckmSquared(2, 4)).toThrow(RangeError)
  })
})

describe('LO partial widths from the kernels\' couplings against the PDG 2024 values (from memory)', () => {
  // At LO the hadronic widths lack the QCD factor 1 + α_s/π ≈ 1.038 and come out a few per cent
  // low (common practice); the leptonic ones agree to about 1% (electroweak corrections).
  it.each([
    // [quantity, LO value, PDG value, lower ratio, upper ratio, PDG entry]
    ['Γ(Z → ℓ⁺ℓ⁻)', () => zChargedLeptonWidthGeV(), 0.083984, 0.98, 1.0, 'PDG 2024 Z: Γ(ℓ⁺ℓ⁻) = 83.984 ± 0.086 MeV'],
    ['Γ(Z → invisible) = 3 Γ(νν̄)', () => 3 * zNeutrinoWidthGeV(), 0.4990, 0.99, 1.01, 'PDG 2024 Z: Γ(invisible) = 499.0 ± 1.5 MeV'],
    ['Γ(Z → hadrons)', () => zHadronicWidthGeV(), 1.7444, 0.94, 0.98, 'PDG 2024 Z: Γ(hadrons) = 1744.4 ± 2.0 MeV'],
    ['Γ(W → ℓν)', () => wLeptonicWidthGeV(), 0.1086 * 2.085, 0.99, 1.01, 'PDG 2024 W: B(ℓν) = 10.86 ± 0.09 %, Γ = 2.085 GeV'],
    ['Γ(W → hadrons)', () => wHadronicWidthGeV(), 0.6741 * 2.085, 0.94, 0.99, 'PDG 2024 W: B(hadrons) = 67.41 ± 0.27 %, Γ = 2.085 GeV']
  ])('%s', (_name, lo, pdg, low, high) => {
    const ratio = (lo as () => number)() / (pdg as number)
    expect(ratio).toBeGreaterThan(low as number)
    expect(ratio).toBeLessThan(high as number)
  })

  it('the hadronic widths move to within 1% of PDG once multiplied by 1 + α_s/π with α_s(M_Z) = 0.118 (common practice: the NLO QCD correction)', () => {
    const k = 1 + 0.118 / Math.PI
    expect(Math.abs(zHadronicWidthGeV() * k / 1.7444 - 1)).toBeLessThan(0.01)
    expect(Math.abs(wHadronicWidthGeV() * k / (0.6741 * 2.085) - 1)).toBeLessThan(0.01)
  })

  it.each([
    // Γ_W = 3 Γ(ℓν) + K Γ(hadrons); Γ_Z = 3 Γ(ℓℓ) + 3 Γ(νν̄) + K Γ(hadrons), K = 1 + α_s/π
    ['Γ_W', () => 3 * wLeptonicWidthGeV() + (1 + 0.118 / Math.PI) * wHadronicWidthGeV(), () => GAMMA_W_GEV],
    ['Γ_Z', () => 3 * zChargedLeptonWidthGeV() + 3 * zNeutrinoWidthGeV() + (1 + 0.118 / Math.PI) * zHadronicWidthGeV(), () => GAMMA_Z_GEV]
  ])('the total width %s of constants.ts is the sum of the partial widths (with the NLO QCD factor) to 1%', (_name, sum, total) => {
    expect(Math.abs(sum() / total() - 1)).toBeLessThan(0.01)
  })

  it('hand-worked: Γ(W → ℓν) = G_F M_W³/(6√2π) = 1.1663788e-5 · 80.3692³ / 26.6573 = 0.227139 GeV', () => {
    // 80.3692³ = 519 121.6; × 1.1663788e-5 = 6.05492; / (6√2π = 26.65730) = 0.227139
    expect(wLeptonicWidthGeV()).toBeCloseTo(0.227139, 5)
  })
})
