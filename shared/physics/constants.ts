/**
 * Physical constants of the Sheaf engine, in natural units (GeV, ħ = c = 1) unless a name says
 * otherwise. One module so every kernel uses the same numbers.
 *
 * Source: Particle Data Group, "Review of Particle Physics", S. Navas et al., Phys. Rev. D 110
 * (2024) 030001 ("PDG 2024"): the "Physical constants" table (α, (ħc)², m_p, G_F), the Summary
 * Tables of gauge and Higgs bosons (M_W, Γ_W, M_Z, Γ_Z, M_H), the review "Electroweak model and
 * constraints on new physics" (sin²θ_W) and the review "CKM quark-mixing matrix" (|V_ij|).
 * Only some values could be checked from this machine, against stored copies of PDG pages found
 * with the project's search tool; each such value names its page (title and address) beside it.
 * Every other value is quoted **from memory** of PDG 2024 and is marked so; a reviewer with the
 * book at hand should confirm the last digits. (The stored PDG Live pages on the W show other
 * editions' numbers — W mass "OUR FIT" 80.379 ± 0.012 GeV, node S043M; W width "OUR AVERAGE"
 * 2.14 ± 0.05 GeV, node S043W — so M_W and Γ_W stay from memory.) Uncertainties are given beside
 * each value for the reader; the engine uses central values only.
 */

/**
 * Fine-structure constant α at zero momentum transfer (Thomson limit), dimensionless.
 * PDG 2024 physical constants (CODATA): α⁻¹ = 137.035 999 084(21) — from memory.
 * The LO kernels use α(0); running α(Q²) is not included (documented in each kernel).
 * @example 1 / ALPHA_EM // 137.035999084
 */
export const ALPHA_EM = 1 / 137.035999084

/**
 * Fermi coupling constant G_F/(ħc)³ in GeV⁻².
 * PDG 2024 physical constants: 1.166 378 8(6) × 10⁻⁵ GeV⁻² — from memory.
 * @example GF_GEV2 * 1e5 // 1.1663788
 */
export const GF_GEV2 = 1.1663788e-5

/**
 * W boson mass in GeV. PDG 2024 Summary Table, W mass average 80.3692 ± 0.0133 GeV — from memory.
 * @example MW_GEV // 80.3692
 */
export const MW_GEV = 80.3692

/**
 * W boson total width in GeV. PDG 2024 Summary Table: 2.085 ± 0.042 GeV — from memory.
 * Used only for comparisons (the W kernels are narrow-width).
 */
export const GAMMA_W_GEV = 2.085

/**
 * Z boson mass in GeV: 91.1880 ± 0.0020 GeV, as printed on the stored PDG Live page
 * "GAUGE AND HIGGS BOSONS — Z" (Z MASS), http://pdglive.lbl.gov/Particle.action?node=S044&init=0
 * (the page names no edition; these are the PDG 2024 numbers).
 * @example MZ_GEV // 91.188
 */
export const MZ_GEV = 91.188

/**
 * Z boson total width in GeV: 2.4955 ± 0.0023 GeV, as printed on the stored PDG Live page
 * "GAUGE AND HIGGS BOSONS — Z" (Z WIDTH), http://pdglive.lbl.gov/Particle.action?node=S044&init=0.
 * Used only for comparisons (the Z kernel is narrow-width).
 */
export const GAMMA_Z_GEV = 2.4955

/**
 * Higgs boson mass in GeV. PDG 2024 Summary Table: 125.20 ± 0.11 GeV — from memory.
 */
export const MH_GEV = 125.2

/**
 * Effective leptonic weak mixing angle sin²θ_eff^ℓ (the Z-pole "effective" scheme), dimensionless.
 * PDG 2024 electroweak review, Z-pole average: 0.23153 ± 0.00004 — from memory.
 * This is the scheme the LO Z couplings g_V = T₃ − 2 e_q sin²θ use: it absorbs the bulk of the
 * electroweak corrections to the Z–fermion vertex (common practice).
 */
