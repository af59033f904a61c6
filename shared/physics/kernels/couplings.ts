import { SIN2_THETA_W_EFF, ckmSquared } from '../constants'
import type { Pdg } from '../types'

/** Quark PDG codes d, u, s, c, b, t. */
export const QUARKS: readonly Pdg[] = Object.freeze([1, 2, 3, 4, 5, 6])
/** Up-type quarks u, c, t. */
export const UP_TYPE: readonly Pdg[] = Object.freeze([2, 4, 6])
/** Down-type quarks d, s, b. */
export const DOWN_TYPE: readonly Pdg[] = Object.freeze([1, 3, 5])

/**
 * Electric charge of a quark or antiquark in units of the positron charge
 * (d −1/3, u +2/3, …, sign flipped for antiquarks); 0 for the gluon and the photon.
 * @example quarkCharge(-2) // −2/3
 */
export function quarkCharge(pdg: Pdg): number {
  const a = Math.abs(pdg)
  if (a < 1 || a > 6) return 0
  const e = a % 2 === 0 ? 2 / 3 : -1 / 3
  return pdg > 0 ? e : -e
}

/**
 * Vector and axial couplings of a fermion to the Z at LO in the normalisation of
 * shared/physics/README.md, "W and Z"
 * (Ellis–Stirling–Webber, "QCD and Collider Physics", ch. 9): g_V = T₃ − 2 e sin²θ_W, g_A = T₃,
 * T₃ = ±½. Arguments: weak isospin t3 (±½), charge e (positron units), sin²θ_W (default the
 * effective leptonic angle of constants.ts). Dimensionless.
 * @example zCouplings(0.5, 0) // neutrino: { gV: 0.5, gA: 0.5 }
 */
export function zCouplings(t3: number, charge: number, sin2ThetaW = SIN2_THETA_W_EFF): { gV: number, gA: number } {
  return { gV: t3 - 2 * charge * sin2ThetaW, gA: t3 }
}

/**
 * g_V² + g_A² of quark `pdg` (sign ignored) — the combination in σ̂(qq̄ → Z) and Γ(Z → qq̄).
 * @example quarkZCoupling2(2) // (½ − 4/3 · 0.23153)² + ¼ = 0.2866
 */
export function quarkZCoupling2(pdg: Pdg, sin2ThetaW = SIN2_THETA_W_EFF): number {
  const a = Math.abs(pdg)
  if (a < 1 || a > 6) throw new RangeError(`Z coupling of a quark needs a quark PDG code 1–6; got ${pdg}`)
  const up = a % 2 === 0
  const { gV, gA } = zCouplings(up ? 0.5 : -0.5, up ? 2 / 3 : -1 / 3, sin2ThetaW)
  return gV * gV + gA * gA
}

/** CKM choice of the charged-current kernels: PDG 2024 magnitudes, or the unit matrix. */
export type CkmChoice = 'pdg' | 'diagonal'

/** |V_ij|² for up-type i and down-type j (PDG codes, signs ignored). */
export function vSquared(up: Pdg, down: Pdg, ckm: CkmChoice): number {
  return ckmSquared(up, down, ckm === 'diagonal')
}
