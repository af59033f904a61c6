// Bin-to-bin covariance (at ?cl=, default the study's) and correlation of a finished result.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const resultId = uuidParam(event, 'rid', 'Result')
  const query = queryValid(event, bandsQuerySchema)
  const { result } = await requireResult(workspaceId, resultId, user.id, 'viewer')
  assertDone(result)
  const header = await resultSetHeader(result)
  const { clPercent } = reportingChoice(result, header, query)
  try {
    const { covariance, correlation } = await resultMatrices(result, header, clPercent)
    return { bins: covariance.size, clPercent, covariance: matrixRows(covariance), correlation: matrixRows(correlation) }
  } catch (err) {
    throw engineRejection(err, 'The matrices cannot be computed')
  }
})
