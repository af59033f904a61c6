import { asc, desc, eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { publicResult, publicStudy } from '../../../../domain/studies/studies'

// One study with every result version (newest first) and its measurements.
export default defineEventHandler(async (event) => {
  const { study } = await requireStudy(event, 'viewer')
  const db = useDB()
  const [results, measurements] = await Promise.all([
    db.select().from(t.results).where(eq(t.results.studyId, study.id)).orderBy(desc(t.results.version), asc(t.results.createdAt)),
    db.select({ id: t.measurements.id, name: t.measurements.name, pointCount: t.measurements.pointCount, createdAt: t.measurements.createdAt })
      .from(t.measurements).where(eq(t.measurements.studyId, study.id)).orderBy(desc(t.measurements.createdAt))
  ])
  return { ...publicStudy(study), results: results.map(publicResult), measurements }
})
