// Putting a queued row's job on the queue and cancelling it. The caller passes its producers
// (`queues`), so the server, the seed and tests share this code.
import { FlowProducer, type Queue } from 'bullmq'
import { and, eq, inArray } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import { chunkQueueOf, RUN_STUDY_QUEUE, workflowJobOptions, type RunChunkPayload } from '../../../shared/queue/workflow'
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
 * How a run of `members` members is split into chunks for the workers: none below
 * FLOW_MIN_MEMBERS (one job does all), else about twelve chunks of at least 16 members, so
 * that three or four workers each take several and a dead worker's chunk is a small loss.
 */
export const FLOW_MIN_MEMBERS = 64
export function runChunks(members: number, chunkMembers = Math.max(16, Math.ceil(members / 12))): Array<[number, number]> {
  if (members < FLOW_MIN_MEMBERS) return []
  const chunks: Array<[number, number]> = []
  for (let m0 = 0; m0 < members; m0 += chunkMembers) chunks.push([m0, Math.min(members, m0 + chunkMembers)])
  return chunks
}

/**
 * Options of each member chunk and of the flow's parent: tries spaced 1, 2, 4, 8, 16 s apart, so
 * a database or Redis restart of up to half a minute costs a retry, not the run (a chunk is cheap
 * to redo, and redoing it is idempotent).
 */
const flowRetries = { attempts: 6, backoff: { type: 'exponential', delay: 1000 } } as const
export const chunkJobOptions = {
  ...flowRetries,
  failParentOnFailure: true,
  removeOnComplete: { count: 2000 },
  removeOnFail: { count: 500 }
} as const

const flows = new WeakMap<Queue, FlowProducer>()
/** The flow producer on the same Redis connection (and prefix) as `queue`. */
function flowOf(queue: Queue): FlowProducer {
  let f = flows.get(queue)
  if (!f) {
    f = new FlowProducer({ connection: queue.opts.connection, prefix: queue.opts.prefix })
    flows.set(queue, f)
  }
  return f
}

/**
 * Queues result `id` as a BullMQ flow: one child job per member chunk on `<queue>-chunk` (any
 * worker takes any chunk; job ids `<id>-c<k>`, so adding twice adds nothing) and the parent
 * job `id` on `queue`, which runs once every chunk is done and combines them into the one result.
 */
export async function addRunFlow(queue: Queue, id: string, payload: Record<string, unknown>, chunks: Array<[number, number]>, options: EnqueueOptions = {}) {
  const priority = options.priority !== undefined ? { priority: options.priority } : {}
  await flowOf(queue).add({
    name: queue.name, queueName: queue.name, data: { ...payload, chunks }, opts: { jobId: id, ...workflowJobOptions, ...flowRetries, ...priority },
    children: chunks.map(([m0, m1], k) => {
      const data: RunChunkPayload = { resultId: id, m0, m1 }
      return { name: 'chunk', queueName: chunkQueueOf(queue.name), data, opts: { jobId: `${id}-c${k}`, ...chunkJobOptions, ...priority } }
    })
  })
}

/** The chunks a result is split into when queued (none for a small one). */
async function chunksOf(db: DB, queue: string, id: string) {
  if (queue !== RUN_STUDY_QUEUE) return []
  const [row] = await db.select({ members: t.results.membersTotal }).from(t.results).where(eq(t.results.id, id))
  return row ? runChunks(row.members) : []
}

/**
 * Queues `payload` with the row id as the BullMQ job id (a large run: as a flow of member
 * chunks, see addRunFlow). Call it after the transaction that
 * inserted the row has committed (a worker may pick the job up at once). On a queue failure the
 * row is marked failed with the reason (it stays, as the record of a request that could not be
 * queued, beside its audit event) and the request answers 503.
 */
export async function enqueueRow(db: DB, queues: QueueSource, table: QueuedTable, queue: string, id: string, payload: Record<string, unknown>, options: EnqueueOptions = {}) {
  const rows = asResults(table)
  try {
    const chunks = await chunksOf(db, queue, id)
    if (chunks.length) await addRunFlow(queues(queue), id, payload, chunks, options)
    else await queues(queue).add(queue, payload, { jobId: id, ...workflowJobOptions, ...(options.priority !== undefined ? { priority: options.priority } : {}) })
  } catch (err) {
    console.error('[queue]', (err as Error).message)
    await db.update(rows).set({ state: 'failed', error: 'The job queue is unavailable', finishedAt: new Date() }).where(eq(rows.id, id))
    fail(503, 'The job queue is unavailable; try again in a minute')
  }
  await db.update(rows).set({ jobId: id }).where(eq(rows.id, id))
}

/**
 * Cancels a queued or running row: a waiting job is removed and the row marked cancelled at once;
 * a running one gets the cancel flag, which the worker reads every 200 ms (watchCancel). 409 once it has ended.
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
    if (await job.isWaitingChildren()) {
      // A run's flow: removing the parent removes its chunks; it fails while a worker holds one.
      await job.remove({ removeChildren: true })
      return ['queued', 'running']
    }
  } catch {
    // Locked by a worker that just picked it up: the flag will stop it.
  }
  return []
}
