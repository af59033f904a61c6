// What the worker does with each queue's jobs: the domain's run functions, with the job's
// progress and retries. Bad physics input (FinalFailure) becomes BullMQ's UnrecoverableError, so
// the queue does not retry what no retry can mend. A large run is a flow: its member chunks are
// child jobs (runChunkJob, any worker), its run-study job combines their values.
import { hostname } from 'node:os'
import { type Job, UnrecoverableError } from 'bullmq'
import { eq, inArray, and } from 'drizzle-orm'
import { tables as t, type DB } from '../server/database/client'
import { FinalFailure, type Attempt } from '../server/domain/jobs/lifecycle'
import type { Settings } from '../server/domain/settings'
import { runSetBuild } from '../server/domain/sets/build'
import { evaluateRunChunk, runStudy } from '../server/domain/studies/run'
import { buildSetPayload, failureReason, runChunkPayload, runStudyPayload } from '../shared/queue/workflow'

/** This worker's name in chunk results (which worker took which chunk). */
export const WORKER_NAME = process.env.SHEAF_WORKER_NAME || `${hostname()}:${process.pid}`

/** The domain's view of a BullMQ job's current try: the last one when no retry remains. */
export const attemptOf = (job: Job): Attempt => ({
  last: job.attemptsMade + 1 >= (job.opts.attempts ?? 1),
  label: `${job.queueName} ${job.id}`
})

/** Exported for the handlers in their own files (workers/impact-update.ts). */
export async function unrecoverableOnFinal<T>(work: Promise<T>): Promise<T> {
  try {
    return await work
  } catch (err) {
    throw err instanceof FinalFailure ? new UnrecoverableError(err.message) : err
  }
}

const runOptions = (job: Job, settings: Settings) =>
  ({ onProgress: (p: object) => job.updateProgress(p), attempt: attemptOf(job), mail: settings })

/** What a chunk job returns: its members' values (little-endian float64, base64), or null when the run was cancelled. */
export interface ChunkValue { m0: number, m1: number, by: string, values: string | null }

/** The run-study queue: one study on one set (a results row); with `chunks`, the combining step of a flow. */
export function runStudyJob(db: DB, settings: Settings, job: Job) {
  const { resultId, chunks } = runStudyPayload.parse(job.data)
  const memberValues = chunks?.length ? () => gatherChunks(job, chunks) : undefined
  return unrecoverableOnFinal(runStudy(db, resultId, { ...runOptions(job, settings), memberValues }))
}

/** The member values of every chunk of the flow, in member order (one members × bins matrix). */
async function gatherChunks(job: Job, chunks: Array<[number, number]>): Promise<Float64Array> {
  const got = Object.values(await job.getChildrenValues<ChunkValue>())
  const byStart = new Map(got.filter(v => v?.values).map(v => [v.m0, v]))
  const parts = chunks.map(([m0, m1]) => {
    const v = byStart.get(m0)
    if (!v || v.m1 !== m1) throw new Error(`The values of members ${m0}…${m1} are missing`)
    const bytes = Buffer.from(v.values!, 'base64')
    return new Float64Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength))
  })
  const out = new Float64Array(parts.reduce((n, p) => n + p.length, 0))
  let at = 0
  for (const p of parts) {
    out.set(p, at)
    at += p.length
  }
  return out
}

/**
 * A member chunk of a run's flow. Its last failure (or bad physics input at once) marks the
 * result failed with the reason, since the flow's parent will then never run.
 */
export async function runChunkJob(db: DB, job: Job): Promise<ChunkValue> {
  const { resultId, m0, m1 } = runChunkPayload.parse(job.data)
  try {
    const values = await evaluateRunChunk(db, resultId, m0, m1)
    return { m0, m1, by: WORKER_NAME, values: values ? Buffer.from(values.buffer, values.byteOffset, values.byteLength).toString('base64') : null }
  } catch (err) {
    const physics = err instanceof RangeError
    if (physics || attemptOf(job).last) {
      await db.update(t.results).set({ state: 'failed', error: failureReason(err), finishedAt: new Date() })
        .where(and(eq(t.results.id, resultId), inArray(t.results.state, ['queued', 'running'])))
    }
    throw physics ? new UnrecoverableError(failureReason(err)) : err
  }
}

/** The build-set queue: an error set from a fit (a set_builds row). */
export function buildSetJob(db: DB, settings: Settings, job: Job) {
  const { buildId } = buildSetPayload.parse(job.data)
  return unrecoverableOnFinal(runSetBuild(db, buildId, runOptions(job, settings)))
}
