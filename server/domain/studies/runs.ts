import { and, eq, inArray } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { Result, Study } from '../../database/schema'
import { RUN_STUDY_QUEUE, type RunStudyPayload } from '../../../shared/queue/workflow'
import { conflictOnUnique, fail } from '../errors'
import { cancelRow, enqueueRow, type QueueSource } from '../jobs/queue'
import { insertResultVersions } from '../results/versions'
import { setsOfWorkspace } from '../sets/library'
import { LIMITS } from '../limits'
import { runSizeProblem, runVariation, studySizeProblem, variationProblem } from './check'

/**
 * Makes one new result version per set of `setIds` (all in the study) and queues a job for each,
 * with the result id as the BullMQ job id. 400 for a set the study does not have, 409 when one
 * is already queued or running (or another Run made the same version a moment earlier), 413 over
 * the budgets, 503 without a queue. No per-bin work here (see runInputs). The versions and their audit events are
 * one transaction; the jobs are queued only after it has committed, so a refused or failed
 * request queues nothing. If the queue fails, the versions not yet queued are marked failed
 * (they stay, with their audit events, as the record of what was asked) and the answer is 503.
 */
export async function startRuns(db: DB, queues: QueueSource, study: Study, setIds: readonly string[], userId: string): Promise<Result[]> {
  if (setIds.length === 0) {
    fail(400, 'Add at least one error set to the study before running it', { issues: [{ message: 'The study has no error sets', path: ['setIds'] }] })
  }
  const foreign = setIds.filter(id => !study.setIds.includes(id))
  if (foreign.length) {
    fail(400, 'Run only sets the study has', { issues: foreign.map(id => ({ message: `Set ${id} is not one of this study's sets`, path: ['setIds'] })) })
  }
  const { spec, sets, second } = await runInputs(db, study, setIds)
  const active = await db.select({ setId: t.results.setId, version: t.results.version }).from(t.results)
    .where(and(eq(t.results.studyId, study.id), inArray(t.results.setId, [...setIds]), inArray(t.results.state, ['queued', 'running'])))
  if (active.length) {
    const names = active.map(a => `${sets.find(s => s.id === a.setId)?.name ?? a.setId} (version ${a.version})`)
    fail(409, `Already queued or running: ${names.join(', ')}; wait for it or cancel it first`)
  }
  const created = await conflictOnUnique(RESULT_VERSION_UNIQUE, () => insertResultVersions(db, { study, spec, sets, second, userId }),
    'Another run of this study started a moment ago; wait for it or cancel it first')
  for (const [i, r] of created.entries()) {
    try {
      await enqueueRun(db, queues, r)
    } catch (err) {
      await markUnqueued(db, created.slice(i + 1))
      throw err
    }
  }
  return created
}

/**
 * What Run needs, without going through the bins one by one: the study's spec was checked in full
 * when it was saved (structure, the budgets, every bin's reach on each of its sets and its second
 * set; create and edit both call validateStudy) and a set's grid never changes once uploaded, so
 * here only the sets are looked up (400 for one not in the workspace) and the budgets, arithmetic
 * on counts, checked again (413). The per-bin work happens on the worker: a bin the engine still
 * refuses fails the run there with the engine's located message.
 */
async function runInputs(db: DB, study: Study, setIds: readonly string[]) {
  const spec = study.spec
  const tooLarge = studySizeProblem(spec)
  if (tooLarge) throw tooLarge
  const sets = await setsOfWorkspace(db, study.workspaceId, setIds)
  const [second] = study.secondSetId ? await setsOfWorkspace(db, study.workspaceId, [study.secondSetId], 'secondSetId') : [null]
  const unvaried = variationProblem(spec, second)
  if (unvaried) throw unvaried
  for (const s of sets) {
    const runTooLarge = runSizeProblem(spec, s, LIMITS, runVariation(spec, s, second).rows)
    if (runTooLarge) throw runTooLarge
  }
  return { spec, sets, second: second ?? null }
}

const RESULT_VERSION_UNIQUE = 'results_study_id_set_id_version_unique'

/** Marks result versions whose job was never queued (the queue failed before them) as failed. */
async function markUnqueued(db: DB, rows: Result[]) {
  if (!rows.length) return
  await db.update(t.results).set({ state: 'failed', error: 'The job queue is unavailable', finishedAt: new Date() })
    .where(inArray(t.results.id, rows.map(r => r.id)))
}

/** Puts a result on the run-study queue (503 without a queue). */
async function enqueueRun(db: DB, queues: QueueSource, r: Result) {
  const payload: RunStudyPayload = { resultId: r.id }
  await enqueueRow(db, queues, t.results, RUN_STUDY_QUEUE, r.id, payload)
  r.jobId = r.id
}

/** Cancels a queued or running result (cancelRow, with its audit event); the row as it is now. */
export async function cancelRun(db: DB, queues: QueueSource, r: Result, workspaceId: string, actorId: string) {
  await cancelRow(db, queues, t.results, RUN_STUDY_QUEUE, r, 'result', {
    workspaceId, actorId, action: 'result.cancel-requested', subjectType: 'result', subjectId: r.id, detail: { state: r.state }
  })
  const [row] = await db.select().from(t.results).where(eq(t.results.id, r.id))
  return row!
}
