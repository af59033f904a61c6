import { publicResult } from '../../../../../domain/studies/studies'
import { cancelRun } from '../../../../../domain/studies/runs'
import { audit } from '../../../../../domain/audit'
// Cancel a queued or running result (analysts).
export default defineEventHandler(async (event) => {
  const { user, workspace, result } = await requireResult(event, 'analyst')
  const workspaceId = workspace.id
  const row = await cancelRun(useDB(), useQueue, result)
  await audit(useDB(), { workspaceId, actorId: user.id, action: 'result.cancel-requested', subjectType: 'result', subjectId: result.id, detail: { state: row.state } })
  return publicResult(row)
})
