// The life of a queued row (a result or a set build) in the worker: claim it, run the work,
// record cancel or failure, mail the end. No Nitro imports.
import { type Job, UnrecoverableError } from 'bullmq'
import { and, eq, inArray } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import { failureReason } from '../../../shared/queue/workflow'

/** Thrown by work that saw its row's cancel flag. */
export class JobCancelled extends Error {}

/**
 * Both queued tables share the columns used here (id, state, error, cancelRequested,
 * startedAt, finishedAt); queries are typed against results and run on either table.
 */
type QueuedTable = typeof t.results | typeof t.setBuilds
const asResults = (table: QueuedTable) => table as typeof t.results

export interface QueuedWork<Row, Out> {
  table: QueuedTable
  id: string
  /** Extra columns to reset when the row is claimed (its progress counter). */
  resetProgress: Record<string, number>
  work: (row: Row) => Promise<Out>
  /** Mails the requester once the row has ended. */
  notify: () => Promise<void>
}

/**
 * Claims the row (queued, or running after a worker died) unless it is cancelled, runs `work`,
 * and records the outcome: cancelled (JobCancelled), failed at once for a RangeError of the
 * engine (UnrecoverableError: retrying bad physics input cannot help), otherwise back to queued
 * until the last attempt. A row that cannot be claimed (gone, finished, cancelled) is skipped.
 */
export async function runQueuedWork<Row, Out>(db: DB, job: Job, w: QueuedWork<Row, Out>) {
  const table = asResults(w.table)
  const [claimed] = await db.update(table)
    .set({ state: 'running', startedAt: new Date(), error: null, finishedAt: null, ...w.resetProgress })
    .where(and(eq(table.id, w.id), inArray(table.state, ['queued', 'running']), eq(table.cancelRequested, false)))
    .returning()
  const cancel = async () => {
    await db.update(table).set({ state: 'cancelled', finishedAt: new Date() }).where(eq(table.id, w.id))
  }
  if (!claimed) {
    const [row] = await db.select().from(table).where(eq(table.id, w.id))
    if (row?.cancelRequested && (row.state === 'queued' || row.state === 'running')) {
      await cancel()
      return { id: w.id, state: 'cancelled' as const, skipped: true }
    }
    return { id: w.id, state: row?.state ?? 'missing', skipped: true }
  }
  try {
    const out = await w.work(claimed as Row)
    await w.notify()
    return { id: w.id, state: 'done' as const, ...out }
  } catch (err) {
    if (err instanceof JobCancelled) {
      await cancel()
      await w.notify()
      return { id: w.id, state: 'cancelled' as const }
    }
    const physics = err instanceof RangeError
    const final = physics || job.attemptsMade + 1 >= (job.opts.attempts ?? 1)
    const message = failureReason(err)
    if (!physics) console.error(`[worker] ${job.queueName} ${job.id}:`, err instanceof Error && err.cause instanceof Error ? err.cause.message : message)
    await db.update(table).set({ state: final ? 'failed' : 'queued', error: message, finishedAt: final ? new Date() : null }).where(eq(table.id, w.id))
    if (final) await w.notify()
    throw physics ? new UnrecoverableError(message) : new Error(message)
  }
}
