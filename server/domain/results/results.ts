import { and, asc, eq, inArray } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { Result, StoredBands } from '../../database/schema'
import type { SetHeader } from '../../../shared/physics/types'
import { binCovariance, correlationFromCovariance, type MemberValues, type Prescription, type SquareMatrix } from '../../../shared/physics/uncertainty'
import { fail } from '../errors'
import { apartCovariance, splitApart } from '../../../shared/physics/uncertainty/two-sets'
import { apartStoredBands, bandsFromValues, memberSourceOf, resolvePrescription, storedBands, type MemberSource } from './bands'
import { bytesToFloat64 } from './float64'

/**
 * The stored member values of a finished result, and its scale variations (if any). `matrix` is
 * always the result's set's members (what every prescription, matrix and comparison reads); an
 * apart run's second-set part (its members with the result's set at its central member, central
 * first) is `second`, null otherwise.
 */
export async function loadResultValues(db: DB, resultId: string) {
  const [row] = await db.select({ values: t.resultValues, snapshot: t.results.specSnapshot }).from(t.resultValues)
    .innerJoin(t.results, eq(t.results.id, t.resultValues.resultId)).where(eq(t.resultValues.resultId, resultId))
  if (!row) fail(409, 'This result has no stored values yet; wait until it has finished')
  const stored: MemberValues = { members: row.values.memberCount, bins: row.values.binCount, values: bytesToFloat64(row.values.values) }
  const second = row.snapshot.second
  if (second?.variation !== 'apart' || !second.memberCount) return { matrix: stored, second: null, scale: row.values.scale }
  const parts = splitApart(stored, row.snapshot.set.memberCount, second.memberCount)
  return { matrix: parts.main, second: parts.second, scale: row.values.scale }
}

/** The header of an apart result's second set, or null for any other result. */
export async function apartSecondHeader(db: DB, r: Result): Promise<SetHeader | null> {
  if (r.specSnapshot.second?.variation !== 'apart' || !r.secondSetId) return null
  const [row] = await db.select({ header: t.errorSets.header }).from(t.errorSets).where(eq(t.errorSets.id, r.secondSetId))
  return row?.header ?? null
}

/** The scale variation of a finished result alone (not its member values). */
export async function loadResultScale(db: DB, resultId: string) {
  const [row] = await db.select({ scale: t.resultValues.scale }).from(t.resultValues).where(eq(t.resultValues.resultId, resultId))
  return row?.scale ?? null
}

/** 409 unless the result has finished (bands, matrices and exports need its values). */
export function assertDone(r: Result) {
  if (r.state !== 'done') {
    fail(409, `This result is ${r.state}${r.state === 'failed' ? `: ${r.error ?? 'no reason recorded'}` : ''}; only finished results have bands`)
  }
}

/** The header of the set a result ran on (from the library row). */
export async function resultSetHeader(db: DB, r: Result): Promise<SetHeader> {
  const [row] = await db.select({ header: t.errorSets.header }).from(t.errorSets).where(eq(t.errorSets.id, r.setId))
  return row!.header
}

/** The prescription and CL a request asks for, defaulting to the study's choice as run. */
export function reportingChoice(r: Result, header: SetHeader, query: { prescription?: string, cl?: number }) {
  const snap = r.specSnapshot
  const explicit = query.prescription !== undefined && query.prescription !== 'auto'
  // An explicit choice must fit the set; the study's own choice falls back to the kind's default.
  const prescription = explicit ? setPrescription(header.kind, query.prescription) : resolvePrescription(header.kind, snap.prescription)
  return { prescription, clPercent: query.cl ?? snap.clPercent }
}

/**
 * Bands of a finished result for a prescription and CL: from the cache when computed before,
 * otherwise recomputed from the stored member values (no new job) and cached.
 */
