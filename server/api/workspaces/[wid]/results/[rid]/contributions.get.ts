// For one bin (?bin=, 1-based) of a finished Hessian result, at ?cl= (default the study's): each
// eigenvector's signed shift, share of the variance and the shifts of its members from the
// central value. Replica sets have no eigenvectors: 422.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const resultId = uuidParam(event, 'rid', 'Result')
  const query = queryValid(event, contributionsQuerySchema)
  const { result } = await requireResult(workspaceId, resultId, user.id, 'viewer')
  assertDone(result)
  if (query.bin > result.binCount) {
    throw createError({ statusCode: 400, statusMessage: `This result has ${result.binCount} bins; bin ${query.bin} does not exist`, data: { fields: { bin: `at most ${result.binCount}` } } })
  }
  const header = await resultSetHeader(result)
  const { clPercent } = reportingChoice(result, header, { cl: query.cl })
  const { matrix } = await loadResultValues(result.id)
  try {
    return { bin: query.bin, clPercent, ...eigenvectorBars(matrix, query.bin - 1, header, clPercent) }
  } catch (err) {
    throw engineRejection(err, 'No eigenvector contributions')
  }
})
