/**
 * Queues of the analyst's workflow and the payload each job carries. The server enqueues, the
 * worker parses `job.data` with the same schema. A job's BullMQ id is the id of the row it
 * fills (a result or a set build), so enqueuing twice or retrying never makes a second row.
 */
import { z } from 'zod'

/** One job per study × set: evaluate every member and store values + bands. */
export const RUN_STUDY_QUEUE = 'run-study'
/** Build an error set from a parametrised fit (evolution + members). */
export const BUILD_SET_QUEUE = 'build-set'

/** Member chunks of a large run, children of its run-study job in a BullMQ flow: `<queue>-chunk`. */
export const chunkQueueOf = (runQueue: string) => `${runQueue}-chunk`
export const RUN_CHUNK_QUEUE = chunkQueueOf(RUN_STUDY_QUEUE)

export const runChunkPayload = z.object({
  resultId: z.uuid(),
  /** Members [m0, m1) of the varying set. */
  m0: z.number().int().min(0),
  m1: z.number().int().min(1)
})
export type RunChunkPayload = z.infer<typeof runChunkPayload>

export const runStudyPayload = z.object({
  /** The `results` row this job fills. */
  resultId: z.uuid(),
  /**
   * Member ranges [m0, m1) evaluated by the child jobs of this job's flow (a large run spread
   * over workers); this job then only combines and stores. Absent: the job evaluates everything.
   */
  chunks: z.array(z.tuple([z.number().int().min(0), z.number().int().min(1)])).optional()
})
export type RunStudyPayload = z.infer<typeof runStudyPayload>

export const buildSetPayload = z.object({
  /** The `set_builds` row this job fills. */
  buildId: z.uuid()
})
export type BuildSetPayload = z.infer<typeof buildSetPayload>

// ---- set updates by a measurement (reweighting, profiling): handler in workers/impact-update.ts
/** Update a set by a measurement and save the derived set (an impact_updates row). */
export const IMPACT_UPDATE_QUEUE = 'impact-update'

export const impactUpdatePayload = z.object({
  /** The `impact_updates` row this job fills. */
  updateId: z.uuid()
})
export type ImpactUpdatePayload = z.infer<typeof impactUpdatePayload>
// ---- end of set updates

/** A build request as stored in set_builds.request and read back by the build-set job. */
export interface SetBuildRequest {
  /** The parametrised input (or nuclear modification) document, members and grid overrides applied. */
  input: unknown
  /** The baseline document of a nuclear modification. */
  baseline?: unknown
  members?: unknown
  grid?: unknown
  /**
   * A nuclear family built for several nuclei in one job: one set per entry, named `name`, in
   * this order (checked and named when the build was requested).
   */
  nuclei?: Array<{ z: number, a: number, name: string }>
}

/**
 * The phases a run or build names in its progress, in order: waiting on the queue, the engine
 * evaluating (a run) or evolving (a build) the members, the bands of every prescription and the
 * scale variation, and the one transaction that stores it all.
 */
export const JOB_PHASES = ['queued', 'evaluating members', 'evolving members', 'combining', 'storing'] as const
export type JobPhase = typeof JOB_PHASES[number]

/** Progress a job reports through job.updateProgress (and into its row). */
export const jobProgress = z.object({ done: z.number().int().min(0), total: z.number().int().min(0), phase: z.enum(JOB_PHASES).optional() })
export type JobProgress = z.infer<typeof jobProgress>

/** Default BullMQ job options: two attempts (a retry is idempotent), keep a short history. */
export const workflowJobOptions = {
  attempts: 2,
  backoff: { type: 'fixed', delay: 1000 },
  removeOnComplete: { count: 200 },
  removeOnFail: { count: 500 }
} as const

/**
 * A short, readable failure reason for a job's row: the engine's RangeError message as it is;
 * for anything else the underlying cause (a database driver error keeps its SQL and bound
 * parameters in the wrapper's message, which must not reach users), first line, at most 500
 * characters.
 */
export function failureReason(err: unknown): string {
  if (err instanceof RangeError) return err.message.slice(0, 2000)
  const cause = err instanceof Error && err.cause instanceof Error ? err.cause : err
  const text = cause instanceof Error ? cause.message : String(cause)
  const line = text.split('\n')[0]!.trim()
  return (line.startsWith('Failed query') ? 'A database error stopped the job' : line).slice(0, 500)
}
