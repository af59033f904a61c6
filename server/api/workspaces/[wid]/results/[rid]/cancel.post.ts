import { publicResult } from '../../../../../domain/studies/studies'
import { cancelRun } from '../../../../../domain/studies/runs'
// Cancel a queued or running result (analysts); the request and its audit event are one write.
export default defineEventHandler(async (event) => {
  const { user, workspace, result } = await requireResult(event, 'analyst')
  return publicResult(await cancelRun(useDB(), useQueue, result, workspace.id, user.id))
})
