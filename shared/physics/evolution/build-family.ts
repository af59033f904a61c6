/**
 * Building one nuclear family for several nuclei: the same modification document, fit and
 * covariance compiled for each nucleus (A-dependent coefficients evaluated there) and built into
 * one set per nucleus, named "<document name>-<symbol><A>" (see shared/physics/README.md,
 * "Nuclear families"). Members k of every set come from the same parameter vector, so member k
 * of one nucleus and member k of another move together (ratios between them are correlated).
 */
import type { InputDocument } from '../input/parse'
import { compileInput } from '../input/model'
import type { Nucleus } from '../input/mass-number'
import { nucleusSetName } from '../nuclei'
import type { ErrorSet } from '../types'
import { buildErrorSet, type ModelEvolutionOptions } from './build-set'

/** A nucleus to build, optionally with the set's name (default nucleusSetName). */
export interface FamilyNucleus extends Nucleus {
  name?: string
}

/** Options of buildNuclearFamily. */
export interface FamilyBuildOptions extends ModelEvolutionOptions {
  /** After each member: members done and total over all nuclei, and which nucleus (index) is being built. */
  onProgress?: (done: number, total: number, nucleusIndex: number) => void | Promise<void>
  provenance?: string
}

/**
 * One set per nucleus from a nuclear-modification document and its baseline.
 * @throws InputError when the document does not compile for a nucleus (the message names it);
 * RangeError as buildErrorSet.
 * @example await buildNuclearFamily(familyDoc, baselineDoc, [{ z: 6, a: 12 }, { z: 82, a: 208 }])
 */
export async function buildNuclearFamily(document: InputDocument, baseline: InputDocument, nuclei: readonly FamilyNucleus[], options: FamilyBuildOptions = {}): Promise<ErrorSet[]> {
  if (document.kind !== 'nuclear') throw new RangeError('a family is built from a nuclear modification (sheaf.nuclear-modification)')
  if (nuclei.length === 0) throw new RangeError('give at least one nucleus to build')
  const models = nuclei.map((n, i) => compileInput(document, baseline, `nuclei[${i}]`, { nucleus: { z: n.z, a: n.a } }))
  const perSet = models.map(m => (m.members?.type === 'replicas' ? m.members.count + 1 : 1 + 2 * m.parameterNames.length))
  const total = perSet.reduce((s, v) => s + v, 0)
  const sets: ErrorSet[] = []
  let before = 0
  for (let i = 0; i < models.length; i++) {
    const model = { ...models[i]!, name: nuclei[i]!.name ?? nucleusSetName(document.doc.name, nuclei[i]!) }
    const { onProgress, ...evolution } = options
    const set = await buildErrorSet(model, undefined, {
      ...evolution,
      onProgress: onProgress ? (done: number) => onProgress(before + done, total, i) : undefined
    })
    before += set.members.length
    sets.push(set)
  }
  return sets
}
