// The nuclei of a family build ("build C, Ar, Fe, Pb from this family"): symbols resolved to
// usual targets, each nucleus checked and given its set's name, every problem located at
// nuclei[i] before anything is stored or queued.
import { fail } from '../errors'
import { nucleusProblem } from '../../../shared/physics/input/mass-number'
import { nucleusSetName, usualNucleus } from '../../../shared/physics/nuclei'

/** A nucleus as the request body gives it. */
export type NucleusEntry = string | { z: number, a: number, name?: string }

/** A checked nucleus of a build with the name of the set it writes. */
export interface NamedNucleus { z: number, a: number, name: string }

const KNOWN = 'D, He, Li, Be, C, N, O, Al, Ar, Ca, Fe, Cu, Kr, Ag, Sn, Xe, W, Au, Pb, U'

/**
 * The nuclei of a request, named "<set name>-<symbol><A>" unless an entry names its set: 400 for
 * an unknown symbol or a repeated nucleus or name, 422 for a nucleus the engine does not build
 * (Z > A, A > 300), each at `nuclei[i]`.
 */
export function resolveNuclei(entries: readonly NucleusEntry[], setName: string): NamedNucleus[] {
  const out: NamedNucleus[] = []
  entries.forEach((entry, i) => {
    const path = `nuclei[${i}]`
    const nucleus = typeof entry === 'string' ? usualNucleus(entry) : { z: entry.z, a: entry.a }
    if (!nucleus) {
      fail(400, `${path}: "${entry as string}" is not a target symbol Sheaf knows; give { "z": …, "a": … } or one of ${KNOWN}`, {
        issues: [{ path, message: `unknown target symbol "${entry as string}"` }]
      })
    }
    const problem = nucleusProblem(nucleus)
    if (problem) fail(422, `${path}: ${problem}`, { issues: [{ path, message: problem, kind: 'physics' }] })
    const name = (typeof entry === 'object' ? entry.name : undefined) ?? nucleusSetName(setName, nucleus)
    const twin = out.findIndex(n => (n.z === nucleus.z && n.a === nucleus.a) || n.name === name)
    if (twin >= 0) {
      fail(400, `${path}: Z = ${nucleus.z}, A = ${nucleus.a} (set ${name}) repeats nuclei[${twin}]`, { issues: [{ path, message: `repeats nuclei[${twin}]` }] })
    }
    out.push({ ...nucleus, name })
  })
  return out
}
