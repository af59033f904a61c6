/**
 * Leading-order QCD splitting functions (Ellis–Stirling–Webber, "QCD and Collider
 * Physics", ch. 4) in the normalisation ∂f/∂ln μ² = (α_s/2π) P ⊗ f, with C_F = 4/3, C_A = 3,
 * T_R = 1/2 (see shared/physics/README.md, "Splitting functions"):
 *   P_qq = C_F [(1+z²)/(1−z)]₊,  P_qg = T_R [z² + (1−z)²] (per flavour),
 *   P_gq = C_F [1 + (1−z)²]/z,
 *   P_gg = 2C_A [z/(1−z)₊ + (1−z)/z + z(1−z)] + δ(1−z)(11C_A − 4 n_f T_R)/6.
 */

/** Colour factor C_F = (N_c² − 1)/(2N_c) = 4/3. */
export const CF = 4 / 3
/** Colour factor C_A = N_c = 3. */
export const CA = 3
/** Normalisation T_R = 1/2 of the quark–gluon vertex. */
export const TR = 1 / 2

/**
 * Regular part of P_qg(z) = T_R [z² + (1−z)²], for one quark flavour (the singlet equation
 * carries 2 n_f of it). Domain 0 < z ≤ 1.
 * @example pqg(0.5) // 0.25
 */
export function pqg(z: number): number {
  return TR * (z * z + (1 - z) * (1 - z))
}

/**
 * P_gq(z) = C_F [1 + (1−z)²]/z, domain 0 < z ≤ 1.
 * @example pgq(1) // 4/3
 */
export function pgq(z: number): number {
  return (CF * (1 + (1 - z) * (1 - z))) / z
}

/**
 * Coefficient of δ(1−z) in P_gg: (11 C_A − 4 n_f T_R)/6 = β₀/2.
 * @example pggDelta(4) // 25/6
 */
export function pggDelta(nf: number): number {
  return (11 * CA - 4 * nf * TR) / 6
}

/** Coefficient of δ(1−z) in P_qq once the plus prescription of [(1+z²)/(1−z)]₊ is split off: 3C_F/2. */
export const PQQ_DELTA = (3 * CF) / 2
