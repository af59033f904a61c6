// The impact-update job: updates a set by a measurement (updates.ts checked the request) and
// saves the derived set to the library — the unweighted replica set after reweighting
// (arXiv:1012.0836, arXiv:1108.1758) or the profiled Hessian set (arXiv:1402.6623) — with the
// row's summary and `done` state in one transaction. One function for the worker and tests.
// Progress in four steps (inputs read, update computed, set built, stored); the cancel flag is
// read between them. Idempotent: a retry recomputes everything and stores one set.
import { and, eq } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { ImpactSummary, ImpactUpdate } from '../../database/schema'
import { IMPACT_CAUTION } from '../../../shared/export/impact-caution'
import { RESULT_CAUTION_SHORT } from '../../../shared/export/caution'
import { chi2Profile, profiledSet, unweightedCopies, unweightedMatrix, unweightedSet, weightedBand } from '../../../shared/physics/impact'
import { SET_FILE_EXTENSION } from '../../../shared/physics/sets/format'
import { writeSetFile } from '../../../shared/physics/sets/write'
import { bandToJson } from '../../../shared/physics/uncertainty/band'
import { ENGINE_VERSION } from '../../../shared/physics/version'
import type { JobProgress } from '../../../shared/queue/workflow'
import { JobCancelled, ONLY_ATTEMPT, runQueuedWork, type Attempt } from '../jobs/lifecycle'
import { insertErrorSet, loadErrorSet } from '../sets/store'
import { updateInputs, updatesTable, updateValues } from './updates'

export interface RunOptions {
  onProgress?: (p: JobProgress) => unknown
  attempt?: Attempt
}

/** The α grid of the stored χ² profile P(α): 0.2 to 4 in steps of 0.02. */
export const PROFILE_ALPHAS = Array.from({ length: 191 }, (_, i) => Math.round((0.2 + 0.02 * i) * 100) / 100)

const STEPS = 4

/** Runs update `updateId` to its end (see the file comment). */
export function runImpactUpdate(db: DB, updateId: string, o: RunOptions = {}) {
  return runQueuedWork<ImpactUpdate, { setId: string }>(db, o.attempt ?? ONLY_ATTEMPT, {
    table: updatesTable, id: updateId, resetProgress: { progressDone: 0 },
    work: async row => ({ setId: await update(db, row, o.onProgress) })
  })
}

async function step(db: DB, id: string, done: number, onProgress: RunOptions['onProgress']) {
  const [row] = await db.update(t.impactUpdates).set({ progressDone: done, progressTotal: STEPS })
    .where(eq(t.impactUpdates.id, id)).returning({ cancel: t.impactUpdates.cancelRequested })
  await onProgress?.({ done, total: STEPS })
  if (!row || row.cancel) throw new JobCancelled()
}

const shortNumber = (v: number) => (Number.isFinite(v) ? v.toPrecision(4) : String(v))

