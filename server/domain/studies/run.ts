// Running one study on one set (a `results` row) in ONE function, used by the worker, the seed
// and the command line alike: every member through the engine's precomputed plan, in chunks with
// progress (members done / total) into the row and the caller's callback, stopping at the cancel
// flag; then the member values, the scale variations and the bands of every prescription of the
// set's kind at the study's CL in one transaction. Idempotent: a retry of a finished result does
// nothing, a retry of an unfinished one recomputes and overwrites the same rows (result_values
// keyed by result id). Bad physics input (a RangeError from the engine) fails at once.
import { eq } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { Result, ScaleVariationJson } from '../../database/schema'
import { buildPlan, evaluatePlan } from '../../../shared/physics/study/plan'
import { memberAlphasFunctions } from '../../../shared/physics/study/member-alphas'
import { scaleVariation } from '../../../shared/physics/study/scale'
import { parseStudySpec, type StudySpec } from '../../../shared/physics/study/spec'
import type { ErrorSet } from '../../../shared/physics/types'
import { prescriptionsFor } from '../../../shared/physics/uncertainty/bands'
import { ENGINE_VERSION } from '../../../shared/physics/version'
import type { JobProgress } from '../../../shared/queue/workflow'
import { JobCancelled, ONLY_ATTEMPT, runQueuedWork } from '../jobs/lifecycle'
import { notifyRunEnded } from '../mail/job-ended'
import { storedBands, bandsFromValues, memberSourceOf } from '../results/bands'
import { float64ToBytes } from '../results/float64'
import type { RunOptions } from '../sets/build'
import { loadErrorSet } from '../sets/store'
import { kernelContextOf, pairRoles, runSizeProblem, studySizeProblem } from './check'

/** Members per chunk: progress is reported and the cancel flag read after each chunk. */
const chunkSize = (members: number) => Math.max(1, Math.min(25, Math.ceil(members / 20)))

/** Runs result `resultId` to its end (see the file comment). */
export function runStudy(db: DB, resultId: string, o: RunOptions = {}) {
  return runQueuedWork<Result, { members: number, bins: number }>(db, o.attempt ?? ONLY_ATTEMPT, {
    table: t.results, id: resultId, resetProgress: { membersDone: 0 },
    work: row => compute(db, row, o.onProgress),
    ended: o.mail ? () => notifyRunEnded(db, o.mail!, resultId) : undefined
  })
}

async function compute(db: DB, result: Result, onProgress: RunOptions['onProgress']) {
  const snapshot = result.specSnapshot
  const spec = parseStudySpec(snapshot.spec)
  // Runs queued before the budgets existed (or under larger ones) fail at once, before loading.
  const tooLarge = studySizeProblem(spec) ?? runSizeProblem(spec, snapshot.set)
  if (tooLarge) throw new RangeError(tooLarge.message)
  const set = await loadErrorSet(db, result.setId)
  const second = result.secondSetId ? await loadErrorSet(db, result.secondSetId) : null
  const values = await evaluateMembers(db, result, spec, set, second, onProgress)
  const scale = evaluateScaleVariations(spec, set, second)
  const source = memberSourceOf(set.header)
  const matrix = { members: set.members.length, bins: spec.bins.length, values }
  const bands = prescriptionsFor(set.header.kind).map(p => storedBands(bandsFromValues(matrix, source, p, snapshot.clPercent)))
  await db.transaction(async (tx) => {
    const [current] = await tx.select({ cancel: t.results.cancelRequested }).from(t.results).where(eq(t.results.id, result.id)).for('update')
    if (!current || current.cancel) throw new JobCancelled()
    const row = { resultId: result.id, memberCount: matrix.members, binCount: matrix.bins, values: float64ToBytes(values), scale }
    await tx.insert(t.resultValues).values(row).onConflictDoUpdate({ target: t.resultValues.resultId, set: row })
    await tx.delete(t.resultBands).where(eq(t.resultBands.resultId, result.id))
    await tx.insert(t.resultBands).values(bands.map(b => ({ resultId: result.id, prescription: b.prescription, clPercent: snapshot.clPercent, bands: b })))
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
  return buildPlan(spec, main, { ...kernelContextOf(main.header), ...(second ? { second } : {}) })
}

/**
 * members × bins values of the varying set, member-major, evaluated chunk by chunk with progress
 * and cancel checks; the partner set (if any) is held at its central member.
 */
async function evaluateMembers(db: DB, result: Result, spec: StudySpec, set: ErrorSet, partner: ErrorSet | null, onProgress: RunOptions['onProgress']) {
  const roles = pairRoles(set, partner)
  const plan = planFor(spec, roles.main, roles.second)
  const total = set.members.length
  const bins = plan.nBins
  const values = new Float64Array(total * bins)
  const step = chunkSize(total)
  // Kernels with α_s (gg → H) run each member of the varying main set with its own α_s(M_Z).
  const memberAlphas = memberAlphasFunctions({ ...set.header, memberCount: total })
  for (let m0 = 0; m0 < total; m0 += step) {
    const m1 = Math.min(total, m0 + step)
    const chunk = set.members.slice(m0, m1)
    const out = roles.varyingRole === 'main'
      ? evaluatePlan(plan, chunk, roles.second ? [roles.second.members[0]!] : undefined, { memberAlphas: memberAlphas.slice(m0, m1) })
      : evaluatePlan(plan, [roles.main.members[0]!], chunk)
    values.set(out, m0 * bins)
    const [row] = await db.update(t.results).set({ membersDone: m1 }).where(eq(t.results.id, result.id))
      .returning({ cancel: t.results.cancelRequested })
    const progress: JobProgress = { done: m1, total }
    await onProgress?.(progress)
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
      ...kernelContextOf(main.header), ...(second ? { second, secondCentral: second.members[0]! } : {})
    })
    const bins = spec.bins.length
    return {
      variation: v.variation, label: v.label,
      kappas: v.kappas,
      values: [0, 1, 2].map(k => Array.from(v.values.subarray(k * bins, (k + 1) * bins))),
      nominal: Array.from(v.nominal), up: Array.from(v.up), down: Array.from(v.down)
    }
  } catch (err) {
    if (err instanceof RangeError) return null
    throw err
  }
}
