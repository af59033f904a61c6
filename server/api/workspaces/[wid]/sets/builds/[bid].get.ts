// A set build's state and progress (members built / total) and, once done, the new set's id.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const buildId = uuidParam(event, 'bid', 'Set build')
  const { build } = await requireSetBuild(workspaceId, buildId, user.id, 'viewer')
  return publicSetBuild(build)
})
