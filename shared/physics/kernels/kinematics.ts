/**
 * Leading-order kinematics shared by the kernels. Massless partons; natural units.
 */

/**
 * Momentum fractions of the two partons producing a system of mass M at rapidity y in a
 * collision at √s: x₁,₂ = (M/√s) e^{±y} (Ellis–Stirling–Webber, "QCD and Collider Physics",
 * ch. 9). Units: GeV, GeV, dimensionless. Domain: 0 < M < √s, finite y; the caller checks x < 1.
 * @example partonFractions(91.188, 0, 13000) // { x1: 0.0070145, x2: 0.0070145 }
 */
export function partonFractions(mGeV: number, y: number, sqrtSGeV: number): { x1: number, x2: number } {
  const r = mGeV / sqrtSGeV
  return { x1: r * Math.exp(y), x2: r * Math.exp(-y) }
}

/**
 * The rapidity interval in which both momentum fractions lie in [xMin, xMax]:
 * |y| ≤ min(ln(xMax/√τ), ln(√τ/xMin)), τ = M²/s. For the full phase space xMax = 1 and xMin
 * = τ give |y| ≤ ½ ln(1/τ). Returns null when no rapidity is allowed (τ too small or large).
 * @example rapidityReach(125.2, 13000, 1e-6, 1) // [−4.64, 4.64]
 */
export function rapidityReach(mGeV: number, sqrtSGeV: number, xMin: number, xMax: number): [number, number] | null {
  const rootTau = mGeV / sqrtSGeV
  const limit = Math.min(Math.log(xMax / rootTau), Math.log(rootTau / xMin))
  if (!(limit > 0)) return null
  return [-limit, limit]
}

/**
 * DIS inelasticity y = Q²/(x s) for massless kinematics (Q² = x y s; see shared/physics/README.md,
 * "Kinematics"). Units: x dimensionless, Q² and s in GeV². Result dimensionless; the caller checks
 * y ≤ 1.
 * @example inelasticity(0.01, 100, 300 ** 2) // 0.111
 */
export function inelasticity(x: number, q2GeV2: number, sGeV2: number): number {
  return q2GeV2 / (x * sGeV2)
}
