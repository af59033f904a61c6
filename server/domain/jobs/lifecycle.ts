// The one life of a queued row (a result or a set build): queued → running → done / failed /
// cancelled, with progress, cancel and retry. Used by the worker, the seed and the command line
// alike; nothing here knows about BullMQ.
import { and, eq, inArray } from 'drizzle-orm'
import type { DB, tables as t } from '../../database/client'
import { failureReason } from '../../../shared/queue/workflow'
import { logText } from '../log-text'

/** Thrown by work that saw its row's cancel flag. */
export class JobCancelled extends Error {}

/** Thrown for a failure that no retry can mend (bad physics input); the queue must not retry. */
export class FinalFailure extends Error {}

/**
 * Both queued tables share the columns used here (id, state, error, cancelRequested,
 * startedAt, finishedAt); queries are typed against results and run on either table.
 */
export type QueuedTable = typeof t.results | typeof t.setBuilds
export const asResults = (table: QueuedTable) => table as typeof t.results

/** One try at the work: whether a failure now is the last, and a label for the log. */
export interface Attempt { last: boolean, label: string }

/** A single try with no retry after it (the seed, the command line). */
export const ONLY_ATTEMPT: Attempt = { last: true, label: 'inline' }

export interface QueuedWork<Row, Out> {
  table: QueuedTable
  id: string
  /** Extra columns to reset when the row is claimed (its progress counter). */
  resetProgress: Record<string, number>
  work: (row: Row) => Promise<Out>
  /** Called once the row has ended (done, failed for the last time, cancelled): the e-mail. */
  ended?: () => Promise<void>
}

export type WorkOutcome<Out> =
  | ({ id: string, state: 'done' } & Out)
  | { id: string, state: 'cancelled', skipped?: true }
  | { id: string, state: string, skipped: true }

/**
 * Claims the row (queued, or running after a worker died) unless it is cancelled, runs `work`,
 * and records the outcome: cancelled (JobCancelled), failed at once for a RangeError of the
 * engine (rethrown as FinalFailure: retrying bad physics input cannot help), otherwise back to
 * queued until the last attempt (rethrown, so the queue retries). A row that cannot be claimed
 * (gone, finished, cancelled) is skipped.
 */
export async function runQueuedWork<Row, Out extends object>(db: DB, attempt: Attempt, w: QueuedWork<Row, Out>): Promise<WorkOutcome<Out>> {
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
      return { id: w.id, state: 'cancelled', skipped: true }
    }
    return { id: w.id, state: row?.state ?? 'missing', skipped: true }
  }
  try {
    const out = await w.work(claimed as Row)
    await w.ended?.()
    return { id: w.id, state: 'done', ...out }
  } catch (err) {
    if (err instanceof JobCancelled) {
      await cancel()
      await w.ended?.()
      return { id: w.id, state: 'cancelled' }
    }
    const physics = err instanceof RangeError
    const final = physics || attempt.last
    const message = failureReason(err)
    if (!physics) console.error(`[jobs] ${attempt.label}: ${logText(err)}`)
    await db.update(table).set({ state: final ? 'failed' : 'queued', error: message, finishedAt: final ? new Date() : null }).where(eq(table.id, w.id))
    if (final) await w.ended?.()
    throw physics ? new FinalFailure(message) : new Error(message)
  }
}