async function update(db: DB, u: ImpactUpdate, onProgress: RunOptions['onProgress']): Promise<string> {
  const [study] = await db.select().from(t.studies).where(eq(t.studies.id, u.studyId))
  if (!study) throw new RangeError('The study of this update no longer exists')
  if (!u.parentSetId || !u.measurementId) throw new RangeError('The set or the measurement of this update no longer exists')
  const inputs = await updateInputs(db, study, u.parentSetId, u.measurementId)
  const parentSet = await loadErrorSet(db, u.parentSetId)
  await step(db, u.id, 1, onProgress)

  const computed = updateValues(inputs, u.request)
  const parent = inputs.parent
  const m = inputs.measurement
  const where = `the measurement '${m.name}' (${m.data.values.length} points) on the study '${study.name}' (result version ${inputs.result.version})`
  const base = {
    points: m.data.values.length,
    parent: { id: parent.id, name: parent.name, version: parent.version, kind: parent.kind, memberCount: parent.memberCount },
    measurement: { id: m.id, name: m.name },
    study: { id: study.id, name: study.name },
    result: { id: inputs.result.id, version: inputs.result.version },
    data: Array.from(m.data.values),
    caution: `${RESULT_CAUTION_SHORT} ${IMPACT_CAUTION}`
  }
  let summary: ImpactSummary
  let derived
  if (computed.method === 'reweight') {
    const r = computed.result
    const count = u.request.replicas ?? r.replicas
    const copies = unweightedCopies(r.weights, count, u.request.seed === undefined ? {} : { seed: u.request.seed })
    await step(db, u.id, 2, onProgress)
    const after = weightedBand(unweightedMatrix(computed.matrix, copies), new Float64Array(count).fill(1))
    const profile = chi2Profile(r.chi2, r.points, PROFILE_ALPHAS)
    const provenance = `Reweighted (${r.form} weights, arXiv:1012.0836) by ${where}; N_eff = ${r.effectiveReplicas.toFixed(1)} of ${r.replicas};`
      + ` χ² ${shortNumber(r.chi2Before)} → ${shortNumber(r.chi2After)}; unweighted to ${count} replicas (arXiv:1108.1758${u.request.seed === undefined ? '' : `, seed ${u.request.seed}`});`
      + ` set update ${u.id}; ${ENGINE_VERSION}. ${IMPACT_CAUTION}`
    derived = unweightedSet(parentSet, copies, { name: u.request.name, version: u.request.version, provenance })
    summary = {
      ...base, method: 'reweight', chi2Before: r.chi2Before, chi2After: r.chi2After, before: bandToJson(r.before), after: bandToJson(after),
      reweight: {
        replicas: r.replicas, effectiveReplicas: r.effectiveReplicas, warning: r.warning, unweightedReplicas: count,
        distinctReplicas: Array.from(copies).filter(c => c > 0).length, seed: u.request.seed ?? null,
        profile: { alpha: Array.from(profile.alpha), density: Array.from(profile.density), mostProbableAlpha: profile.mostProbableAlpha }
      }
    }
  } else {
    const r = computed.result
    await step(db, u.id, 2, onProgress)
    const shifts = Array.from(r.shifts, (z, k) => `z${k + 1} = ${z.toFixed(4)}`).join(', ')
    const provenance = `Profiled (arXiv:1402.6623; tolerance T = ${computed.tolerance.toPrecision(6)}) by ${where};`
      + ` χ² ${shortNumber(r.chi2Before)} → ${shortNumber(r.chi2After.data)} (+ penalty ${shortNumber(r.chi2After.penalty)}); shifts ${shifts};`
      + ` set update ${u.id}; ${ENGINE_VERSION}. ${IMPACT_CAUTION}`
    derived = profiledSet(parentSet, r, { name: u.request.name, version: u.request.version, provenance })
    summary = {
      ...base, method: 'profile', chi2Before: r.chi2Before, chi2After: r.chi2After.data, before: bandToJson(r.bandBefore), after: bandToJson(r.bandAfter),
      profile: { tolerance: computed.tolerance, shifts: Array.from(r.shifts), penalty: r.chi2After.penalty, eigenvalues: Array.from(r.eigenvalues) }
    }
  }
  const bytes = writeSetFile(derived)
  await step(db, u.id, 3, onProgress)

  return db.transaction(async (tx) => {
    const [current] = await tx.select({ cancel: t.impactUpdates.cancelRequested }).from(t.impactUpdates).where(eq(t.impactUpdates.id, u.id)).for('update')
    if (!current || current.cancel) throw new JobCancelled()
    const [taken] = await tx.select({ id: t.errorSets.id }).from(t.errorSets)
      .where(and(eq(t.errorSets.workspaceId, u.workspaceId), eq(t.errorSets.name, u.request.name), eq(t.errorSets.version, u.request.version)))
    if (taken) throw new RangeError(`A set named ${u.request.name} version ${u.request.version} was added to the library meanwhile; start the update again with another name or version`)
    const setId = await insertErrorSet(tx, {
      workspaceId: u.workspaceId, name: u.request.name, fileName: `${`${u.request.name}-${u.request.version}`.replace(/[^\w.-]+/g, '_')}${SET_FILE_EXTENSION}`,
      bytes, origin: 'build', addedBy: u.requestedBy
    })
    await tx.update(t.impactUpdates).set({ state: 'done', setId, summary, progressDone: STEPS, progressTotal: STEPS, finishedAt: new Date() })
      .where(eq(t.impactUpdates.id, u.id))
    await tx.insert(t.auditEvents).values({
      workspaceId: u.workspaceId, actorId: u.requestedBy, action: 'set.updated', subjectType: 'error_set', subjectId: setId,
      detail: { updateId: u.id, method: u.method, parentSetId: parent.id, measurementId: m.id, members: derived.members.length }
    })
    return setId
  })
}
