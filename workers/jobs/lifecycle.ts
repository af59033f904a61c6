import { eq } from 'drizzle-orm'
import type { DB } from '../../server/database/client'
import { tables as t } from '../../server/database/client'

// State changes of a jobs row shared by every job function.

export async function markRunning(db: DB, id: string, attempt: number) {
  await db.update(t.jobs)
    .set({ state: 'running', progress: 0, attempts: attempt, startedAt: new Date(), error: null, result: null, finishedAt: null })
    .where(eq(t.jobs.id, id))
}

export async function markSucceeded(db: DB, id: string, result: Record<string, unknown>) {
  await db.update(t.jobs).set({ state: 'succeeded', progress: 1, result, finishedAt: new Date() }).where(eq(t.jobs.id, id))
}

/** Record the error; the row only turns `failed` on the last attempt, else back to `queued`. */
export async function markFailed(db: DB, id: string, err: unknown, final: boolean) {
  const message = err instanceof Error ? err.message : String(err)
  await db.update(t.jobs)
    .set({ state: final ? 'failed' : 'queued', error: message.slice(0, 2000), finishedAt: final ? new Date() : null })
    .where(eq(t.jobs.id, id))
}
