import { GF_GEV2, MH_GEV } from '../constants'
import type { CollisionOptions } from './collider'
import { collisionTerm } from './collider'
import type { BilinearTerm, PairWeight, XfFunction } from './terms'
import { evaluateTerm } from './terms'
import type { CrossSectionUnit } from './units'
import { gev2ToUnit } from './units'

/**
 * Higgs production by gluon fusion at LO in the heavy-top limit (the effective ggH coupling;
 * see shared/physics/README.md, "Higgs"):
 *   σ̂(gg → H) = σ₀ M_H² δ(ŝ − M_H²),  σ₀ = G_F α_s² / (288 √2 π),
 *   dσ/dy = σ₀ x₁g(x₁) x₂g(x₂),  x₁,₂ = (M_H/√s) e^{±y}.
 * α_s is taken at the renormalisation scale μ_R = κ_R M_H (κ_R = 1 by default) from the caller's
 * function (one-loop α_s of shared/physics/alphas.ts in the engine); μ_F and μ_R are varied
 * independently (shared/physics/study/scale.ts). In a study each member runs with its own
 * α_s(M_Z): the plan rescales member k by (α_s,k(μ_R²)/α_s,0(μ_R²))². The LO
 * heavy-top cross-section is well known to be about half the measured one (common practice).
 */

/** The single pair g g with weight 1. */
export const GLUON_PAIR: readonly PairWeight[] = Object.freeze([{ a: 21, b: 21, w: 1 }])

/** Options of the gluon-fusion kernel. */
export interface HiggsOptions extends CollisionOptions {
  /** α_s(μ²) with μ² in GeV² (dimensionless result). */
  alphas: (q2GeV2: number) => number
  /** Default pb. */
  unit?: CrossSectionUnit
  /** κ_R in μ_R = κ_R M_H; default 1. */
  renormalisationScaleFactor?: number
}

/**
 * σ₀ = G_F α_s²/(288√2 π) in GeV⁻² for a given α_s.
 * @example higgsSigma0GeV2(0.118) // 3.98e-10 GeV⁻²
 */
export function higgsSigma0GeV2(alphas: number): number {
  return GF_GEV2 * alphas * alphas / (288 * Math.SQRT2 * Math.PI)
}

/**
 * dσ/dy of gg → H as a bilinear form in `unit` (pb by default). Domain: finite y, x < 1, and a
 * positive finite α_s(M_H²); else RangeError.
 * @example higgsTerm(0, { sqrtSGeV: 13000, alphas: () => 0.112 }).pairs // [{ a: 21, b: 21, w: 1 }]
 */
export function higgsTerm(y: number, options: HiggsOptions): BilinearTerm {
  const kappaR = options.renormalisationScaleFactor ?? 1
  const as = options.alphas((kappaR * MH_GEV) ** 2)
  if (!(as > 0) || !Number.isFinite(as)) throw new RangeError(`α_s(μ_R²) at μ_R = ${kappaR === 1 ? 'M_H' : `${kappaR} M_H`} (α_s(M_H²) when κ_R = 1) must be a positive number; the α_s function returned ${as}`)
  return collisionTerm(MH_GEV, y, options, higgsSigma0GeV2(as) * gev2ToUnit(options.unit), GLUON_PAIR)
}

/** dσ/dy of gg → H in `unit` for densities `xf`; see {@link higgsTerm}. */
export function dSigmaDyHiggs(xf: XfFunction, y: number, options: HiggsOptions, xf2: XfFunction = xf): number {
  return evaluateTerm(higgsTerm(y, options), xf, xf2)
}
