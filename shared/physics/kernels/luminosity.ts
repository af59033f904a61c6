import { QUARKS } from './couplings'
import type { CollisionOptions } from './collider'
import { collisionTerm } from './collider'
import type { BilinearTerm, PairWeight } from './terms'

/**
 * Parton luminosities (see shared/physics/README.md, "Parton luminosities"):
 *   dL_ij/dτ = (1/(1 + δ_ij)) ∫_τ¹ dx/x [f_i(x) f_j(τ/x) + f_j(x) f_i(τ/x)],  τ = M²/s.
 * With x₁,₂ = √τ e^{±y} (so dx/x = dy) and momentum densities, the integrand is
 * (1/τ) [x₁f_i x₂f_j + x₁f_j x₂f_i] integrated over |y| ≤ ½ ln(1/τ). This module gives the
 * integrand at one rapidity; the study integrates it over the full rapidity range.
 *   gg:  (1/τ) x₁g x₂g;   qq̄ (summed over quarks q = d … t): (1/τ) Σ_q [x₁q x₂q̄ + x₁q̄ x₂q];
 *   qg (summed over quarks and antiquarks): (1/τ) Σ_{q, q̄} [x₁q x₂g + x₁g x₂q].
 * Dimensionless; μ_F² = M².
 */

export type LuminosityChannel = 'gg' | 'qqbar' | 'qg'

/** Parton pairs of a luminosity channel, weight 1 each (the 1/(1+δ_ij) already applied). */
export function luminosityPairs(channel: LuminosityChannel): PairWeight[] {
  if (channel === 'gg') return [{ a: 21, b: 21, w: 1 }]
  const pairs: PairWeight[] = []
  for (const q of QUARKS) {
    if (channel === 'qqbar') {
      pairs.push({ a: q, b: -q, w: 1 }, { a: -q, b: q, w: 1 })
    } else {
      for (const p of [q, -q]) pairs.push({ a: p, b: 21, w: 1 }, { a: 21, b: p, w: 1 })
    }
  }
  return pairs
}

/**
 * The integrand in y of dL/dτ at mass M (GeV) and rapidity y, dimensionless.
 * Domain: M > 0, both x < 1; else RangeError.
 * @example luminosityTerm('gg', 125, 0, { sqrtSGeV: 13000 }).factor // 1/τ = (13000/125)²
 */
export function luminosityTerm(channel: LuminosityChannel, mGeV: number, y: number, options: CollisionOptions): BilinearTerm {
  const tau = (mGeV / options.sqrtSGeV) ** 2
  return collisionTerm(mGeV, y, options, 1 / tau, luminosityPairs(channel))
}
