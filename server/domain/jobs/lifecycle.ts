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

/**
 * The cancel flag of a running row, read cheaply and often: one primary-key read every
 * `everyMs` (200 ms) in the background, so cancel takes effect within that (plus the current
 * engine slice) at any phase, not only between member chunks. `signal` aborts on cancel (pool
 * tasks listen to it); `check()` throws JobCancelled once it has.
 */
export interface CancelWatch {
  signal: AbortSignal
  check: () => void
  /** Reads the flag now (at a chunk's end, before the final commit). */
  readNow: () => Promise<void>
  stop: () => void
}

export const CANCEL_POLL_MS = 200

export function watchCancel(db: DB, queued: QueuedTable, id: string, everyMs = CANCEL_POLL_MS): CancelWatch {
  const table = asResults(queued)
  const controller = new AbortController()
  let timer: ReturnType<typeof setTimeout> | undefined
  let stopped = false
  const readNow = async () => {
    const [row] = await db.select({ cancel: table.cancelRequested }).from(table).where(eq(table.id, id))
    if (!row || row.cancel) controller.abort(new JobCancelled())
  }
  const tick = () => {
    timer = setTimeout(() => {
      // A failed read (database restarting) is not a cancel: the next tick reads again.
      readNow().catch(() => {}).finally(() => {
        if (!stopped && !controller.signal.aborted) tick()
      })
    }, everyMs)
    timer.unref?.()
  }
  tick()
  return {
    signal: controller.signal,
    check: () => { if (controller.signal.aborted) throw new JobCancelled() },
    readNow: async () => {
      await readNow()
      if (controller.signal.aborted) throw new JobCancelled()
    },
    stop: () => { stopped = true; clearTimeout(timer) }
  }
}

/** Whether `err` is a cancel: JobCancelled, or a pool task aborted by the watch's signal. */
export const isCancel = (err: unknown, watch?: CancelWatch) =>
  err instanceof JobCancelled || Boolean(watch?.signal.aborted && err instanceof Error && (err.name === 'AbortError' || err.cause instanceof JobCancelled))

/** One try at the work: whether a failure now is the last, and a label for the log. */
export interface Attempt { last: boolean, label: string }

/** A single try with no retry after it (the seed, the command line). */
export const ONLY_ATTEMPT: Attempt = { last: true, label: 'inline' }

export interface QueuedWork<Row, Out> {
  table: QueuedTable
  id: string
  /** Extra columns to set when the row is claimed (its progress counter, its first phase). */
  resetProgress: Record<string, number | string>
  /** The work; `cancel` watches the row's flag from the claim on. */
  work: (row: Row, cancel: CancelWatch) => Promise<Out>
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
  const watch = watchCancel(db, w.table, w.id)
  try {
    const out = await w.work(claimed as Row, watch)
    await w.ended?.()
    return { id: w.id, state: 'done', ...out }
  } catch (err) {
    if (isCancel(err, watch)) {
      await cancel()
      await w.ended?.()
      return { id: w.id, state: 'cancelled' }
    }
    const physics = err instanceof RangeError
    const final = physics || attempt.last
    const message = failureReason(err)
    if (!physics) console.error(`[jobs] ${attempt.label}: ${logText(err)}`)
    await db.update(table).set({ state: final ? 'failed' : 'queued', ...(final ? {} : { phase: 'queued' as const }), error: message, finishedAt: final ? new Date() : null }).where(eq(table.id, w.id))
    if (final) await w.ended?.()
    throw physics ? new FinalFailure(message) : new Error(message)
  } finally {
    watch.stop()
  }
}
