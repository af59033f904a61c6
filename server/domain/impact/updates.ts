// Updating an error set by a measurement stored with a study: reweighting a replica set or
// profiling a Hessian set, saved to the library by the impact-update job (run.ts). Here: the
// request's checks (everything the engine can refuse is tried on the study's values before
// anything is stored or queued), the row with its audit event, the queue, listing and cancel.
import { and, desc, eq } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { ErrorSetRow, ImpactRequest, ImpactUpdate, Result, Study } from '../../database/schema'
import { engineMeasurement, type MeasurementData } from '../../../shared/measurements/csv'
import { profile, reweight } from '../../../shared/physics/impact'
import { sigmaMultiple, withoutMembers, type Measurement, type MemberValues } from '../../../shared/physics/uncertainty'
import { IMPACT_UPDATE_QUEUE, type ImpactUpdatePayload } from '../../../shared/queue/workflow'
import type { ImpactUpdateBody } from '../../../shared/utils/impact-schemas'
import { audit } from '../audit'
import { fail } from '../errors'
import type { QueuedTable } from '../jobs/lifecycle'
import { cancelRow, enqueueRow, type QueueSource } from '../jobs/queue'
import { loadResultValues } from '../results/results'
import { assertSetNameFree } from '../sets/library'
import { assertQuota } from '../sets/store'
import { latestDoneResults } from '../studies/studies'

/**
 * impact_updates carries the same queued-work columns as results and set_builds (state, error,
 * cancelRequested, startedAt, finishedAt), which is all that the job lifecycle and cancelRow touch.
 */
export const updatesTable = t.impactUpdates as unknown as QueuedTable

/** What the API shows of an update. */
export const publicUpdate = (u: ImpactUpdate) => ({
  id: u.id, studyId: u.studyId, measurementId: u.measurementId, resultId: u.resultId, parentSetId: u.parentSetId,
  method: u.method, request: u.request, state: u.state, error: u.error, cancelRequested: u.cancelRequested,
  progress: { done: u.progressDone, total: u.progressTotal, percent: u.progressTotal ? Math.round(100 * u.progressDone / u.progressTotal) : 0 },
  summary: u.summary, setId: u.setId, requestedBy: u.requestedBy, createdAt: u.createdAt, startedAt: u.startedAt, finishedAt: u.finishedAt
})

/** An update of study `studyId` (404 otherwise: another study's or workspace's row names nothing here). */
export async function findImpactUpdate(db: DB, studyId: string, updateId: string) {
  const [row] = await db.select().from(t.impactUpdates).where(and(eq(t.impactUpdates.id, updateId), eq(t.impactUpdates.studyId, studyId)))
  if (!row) fail(404, 'Set update not found')
  return row
}

/** The study's updates, newest first. */
export async function listImpactUpdates(db: DB, studyId: string) {
  return db.select().from(t.impactUpdates).where(eq(t.impactUpdates.studyId, studyId)).orderBy(desc(t.impactUpdates.createdAt))
}

/** The update that saved set `setId`, if any (the set page's provenance). */
export async function updateOfSet(db: DB, workspaceId: string, setId: string) {
  const [row] = await db.select().from(t.impactUpdates).where(and(eq(t.impactUpdates.workspaceId, workspaceId), eq(t.impactUpdates.setId, setId)))
  return row ?? null
}

const field = (name: string, message: string) => ({ fields: { [name]: message } })

/** Everything one update reads: the parent set's row, its newest finished result, the measurement. */
export interface UpdateInputs {
  parent: Omit<ErrorSetRow, 'content'> | ErrorSetRow
  result: Result
  matrix: MemberValues
  measurement: { id: string, name: string, data: MeasurementData }
  engine: Measurement
}

/**
 * The inputs of an update of `setId` by `measurementId` on `study`, or a located 4xx: 400 for a set
 * or measurement that is not the study's (data.fields names it), 409 when the study has no
 * finished result on the set or the result's bins do not match the measurement's points.
 */
export async function updateInputs(db: DB, study: Study, setId: string, measurementId: string): Promise<UpdateInputs> {
  if (!study.setIds.includes(setId)) fail(400, 'Update only one of this study\'s sets', field('setId', 'Not one of this study\'s sets'))
  const [m] = await db.select().from(t.measurements).where(and(eq(t.measurements.id, measurementId), eq(t.measurements.studyId, study.id)))
  if (!m) fail(400, 'Update by one of this study\'s measurements', field('measurementId', 'Not a measurement of this study'))
  const [parent] = await db.select().from(t.errorSets).where(and(eq(t.errorSets.id, setId), eq(t.errorSets.workspaceId, study.workspaceId)))
  if (!parent) fail(400, 'That set is no longer in the library', field('setId', 'Not in the library'))
  const [result] = await latestDoneResults(db, study.id, [setId])
  if (!result) fail(409, `The study has no finished result on ${parent.name} ${parent.version} yet; run it on that set first`)
  const data = m.data as MeasurementData
  if (result.binCount !== data.values.length) {
    fail(409, `The newest result on ${parent.name} ${parent.version} has ${result.binCount} bins but the measurement '${m.name}' has ${data.values.length} points; run the study again or upload a measurement for the current bins`)
  }
  const { matrix } = await loadResultValues(db, result.id)
  return { parent, result, matrix, measurement: { id: m.id, name: m.name, data }, engine: engineMeasurement(data) }
}

