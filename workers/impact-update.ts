// The impact-update queue: a set updated by a measurement and saved to the library (an
// impact_updates row), through the domain's runImpactUpdate with the job's progress and retries.
import type { Job } from 'bullmq'
import type { DB } from '../server/database/client'
import { runImpactUpdate } from '../server/domain/impact/run'
import { impactUpdatePayload } from '../shared/queue/workflow'
import { attemptOf, unrecoverableOnFinal } from './handlers'

export function impactUpdateJob(db: DB, job: Job) {
  const { updateId } = impactUpdatePayload.parse(job.data)
  return unrecoverableOnFinal(runImpactUpdate(db, updateId, { onProgress: (p: object) => job.updateProgress(p), attempt: attemptOf(job) }))
}
