import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../../../database/client'

// Delete a measurement (analysts).
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const studyId = uuidParam(event, 'id', 'Study')
  const measurementId = uuidParam(event, 'mid', 'Measurement')
  const { measurement } = await requireMeasurement(workspaceId, studyId, measurementId, user.id, 'analyst')
  await useDB().delete(t.measurements).where(eq(t.measurements.id, measurement.id))
  await audit({ workspaceId, actorId: user.id, action: 'measurement.deleted', subjectType: 'measurement', subjectId: measurement.id, detail: { name: measurement.name } })
  return { deleted: measurement.id }
})
