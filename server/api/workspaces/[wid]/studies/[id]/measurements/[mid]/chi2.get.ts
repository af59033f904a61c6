import type { MeasurementData } from '../../../../../../../utils/workflow/measurement-csv'

// χ² of the measurement against the newest finished result on each set (?setIds=; default all),
// with the experimental covariance alone and with the PDF covariance added, and the point count.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const studyId = uuidParam(event, 'id', 'Study')
  const measurementId = uuidParam(event, 'mid', 'Measurement')
  const query = queryValid(event, chi2QuerySchema)
  const { study, measurement } = await requireMeasurement(workspaceId, studyId, measurementId, user.id, 'viewer')
  const sets = await comparedSets(study, query.setIds)
  const data = measurement.data as MeasurementData
  if (sets[0]!.matrix.bins !== data.values.length) {
    throw createError({ statusCode: 409, statusMessage: `The results have ${sets[0]!.matrix.bins} bins but the measurement has ${data.values.length} points; upload a measurement for the current bins` })
  }
  return { measurement: publicMeasurement(measurement), points: data.values.length, sets: chiSquares(sets, engineMeasurement(data)) }
})
