/**
 * The momentum sum rule of fragmentation functions (see shared/physics/README.md, "Timelike
 * evolution"): for every parton i, summed over a complete set of hadron species h,
 *   Σ_h ∫₀¹ z D_i^h(z, Q²) dz = 1
 * at every scale, because the timelike kernels conserve momentum parton by parton. With one
 * species (or an incomplete list) each parton's sum is ≤ 1.
 */
import { EVOLVED_FLAVOURS, N_SLOTS } from '../input/flavours'
import type { MemberGrid } from '../types'
import { integrateXParts } from './sum-rules'

/** Per parton (EVOLVED_FLAVOURS order): the summed momentum fraction, and how much of it lies below the first z node. */
export interface FragmentationSums {
  /** Σ_h ∫₀¹ z D_i^h dz: the grid part plus the tail estimate. */
  momentum: Float64Array
  /** Σ_h of the power-law estimate of ∫₀^{z₀} z D_i^h dz (integrateXParts). */
  tail: Float64Array
}

/**
 * Σ_h ∫ z D_i^h dz of each of the 13 evolved partons at Q² node `iq`, over the species' grids
 * (one member each, same z and Q² nodes, the 13 evolved flavours). Method: `integrateXParts` per
 * species and parton — piecewise Lagrange in ln z with Gauss–Legendre on [z₀, 1], a power law fitted
 * to the two smallest nodes below z₀; the tail is returned separately so the caller can judge it.
 * @throws RangeError for no grids, grids on different nodes or another flavour layout.
 * @example fragmentationMomentumSums([piPlus, piMinus, kPlus, kMinus], 0).momentum[12] // gluon
 */
export function fragmentationMomentumSums(grids: readonly MemberGrid[], iq: number, degree = 7): FragmentationSums {
  if (grids.length === 0) throw new RangeError('give at least one species grid')
  const first = grids[0]!
  grids.forEach((g, h) => {
    if (g.flavours.length !== N_SLOTS || g.flavours.some((f, i) => f !== EVOLVED_FLAVOURS[i])) {
      throw new RangeError(`species grid ${h} must carry the 13 evolved flavours −6…−1, 1…6, 21 in that order`)
    }
    if (g.x.length !== first.x.length || g.x.some((v, i) => v !== first.x[i]) || g.q2.length !== first.q2.length || g.q2.some((v, i) => v !== first.q2[i])) {
      throw new RangeError(`species grid ${h} is on other z or Q² nodes than species grid 0`)
    }
  })
  if (!Number.isInteger(iq) || iq < 0 || iq >= first.q2.length) throw new RangeError(`Q² node ${iq} is outside 0..${first.q2.length - 1}`)
  const nz = first.x.length
  const momentum = new Float64Array(N_SLOTS)
  const tail = new Float64Array(N_SLOTS)
  const column = new Float64Array(nz)
  for (const g of grids) {
    for (let s = 0; s < N_SLOTS; s++) {
      for (let iz = 0; iz < nz; iz++) column[iz] = g.values[(iq * nz + iz) * N_SLOTS + s]!
      const parts = integrateXParts(g.x, column, 1, degree)
      momentum[s]! += parts.grid + parts.tail
      tail[s]! += parts.tail
    }
  }
  return { momentum, tail }
}
