import { eigenvectorContributions } from '../../../../../../shared/physics/uncertainty/contributions'

// For one bin (?bin=, 1-based) of a finished Hessian result: each eigenvector's signed shift and
// share of the variance. Replica sets have no eigenvectors: 422.
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
    const c = eigenvectorContributions(matrix, query.bin - 1, { kind: header.kind, clFrom: header.confidenceLevelPercent, clTo: clPercent, alphasMembers: header.alphasMembers })
    return {
      bin: query.bin, clPercent, total: c.total,
      eigenvectors: Array.from(c.eigenvector, (k, i) => ({ eigenvector: k, signed: c.signed[i]!, fraction: Number.isFinite(c.fraction[i]!) ? c.fraction[i]! : null }))
    }
  } catch (err) {
    throw engineRejection(err, 'No eigenvector contributions')
  }
})
