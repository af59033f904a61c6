// Sensitivity maps of a study's newest result on one of its sets: cos φ between every bin and
// x·f(x, Q²) of one flavour over x (arXiv:0802.0007 for Hessian sets, the sample correlation for
// replicas), and, with one of the study's measurements, the sensitivity cos φ × ΔX/δD
// (arXiv:1803.02777). See shared/physics/README.md, section 21.5.
import { and, eq } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { Study } from '../../database/schema'
import { engineMeasurement, type MeasurementData } from '../../../shared/measurements/csv'
import { correlationMap, densityValues, predictionErrors, sensitivityMap } from '../../../shared/physics/impact'
import { partonLabel } from '../../../shared/physics/partons'
import { fail } from '../errors'
import { loadResultValues } from '../results/results'
import { assertQ2Inside } from '../sets/library'
import { loadErrorSet } from '../sets/store'
import { latestDoneResults } from '../studies/studies'

/** Where the map looks along x: below x = 0.1 logarithmically, above it linearly (half the points each). */
export function sensitivityXs(xMin: number, xMax: number, points: number): number[] {
  const top = Math.min(xMax, 0.95)
  const lo = Math.max(xMin, 1e-6)
  if (top <= 0.1) return Array.from({ length: points }, (_, i) => lo * (top / lo) ** (i / (points - 1)))
  const nLog = Math.ceil(points / 2)
  const nLin = points - nLog
  const log = Array.from({ length: nLog }, (_, i) => lo * (0.1 / lo) ** (i / nLog))
  const lin = Array.from({ length: nLin }, (_, i) => 0.1 + (top - 0.1) * (i / (nLin - 1 || 1)))
  return [...log, ...lin]
}

const rows = (values: Float64Array, bins: number, points: number) =>
  Array.from({ length: bins }, (_, b) => Array.from(values.subarray(b * points, (b + 1) * points), v => (Number.isFinite(v) ? v : null)))

export interface SensitivityRequest { setId: string, flavour: number, q2: number, points: number, measurementId?: string }

/**
 * The maps (rows = bins, columns = x points), or a located 4xx: 400 for a set or measurement that
 * is not the study's, 422 for Q² outside the set's grid, 409 without a finished result or when the
 * measurement's points do not match the result's bins.
 */
export async function studySensitivity(db: DB, study: Study, q: SensitivityRequest) {
  if (!study.setIds.includes(q.setId)) fail(400, 'Map only one of this study\'s sets', { fields: { setId: 'Not one of this study\'s sets' } })
  const [row] = await db.select({ name: t.errorSets.name, version: t.errorSets.version, kind: t.errorSets.kind, header: t.errorSets.header, xMin: t.errorSets.xMin, xMax: t.errorSets.xMax, q2Min: t.errorSets.q2Min, q2Max: t.errorSets.q2Max })
    .from(t.errorSets).where(and(eq(t.errorSets.id, q.setId), eq(t.errorSets.workspaceId, study.workspaceId)))
  if (!row) fail(400, 'That set is no longer in the library', { fields: { setId: 'Not in the library' } })
  assertQ2Inside(q.q2, row.q2Min, row.q2Max)
  let measurement: { name: string, data: MeasurementData } | null = null
  if (q.measurementId) {
    const [m] = await db.select().from(t.measurements).where(and(eq(t.measurements.id, q.measurementId), eq(t.measurements.studyId, study.id)))
    if (!m) fail(400, 'Use one of this study\'s measurements', { fields: { measurementId: 'Not a measurement of this study' } })
    measurement = { name: m.name, data: m.data as MeasurementData }
  }
  const [result] = await latestDoneResults(db, study.id, [q.setId])
  if (!result) fail(409, `The study has no finished result on ${row.name} ${row.version} yet; run it on that set first`)
  if (measurement && measurement.data.values.length !== result.binCount) {
    fail(409, `The newest result on ${row.name} ${row.version} has ${result.binCount} bins but the measurement '${measurement.name}' has ${measurement.data.values.length} points`)
  }
  const { matrix } = await loadResultValues(db, result.id)
  const set = await loadErrorSet(db, q.setId)
  const xs = sensitivityXs(row.xMin, row.xMax, q.points)
  const header = row.header
  try {
    const map = correlationMap(matrix, densityValues(set, q.flavour, q.q2, xs), header.kind, header.alphasMembers)
    const sensitivity = measurement
      ? sensitivityMap(map, predictionErrors(matrix, header.kind, header.confidenceLevelPercent, header.alphasMembers), engineMeasurement(measurement.data))
      : null
    return {
      set: { id: q.setId, name: row.name, version: row.version, kind: row.kind },
      result: { id: result.id, version: result.version },
      flavour: q.flavour, flavourLabel: partonLabel(q.flavour), q2: q.q2, x: xs,
      bins: result.specSnapshot.spec.bins.length,
      cosPhi: rows(map.cosPhi, map.bins, map.points),
      sensitivity: sensitivity ? rows(sensitivity, map.bins, map.points) : null,
      measurement: measurement ? { id: q.measurementId, name: measurement.name } : null
    }
  } catch (err) {
    if (err instanceof RangeError) fail(422, err.message)
    throw err
  }
}