export const SIN2_THETA_W_EFF = 0.23153

/**
 * Weak mixing angle in the MS-bar scheme at μ = M_Z, ŝ²_Z, dimensionless.
 * PDG 2024 electroweak review, global fit: 0.23129 ± 0.00004 — from memory. Not used by the
 * kernels (they use {@link SIN2_THETA_W_EFF}); kept so callers can compare schemes.
 */
export const SIN2_THETA_W_MSBAR = 0.23129

/**
 * Conversion constant (ħc)² in pb·GeV²: a cross-section in GeV⁻² times this is in pb.
 * (ħc)² = 0.389 379 372 1… GeV² mbarn (exact since the 2019 SI), as printed in PDG "1. Physical
 * Constants", Table 1.1 of the 2022 edition (stored copy "rpp2022-rev-phys-constants",
 * https://www.scribd.com/document/620895509/rpp2022-rev-phys-constants; the 2024 table was not
 * seen), and 1 mb = 10⁹ pb (see shared/physics/README.md, "Units and codes").
 * @example 1e-9 * HBARC2_PB_GEV2 // 0.3893793721 (mb GeV²)
 */
export const HBARC2_PB_GEV2 = 0.3893793721e9

/**
 * Proton mass in GeV: m_p = 938.272 088 16(29) MeV, as printed in PDG "1. Physical Constants",
 * Table 1.1 of the 2022 edition (stored copy "rpp2022-rev-phys-constants",
 * https://www.scribd.com/document/620895509/rpp2022-rev-phys-constants; the 2024 table was not
 * seen).
 */
export const PROTON_MASS_GEV = 0.93827208816

/**
 * Magnitudes |V_ij| of the CKM matrix, rows u, c, t and columns d, s, b, dimensionless.
 * PDG 2024 review "CKM quark-mixing matrix", the magnitudes from the global fit imposing
 * unitarity — from memory:
 *   |V_ud| 0.97435, |V_us| 0.22501, |V_ub| 0.003732,
 *   |V_cd| 0.22487, |V_cs| 0.97349, |V_cb| 0.04183,
 *   |V_td| 0.00858, |V_ts| 0.04111, |V_tb| 0.999118.
 * The global-fit values are used (rather than the individual measurements) because the
 * charged-current sum rules rely on unitarity; each row's Σ|V|² is 1 to about 1e-4.
 * @example CKM.ud // 0.97435
 */
export const CKM = Object.freeze({
  ud: 0.97435, us: 0.22501, ub: 0.003732,
  cd: 0.22487, cs: 0.97349, cb: 0.04183,
  td: 0.00858, ts: 0.04111, tb: 0.999118
})

/** A CKM row key (up-type quark) × column key (down-type quark), e.g. 'us'. */
export type CkmElement = keyof typeof CKM

/**
 * |V_ij|² for an up-type PDG code (2, 4, 6) and a down-type PDG code (1, 3, 5), signs ignored,
 * from {@link CKM}, or from the identity matrix when `diagonal` is true.
 * Throws RangeError for a pair that is not (up-type, down-type).
 * @example ckmSquared(2, 3) // |V_us|² = 0.0506295
 */
export function ckmSquared(upPdg: number, downPdg: number, diagonal = false): number {
  const up = Math.abs(upPdg)
  const down = Math.abs(downPdg)
  const row = ({ 2: 'u', 4: 'c', 6: 't' } as Record<number, string>)[up]
  const col = ({ 1: 'd', 3: 's', 5: 'b' } as Record<number, string>)[down]
  if (row === undefined || col === undefined) {
    throw new RangeError(`CKM element needs an up-type quark (2, 4, 6) and a down-type quark (1, 3, 5); got ${upPdg} and ${downPdg}`)
  }
  if (diagonal) return up === down + 1 ? 1 : 0
  const v = CKM[(row + col) as CkmElement]
  return v * v
}
