// Review step "submitted" on a finished result version (analyst role or higher).
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const resultId = uuidParam(event, 'rid', 'Result')
  const { comment } = await readValid(event, reviewCommentSchema)
  const { result } = await requireResult(workspaceId, resultId, user.id, 'analyst')
  return publicResult(await reviewStep(result, workspaceId, user, 'submitted', comment))
})
