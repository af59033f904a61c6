import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'

// Delete a result version (analysts), unless it is approved (frozen) or still queued/running.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const resultId = uuidParam(event, 'rid', 'Result')
  const { result } = await requireResult(workspaceId, resultId, user.id, 'analyst')
  assertNotFrozen(result)
  if (result.state === 'queued' || result.state === 'running') {
    throw createError({ statusCode: 409, statusMessage: 'This result is still queued or running; cancel it first' })
  }
  await useDB().transaction(async (tx) => {
    await tx.delete(t.results).where(eq(t.results.id, result.id))
    await audit({ workspaceId, actorId: user.id, action: 'result.deleted', subjectType: 'result', subjectId: result.id, detail: { version: result.version, studyId: result.studyId } }, tx)
  })
  return { deleted: result.id }
})
