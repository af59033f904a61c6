// Review step "returned" on a finished result version (owner role or higher).
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const resultId = uuidParam(event, 'rid', 'Result')
  const { comment } = await readValid(event, returnCommentSchema)
  const { result } = await requireResult(workspaceId, resultId, user.id, 'owner')
  return publicResult(await reviewStep(result, workspaceId, user, 'returned', comment))
})
