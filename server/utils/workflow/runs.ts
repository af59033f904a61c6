import { and, eq, inArray } from 'drizzle-orm'
import { tables as t } from '../../database/client'
import type { Result, Study } from '../../database/workflow-schema'
import { RUN_STUDY_QUEUE, type RunStudyPayload } from '../../../shared/queue/workflow'
import { cancelRow, enqueueRow } from './queued-rows'
import { insertResultVersions } from './result-versions'

/**
 * Makes one new result version per set of `setIds` (all in the study) and queues a job for each,
 * with the result id as the BullMQ job id. 400 for a set the study does not have, 409 when one
 * is already queued or running, 422 when a bin is out of a set's reach, 503 without a queue.
 */
export async function startRuns(study: Study, setIds: readonly string[], userId: string): Promise<Result[]> {
  if (setIds.length === 0) {
    throw createError({ statusCode: 400, statusMessage: 'Add at least one error set to the study before running it', data: { issues: [{ message: 'The study has no error sets', path: ['setIds'] }] } })
  }
  const foreign = setIds.filter(id => !study.setIds.includes(id))
  if (foreign.length) {
    throw createError({ statusCode: 400, statusMessage: 'Run only sets the study has', data: { issues: foreign.map(id => ({ message: `Set ${id} is not one of this study's sets`, path: ['setIds'] })) } })
  }
  const { spec, sets, second } = await validateStudy(study.workspaceId, { spec: study.spec, setIds: [...setIds], secondSetId: study.secondSetId })
  const db = useDB()
  const active = await db.select({ setId: t.results.setId, version: t.results.version }).from(t.results)
    .where(and(eq(t.results.studyId, study.id), inArray(t.results.setId, [...setIds]), inArray(t.results.state, ['queued', 'running'])))
  if (active.length) {
    const names = active.map(a => `${sets.find(s => s.id === a.setId)?.name ?? a.setId} (version ${a.version})`)
    throw createError({ statusCode: 409, statusMessage: `Already queued or running: ${names.join(', ')}; wait for it or cancel it first` })
  }
  const created = await insertResultVersions(db, { study, spec, sets, second, userId })
  for (const r of created) await enqueueRun(r)
  return created
}

/** Puts a result on the run-study queue (503 without a queue). */
async function enqueueRun(r: Result) {
  const payload: RunStudyPayload = { resultId: r.id }
  await enqueueRow(t.results, RUN_STUDY_QUEUE, r.id, payload)
  r.jobId = r.id
}

/** Cancels a queued or running result (cancelRow); the row as it is now. */
export async function cancelRun(r: Result) {
  await cancelRow(t.results, RUN_STUDY_QUEUE, r, 'result')
  const [row] = await useDB().select().from(t.results).where(eq(t.results.id, r.id))
  return row!
}
