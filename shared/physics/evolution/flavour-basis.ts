/**
 * The LO evolution basis for n_f active flavours and its inverse:
 *   singlet Σ = Σ_{i≤n_f} (q_i + q̄_i) and gluon g (coupled),
 *   valence-type non-singlets V_i = q_i − q̄_i,
 *   sea-type non-singlets T_i = (q_i + q̄_i) − Σ/n_f          (i = 1..n_f),
 * all of which evolve with P_qq alone at LO. Inactive heavy flavours are zero. The maps are
 * linear with real coefficients, so they apply equally to x-space node values and to the real
 * and imaginary parts of Mellin moments.
 */
import { GLUON_SLOT, N_SLOTS, quarkSlots } from '../input/flavours'

/** Densities (or moments) in the evolution basis, each an array over nodes. */
export interface EvolutionBasis {
  nf: number
  sigma: Float64Array
  gluon: Float64Array
  /** V_i, i = 1..n_f at index i − 1. */
  valence: Float64Array[]
  /** T_i, i = 1..n_f at index i − 1. */
  tplus: Float64Array[]
}

/**
 * Flavour slots (13 arrays over the same nodes, EVOLVED_FLAVOURS order) → evolution basis.
 * @example toEvolutionBasis(slots, 4).sigma
 */
export function toEvolutionBasis(slots: readonly Float64Array[], nf: number): EvolutionBasis {
  const len = slots[GLUON_SLOT]!.length
  const sigma = new Float64Array(len)
  const plus: Float64Array[] = []
  const valence: Float64Array[] = []
  for (let q = 1; q <= nf; q++) {
    const { quark, anti } = quarkSlots(q)
    const p = new Float64Array(len)
    const v = new Float64Array(len)
    for (let k = 0; k < len; k++) {
      p[k] = slots[quark]![k]! + slots[anti]![k]!
      v[k] = slots[quark]![k]! - slots[anti]![k]!
      sigma[k]! += p[k]!
    }
    plus.push(p)
    valence.push(v)
  }
  const tplus = plus.map(p => p.map((v, k) => v - sigma[k]! / nf))
  return { nf, sigma, gluon: Float64Array.from(slots[GLUON_SLOT]!), valence, tplus }
}

/**
 * Evolution basis → 13 flavour slots (heavy flavours above n_f are zero):
 * q_i + q̄_i = T_i + Σ/n_f, q_i = (q_i + q̄_i + V_i)/2, q̄_i = (q_i + q̄_i − V_i)/2.
 * @example fromEvolutionBasis(basis)[12] // the gluon
 */
export function fromEvolutionBasis(basis: EvolutionBasis): Float64Array[] {
  const len = basis.gluon.length
  const slots = Array.from({ length: N_SLOTS }, () => new Float64Array(len))
  for (let q = 1; q <= basis.nf; q++) {
    const { quark, anti } = quarkSlots(q)
    const t = basis.tplus[q - 1]!
    const v = basis.valence[q - 1]!
    for (let k = 0; k < len; k++) {
      const p = t[k]! + basis.sigma[k]! / basis.nf
      slots[quark]![k] = 0.5 * (p + v[k]!)
      slots[anti]![k] = 0.5 * (p - v[k]!)
    }
  }
  slots[GLUON_SLOT]!.set(basis.gluon)
  return slots
}
