import { assertDone, loadResultValues, reportingChoice, resultSetHeader } from '../../../../../domain/results/results'
import { engineRejection, fail } from '../../../../../domain/errors'
import { eigenvectorBars } from '../../../../../domain/results/contributions'
// For one bin (?bin=, 1-based) of a finished Hessian result, at ?cl= (default the study's): each
// eigenvector's signed shift, share of the variance and the shifts of its members from the
// central value. Replica sets have no eigenvectors: 422.
export default defineEventHandler(async (event) => {
  const { result } = await requireResult(event, 'viewer')
  const query = queryValid(event, contributionsQuerySchema)
  assertDone(result)
  if (query.bin > result.binCount) {
    fail(400, `This result has ${result.binCount} bins; bin ${query.bin} does not exist`, { fields: { bin: `at most ${result.binCount}` } })
  }
  const header = await resultSetHeader(useDB(), result)
  const { clPercent } = reportingChoice(result, header, { cl: query.cl })
  const { matrix } = await loadResultValues(useDB(), result.id)
  try {
    return { bin: query.bin, clPercent, ...eigenvectorBars(matrix, query.bin - 1, header, clPercent) }
  } catch (err) {
    throw engineRejection(err, 'No eigenvector contributions')
  }
})
