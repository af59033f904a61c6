import { and, eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'

export default defineEventHandler(async (event) => {
  const { workspace } = await requireWorkspace(event, 'viewer')
  const id = uuidParam(event, 'jid', 'Job')
  const [row] = await useDB().select().from(t.jobs).where(and(eq(t.jobs.id, id), eq(t.jobs.workspaceId, workspace.id)))
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Job not found' })
  return publicJob(row)
})
