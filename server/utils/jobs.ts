import { eq } from 'drizzle-orm'
import { tables as t } from '../database/client'
import type { Job } from '../database/schema'

/** What the API shows of a job row. */
export const publicJob = (j: Job) => ({
  id: j.id, kind: j.kind, state: j.state, progress: j.progress, input: j.input, result: j.result,
  error: j.error, createdAt: j.createdAt, startedAt: j.startedAt, finishedAt: j.finishedAt
})

/**
 * Insert a jobs row (state queued) and put `{ jobId, ...input }` on `queue` with the row id as the
 * BullMQ job id, so a duplicate add is ignored and a retry updates the same row.
 */
export async function enqueueJob(o: { queue: string, kind: string, workspaceId: string, requestedBy: string, input: Record<string, unknown> }) {
  const [row] = await useDB().insert(t.jobs)
    .values({ workspaceId: o.workspaceId, kind: o.kind, requestedBy: o.requestedBy, input: o.input })
    .returning()
  try {
    await useQueue(o.queue).add(o.kind, { jobId: row!.id, ...o.input }, {
      jobId: row!.id, attempts: 3, backoff: { type: 'exponential', delay: 1000 },
      removeOnComplete: { age: 24 * 3600 }, removeOnFail: { age: 7 * 24 * 3600 }
    })
  } catch (err) {
    await useDB().update(t.jobs).set({ state: 'failed', error: 'The queue is unavailable' }).where(eq(t.jobs.id, row!.id))
    console.error('[queue]', (err as Error).message)
    throw createError({ statusCode: 503, statusMessage: 'The job queue is unavailable; try again in a minute' })
  }
  await audit({ workspaceId: o.workspaceId, actorId: o.requestedBy, action: 'job.enqueued', subjectType: 'job', subjectId: row!.id, detail: { kind: o.kind } })
  return publicJob(row!)
}
