/**
 * Header of a set derived from another one (unweighted after reweighting, or profiled): the
 * parent's grid description with a new name and provenance.
 */
import type { SetHeader } from '../types'

/** What an unweighted or profiled set says about where it came from. */
export interface DerivedSetInfo {
  /** Name of the new set. */
  name: string
  /** Version text of the new set (default: the parent's). */
  version?: string
  /** Free text appended to the generated provenance (measurement file, study, engine version). */
  provenance: string
}

/** The parent's header without α_s members, renamed, with the new provenance. */
export function derivedHeader(parent: SetHeader, info: DerivedSetInfo): SetHeader {
  const { alphasMembers: _members, alphasMz: _mz, replicaCentral: _central, ...rest } = parent
  return {
    ...rest,
    name: info.name,
    version: info.version ?? parent.version,
    provenance: `${info.provenance} Parent set: ${parent.name} ${parent.version} (${parent.family}).`.slice(0, 4000)
  }
}
