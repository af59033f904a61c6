import { publicResult } from '../../../../../domain/studies/studies'
import { reviewStep } from '../../../../../domain/results/review'
// Review step "submitted" on a finished result version (analyst role or higher).
export default defineEventHandler(async (event) => {
  const { user, workspace, result } = await requireResult(event, 'analyst')
  const workspaceId = workspace.id
  const { comment } = await readValid(event, reviewCommentSchema)
  return publicResult(await reviewStep(useDB(), useSettings(), result, workspaceId, user, 'submitted', comment))
})