export async function resultBands(db: DB, r: Result, header: SetHeader, prescription: Prescription, clPercent: number): Promise<StoredBands> {
  const [cached] = await db.select({ bands: t.resultBands.bands }).from(t.resultBands)
    .where(and(eq(t.resultBands.resultId, r.id), eq(t.resultBands.prescription, prescription), eq(t.resultBands.clPercent, clPercent)))
  if (cached) return cached.bands
  const { matrix, second } = await loadResultValues(db, r.id)
  const secondHeader = second ? await apartSecondHeader(db, r) : null
  const bands = second && secondHeader
    ? apartStoredBands({ main: matrix, second }, { set: memberSourceOf(header), second: secondHeader }, prescription, clPercent)
    : storedBands(bandsFromValues(matrix, memberSourceOf(header), prescription, clPercent))
  await db.insert(t.resultBands).values({ resultId: r.id, prescription, clPercent, bands }).onConflictDoNothing()
  return bands
}

/** Largest bin count for which the n × n matrices are built (10,000² doubles exhausted the server's heap). */
export const MATRIX_MAX_BINS = Number(process.env.SHEAF_MATRIX_MAX_BINS ?? 2000)

/** Bin-to-bin covariance (at `clPercent`) and correlation of a finished result. */
export async function resultMatrices(db: DB, r: Result, header: SetHeader, clPercent: number) {
  const { matrix, second } = await loadResultValues(db, r.id)
  if (matrix.bins > MATRIX_MAX_BINS) {
    fail(413, `The bin-to-bin matrices are offered up to ${MATRIX_MAX_BINS} bins; this result has ${matrix.bins}. Export the member values (JSON) and build the matrix offline, or split the study`)
  }
  const options = (s: MemberSource) => ({ kind: s.kind, clFrom: s.confidenceLevelPercent, clTo: clPercent, alphasMembers: s.alphasMembers })
  const source = memberSourceOf(header)
  const secondHeader = second ? await apartSecondHeader(db, r) : null
  if (second && secondHeader) {
    // Apart: the two sets vary independently, so their covariances add (two-sets.ts).
    const c = apartCovariance({ main: matrix, second }, { main: options(source), second: options(memberSourceOf(secondHeader)) })
    return { covariance: c.total, correlation: c.correlation }
  }
  const covariance = binCovariance(matrix, options(source))
  const correlation = correlationFromCovariance(covariance)
  return { covariance, correlation }
}

/** A square matrix as rows, NaN (a bin without PDF dependence) as null. */
export const matrixRows = (m: SquareMatrix) =>
  Array.from({ length: m.size }, (_, i) => Array.from(m.values.subarray(i * m.size, (i + 1) * m.size), v => (Number.isFinite(v) ? v : null)))

/** Review steps of a result and the audit trail (created, ran, review steps) with actors' names. */
export async function resultTrail(db: DB, r: Result) {
  const reviews = await db.select({ action: t.resultReviews.action, comment: t.resultReviews.comment, at: t.resultReviews.createdAt, actorId: t.resultReviews.actorId, actorName: t.users.name })
    .from(t.resultReviews).leftJoin(t.users, eq(t.users.id, t.resultReviews.actorId))
    .where(eq(t.resultReviews.resultId, r.id)).orderBy(asc(t.resultReviews.createdAt))
  const events = await db.select({ action: t.auditEvents.action, at: t.auditEvents.createdAt, actorId: t.auditEvents.actorId, actorName: t.users.name, detail: t.auditEvents.detail })
    .from(t.auditEvents).leftJoin(t.users, eq(t.users.id, t.auditEvents.actorId))
    .where(and(eq(t.auditEvents.subjectType, 'result'), eq(t.auditEvents.subjectId, r.id)))
    .orderBy(asc(t.auditEvents.createdAt))
  return { reviews, events }
}

/** Names of users by id (for provenance lines). */
export async function userNames(db: DB, ids: Array<string | null>) {
  const wanted = [...new Set(ids.filter((v): v is string => !!v))]
  if (!wanted.length) return new Map<string, string>()
  const rows = await db.select({ id: t.users.id, name: t.users.name }).from(t.users).where(inArray(t.users.id, wanted))
  return new Map(rows.map(u => [u.id, u.name]))
}

/** The prescription for a set of `kind` asked by a query (default the kind's first); 400 if it does not apply. */
export function setPrescription(kind: SetHeader['kind'], wanted?: string): Prescription {
  try {
    return resolvePrescription(kind, wanted ?? 'auto', wanted !== undefined && wanted !== 'auto')
  } catch (err) {
    fail(400, (err as Error).message, { fields: { prescription: (err as Error).message } })
  }
}
