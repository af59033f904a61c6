// State and progress only (members done / total): cheap enough to poll every half second.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const resultId = uuidParam(event, 'rid', 'Result')
  const { result } = await requireResult(workspaceId, resultId, user.id, 'viewer')
  return progressOf(result)
})
