import { GF_GEV2, MW_GEV, MZ_GEV, SIN2_THETA_W_EFF } from '../constants'
import type { CkmChoice } from './couplings'
import { DOWN_TYPE, quarkZCoupling2, vSquared, zCouplings } from './couplings'

/**
 * Leading-order partial widths of the W and Z from the same couplings the production kernels
 * use (massless fermions, no QCD or electroweak corrections). Formulas: Ellis–Stirling–Webber,
 * "QCD and Collider Physics", ch. 9 (and PDG 2024 review "Electroweak model and constraints on
 * new physics"): Γ(W → f f̄′) = N_c |V|² G_F M_W³/(6√2 π),
 * Γ(Z → f f̄) = N_c (g_V² + g_A²) G_F M_Z³/(6√2 π). At LO the hadronic widths come out a few per
 * cent below the measured ones, because the QCD factor 1 + α_s/π is missing (common practice).
 * All widths in GeV.
 */

const widthScale = (massGeV: number) => GF_GEV2 * massGeV ** 3 / (6 * Math.SQRT2 * Math.PI)

/**
 * Γ(W → ℓν) for one lepton flavour, in GeV: G_F M_W³/(6√2 π).
 * @example wLeptonicWidthGeV() // ≈ 0.2271
 */
export function wLeptonicWidthGeV(massGeV = MW_GEV): number {
  return widthScale(massGeV)
}

/**
 * Γ(W → hadrons) in GeV: 3 Σ_{i ∈ u, c} Σ_{j ∈ d, s, b} |V_ij|² · G_F M_W³/(6√2 π) (top excluded
 * by phase space).
 * @example wHadronicWidthGeV() // ≈ 1.363
 */
export function wHadronicWidthGeV(massGeV = MW_GEV, ckm: CkmChoice = 'pdg'): number {
  let sum = 0
  for (const up of [2, 4]) for (const down of DOWN_TYPE) sum += vSquared(up, down, ckm)
  return 3 * sum * widthScale(massGeV)
}

/**
 * Γ(Z → ℓ⁺ℓ⁻) for one charged-lepton flavour, in GeV.
 * @example zChargedLeptonWidthGeV() // ≈ 0.0834
 */
export function zChargedLeptonWidthGeV(massGeV = MZ_GEV, sin2ThetaW = SIN2_THETA_W_EFF): number {
  const { gV, gA } = zCouplings(-0.5, -1, sin2ThetaW)
  return (gV * gV + gA * gA) * widthScale(massGeV)
}

/**
 * Γ(Z → νν̄) for one neutrino flavour, in GeV (g_V = g_A = ½).
 * @example 3 * zNeutrinoWidthGeV() // invisible width ≈ 0.498
 */
export function zNeutrinoWidthGeV(massGeV = MZ_GEV): number {
  return 0.5 * widthScale(massGeV)
}

/**
 * Γ(Z → hadrons) in GeV: 3 Σ_{q ∈ u, d, s, c, b} (g_V² + g_A²) · G_F M_Z³/(6√2 π).
 * @example zHadronicWidthGeV() // ≈ 1.674
 */
export function zHadronicWidthGeV(massGeV = MZ_GEV, sin2ThetaW = SIN2_THETA_W_EFF): number {
  let sum = 0
  for (const q of [1, 2, 3, 4, 5]) sum += quarkZCoupling2(q, sin2ThetaW)
  return 3 * sum * widthScale(massGeV)
}
