import { publicResult } from '../../../../../domain/studies/studies'
import { reviewStep } from '../../../../../domain/results/review'
// Review step "returned" on a finished result version (owner role or higher).
export default defineEventHandler(async (event) => {
  const { user, workspace, result } = await requireResult(event, 'owner')
  const workspaceId = workspace.id
  const { comment } = await readValid(event, returnCommentSchema)
  return publicResult(await reviewStep(useDB(), useSettings(), result, workspaceId, user, 'returned', comment))
})
