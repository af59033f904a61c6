// What the worker does with each queue's jobs: the domain's run functions, with the job's
// progress and retries. Bad physics input (FinalFailure) becomes BullMQ's UnrecoverableError, so
// the queue does not retry what no retry can mend.
import { type Job, UnrecoverableError } from 'bullmq'
import type { DB } from '../server/database/client'
import { FinalFailure, type Attempt } from '../server/domain/jobs/lifecycle'
import type { Settings } from '../server/domain/settings'
import { runSetBuild } from '../server/domain/sets/build'
import { runStudy } from '../server/domain/studies/run'
import { buildSetPayload, runStudyPayload } from '../shared/queue/workflow'

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

/** The run-study queue: one study on one set (a results row). */
export function runStudyJob(db: DB, settings: Settings, job: Job) {
  const { resultId } = runStudyPayload.parse(job.data)
  return unrecoverableOnFinal(runStudy(db, resultId, runOptions(job, settings)))
}

/** The build-set queue: an error set from a fit (a set_builds row). */
export function buildSetJob(db: DB, settings: Settings, job: Job) {
  const { buildId } = buildSetPayload.parse(job.data)
  return unrecoverableOnFinal(runSetBuild(db, buildId, runOptions(job, settings)))
}
