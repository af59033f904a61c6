/**
 * Checks of a parametrised input that describes fragmentation functions (a document with
 * `"density": { "type": "fragmentation", "hadron": … }`; see shared/physics/README.md,
 * "Fragmentation inputs"). The parton-density sum rules do not apply to them; instead, for one
 * hadron species h and every parton i, member by member:
 * - positivity: z·D_i^h(z, μ₀²) ≥ 0 on every output z node (a LO fragmentation function is a
 *   number density of hadrons; common practice);
 * - momentum: ∫₀¹ z D_i^h(z, μ₀²) dz ≤ 1, the fraction of parton i's momentum carried by species h
 *   alone cannot exceed what all hadrons together carry (Σ_h ∫ z D_i^h dz = 1; ESW, fragmentation
 *   section of the e⁺e⁻ chapter, from memory). Computed exactly from the terms' Beta-function moments.
 */
import { partonName } from '../partons'
import type { BoundInput } from './bind'
import { evaluateXf, flavourMoments } from './evaluate'
import { EVOLVED_FLAVOURS, N_SLOTS } from './flavours'

/** Largest momentum fraction one species may take from one parton (with room for rounding). */
export const FRAGMENTATION_MOMENTUM_LIMIT = 1 + 1e-12

/**
 * ∫₀¹ z D_i^h(z, μ₀²) dz of each of the 13 evolved partons (EVOLVED_FLAVOURS order), exact.
 * @example fragmentationMomenta(bindParameters(model))[12] // the gluon's momentum fraction into h
 */
export function fragmentationMomenta(bound: BoundInput): Float64Array {
  return flavourMoments(bound, 2)
}

/**
 * The first problem of a bound fragmentation input, or undefined: a momentum fraction above 1,
 * then a negative z·D at a node of `z`. The message names the member (`label`), the parton and
 * the value (and z).
 * @example fragmentationProblem(bound, xNodes(), 'member 3') // undefined when it can be built
 */
export function fragmentationProblem(bound: BoundInput, z: ArrayLike<number>, label: string): string | undefined {
  const momenta = fragmentationMomenta(bound)
  for (let s = 0; s < N_SLOTS; s++) {
    if (momenta[s]! > FRAGMENTATION_MOMENTUM_LIMIT) {
      return `${label}: ∫ z·D dz of parton ${partonName(EVOLVED_FLAVOURS[s]!)} is ${momenta[s]!.toPrecision(6)} > 1; one hadron species cannot carry more than the parton's whole momentum`
    }
  }
  const values = evaluateXf(bound, z)
  for (let iz = 0; iz < z.length; iz++) {
    for (let s = 0; s < N_SLOTS; s++) {
      const v = values[iz * N_SLOTS + s]!
      if (v < 0) return `${label}: z·D of parton ${partonName(EVOLVED_FLAVOURS[s]!)} is ${v.toPrecision(4)} < 0 at z = ${z[iz]!.toPrecision(4)}; a fragmentation function must not be negative`
    }
  }
  return undefined
}
