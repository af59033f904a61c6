// Build an error set from a parametrised fit (analysts): the input document is checked now
// (400 with data.issues naming each JSON path), the build runs on the queue.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const body = await readValid(event, setBuildSchema)
  await requireMembership(workspaceId, user.id, 'analyst')
  const { name, request } = checkBuildRequest(body)
  const build = await startSetBuild(workspaceId, user.id, name, request)
  setResponseStatus(event, 202)
  return publicSetBuild(build)
})
