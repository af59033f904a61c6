import { desc, eq } from 'drizzle-orm'
import { tables as t } from '../../../../../../database/client'

// The measurements uploaded for a study.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const studyId = uuidParam(event, 'id', 'Study')
  const { study } = await requireStudy(workspaceId, studyId, user.id, 'viewer')
  const rows = await useDB().select().from(t.measurements).where(eq(t.measurements.studyId, study.id)).orderBy(desc(t.measurements.createdAt))
  return { measurements: rows.map(publicMeasurement) }
})
