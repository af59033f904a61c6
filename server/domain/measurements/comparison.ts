import { eq, inArray } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { Result, Study } from '../../database/schema'
import type { SetHeader } from '../../../shared/physics/types'
import {
  bandEnvelope, clScaleFactor, compareWithSet, intervalRule, poolSets, replicaMedianInterval, scaleBands, type MemberValues
} from '../../../shared/physics/uncertainty'
import { fail } from '../errors'
import { bandToJson } from '../../../shared/physics/uncertainty/band'
import { bandsFromValues, memberSourceOf, resolvePrescription } from '../results/bands'
import { loadResultValues } from '../results/results'
import { latestDoneResults } from '../studies/studies'

/** A finished result of the study on one set, with its set's header and member values. */
export interface ComparedSet {
  result: Result
  header: SetHeader
  matrix: MemberValues
  name: string
}

/** The bins a result ran on (its spec snapshot). */
const binsOf = (r: Result) => r.specSnapshot.spec.bins

/**
 * The newest finished result of `study` on each of `setIds` (default the study's sets), with the
 * member values. 409 when none has finished, or when they ran on different bins.
 */
export async function comparedSets(db: DB, study: Study, setIds?: string[]): Promise<ComparedSet[]> {
  const ids = setIds ?? study.setIds
  const foreign = ids.filter(id => !study.setIds.includes(id))
  if (foreign.length) {
    fail(400, 'Compare only sets of this study', { issues: foreign.map(id => ({ message: `Set ${id} is not one of this study's sets`, path: ['setIds'] })) })
  }
  const results = await latestDoneResults(db, study.id, ids)
  if (!results.length) fail(409, 'No finished results to compare yet; run the study first')
  // Equal bin counts are not enough: an edit may move bins and keep their number.
  const binSets = new Set(results.map(r => JSON.stringify(binsOf(r))))
  if (binSets.size > 1) {
    fail(409, 'The newest results were computed on different bins (the study was edited between runs); run the study again on every set')
  }
  const headers = await db.select({ id: t.errorSets.id, header: t.errorSets.header }).from(t.errorSets)
    .where(inArray(t.errorSets.id, results.map(r => r.setId)))
  const byId = new Map(headers.map(h => [h.id, h.header]))
  return Promise.all(results.map(async r => ({
    result: r, header: byId.get(r.setId)!, matrix: (await loadResultValues(db, r.id)).matrix,
    name: `${r.specSnapshot.set.name} ${r.specSnapshot.set.version}`
  })))
}

/**
 * Envelope of the sets' bands (each at its default or the study's prescription, all at
 * `clPercent`) and the Monte-Carlo pooled combination (PDF4LHC, arXiv:1510.03865), at `clPercent`,
 * with the bins they ran on (comparedSets makes sure all ran on the same bins; the study's own
 * bins may have been edited since).
 */
export function combineSets(sets: ComparedSet[], study: Study, clPercent: number, requestedPerSet: number | undefined, seed: number) {
  const replicaCounts = sets.filter(s => s.header.kind === 'replicas').map(s => s.matrix.members - 1)
  const replicasPerSet = requestedPerSet ?? Math.max(2, Math.min(100, ...replicaCounts))
  const perSet = sets.map((s) => {
    const prescription = resolvePrescription(s.header.kind, study.prescription)
    const band = bandsFromValues(s.matrix, memberSourceOf(s.header), prescription, clPercent)
    return { s, prescription, band }
  })
  const envelope = bandEnvelope(perSet.map(p => p.band))
  const pooled = poolSets(sets.map(s => ({ matrix: s.matrix, kind: s.header.kind, clFrom: s.header.confidenceLevelPercent, alphasMembers: s.header.alphasMembers })), { replicasPerSet, seed })
  // The pool's replicas describe 68 % CL: its standard deviation goes to other CLs by the Gaussian
  // factor (common practice); its interval is read from the pool's percentiles at the CL itself.
  const factor = clScaleFactor(68, clPercent)
  const interval = replicaMedianInterval(pooled.replicas, clPercent)
  return {
    clPercent,
    bins: binsOf(sets[0]!.result),
    sets: perSet.map(p => ({ setId: p.s.result.setId, resultId: p.s.result.id, version: p.s.result.version, name: p.s.name, kind: p.s.header.kind, prescription: p.prescription, band: bandToJson(p.band) })),
    envelope: bandToJson(envelope),
    pooled: { replicasPerSet, seed, replicas: pooled.replicas.members - 1, sd: bandToJson(scaleBands(pooled.sd, factor)), interval: bandToJson(interval), intervalLabel: intervalRule('replica-68-interval', 68, clPercent).label }
  }
}

/**
 * χ² of a measurement against each set, with and without the PDF covariance, and each set's band
 * (the study's prescription for its kind, at `clPercent`) for drawing the data over it.
 */
export function chiSquares(sets: ComparedSet[], measurement: Parameters<typeof compareWithSet>[0], study?: Study, clPercent = 68) {
  return sets.map((s) => {
    const prescription = resolvePrescription(s.header.kind, study?.prescription ?? 'auto')
    const band = bandToJson(bandsFromValues(s.matrix, memberSourceOf(s.header), prescription, clPercent))
    const base = { setId: s.result.setId, resultId: s.result.id, version: s.result.version, name: s.name, prescription, band }
    try {
      const c = compareWithSet(measurement, s.matrix, { kind: s.header.kind, clFrom: s.header.confidenceLevelPercent, alphasMembers: s.header.alphasMembers })
      const pick = (r: typeof c.withPdf) => ({ chi2: r.chi2, points: r.points, chi2PerPoint: r.chi2PerPoint, degreesOfFreedom: r.degreesOfFreedom, pValue: r.pValue })
      return { ...base, points: c.experimental.points, prediction: Array.from(c.prediction), experimental: pick(c.experimental), withPdf: pick(c.withPdf), error: null }
    } catch (err) {
      if (!(err instanceof RangeError)) throw err
      return { ...base, points: measurement.values.length, prediction: null, experimental: null, withPdf: null, error: err.message }
    }
  })
}

/** The stored measurement `id` (already guarded). */
export async function measurementRow(db: DB, id: string) {
  const [row] = await db.select().from(t.measurements).where(eq(t.measurements.id, id))
  return row!
}
