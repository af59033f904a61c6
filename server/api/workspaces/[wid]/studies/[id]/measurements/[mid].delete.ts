import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../../../database/client'
import { audit } from '../../../../../../domain/audit'

// Delete a measurement (analysts).
export default defineEventHandler(async (event) => {
  const { user, workspace, measurement } = await requireMeasurement(event, 'analyst')
  const workspaceId = workspace.id
  await useDB().transaction(async (tx) => {
    await tx.delete(t.measurements).where(eq(t.measurements.id, measurement.id))
    await audit(tx, { workspaceId, actorId: user.id, action: 'measurement.deleted', subjectType: 'measurement', subjectId: measurement.id, detail: { name: measurement.name } })
  })
  return { deleted: measurement.id }
})
