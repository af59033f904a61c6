import { desc, eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'

// The workspace's studies, newest first, each with the newest result version per set.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  await requireMembership(workspaceId, user.id, 'viewer')
  const rows = await useDB().select().from(t.studies)
    .where(eq(t.studies.workspaceId, workspaceId)).orderBy(desc(t.studies.updatedAt))
  const latest = await latestResults(rows.map(s => s.id))
  return {
    studies: rows.map(s => ({
      ...publicStudy(s),
      binCount: (s.spec as { bins?: unknown[] }).bins?.length ?? 0,
      latestResults: latest.filter(r => r.studyId === s.id).map(publicResult)
    }))
  }
})
