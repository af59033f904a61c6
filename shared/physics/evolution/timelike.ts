/**
 * Which way a LO evolution runs: spacelike (parton densities f_i, initial-state partons) or
 * timelike (fragmentation functions D_i^h, a parton i fragmenting into hadron h). At one loop the
 * two share α_s, thresholds and the four splitting functions; they differ only in the singlet's
 * off-diagonal couplings (see shared/physics/README.md, "Timelike evolution"):
 *
 *   spacelike  ∂Σ = P_qq⊗Σ + 2n_f P_qg⊗g,   ∂g = P_gq⊗Σ + P_gg⊗g   (Σ = Σ_q (q + q̄))
 *   timelike   ∂D_Σ = P_qq⊗D_Σ + 2n_f P_gq⊗D_g,   ∂D_g = P_qg⊗D_Σ + P_gg⊗D_g   (D_Σ = Σ_q (D_q + D_q̄))
 *
 * i.e. the parton-basis kernel is transposed, ∂D_i = Σ_j P_ji ⊗ D_j (R. K. Ellis, W. J. Stirling,
 * B. R. Webber, "QCD and Collider Physics", the fragmentation-function section of the e⁺e⁻
 * chapter, from memory), and in the singlet basis with D_Σ a sum over 2n_f (anti)quarks the 2n_f
 * stays in the upper-right entry while P_qg and P_gq change places.
 */
import { cScale, type Complex } from '../input/complex'
import { gammaGQ, gammaQG } from './anomalous-dimensions'
import { pgq, pqg } from './splitting'

/** The evolution's direction: 'spacelike' for parton densities, 'timelike' for fragmentation functions. */
export type EvolutionDirection = 'spacelike' | 'timelike'

/**
 * Regular off-diagonal entries of the singlet kernel at momentum fraction z:
 * `sigmaFromGluon` (what ∂Σ receives per unit of g) and `gluonFromSigma` (what ∂g receives per unit of Σ).
 * spacelike: 2n_f T_R[z² + (1−z)²] and C_F[1 + (1−z)²]/z; timelike: 2n_f C_F[1 + (1−z)²]/z and T_R[z² + (1−z)²].
 * @example singletCouplings('timelike', 4, 0.5) // { sigmaFromGluon: 26.666…, gluonFromSigma: 0.25 }
 */
export function singletCouplings(direction: EvolutionDirection, nf: number, z: number): { sigmaFromGluon: number, gluonFromSigma: number } {
  return direction === 'timelike'
    ? { sigmaFromGluon: 2 * nf * pgq(z), gluonFromSigma: pqg(z) }
    : { sigmaFromGluon: 2 * nf * pqg(z), gluonFromSigma: pgq(z) }
}

/**
 * The same entries as Mellin moments: b = upper right (Σ ← g), c = lower left (g ← Σ) of the
 * singlet anomalous-dimension matrix Γ = [[γ_qq, b], [c, γ_gg]].
 * @example singletOffDiagonalMoments(complex(2), 4, 'timelike').b // 2·4·16/9 = 14.22…
 */
export function singletOffDiagonalMoments(n: Complex, nf: number, direction: EvolutionDirection): { b: Complex, c: Complex } {
  const qg = gammaQG(n)
  const gq = gammaGQ(n)
  return direction === 'timelike'
    ? { b: cScale(gq, 2 * nf), c: qg }
    : { b: cScale(qg, 2 * nf), c: gq }
}
