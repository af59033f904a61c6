import { publicResult } from '../../../../../domain/studies/studies'
import { reviewStep } from '../../../../../domain/results/review'
// Review step "approved" on a finished result version (owner role or higher).
export default defineEventHandler(async (event) => {
  const { user, workspace, result } = await requireResult(event, 'owner')
  const workspaceId = workspace.id
  const { comment } = await readValid(event, reviewCommentSchema)
  return publicResult(await reviewStep(useDB(), useSettings(), result, workspaceId, user, 'approved', comment))
})
