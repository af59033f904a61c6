import { ALPHA_EM, GAMMA_Z_GEV, GF_GEV2, MZ_GEV } from '../constants'
import type { FlavourScheme, Pdg } from '../types'
import { QUARKS, quarkCharge, zCouplings } from './couplings'
import type { LinearTerm } from './terms'

/**
 * Single-hadron inclusive e⁺e⁻ annihilation, e⁺e⁻ → (γ, Z) → h X, at LO (PDG review
 * "Fragmentation functions in e⁺e⁻, ep and pp collisions", the LO expression of the normalised
 * cross-section; the electroweak charges from the PDG review "Electroweak model and constraints
 * on new physics"; see shared/physics/README.md, "Hadron production: e⁺e⁻ → h X"):
 *   (1/σ_tot) dσ^h/dz = Σ_q ê_q²(s) [D_q^h(z, s) + D_q̄^h(z, s)] / Σ_q ê_q²(s),
 *   ê_q²(s) = e_q² − 2 e_q g_V^e g_V^q χ₁(s) + (g_V^e² + g_A^e²)(g_V^q² + g_A^q²) χ₂(s),
 *   χ₁(s) = κ s (s − M_Z²) / ((s − M_Z²)² + Γ_Z² M_Z²),  χ₂(s) = κ² s² / ((s − M_Z²)² + Γ_Z² M_Z²),
 *   κ = G_F M_Z² / (2√2 π α) (= 1/(4 sin²θ_W cos²θ_W) at tree level; the prefactor of η_γZ in
 *   dis-neutral.ts, so both neutral-current kernels share one normalisation),
 * with g_V = T₃ − 2e sin²θ_W, g_A = T₃ (couplings.ts). The sums run over the quarks produced at
 * √s: u, d, s always, c, b, t when √s > 2 m_q with the masses of the set's flavour scheme (and no
 * more than the scheme's n_f). Scale μ_F² = s (times κ_F² of the study). The set is a
 * fragmentation set: its grid holds z·D_i^h(z, μ²) on its x axis read as z, hence the factor 1/z.
 * Result dimensionless (hadrons per unit z per event).
 */

/** Boson exchange of the e⁺e⁻ kernel: 'gamma-z' (default) γ, γ/Z interference and Z; 'photon' γ only. */
export type AnnihilationExchange = 'photon' | 'gamma-z'

/** Options of {@link annihilationTerm}. */
export interface AnnihilationOptions {
  exchange?: AnnihilationExchange
  /** The fragmentation set's flavour scheme (quark masses and n_f): which quarks √s can produce. */
  scheme: FlavourScheme
}

/**
 * The propagator factors χ₁(s), χ₂(s) of γ/Z interference and Z exchange (formulas in the module
 * comment). Dimensionless.
 * @example annihilationPropagators(91.188 ** 2).chi1 // 0 on the Z pole
 */
export function annihilationPropagators(sGeV2: number): { chi1: number, chi2: number } {
  const mz2 = MZ_GEV * MZ_GEV
  const kappa = GF_GEV2 * mz2 / (2 * Math.SQRT2 * Math.PI * ALPHA_EM)
  const den = (sGeV2 - mz2) ** 2 + GAMMA_Z_GEV * GAMMA_Z_GEV * mz2
  return { chi1: kappa * sGeV2 * (sGeV2 - mz2) / den, chi2: kappa * kappa * sGeV2 * sGeV2 / den }
}

/**
 * The effective electroweak charge ê_q²(s) of quark flavour |pdg| in e⁺e⁻ → q q̄ (formula in the
 * module comment); 'photon' gives e_q². Dimensionless.
 * @example effectiveCharge2(2, 10.58 ** 2) // ≈ 0.4429 (4/9 = 0.4444 for γ alone)
 */
export function effectiveCharge2(pdg: Pdg, sGeV2: number, exchange: AnnihilationExchange = 'gamma-z'): number {
  const a = Math.abs(pdg)
  if (a < 1 || a > 6) throw new RangeError(`an electroweak quark charge needs a quark PDG code 1–6; got ${pdg}`)
  const eq = quarkCharge(a)
  if (exchange === 'photon') return eq * eq
  const { chi1, chi2 } = annihilationPropagators(sGeV2)
  const e = zCouplings(-0.5, -1)
  const q = zCouplings(a % 2 === 0 ? 0.5 : -0.5, eq)
  return eq * eq - 2 * eq * e.gV * q.gV * chi1 + (e.gV * e.gV + e.gA * e.gA) * (q.gV * q.gV + q.gA * q.gA) * chi2
}

/**
 * How many quark flavours e⁺e⁻ at √s produces: 3 below the charm pair threshold 2 m_c, then 4, 5
 * (above 2 m_b) and 6 (above 2 m_t), masses of the scheme, capped by the scheme's n_f.
 * @example producedFlavours(10.58, scheme) // 4 with m_c = 1.51, m_b = 4.92 GeV
 */
export function producedFlavours(sqrtSGeV: number, scheme: FlavourScheme): number {
  const { charm, bottom, top } = scheme.massesGeV
  let n = 3
  for (const m of [charm, bottom, top]) if (sqrtSGeV > 2 * m) n++
  return Math.min(n, scheme.nf)
}

/**
 * (1/σ_tot) dσ^h/dz at (z, √s) as a linear form in the fragmentation set's z·D_i^h(z, s).
 * Domain: z in (0, 1), √s > 0; else RangeError. Dimensionless.
 * @example annihilationTerm(0.3, 91.188, { scheme }).weights.get(2) // ≈ 0.171 (Γ_uū/Γ_had)
 */
export function annihilationTerm(z: number, sqrtSGeV: number, options: AnnihilationOptions): LinearTerm {
  if (!(z > 0 && z < 1)) throw new RangeError(`z = ${z} must lie in (0, 1)`)
  if (!(sqrtSGeV > 0) || !Number.isFinite(sqrtSGeV)) throw new RangeError(`√s = ${sqrtSGeV} GeV must be positive`)
  const s = sqrtSGeV * sqrtSGeV
  const nf = producedFlavours(sqrtSGeV, options.scheme)
  const charges = QUARKS.slice(0, nf).map(q => [q, effectiveCharge2(q, s, options.exchange)] as const)
  const total = charges.reduce((sum, [, c]) => sum + c, 0)
  const weights = new Map<Pdg, number>()
  for (const [q, c] of charges) {
    weights.set(q, c / total)
    weights.set(-q, c / total)
  }
  return { kind: 'linear', x: z, mu2GeV2: s, factor: 1 / z, weights }
}
