import { eq } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { audit } from '../../../../domain/audit'
import { fail } from '../../../../domain/errors'
import { assertNotFrozen } from '../../../../domain/lookups'

// Delete a result version (analysts), unless it is approved (frozen) or still queued/running.
export default defineEventHandler(async (event) => {
  const { user, workspace, result } = await requireResult(event, 'analyst')
  const workspaceId = workspace.id
  assertNotFrozen(result)
  if (result.state === 'queued' || result.state === 'running') {
    fail(409, 'This result is still queued or running; cancel it first')
  }
  await useDB().transaction(async (tx) => {
    await tx.delete(t.results).where(eq(t.results.id, result.id))
    await audit(tx, { workspaceId, actorId: user.id, action: 'result.deleted', subjectType: 'result', subjectId: result.id, detail: { version: result.version, studyId: result.studyId } })
  })
  return { deleted: result.id }
})
