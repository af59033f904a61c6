// Cancel a queued or running set build (analysts).
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const buildId = uuidParam(event, 'bid', 'Set build')
  const { build } = await requireSetBuild(workspaceId, buildId, user.id, 'analyst')
  return publicSetBuild(await cancelSetBuild(build))
})
