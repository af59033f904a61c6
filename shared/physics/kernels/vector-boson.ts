import { GF_GEV2, MW_GEV, MZ_GEV, SIN2_THETA_W_EFF } from '../constants'
import type { CkmChoice } from './couplings'
import { DOWN_TYPE, QUARKS, UP_TYPE, quarkZCoupling2, vSquared } from './couplings'
import type { CollisionOptions } from './collider'
import { collisionTerm } from './collider'
import type { BilinearTerm, PairWeight, XfFunction } from './terms'
import { evaluateTerm } from './terms'
import type { CrossSectionUnit } from './units'
import { gev2ToUnit } from './units'

/**
 * On-shell W⁺, W⁻ and Z production at LO in the narrow-width approximation (Ellis–Stirling–Webber,
 * "QCD and Collider Physics", ch. 9; see shared/physics/README.md, "W and Z"):
 *   σ̂(q q̄′ → W) = (π/3)√2 G_F M_W² |V_qq′|² δ(ŝ − M_W²),
 *   σ̂(q q̄ → Z) = (π/3)√2 G_F M_Z² (g_V² + g_A²) δ(ŝ − M_Z²),
 * hence dσ/dy = (√2 π G_F/3) Σ coupling · [x₁q(x₁) x₂q̄′(x₂) + (1 ↔ 2)] at x₁,₂ = (M/√s) e^{±y},
 * μ_F² = M². No decay branching fraction is applied: the result is the production cross-section.
 * g_V uses sin²θ_eff (constants.ts). Masses and G_F: PDG 2024 (constants.ts).
 */

export type VectorBoson = 'W+' | 'W-' | 'Z'

/**
 * Parton pairs of W⁺ (u_i d̄_j), W⁻ (d_j ū_i) with |V_ij|², or Z (q q̄) with g_V² + g_A², both
 * orderings, on the beams' own densities. The top quark is included for completeness (its
 * density is absent from ordinary sets and counts as zero).
 * @example vectorBosonPairs('W+', 'diagonal') // u d̄, d̄ u, c s̄, s̄ c, t b̄, b̄ t with weight 1
 */
export function vectorBosonPairs(boson: VectorBoson, ckm: CkmChoice = 'pdg', sin2ThetaW = SIN2_THETA_W_EFF): PairWeight[] {
  const pairs: PairWeight[] = []
  if (boson === 'Z') {
    for (const q of QUARKS) {
      const c = quarkZCoupling2(q, sin2ThetaW)
      pairs.push({ a: q, b: -q, w: c }, { a: -q, b: q, w: c })
    }
    return pairs
  }
  for (const u of UP_TYPE) {
    for (const d of DOWN_TYPE) {
      const v2 = vSquared(u, d, ckm)
      if (v2 === 0) continue
      const quark = boson === 'W+' ? u : d
      const anti = boson === 'W+' ? -d : -u
      pairs.push({ a: quark, b: anti, w: v2 }, { a: anti, b: quark, w: v2 })
    }
  }
  return pairs
}

/** Pole mass of a vector boson in GeV (PDG 2024, constants.ts). */
export function vectorBosonMassGeV(boson: VectorBoson): number {
  return boson === 'Z' ? MZ_GEV : MW_GEV
}

/** Options of the W/Z kernels. */
export interface VectorBosonOptions extends CollisionOptions {
  ckm?: CkmChoice
  /** Default pb. */
  unit?: CrossSectionUnit
}

/**
 * dσ/dy of pp → V + X (V = W⁺, W⁻, Z) as a bilinear form, in `unit` (pb by default).
 * Domain: finite y with both x < 1; else RangeError.
 * @example vectorBosonTerm('Z', 0, { sqrtSGeV: 13000 }).x1 // M_Z/√s = 0.0070145
 */
export function vectorBosonTerm(boson: VectorBoson, y: number, options: VectorBosonOptions): BilinearTerm {
  const factor = Math.SQRT2 * Math.PI * GF_GEV2 / 3 * gev2ToUnit(options.unit)
  return collisionTerm(vectorBosonMassGeV(boson), y, options, factor, vectorBosonPairs(boson, options.ckm))
}

/** dσ/dy in `unit` for densities `xf` (beam 2 `xf2`); see {@link vectorBosonTerm}. */
export function dSigmaDyVectorBoson(xf: XfFunction, boson: VectorBoson, y: number, options: VectorBosonOptions, xf2: XfFunction = xf): number {
  return evaluateTerm(vectorBosonTerm(boson, y, options), xf, xf2)
}
