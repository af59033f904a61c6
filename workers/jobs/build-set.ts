import type { Job } from 'bullmq'
import { eq } from 'drizzle-orm'
import type { DB } from '../../server/database/client'
import { tables as t } from '../../server/database/client'
import type { SetBuild } from '../../server/database/workflow-schema'
import { ENGINE_VERSION } from '../../server/utils/workflow/engine-version'
import { JobCancelled, runQueuedWork } from '../../server/utils/workflow/job-lifecycle'
import { notifyBuildEnded } from '../../server/utils/workflow/job-mail'
import { insertErrorSet } from '../../server/utils/workflow/set-store'
import { buildErrorSet } from '../../shared/physics/evolution/build-set'
import { compileInput } from '../../shared/physics/input/model'
import { parseInputDocument } from '../../shared/physics/input/parse'
import { SET_FILE_EXTENSION } from '../../shared/physics/sets/format'
import { writeSetFile } from '../../shared/physics/sets/write'
import { buildSetPayload, type JobProgress, type SetBuildRequest } from '../../shared/queue/workflow'

/**
 * Builds an error set from a parametrised fit (the `set_builds` row named by the payload): the
 * engine evolves every member, reporting members built / total into the row and
 * job.updateProgress and stopping at the cancel flag; the set file is written by the engine and
 * stored as a new library set together with the row's `done` state in one transaction.
 * Idempotent: a finished build is not rebuilt; an unfinished one starts over. A RangeError
 * (bad fit: no covariance, a divergent member) fails at once without retries.
 */
export async function buildSetJob(db: DB, job: Job) {
  const { buildId } = buildSetPayload.parse(job.data)
  return runQueuedWork<SetBuild, { setId: string }>(db, job, {
    table: t.setBuilds, id: buildId, resetProgress: { progressDone: 0 },
    work: async row => ({ setId: await build(db, job, row) }),
    notify: () => notifyBuildEnded(db, buildId)
  })
}

async function build(db: DB, job: Job, b: SetBuild): Promise<string> {
  const request = b.request as SetBuildRequest
  const document = parseInputDocument(request.input, 'input')
  const baseline = request.baseline !== undefined ? parseInputDocument(request.baseline, 'baseline') : undefined
  const model = compileInput(document, baseline)
  const [requester] = b.requestedBy
    ? await db.select({ name: t.users.name }).from(t.users).where(eq(t.users.id, b.requestedBy))
    : []
  const set = await buildErrorSet(model, undefined, {
    provenance: `built by ${requester?.name ?? 'unknown'} with ${ENGINE_VERSION} (set build ${b.id})`,
    onProgress: async (done, total) => {
      const [row] = await db.update(t.setBuilds).set({ progressDone: done, progressTotal: total })
        .where(eq(t.setBuilds.id, b.id)).returning({ cancel: t.setBuilds.cancelRequested })
      const progress: JobProgress = { done, total }
      await job.updateProgress(progress)
      if (!row || row.cancel) throw new JobCancelled()
    }
  })
  const bytes = writeSetFile(set)
  return db.transaction(async (tx) => {
    const [current] = await tx.select({ cancel: t.setBuilds.cancelRequested }).from(t.setBuilds).where(eq(t.setBuilds.id, b.id)).for('update')
    if (!current || current.cancel) throw new JobCancelled()
    const setId = await insertErrorSet(tx, {
      workspaceId: b.workspaceId, name: b.name, fileName: `${b.name.replace(/[^\w.-]+/g, '_')}${SET_FILE_EXTENSION}`,
      bytes, origin: 'build', addedBy: b.requestedBy
    })
    await tx.update(t.setBuilds).set({ state: 'done', setId, progressDone: set.members.length, progressTotal: set.members.length, finishedAt: new Date() })
      .where(eq(t.setBuilds.id, b.id))
    await tx.insert(t.auditEvents).values({
      workspaceId: b.workspaceId, actorId: b.requestedBy, action: 'set.built', subjectType: 'error_set', subjectId: setId,
      detail: { buildId: b.id, members: set.members.length }
    })
    return setId
  })
}
