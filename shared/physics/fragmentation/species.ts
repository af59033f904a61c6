/**
 * The hadron species a fragmentation set may describe, with their PDG Monte-Carlo particle codes
 * (PDG review "Monte Carlo particle numbering scheme"): π⁺ 211, π⁻ −211, π⁰ 111, K⁺ 321,
 * K⁻ −321, p 2212, p̄ −2212. Unidentified charged hadrons (h⁺ + h⁻ summed) have no PDG code; they
 * are the species 'h+-' with code null.
 */
import { z } from 'zod'

/** Our key of a hadron species (ASCII, for files, URLs and the API). */
export const HADRON_SPECIES = ['pi+', 'pi-', 'pi0', 'K+', 'K-', 'p', 'pbar', 'h+-'] as const
export type HadronSpecies = typeof HADRON_SPECIES[number]

/** One species: key, PDG code (null for summed charged hadrons), symbol and label in words. */
export interface SpeciesInfo {
  key: HadronSpecies
  pdg: number | null
  symbol: string
  label: string
  /** Electric charge in units of e (0 for the summed h±). */
  charge: number
}

export const SPECIES: Readonly<Record<HadronSpecies, SpeciesInfo>> = Object.freeze({
  'pi+': { key: 'pi+', pdg: 211, symbol: 'π⁺', label: 'positive pion', charge: 1 },
  'pi-': { key: 'pi-', pdg: -211, symbol: 'π⁻', label: 'negative pion', charge: -1 },
  'pi0': { key: 'pi0', pdg: 111, symbol: 'π⁰', label: 'neutral pion', charge: 0 },
  'K+': { key: 'K+', pdg: 321, symbol: 'K⁺', label: 'positive kaon', charge: 1 },
  'K-': { key: 'K-', pdg: -321, symbol: 'K⁻', label: 'negative kaon', charge: -1 },
  'p': { key: 'p', pdg: 2212, symbol: 'p', label: 'proton', charge: 1 },
  'pbar': { key: 'pbar', pdg: -2212, symbol: 'p̄', label: 'antiproton', charge: -1 },
  'h+-': { key: 'h+-', pdg: null, symbol: 'h±', label: 'charged hadrons (both charges summed)', charge: 0 }
})

export const hadronSpeciesSchema = z.enum(HADRON_SPECIES, { error: `hadron must be one of ${HADRON_SPECIES.join(', ')}` })

/**
 * What a set's grid holds. Absent in a header (every version-1 file) means parton densities.
 * - parton: x·f_i(x, Q²) of partons in the set's target;
 * - fragmentation: z·D_i^h(z, Q²), parton i fragmenting into hadron species h; the grid's
 *   momentum-fraction axis is then z (the hadron's fraction of the parton's momentum).
 */
export type SetDensity =
  | { type: 'parton' }
  | { type: 'fragmentation', hadron: HadronSpecies }

export const setDensitySchema = z.discriminatedUnion('type', [
  z.strictObject({ type: z.literal('parton') }),
  z.strictObject({ type: z.literal('fragmentation'), hadron: hadronSpeciesSchema })
])

/** The density of a header: parton unless it says otherwise. */
export function densityOf(header: { density?: SetDensity }): SetDensity {
  return header.density ?? { type: 'parton' }
}

/** True when a header describes fragmentation functions. */
export function isFragmentation(header: { density?: SetDensity }): boolean {
  return densityOf(header).type === 'fragmentation'
}
