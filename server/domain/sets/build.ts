// Building an error set from a parametrised fit (a set_builds row), in one function used by the
// worker and by tests: the engine evolves every member with progress into the row and the
// caller's callback (phase "evolving members", then "storing"), stopping at the cancel flag;
// the set file is stored as a new library set together with the row's `done` state in one
// transaction. A family build (request.nuclei) evolves every nucleus's members in turn, the
// progress counting all of them, and stores all its sets in that one transaction. Idempotent: a finished build is not
// rebuilt; an unfinished one starts over. A RangeError (bad fit: no covariance, a divergent
// member) fails at once without retries.
import { eq } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { SetBuild } from '../../database/schema'
import { buildErrorSet } from '../../../shared/physics/evolution/build-set'
import type { ErrorSet } from '../../../shared/physics/types'
import { compileInput } from '../../../shared/physics/input/model'
import { parseInputDocument } from '../../../shared/physics/input/parse'
import { SET_FILE_EXTENSION } from '../../../shared/physics/sets/format'
import { writeSetFile } from '../../../shared/physics/sets/write'
import { ENGINE_VERSION } from '../../../shared/physics/version'
import type { JobProgress } from '../../../shared/queue/workflow'
import { type CancelWatch, JobCancelled, ONLY_ATTEMPT, runQueuedWork, type Attempt } from '../jobs/lifecycle'
import { notifyBuildEnded } from '../mail/job-ended'
import type { Settings } from '../settings'
import { insertErrorSet } from './store'

export interface RunOptions {
  onProgress?: (p: JobProgress) => unknown
  attempt?: Attempt
  /** Mail the requester at the end (settings for the mailer); no mail without. */
  mail?: Settings
}

/** Runs the set build `buildId` to its end (see the file comment). */
export function runSetBuild(db: DB, buildId: string, o: RunOptions = {}) {
  return runQueuedWork<SetBuild, { setId: string }>(db, o.attempt ?? ONLY_ATTEMPT, {
    table: t.setBuilds, id: buildId, resetProgress: { progressDone: 0, phase: 'evolving members' },
    work: async (row, cancel) => ({ setId: await build(db, row, o.onProgress, cancel) }),
    ended: o.mail ? () => notifyBuildEnded(db, o.mail!, buildId) : undefined
  })
}

async function build(db: DB, b: SetBuild, onProgress: RunOptions['onProgress'], cancel: CancelWatch): Promise<string> {
  const document = parseInputDocument(b.request.input, 'input')
  const baseline = b.request.baseline !== undefined ? parseInputDocument(b.request.baseline, 'baseline') : undefined
  // One model, or one per nucleus of a family build (each with its set's name).
  const targets = b.request.nuclei
    ? b.request.nuclei.map((n, i) => ({ ...compileInput(document, baseline, `nuclei[${i}]`, { nucleus: { z: n.z, a: n.a } }), name: n.name }))
    : [compileInput(document, baseline)]
  const perSet = targets.map(m => (m.members?.type === 'replicas' ? m.members.count + 1 : 1 + 2 * m.parameterNames.length))
  const total = perSet.reduce((n, v) => n + v, 0)
  const [requester] = b.requestedBy
    ? await db.select({ name: t.users.name }).from(t.users).where(eq(t.users.id, b.requestedBy))
    : []
  const sets: ErrorSet[] = []
  let before = 0
  for (const model of targets) {
    const set = await buildErrorSet(model, undefined, {
      provenance: `built by ${requester?.name ?? 'unknown'} with ${ENGINE_VERSION} (set build ${b.id})`,
      onProgress: async (memberDone) => {
        const done = before + memberDone
        const [row] = await db.update(t.setBuilds).set({ progressDone: done, progressTotal: total })
          .where(eq(t.setBuilds.id, b.id)).returning({ cancel: t.setBuilds.cancelRequested })
        await onProgress?.({ done, total, phase: 'evolving members' })
        if (!row || row.cancel) throw new JobCancelled()
        cancel.check()
      }
    })
    before += set.members.length
    sets.push(set)
  }
  await db.update(t.setBuilds).set({ phase: 'storing' }).where(eq(t.setBuilds.id, b.id))
  await onProgress?.({ done: total, total, phase: 'storing' })
  cancel.check()
  const files = sets.map(set => ({ name: b.request.nuclei ? set.header.name : b.name, members: set.members.length, bytes: writeSetFile(set) }))
  return db.transaction(async (tx) => {
    const [current] = await tx.select({ cancel: t.setBuilds.cancelRequested }).from(t.setBuilds).where(eq(t.setBuilds.id, b.id)).for('update')
    if (!current || current.cancel) throw new JobCancelled()
    const setIds: string[] = []
    for (const f of files) {
      const setId = await insertErrorSet(tx, {
        workspaceId: b.workspaceId, name: f.name, fileName: `${f.name.replace(/[^\w.-]+/g, '_')}${SET_FILE_EXTENSION}`,
        bytes: f.bytes, origin: 'build', addedBy: b.requestedBy
      })
      setIds.push(setId)
      await tx.insert(t.auditEvents).values({
        workspaceId: b.workspaceId, actorId: b.requestedBy, action: 'set.built', subjectType: 'error_set', subjectId: setId,
        detail: { buildId: b.id, members: f.members }
      })
    }
    await tx.update(t.setBuilds).set({ state: 'done', setId: setIds[0]!, setIds, progressDone: total, progressTotal: total, finishedAt: new Date() })
      .where(eq(t.setBuilds.id, b.id))
    return setIds[0]!
  })
}
