import { ALPHA_EM } from '../constants'
import { QUARKS, quarkCharge } from './couplings'
import type { CollisionOptions } from './collider'
import { collisionTerm } from './collider'
import type { BilinearTerm, PairWeight, XfFunction } from './terms'
import { evaluateTerm } from './terms'
import type { CrossSectionUnit } from './units'
import { gev2ToUnit } from './units'

/**
 * Drell–Yan lepton-pair production through a virtual photon at LO (Ellis–Stirling–Webber,
 * "QCD and Collider Physics", ch. 9; see shared/physics/README.md, "Drell–Yan"):
 *   d²σ/dM² dy = (4πα²/(9 M⁴)) Σ_q e_q² [x₁q(x₁) x₂q̄(x₂) + x₁q̄(x₁) x₂q(x₂)],
 *   d²σ/dM dy = 2M · d²σ/dM² dy = (8πα²/(9 M³)) Σ_q e_q² [...],
 * x₁,₂ = (M/√s) e^{±y}, one lepton flavour, α = α(0), μ_F² = M². No Z exchange.
 */

/** Parton pairs q q̄ and q̄ q with weight e_q², on the beams' own densities. */
export function drellYanPairs(): PairWeight[] {
  const pairs: PairWeight[] = []
  for (const q of QUARKS) {
    const e2 = quarkCharge(q) ** 2
    pairs.push({ a: q, b: -q, w: e2 }, { a: -q, b: q, w: e2 })
  }
  return pairs
}

/** Options of the Drell–Yan kernel. */
export interface DrellYanOptions extends CollisionOptions {
  /** Default pb, so the result is in pb/GeV. */
  unit?: CrossSectionUnit
}

/**
 * d²σ/dM dy of pp → γ* → ℓ⁺ℓ⁻ + X as a bilinear form, in `unit`/GeV (pb/GeV by default).
 * Units: mGeV in GeV, y dimensionless. Domain: M > 0, both x < 1; else RangeError.
 * @example drellYanTerm(10, 0, { sqrtSGeV: 8000 }).factor // 8πα²/(9·10³) · (ħc)² in pb/GeV
 */
export function drellYanTerm(mGeV: number, y: number, options: DrellYanOptions): BilinearTerm {
  const factor = 8 * Math.PI * ALPHA_EM ** 2 / (9 * mGeV ** 3) * gev2ToUnit(options.unit)
  return collisionTerm(mGeV, y, options, factor, drellYanPairs())
}

/** d²σ/dM dy in `unit`/GeV for densities `xf` (beam 2 `xf2`, default `xf`); see {@link drellYanTerm}. */
export function d2SigmaDMDyDrellYan(xf: XfFunction, mGeV: number, y: number, options: DrellYanOptions, xf2: XfFunction = xf): number {
  return evaluateTerm(drellYanTerm(mGeV, y, options), xf, xf2)
}
