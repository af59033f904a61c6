// Helpers of the set-build integration tests: what a refused request must not leave behind, and
// waiting for a queued build to end.
import { and, eq } from 'drizzle-orm'
import { expect } from 'vitest'
import { tables as t, testDB } from '../../support/db'
import type { ApiClient } from '../../support/http'

/** Build rows and build-queued audit entries of a workspace: none may appear for a refused request. */
export async function buildTraces(workspaceId: string) {
  const db = testDB()
  const rows = await db.select({ id: t.setBuilds.id }).from(t.setBuilds).where(eq(t.setBuilds.workspaceId, workspaceId))
  const audits = await db.select({ id: t.auditEvents.id }).from(t.auditEvents)
    .where(and(eq(t.auditEvents.workspaceId, workspaceId), eq(t.auditEvents.action, 'set.build-queued')))
  return { rows: rows.length, audits: audits.length }
}

/** Polls a set build until it ended (done, failed or cancelled), up to `ms`; its public row. */
export async function waitForBuild(client: ApiClient, workspaceId: string, buildId: string, ms = 90_000) {
  const deadline = Date.now() + ms
  for (;;) {
    const res = await client.get(`/api/workspaces/${workspaceId}/sets/builds/${buildId}`)
    expect(res.status).toBe(200)
    if (['done', 'failed', 'cancelled'].includes(res.body.state)) return res.body
    if (Date.now() > deadline) throw new Error(`build still ${res.body.state}`)
    await new Promise(r => setTimeout(r, 200))
  }
}
