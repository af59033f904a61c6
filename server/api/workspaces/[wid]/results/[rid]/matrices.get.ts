import { assertDone, matrixRows, reportingChoice, resultMatrices, resultSetHeader } from '../../../../../domain/results/results'
import { engineRejection } from '../../../../../domain/errors'
// Bin-to-bin covariance (at ?cl=, default the study's) and correlation of a finished result.
export default defineEventHandler(async (event) => {
  const { result } = await requireResult(event, 'viewer')
  const query = queryValid(event, bandsQuerySchema)
  assertDone(result)
  const header = await resultSetHeader(useDB(), result)
  const { clPercent } = reportingChoice(result, header, query)
  try {
    const { covariance, correlation } = await resultMatrices(useDB(), result, header, clPercent)
    return { bins: covariance.size, clPercent, covariance: matrixRows(covariance), correlation: matrixRows(correlation) }
  } catch (err) {
    throw engineRejection(err, 'The matrices cannot be computed')
  }
})
