import { bandsToCsv, bandsToJsonText, bandsToLatex, matrixToCsv } from '../../../../../../shared/export'
import { assertDone, loadResultValues, matrixRows, reportingChoice, resultBands, resultMatrices, resultSetHeader } from '../../../../../domain/results/results'
import { exportObservable, exportProvenance, resultForExport } from '../../../../../domain/results/export'
import { engineRejection } from '../../../../../domain/errors'

const TYPES = {
  csv: ['text/csv; charset=utf-8', 'csv'],
  json: ['application/json; charset=utf-8', 'json'],
  latex: ['application/x-tex; charset=utf-8', 'tex'],
  covariance: ['text/csv; charset=utf-8', 'covariance.csv'],
  correlation: ['text/csv; charset=utf-8', 'correlation.csv']
} as const

// Export a finished result: ?format=csv|json|latex|covariance|correlation, with ?prescription=
// and ?cl=. Every file carries the provenance and the caution (shared/export formatters).
export default defineEventHandler(async (event) => {
  const { user, result, study } = await requireResult(event, 'viewer')
  const query = queryValid(event, exportQuerySchema)
  assertDone(result)
  const header = await resultSetHeader(useDB(), result)
  const { prescription, clPercent } = reportingChoice(result, header, query)
  const spec = result.specSnapshot.spec
  const provenance = await exportProvenance(useDB(), result, study, header, prescription, clPercent, user.name)
  let text: string
  try {
    if (query.format === 'covariance' || query.format === 'correlation') {
      const m = await resultMatrices(useDB(), result, header, clPercent)
      const values = matrixRows(query.format === 'covariance' ? m.covariance : m.correlation).map(row => row.map(v => v ?? Number.NaN))
      text = matrixToCsv({ provenance, observable: exportObservable(spec), kind: query.format, values })
    } else {
      const bands = await resultBands(useDB(), result, header, prescription, clPercent)
      const { scale } = await loadResultValues(useDB(), result.id)
      const data = resultForExport(provenance, spec, prescription, bands, scale)
      text = query.format === 'csv' ? bandsToCsv(data) : query.format === 'json' ? bandsToJsonText(data) : bandsToLatex(data)
    }
  } catch (err) {
    throw engineRejection(err, 'The export cannot be written')
  }
  const [type, ext] = TYPES[query.format]
  const base = `${study.name}-${result.specSnapshot.set.name}-v${result.version}`.replace(/[^\w.-]+/g, '_')
  setResponseHeaders(event, { 'content-type': type, 'content-disposition': `attachment; filename="${base}.${ext}"` })
  return text
})
