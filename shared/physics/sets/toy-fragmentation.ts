import type { HadronSpecies } from '../fragmentation/species'
import type { FlavourScheme, Pdg } from '../types'

/**
 * TOY fragmentation functions z·D_i^h(z, Q²) from made-up analytic forms — for samples, demos and
 * tests of the plumbing. NOT fits to data and NOT solutions of timelike DGLAP: the Q² dependence
 * is an invented smooth softening. What they do share with real fragmentation functions: they
 * are positive, fall to zero as z → 1, harden for the partons among the hadron's valence
 * ("favoured") and soften as Q² grows (common practice; from memory of the general shape of
 * published sets, no numbers taken from any).
 */

/** Favoured partons of each species (its valence quarks and antiquarks) and an overall scale. */
const SPECIES_TOY: Readonly<Record<HadronSpecies, { favoured: readonly Pdg[], scale: number }>> = {
  'pi+': { favoured: [2, -1], scale: 1 },
  'pi-': { favoured: [1, -2], scale: 1 },
  'pi0': { favoured: [2, -2, 1, -1], scale: 0.5 },
  'K+': { favoured: [2, -3], scale: 0.3 },
  'K-': { favoured: [-2, 3], scale: 0.3 },
  'p': { favoured: [2, 1], scale: 0.15 },
  'pbar': { favoured: [-2, -1], scale: 0.15 },
  'h+-': { favoured: [2, -2, 1, -1, 3, -3], scale: 1.4 }
}

/**
 * TOY z·D_i^h(z, Q²) of parton `pdg` into species `hadron` (dimensionless). With
 * L = ln(Q²/1 GeV²) ≥ 0 and s the species' scale: favoured quarks s·0.45 z^{−0.2}(1−z)^{1.2+0.12L},
 * other light quarks s·0.15 z^{−0.2}(1−z)^{3+0.12L}, gluon s·0.3 z^{0.1}(1−z)^{2.5+0.15L}, charm and
 * bottom (variable scheme only, above m_h²) s·0.25 (1 − m_h²/Q²) z^{−0.2}(1−z)^{2.5+0.12L}, 0 below.
 * @example toyZD('pi+', 2, 0.5, 10, scheme) // z·D_u^{π⁺} at z = 0.5, Q² = 10 GeV²
 */
export function toyZD(hadron: HadronSpecies, pdg: Pdg, z: number, q2GeV2: number, scheme: FlavourScheme): number {
  const L = Math.max(0, Math.log(q2GeV2))
  const { favoured, scale } = SPECIES_TOY[hadron]
  const heavy = (m: number, nfNeeded: number) => {
    if (scheme.type === 'fixed' || scheme.nf < nfNeeded || q2GeV2 <= m * m) return 0
    return scale * 0.25 * (1 - m * m / q2GeV2) * z ** -0.2 * (1 - z) ** (2.5 + 0.12 * L)
  }
  switch (Math.abs(pdg)) {
    case 1: case 2: case 3:
      return favoured.includes(pdg)
        ? scale * 0.45 * z ** -0.2 * (1 - z) ** (1.2 + 0.12 * L)
        : scale * 0.15 * z ** -0.2 * (1 - z) ** (3 + 0.12 * L)
    case 4: return heavy(scheme.massesGeV.charm, 4)
    case 5: return heavy(scheme.massesGeV.bottom, 5)
    case 21: return scale * 0.3 * z ** 0.1 * (1 - z) ** (2.5 + 0.15 * L)
    default: return 0
  }
}
