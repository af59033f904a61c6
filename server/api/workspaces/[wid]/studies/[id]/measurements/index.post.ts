import { tables as t } from '../../../../../../database/client'
import { parseMeasurement, publicMeasurement } from '../../../../../../domain/measurements/measurements'
import { audit } from '../../../../../../domain/audit'

// Upload a measurement for a study (analysts): JSON { name, csv, correlation?, correlationOf? }
// or multipart (fields name, correlationOf; files points, correlation). Problems come back as
// 400 with data.issues located by file, line and column; a point count that differs from the
// study's bins is 422.
export default defineEventHandler(async (event) => {
  const { user, workspace, study } = await requireStudy(event, 'analyst')
  const workspaceId = workspace.id
  const body = await readMeasurementUpload(event)
  const data = parseMeasurement(body, (study.spec as { bins: unknown[] }).bins.length)
  const [row] = await useDB().transaction(async (tx) => {
    const rows = await tx.insert(t.measurements).values({ studyId: study.id, name: body.name, data, pointCount: data.values.length, uploadedBy: user.id }).returning()
    await audit(tx, { workspaceId, actorId: user.id, action: 'measurement.uploaded', subjectType: 'measurement', subjectId: rows[0]!.id, detail: { studyId: study.id, points: data.values.length } })
    return rows
  })
  setResponseStatus(event, 201)
  return publicMeasurement(row!)
})
