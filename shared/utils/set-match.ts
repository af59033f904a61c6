import { SPECIES, type HadronSpecies } from '../physics/fragmentation/species'
import { DENSITY_WORDS, PARTON_SLOTS, type DensityType, type KernelDensities } from '../physics/kernels/densities'
import { kernelDensities } from '../physics/kernels/registry'
import type { SetTarget } from '../physics/types'

/** What the new-study form knows of a library set (the API's target, loosely typed). */
export interface SetForPick { id: string, target?: { type: string, z?: number, a?: number } | null }

/**
 * The target the study's main sets describe: a DIS kernel whose options name a nucleus runs on
 * that nucleus's sets; every other kernel (hadron colliders, ratios, luminosities, DIS on a proton,
 * neutron or isoscalar target) runs on proton sets — a nuclear set is a study's second set.
 */
export function kernelTarget(options: Record<string, unknown>): SetTarget {
  const t = options.target as { type?: string, z?: number, a?: number } | undefined
  return t?.type === 'nucleus' && typeof t.z === 'number' && typeof t.a === 'number' ? { type: 'nucleus', z: t.z, a: t.a } : { type: 'proton' }
}

const sameTarget = (a: NonNullable<SetForPick['target']>, b: SetTarget) => a.type === b.type && (b.type === 'proton' || (a.z === b.z && a.a === b.a))

/**
 * The sets the new-study form ticks first: those whose target is the kernel's
 * ({@link kernelTarget}); a set without a recorded target counts as a proton set.
 * @example setsForKernel({}, [{ id: 'p', target: { type: 'proton' } }, { id: 'pb', target: { type: 'nucleus', z: 82, a: 208 } }]) // ['p']
 */
export function setsForKernel(options: Record<string, unknown>, sets: readonly SetForPick[]): string[] {
  const want = kernelTarget(options)
  return sets.filter(s => sameTarget(s.target ?? { type: 'proton' }, want)).map(s => s.id)
}

/** What a set holds, as the API and the headers say it (absent: parton densities). */
export interface SetDensityLike { density?: { type: string, hadron?: string } | null }

/** 'parton' or 'fragmentation' for a set (header or API row); absent means parton densities. */
export function densityTypeOf(s: SetDensityLike): DensityType {
  return s.density?.type === 'fragmentation' ? 'fragmentation' : 'parton'
}

/** The words for what a set holds: "fragmentation functions into π⁺", "parton densities". */
export function densityWords(s: SetDensityLike): string {
  const type = densityTypeOf(s)
  const hadron = s.density?.hadron as HadronSpecies | undefined
  return type === 'fragmentation' && hadron && SPECIES[hadron] ? `${DENSITY_WORDS.fragmentation} into ${SPECIES[hadron].symbol}` : DENSITY_WORDS[type]
}

/**
 * What each set slot of a study with kernel `kernel` takes (parton densities or fragmentation
 * functions, see shared/physics/README.md, "Hadron production: which set goes where"), or the
 * parton slots for an unknown kernel (the spec check reports that).
 */
export function slotsOf(kernel: string): KernelDensities {
  try {
    return kernelDensities(kernel)
  } catch (err) {
    if (err instanceof RangeError) return PARTON_SLOTS
    throw err
  }
}

/**
 * The sets that fit slot `slot` of a study with kernel `kernel`: only those holding what the slot
 * reads (the form offers nothing else); none for a second slot the kernel never reads.
 * @example setsForSlot('epem-hadron', 'main', sets) // the fragmentation sets
 */
export function setsForSlot<T extends SetDensityLike>(kernel: string, slot: 'main' | 'second', sets: readonly T[]): T[] {
  const want = slotsOf(kernel)[slot]
  return want === null ? [] : sets.filter(s => densityTypeOf(s) === want)
}

/** One refusal of a set in a slot: the request field, its JSON path and the located message. */
export interface SlotIssue { path: Array<string | number>, message: string }

/**
 * Every set of a study in a slot that reads the other density, and a missing or unused second
 * set: `setIds[i]: CT-X 1 holds parton densities; the semi-inclusive multiplicity reads
 * fragmentation functions here`. Empty when every slot fits.
 */
export function slotIssues(kernel: string, sets: ReadonlyArray<SetDensityLike & { name: string, version: string }>, second: (SetDensityLike & { name: string, version: string }) | null): SlotIssue[] {
  const slots = slotsOf(kernel)
  const issues: SlotIssue[] = []
  const refuse = (field: string, path: Array<string | number>, s: SetDensityLike & { name: string, version: string }, want: DensityType) =>
    issues.push({ path, message: `${field}: ${s.name} ${s.version} holds ${densityWords(s)}, but the kernel ${kernel} reads ${DENSITY_WORDS[want]} in ${path[0] === 'setIds' ? 'its main sets' : 'its second set'}` })
  sets.forEach((s, i) => {
    if (densityTypeOf(s) !== slots.main) refuse(`setIds[${i}]`, ['setIds', i], s, slots.main)
  })
  if (second) {
    if (slots.second === null) issues.push({ path: ['secondSetId'], message: `secondSetId: the kernel ${kernel} reads no second set; remove ${second.name} ${second.version}` })
    else if (densityTypeOf(second) !== slots.second) refuse('secondSetId', ['secondSetId'], second, slots.second)
  }
  else if (slots.secondRequired && slots.second) {
    issues.push({ path: ['secondSetId'], message: `secondSetId: the kernel ${kernel} needs a second set holding ${DENSITY_WORDS[slots.second]}` })
  }
  return issues
}
