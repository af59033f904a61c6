// Cancel a queued or running result (analysts).
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const resultId = uuidParam(event, 'rid', 'Result')
  const { result } = await requireResult(workspaceId, resultId, user.id, 'analyst')
  const row = await cancelRun(result)
  await audit({ workspaceId, actorId: user.id, action: 'result.cancel-requested', subjectType: 'result', subjectId: result.id, detail: { state: row.state } })
  return publicResult(row)
})
