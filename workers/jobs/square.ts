import type { Job as QueueJob } from 'bullmq'
import { eq } from 'drizzle-orm'
import type { DB } from '../../server/database/client'
import { tables as t } from '../../server/database/client'
import { squarePayloadSchema } from '../../shared/queue/names'
import { markFailed, markRunning, markSucceeded } from './lifecycle'

const sleep = (ms: number) => new Promise(r => setTimeout(r, ms))

/**
 * Demo job: squares each number, one step per number, reporting progress after each step.
 * Idempotent: a retry recomputes from the input and overwrites the same jobs row.
 */
export async function runSquare(db: DB, job: QueueJob) {
  const payload = squarePayloadSchema.parse(job.data)
  await markRunning(db, payload.jobId, job.attemptsMade + 1)
  try {
    const squares: number[] = []
    for (const [i, n] of payload.numbers.entries()) {
      if (payload.stepMs) await sleep(payload.stepMs)
      squares.push(n * n)
      const progress = (i + 1) / payload.numbers.length
      await db.update(t.jobs).set({ progress }).where(eq(t.jobs.id, payload.jobId))
      await job.updateProgress(Math.round(progress * 100))
    }
    const sum = squares.reduce((a, b) => a + b, 0)
    await markSucceeded(db, payload.jobId, { squares, sum })
    return { sum }
  } catch (err) {
    await markFailed(db, payload.jobId, err, job.attemptsMade + 1 >= (job.opts.attempts ?? 1))
    throw err
  }
}
