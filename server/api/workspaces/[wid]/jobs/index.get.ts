import { desc, eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'

export default defineEventHandler(async (event) => {
  const { workspace } = await requireWorkspace(event, 'viewer')
  const rows = await useDB().select().from(t.jobs)
    .where(eq(t.jobs.workspaceId, workspace.id))
    .orderBy(desc(t.jobs.createdAt)).limit(50)
  return { jobs: rows.map(publicJob) }
})
