import { desc, eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { latestResults, publicResult, publicStudy } from '../../../../domain/studies/studies'

// The workspace's studies, newest first, each with the newest result version per set.
export default defineEventHandler(async (event) => {
  const { workspace } = await requireWorkspace(event, 'viewer')
  const workspaceId = workspace.id
  const rows = await useDB().select().from(t.studies)
    .where(eq(t.studies.workspaceId, workspaceId)).orderBy(desc(t.studies.updatedAt))
  const latest = await latestResults(useDB(), rows.map(s => s.id))
  return {
    studies: rows.map(s => ({
      ...publicStudy(s),
      binCount: (s.spec as { bins?: unknown[] }).bins?.length ?? 0,
      latestResults: latest.filter(r => r.studyId === s.id).map(publicResult)
    }))
  }
})
