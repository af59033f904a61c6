// Putting a queued row's job on the queue and cancelling it. The caller passes its producers
// (`queues`), so the server, the seed and tests share this code.
import type { Queue } from 'bullmq'
import { and, eq, inArray } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { workflowJobOptions } from '../../../shared/queue/workflow'
import { audit, type AuditEntry } from '../audit'
import { fail } from '../errors'
import { asResults, type QueuedTable } from './lifecycle'

/** A BullMQ producer by queue name, created once per process by the caller. */
export type QueueSource = (name: string) => Queue

/** Per-job options: `priority` ≥ 1, lower runs first (BullMQ); none = first come, first served. */
export interface EnqueueOptions {
  priority?: number
}

/**
 * Queues `payload` with the row id as the BullMQ job id. Call it after the transaction that
 * inserted the row has committed (a worker may pick the job up at once). On a queue failure the
 * row is marked failed with the reason (it stays, as the record of a request that could not be
 * queued, beside its audit event) and the request answers 503.
 */
export async function enqueueRow(db: DB, queues: QueueSource, table: QueuedTable, queue: string, id: string, payload: Record<string, unknown>, options: EnqueueOptions = {}) {
  const rows = asResults(table)
  try {
    await queues(queue).add(queue, payload, { jobId: id, ...workflowJobOptions, ...(options.priority !== undefined ? { priority: options.priority } : {}) })
  } catch (err) {
    console.error('[queue]', (err as Error).message)
    await db.update(rows).set({ state: 'failed', error: 'The job queue is unavailable', finishedAt: new Date() }).where(eq(rows.id, id))
    fail(503, 'The job queue is unavailable; try again in a minute')
  }
  await db.update(rows).set({ jobId: id }).where(eq(rows.id, id))
}

/**
 * Cancels a queued or running row: a waiting job is removed and the row marked cancelled at once;
 * a running one gets the cancel flag, which the worker reads between chunks. 409 once it has ended.
 * The flag and the audit event `event` are written in one transaction.
 */
export async function cancelRow(db: DB, queues: QueueSource, table: QueuedTable, queue: string, row: { id: string, state: string }, what: string, event?: AuditEntry) {
  if (row.state !== 'queued' && row.state !== 'running') {
    fail(409, `This ${what} has already ${row.state === 'done' ? 'finished' : row.state === 'failed' ? 'failed' : 'been cancelled'}`)
  }
  const rows = asResults(table)
  await db.transaction(async (tx) => {
    await tx.update(rows).set({ cancelRequested: true }).where(eq(rows.id, row.id))
    if (event) await audit(tx, event)
  })
  const stopNow = await removeWaitingJob(queues(queue), row.id)
  if (stopNow.length) {
    await db.update(rows).set({ state: 'cancelled', finishedAt: new Date() }).where(and(eq(rows.id, row.id), inArray(rows.state, stopNow)))
  }
}

/**
 * Removes job `jobId` from `queue` if it is still waiting. Returns the row states that may be
 * marked cancelled at once: ['queued'] when the job was removed, ['queued', 'running'] when no job
 * exists any more (nothing would read the cancel flag), [] when a worker holds it (it will stop
 * at the flag).
 */
async function removeWaitingJob(queue: Queue, jobId: string): Promise<Array<'queued' | 'running'>> {
  try {
    const job = await queue.getJob(jobId)
    if (!job) return ['queued', 'running']
    if (await job.isWaiting() || await job.isDelayed()) {
      await job.remove()
      return ['queued']
    }
  } catch {
    // Locked by a worker that just picked it up: the flag will stop it.
  }
  return []
}
