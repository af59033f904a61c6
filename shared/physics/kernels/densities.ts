/**
 * Which kind of density each set slot of a study holds (see shared/physics/README.md, "Hadron
 * production: which set goes where"). A study has main sets (the ones it runs, member by member)
 * and an optional second set (beam 2, a nuclear set, or the fragmentation functions of a
 * semi-inclusive kernel). Most kernels read parton densities in both; the hadron-production
 * kernels read fragmentation functions in one or both.
 */

/** What a set's grid holds, as the slots name it (the header's `density.type`). */
export type DensityType = 'parton' | 'fragmentation'

/** The densities a kernel reads in each slot. */
export interface KernelDensities {
  /** The main sets. */
  main: DensityType
  /** The second set: what it must hold, or null when the kernel never reads one. */
  second: DensityType | null
  /** The kernel cannot be evaluated without a second set. */
  secondRequired?: true
}

/** Words for a density type in messages and forms. */
export const DENSITY_WORDS: Readonly<Record<DensityType, string>> = Object.freeze({
  parton: 'parton densities',
  fragmentation: 'fragmentation functions'
})

/** Every kernel that names no densities: parton densities in both slots, second set optional. */
export const PARTON_SLOTS: KernelDensities = Object.freeze({ main: 'parton', second: 'parton' })
/** Semi-inclusive DIS: parton densities in the main slot, the fragmentation set second (required). */
export const SEMI_INCLUSIVE_SLOTS: KernelDensities = Object.freeze({ main: 'parton', second: 'fragmentation', secondRequired: true })
/** e⁺e⁻ → h X: a fragmentation set, no second set. */
export const ANNIHILATION_SLOTS: KernelDensities = Object.freeze({ main: 'fragmentation', second: null })
/** Ratio of two hadron species in e⁺e⁻: a fragmentation set in each slot. */
export const SPECIES_RATIO_SLOTS: KernelDensities = Object.freeze({ main: 'fragmentation', second: 'fragmentation', secondRequired: true })
