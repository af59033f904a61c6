// A measurement to compare a study with: the upload checked and parsed (shared/measurements
// parses the files), what the API shows of it.
import type { Measurement } from '../../database/schema'
import { measurementTreatment, parseCorrelationMatrix, parseMeasurementPoints, type CorrelationOf, type LocatedIssue, type MeasurementData, type SystCombination } from '../../../shared/measurements/csv'
import { fail } from '../errors'

/** What the API shows of a measurement in lists. */
export const publicMeasurement = (m: Measurement) => ({
  id: m.id, studyId: m.studyId, name: m.name, pointCount: m.pointCount, uploadedBy: m.uploadedBy, createdAt: m.createdAt,
  hasCorrelation: m.data.correlation !== null,
  correlationOf: m.data.correlation ? m.data.correlationOf : null,
  systCombination: m.data.systCombination ?? 'uncorrelated',
  treatment: measurementTreatment(m.data)
})

/** A measurement as sent: the points file's text and, optionally, a correlation matrix and what it applies to. */
export interface MeasurementUpload {
  name: string
  csv: string
  correlation?: string | number[][]
  /** Which errors the matrix applies to; required with a matrix. */
  correlationOf?: CorrelationOf
  systCombination?: SystCombination
}

function rejected(issues: LocatedIssue[]): never {
  const first = issues[0]!
  const file = first.file === 'correlation' ? 'correlation matrix' : first.file === 'correlationOf' || first.file === 'systCombination' ? `field ${first.file}` : 'points'
  const where = [file, first.line && `line ${first.line}`, first.column && `column ${first.column}`].filter(Boolean).join(', ')
  fail(400, `The measurement has ${issues.length} problem${issues.length > 1 ? 's' : ''}: ${where}: ${first.message}`, { issues })
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
    if (!u.correlationOf) rejected([{ message: 'Say which errors the correlation matrix applies to: stat, syst or total', file: 'correlationOf' }])
    if (u.correlationOf === 'syst' && !points.data.syst) rejected([{ message: 'The correlation matrix applies to the syst column, but there is none', file: 'points', line: 1 }])
    if (u.correlationOf === 'stat' && !points.data.stat) rejected([{ message: 'The correlation matrix applies to the stat column, but there is none', file: 'points', line: 1 }])
  }
  if (n !== bins) {
    fail(422, `The study has ${bins} bins but the measurement has ${n} points: give one point per bin, in bin order`, { issues: [{ message: `${n} points for ${bins} bins`, file: 'points' }] })
  }
  return { ...points.data, correlation, correlationOf: u.correlationOf ?? 'total', systCombination: u.systCombination ?? 'uncorrelated' }
}
