// A new workspace's first run: the example (TOY) error sets added to its library, and the sample
// files a first user can try (samples/ in the repository). The TOY sets are made-up analytic
// functions (shared/physics/sets/toy.ts), not fits; they are made here with the same settings as
// samples/sets/toy-hessian.sheafset and toy-replicas.sheafset (scripts/make-sample-sets.ts).
import { and, eq, inArray } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import { toyErrorSet, toyQ2Nodes, toyXNodes, writeSetFile } from '../../../shared/physics/sets'
import type { FlavourScheme } from '../../../shared/physics/types'
import { audit } from '../audit'
import { insertErrorSet } from '../sets/store'

const SCHEME: FlavourScheme = { type: 'variable', nf: 5, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }

/** The example sets' files (the same as samples/sets/toy-*.sheafset). */
export function exampleSetFiles(): Array<{ name: string, bytes: Uint8Array }> {
  const x = toyXNodes(20, 1e-5, 0.95)
  const q2 = toyQ2Nodes({ q2MinGeV2: 1, q2MaxGeV2: 1e5, count: 24, thresholdsGeV2: [1.51 ** 2, 4.92 ** 2] })
  return [
    { name: 'toy-hessian', bytes: writeSetFile(toyErrorSet({ kind: 'hessian-pairs', errorMembers: 4, x, q2, scheme: SCHEME, name: 'toy-hessian' }), { encoding: 'float32-le' }) },
    { name: 'toy-replicas', bytes: writeSetFile(toyErrorSet({ kind: 'replicas', errorMembers: 8, x, q2, scheme: SCHEME, seed: 7, name: 'toy-replicas' }), { encoding: 'float32-le' }) }
  ]
}

/**
 * Adds the example sets to a workspace's library, each once: a set of the same name already
 * there is left alone. Returns the ids of the example sets in the library and how many were added.
 */
export async function addExampleSets(db: DB, workspaceId: string, userId: string): Promise<{ ids: string[], added: number }> {
  const files = exampleSetFiles()
  return db.transaction(async (tx) => {
    // One at a time per workspace: insertErrorSet locks the workspace row; lock it first so two
    // clicks cannot both find the sets missing.
    await tx.select({ id: t.workspaces.id }).from(t.workspaces).where(eq(t.workspaces.id, workspaceId)).for('update')
    const present = await tx.select({ id: t.errorSets.id, name: t.errorSets.name }).from(t.errorSets)
      .where(and(eq(t.errorSets.workspaceId, workspaceId), inArray(t.errorSets.name, files.map(f => f.name))))
    const ids = present.map(p => p.id)
    let added = 0
    for (const f of files) {
      if (present.some(p => p.name === f.name)) continue
      const setId = await insertErrorSet(tx, { workspaceId, name: f.name, fileName: `${f.name}.sheafset`, bytes: f.bytes, origin: 'upload', addedBy: userId })
      await audit(tx, { workspaceId, actorId: userId, action: 'set.uploaded', subjectType: 'error_set', subjectId: setId, detail: { name: f.name, example: true, bytes: f.bytes.byteLength } })
      ids.push(setId)
      added++
    }
    return { ids, added }
  })
}

/** The sample files a first user can download, by folder of samples/ (names only; no path from the request is trusted). */
export const SAMPLE_FILES: Readonly<Record<string, readonly string[]>> = {
  bins: ['drell-yan-high-mass.csv', 'w-rapidity.csv', 'ppb-drell-yan-rapidity.csv', 'neutrino-fe-x-q2.csv'],
  measurements: ['drell-yan-high-mass-pseudodata.csv', 'drell-yan-high-mass-correlation.csv'],
  studies: ['drell-yan-mass.json', 'dis-f2.json', 'w-charge-asymmetry.json', 'higgs-total.json'],
  sets: ['toy-hessian.sheafset', 'toy-replicas.sheafset', 'toy-ff-piplus.sheafset']
}
