import type { H3Event } from 'h3'
import type { Measurement } from '../../database/workflow-schema'
import { parseCorrelationMatrix, parseMeasurementPoints, type LocatedIssue, type MeasurementData } from './measurement-csv'

/** What the API shows of a measurement in lists. */
export const publicMeasurement = (m: Measurement) => ({
  id: m.id, studyId: m.studyId, name: m.name, pointCount: m.pointCount, uploadedBy: m.uploadedBy, createdAt: m.createdAt
})

interface MeasurementUpload { name: string, csv: string, correlation?: string | number[][], correlationOf: 'syst' | 'total' }

/** The upload as JSON (measurementJsonSchema) or multipart (files `points`, `correlation`). */
export async function readMeasurementUpload(event: H3Event): Promise<MeasurementUpload> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('multipart/form-data')) return readValid(event, measurementJsonSchema)
  const form = await readUploadForm(event, uploadLimits().csvBytes)
  const points = formFile(form, 'points')
  const correlation = form.get('correlation')
  return readValidObject({
    name: formText(form, 'name') ?? points.name.replace(/\.[^.]*$/, ''),
    csv: await points.text(),
    ...(correlation instanceof File ? { correlation: await correlation.text() } : typeof correlation === 'string' && correlation.trim() ? { correlation } : {}),
    ...(formText(form, 'correlationOf') ? { correlationOf: formText(form, 'correlationOf') } : {})
  })
}

function readValidObject(value: unknown): MeasurementUpload {
  const parsed = measurementJsonSchema.safeParse(value)
  if (!parsed.success) {
    throw createError({ statusCode: 400, statusMessage: 'Check the highlighted fields', data: { fields: Object.fromEntries(parsed.error.issues.map(i => [i.path.join('.'), i.message])) } })
  }
  return parsed.data
}

function rejected(issues: LocatedIssue[]): never {
  const first = issues[0]!
  const where = [first.file === 'correlation' ? 'correlation matrix' : 'points', first.line && `line ${first.line}`, first.column && `column ${first.column}`].filter(Boolean).join(', ')
  throw createError({ statusCode: 400, statusMessage: `The measurement has ${issues.length} problem${issues.length > 1 ? 's' : ''}: ${where}: ${first.message}`, data: { issues } })
}

/** The measurement to store, or 400 with located issues; 422 when the points do not match `bins`. */
export function parseMeasurement(u: MeasurementUpload, bins: number): MeasurementData {
  const points = parseMeasurementPoints(u.csv)
  if (points.issues.length) rejected(points.issues)
  const n = points.data.values.length
  let correlation: number[][] | null = null
  if (u.correlation !== undefined) {
    const text = typeof u.correlation === 'string' ? u.correlation : JSON.stringify(u.correlation)
    const parsed = parseCorrelationMatrix(text, n)
    if (parsed.issues.length) rejected(parsed.issues)
    correlation = parsed.matrix
    if (u.correlationOf === 'syst' && !points.data.syst) rejected([{ message: 'The correlation matrix applies to the syst column, but there is none', file: 'points', line: 1 }])
  }
  if (n !== bins) {
    throw createError({ statusCode: 422, statusMessage: `The study has ${bins} bins but the measurement has ${n} points: give one point per bin, in bin order`, data: { issues: [{ message: `${n} points for ${bins} bins`, file: 'points' }] } })
  }
  return { ...points.data, correlation, correlationOf: u.correlationOf }
}
