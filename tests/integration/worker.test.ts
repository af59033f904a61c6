import type { Job as QueueJob } from 'bullmq'
import { eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { runSquare } from '../../workers/jobs/square'
import { tables, testDB } from '../support/db'
import { createWorkspace } from '../support/users'

// The job function on its own, with a stand-in for the BullMQ job (no queue involved).
function fakeJob(data: unknown, attemptsMade = 0) {
  const progress: number[] = []
  const job = { data, attemptsMade, opts: { attempts: 3 }, updateProgress: async (p: number) => { progress.push(p) } }
  return { job: job as unknown as QueueJob, progress }
}

describe('square job function', () => {
  it('is idempotent: a retry leaves exactly one result on the same row', async () => {
    const ws = await createWorkspace('Worker')
    const [row] = await testDB().insert(tables.jobs).values({ workspaceId: ws.id, kind: 'demo.square', input: { numbers: [2, 5] } }).returning()
    const first = fakeJob({ jobId: row!.id, numbers: [2, 5], stepMs: 0 })
    await runSquare(testDB(), first.job)
    expect(first.progress).toEqual([50, 100])
    await runSquare(testDB(), fakeJob({ jobId: row!.id, numbers: [2, 5], stepMs: 0 }, 1).job)
    const rows = await testDB().select().from(tables.jobs).where(eq(tables.jobs.id, row!.id))
    expect(rows).toHaveLength(1)
    expect(rows[0]).toMatchObject({ state: 'succeeded', progress: 1, attempts: 2, result: { squares: [4, 25], sum: 29 }, error: null })
  })

  it('refuses a malformed payload without touching any row', async () => {
    await expect(runSquare(testDB(), fakeJob({ jobId: 'nope', numbers: [] }).job)).rejects.toThrow()
  })
})