/** The method a set's kind calls for. */
export const methodOf = (kind: string) => (kind === 'replicas' ? 'reweight' as const : 'profile' as const)

/**
 * The engine's update of the study's values (no set is built): reweighting for replicas,
 * profiling for Hessian sets. A RangeError of the engine (a covariance that is not positive
 * definite, too few replicas) comes through as it is.
 */
export function updateValues(inputs: UpdateInputs, request: ImpactRequest) {
  const header = inputs.parent.header
  if (header.kind === 'replicas') {
    const matrix = header.alphasMembers ? withoutMembers(inputs.matrix, header.alphasMembers) : inputs.matrix
    return { method: 'reweight' as const, matrix, result: reweight(matrix, inputs.engine) }
  }
  const tolerance = request.tolerance ?? sigmaMultiple(header.confidenceLevelPercent)
  return {
    method: 'profile' as const,
    tolerance,
    result: profile(inputs.matrix, inputs.engine, { kind: header.kind, tolerance, alphasMembers: header.alphasMembers, clPercent: header.confidenceLevelPercent })
  }
}

/** A version text not yet taken for `name` in the workspace: `<parent version>-u<k>`, k = 1, 2, … */
async function freeVersion(db: DB, workspaceId: string, name: string, base: string) {
  for (let k = 1; ; k++) {
    const version = `${base}-u${k}`.slice(0, 60)
    const [taken] = await db.select({ id: t.errorSets.id }).from(t.errorSets)
      .where(and(eq(t.errorSets.workspaceId, workspaceId), eq(t.errorSets.name, name), eq(t.errorSets.version, version)))
    if (!taken) return version
  }
}

/**
 * Checks the request (updateInputs, the method's options, the name, the storage quota, the
 * engine's update of the study's values), then inserts the row with its audit event in one
 * transaction and (committed) queues the job. Nothing is stored or queued for a refused request.
 */
export async function startImpactUpdate(db: DB, queues: QueueSource, study: Study, userId: string, body: ImpactUpdateBody) {
  const inputs = await updateInputs(db, study, body.setId, body.measurementId)
  const parent = inputs.parent
  const method = methodOf(parent.kind)
  if (method === 'reweight' && body.tolerance !== undefined) {
    fail(400, 'A tolerance belongs to profiling a Hessian set; this is a replica set', field('tolerance', 'Only for a Hessian set'))
  }
  if (method === 'profile') {
    for (const name of ['replicas', 'seed'] as const) {
      if (body[name] !== undefined) fail(400, `The ${name === 'replicas' ? 'replica count' : 'seed'} belongs to reweighting a replica set; this is a Hessian set`, field(name, 'Only for a replica set'))
    }
  }
  const name = body.name ?? `${parent.name}-${method === 'reweight' ? 'reweighted' : 'profiled'}`
  const version = body.version ?? await freeVersion(db, study.workspaceId, name, parent.version)
  await assertSetNameFree(db, study.workspaceId, name, version)
  const request: ImpactRequest = {
    name, version,
    ...(method === 'reweight' ? { replicas: body.replicas ?? (inputs.matrix.members - 1), ...(body.seed !== undefined ? { seed: body.seed } : {}) } : {}),
    ...(body.tolerance !== undefined ? { tolerance: body.tolerance } : {})
  }
  try {
    updateValues(inputs, request)
  } catch (err) {
    if (err instanceof RangeError) fail(422, `The measurement '${inputs.measurement.name}' cannot update ${parent.name} ${parent.version}: ${err.message}`)
    throw err
  }
  // The saved set holds about as many grids as members: the parent's bytes per member times the count.
  const members = method === 'reweight' ? request.replicas! + 1 : parent.memberCount
  const bytes = Math.ceil(parent.sizeBytes / parent.memberCount * members)
  await assertQuota(db, study.workspaceId, bytes, `the set this update saves (about ${Math.round(bytes / 1024)} KiB)`)
  const row = await db.transaction(async (tx) => {
    const [inserted] = await tx.insert(t.impactUpdates).values({
      workspaceId: study.workspaceId, studyId: study.id, measurementId: inputs.measurement.id, resultId: inputs.result.id,
      parentSetId: parent.id, method, request, requestedBy: userId, progressTotal: 4
    }).returning()
    await audit(tx, {
      workspaceId: study.workspaceId, actorId: userId, action: 'set.update-queued', subjectType: 'impact_update', subjectId: inserted!.id,
      detail: { method, parentSetId: parent.id, measurementId: inputs.measurement.id, studyId: study.id, name, version }
    })
    return inserted!
  })
  const payload: ImpactUpdatePayload = { updateId: row.id }
  await enqueueRow(db, queues, updatesTable, IMPACT_UPDATE_QUEUE, row.id, payload)
  const [queued] = await db.select().from(t.impactUpdates).where(eq(t.impactUpdates.id, row.id))
  return queued!
}

/** Cancels a queued or running update (cancelRow with its audit event); the row as it is now. */
export async function cancelImpactUpdate(db: DB, queues: QueueSource, u: ImpactUpdate, actorId: string) {
  await cancelRow(db, queues, updatesTable, IMPACT_UPDATE_QUEUE, u, 'update', {
    workspaceId: u.workspaceId, actorId, action: 'set.update-cancel-requested', subjectType: 'impact_update', subjectId: u.id, detail: { state: u.state }
  })
  const [row] = await db.select().from(t.impactUpdates).where(eq(t.impactUpdates.id, u.id))
  return row!
}
