// One measurement with its points and correlation matrix.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const studyId = uuidParam(event, 'id', 'Study')
  const measurementId = uuidParam(event, 'mid', 'Measurement')
  const { measurement } = await requireMeasurement(workspaceId, studyId, measurementId, user.id, 'viewer')
  return { ...publicMeasurement(measurement), data: measurement.data }
})
