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
