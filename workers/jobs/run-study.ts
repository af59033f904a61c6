import type { Job } from 'bullmq'
import { eq } from 'drizzle-orm'
import type { DB } from '../../server/database/client'
import { tables as t } from '../../server/database/client'
import type { Result, ScaleVariationJson } from '../../server/database/workflow-schema'
import { bandResultToJson, bandsFromValues, memberSourceOf } from '../../server/utils/workflow/bands'
import { ENGINE_VERSION } from '../../server/utils/workflow/engine-version'
import { float64ToBytes } from '../../server/utils/workflow/float64'
import { JobCancelled, runQueuedWork } from '../../server/utils/workflow/job-lifecycle'
import { notifyRunEnded } from '../../server/utils/workflow/job-mail'
import { loadErrorSet } from '../../server/utils/workflow/set-store'
import { kernelContextOf, pairRoles } from '../../server/utils/workflow/study-check'
import { buildPlan, evaluatePlan } from '../../shared/physics/study/plan'
import { scaleVariation } from '../../shared/physics/study/scale'
import { parseStudySpec, type StudySpec } from '../../shared/physics/study/spec'
import type { ErrorSet, SetHeader } from '../../shared/physics/types'
import { prescriptionsFor } from '../../shared/physics/uncertainty/bands'
import { runStudyPayload, type JobProgress } from '../../shared/queue/workflow'

/** Members per chunk: progress is reported and the cancel flag read after each chunk. */
const chunkSize = (members: number) => Math.max(1, Math.min(25, Math.ceil(members / 20)))

/**
 * Evaluates one study on one set (the `results` row named by the payload): every member through
 * the engine's precomputed plan, in chunks with progress (members done / total) into the row and
 * job.updateProgress, stopping at the cancel flag; then the member values, the scale variations
 * and the bands of every prescription of the set's kind at the study's CL in ONE transaction.
 * Idempotent: a retry of a finished result does nothing, a retry of an unfinished one recomputes
 * and overwrites the same rows (result_values keyed by result id). Bad physics input (a RangeError
 * from the engine) fails at once without retries.
 */
export async function runStudyJob(db: DB, job: Job) {
  const { resultId } = runStudyPayload.parse(job.data)
  return runQueuedWork<Result, { members: number, bins: number }>(db, job, {
    table: t.results, id: resultId, resetProgress: { membersDone: 0 },
    work: row => compute(db, job, row),
    notify: () => notifyRunEnded(db, resultId)
  })
}

async function compute(db: DB, job: Job, result: Result) {
  const snapshot = result.specSnapshot as { spec: unknown, clPercent: number }
  const spec = parseStudySpec(snapshot.spec)
  const set = await loadErrorSet(db, result.setId)
  const second = result.secondSetId ? await loadErrorSet(db, result.secondSetId) : null
  const values = await evaluateMembers(db, job, result, spec, set, second)
  const scale = evaluateScaleVariations(spec, set, second)
  const source = memberSourceOf(set.header)
  const matrix = { members: set.members.length, bins: spec.bins.length, values }
  const bands = prescriptionsFor(set.header.kind).map(p => ({
    prescription: p, bands: bandResultToJson(bandsFromValues(matrix, source, p, snapshot.clPercent))
  }))
  await db.transaction(async (tx) => {
    const [current] = await tx.select({ cancel: t.results.cancelRequested }).from(t.results).where(eq(t.results.id, result.id)).for('update')
    if (!current || current.cancel) throw new JobCancelled()
    const row = { resultId: result.id, memberCount: matrix.members, binCount: matrix.bins, values: float64ToBytes(values), scale }
    await tx.insert(t.resultValues).values(row).onConflictDoUpdate({ target: t.resultValues.resultId, set: row })
    await tx.delete(t.resultBands).where(eq(t.resultBands.resultId, result.id))
    await tx.insert(t.resultBands).values(bands.map(b => ({ resultId: result.id, prescription: b.prescription, clPercent: snapshot.clPercent, bands: b.bands })))
    await tx.update(t.results).set({
      state: 'done', membersDone: matrix.members, finishedAt: new Date(), error: null, engineVersion: ENGINE_VERSION
    }).where(eq(t.results.id, result.id))
    const [study] = await tx.select({ workspaceId: t.studies.workspaceId }).from(t.studies).where(eq(t.studies.id, result.studyId))
    await tx.insert(t.auditEvents).values({
      workspaceId: study?.workspaceId ?? null, actorId: result.requestedBy, action: 'result.ran', subjectType: 'result', subjectId: result.id,
      detail: { members: matrix.members, bins: matrix.bins, ms: Date.now() - (result.startedAt?.getTime() ?? Date.now()) }
    })
  })
  return { members: matrix.members, bins: matrix.bins }
}

/** The plan on the main set's grid (with the second set's), whichever of the two varies. */
function planFor(spec: StudySpec, main: ErrorSet, second: ErrorSet | null) {
  return buildPlan(spec, main, { ...kernelContextOf(main.header as SetHeader), ...(second ? { second } : {}) })
}

/**
 * members × bins values of the varying set, member-major, evaluated chunk by chunk with progress
 * and cancel checks; the partner set (if any) is held at its central member.
 */
async function evaluateMembers(db: DB, job: Job, result: Result, spec: StudySpec, set: ErrorSet, partner: ErrorSet | null) {
  const roles = pairRoles(set, partner)
  const plan = planFor(spec, roles.main, roles.second)
  const total = set.members.length
  const bins = plan.nBins
  const values = new Float64Array(total * bins)
  const step = chunkSize(total)
  for (let m0 = 0; m0 < total; m0 += step) {
    const m1 = Math.min(total, m0 + step)
    const chunk = set.members.slice(m0, m1)
    const out = roles.varyingRole === 'main'
      ? evaluatePlan(plan, chunk, roles.second ? [roles.second.members[0]!] : undefined)
      : evaluatePlan(plan, [roles.main.members[0]!], chunk)
    values.set(out, m0 * bins)
    const [row] = await db.update(t.results).set({ membersDone: m1 }).where(eq(t.results.id, result.id))
      .returning({ cancel: t.results.cancelRequested })
    const progress: JobProgress = { done: m1, total }
    await job.updateProgress(progress)
    if (!row || row.cancel) throw new JobCancelled()
  }
  return values
}

/**
 * The engine's factorisation-scale variation of the central members (κ × ½ and × 2), stored
 * apart from the PDF band; null when a varied scale leaves a set's grid (no scale band then).
 */
function evaluateScaleVariations(spec: StudySpec, set: ErrorSet, partner: ErrorSet | null): ScaleVariationJson | null {
  const { main, second } = pairRoles(set, partner)
  try {
    const v = scaleVariation(spec, main, main.members[0]!, {
      ...kernelContextOf(main.header as SetHeader), ...(second ? { second, secondCentral: second.members[0]! } : {})
    })
    const bins = spec.bins.length
    return {
      kappas: v.kappas,
      values: [0, 1, 2].map(k => Array.from(v.values.subarray(k * bins, (k + 1) * bins))),
      nominal: Array.from(v.nominal), up: Array.from(v.up), down: Array.from(v.down)
    }
  } catch (err) {
    if (err instanceof RangeError) return null
    throw err
  }
}

/**
 * Runs a result in this process without the queue (for the seed and the command line): the same
 * work as the job, with progress going only into the row.
 */
export function runStudyInline(db: DB, resultId: string) {
  const job = { data: { resultId }, attemptsMade: 0, opts: { attempts: 1 }, queueName: 'inline', id: resultId, updateProgress: async () => {} }
  return runStudyJob(db, job as unknown as Job)
}
