import { desc, eq } from 'drizzle-orm'
import { tables as t } from '../../../../../../database/client'
import { publicMeasurement } from '../../../../../../domain/measurements/measurements'

// The measurements uploaded for a study.
export default defineEventHandler(async (event) => {
  const { study } = await requireStudy(event, 'viewer')
  const rows = await useDB().select().from(t.measurements).where(eq(t.measurements.studyId, study.id)).orderBy(desc(t.measurements.createdAt))
  return { measurements: rows.map(publicMeasurement) }
})
