import { studyToCsv, studyToJsonText, studyToLatex } from '../../../../../../shared/export'
import { studyForExport } from '../../../../../domain/results/export'
import { engineRejection } from '../../../../../domain/errors'

const TYPES = {
  csv: ['text/csv; charset=utf-8', 'csv'],
  json: ['application/json; charset=utf-8', 'json'],
  latex: ['application/x-tex; charset=utf-8', 'tex']
} as const

// All of a study's sets side by side (?format=csv|json|latex, ?cl=): the newest finished result
// on each set, with each set's provenance and the caution.
export default defineEventHandler(async (event) => {
  const { user, study } = await requireStudy(event, 'viewer')
  const query = queryValid(event, studyExportQuerySchema)
  let text: string
  try {
    const data = await studyForExport(useDB(), study, query, user.name)
    text = query.format === 'csv' ? studyToCsv(data) : query.format === 'json' ? studyToJsonText(data) : studyToLatex(data)
  } catch (err) {
    throw engineRejection(err, 'The export cannot be written')
  }
  const [type, ext] = TYPES[query.format]
  const base = `${study.name}-all-sets`.replace(/[^\w.-]+/g, '_')
  setResponseHeaders(event, { 'content-type': type, 'content-disposition': `attachment; filename="${base}.${ext}"` })
  return text
})
