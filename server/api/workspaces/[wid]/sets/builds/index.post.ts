import { checkBuildRequest, publicSetBuild, startSetBuild } from '../../../../../domain/sets/builds'
// Build an error set from a parametrised fit (analysts): the input document is checked now
// (400 with data.issues naming each JSON path), the build runs on the queue.
export default defineEventHandler(async (event) => {
  const { user, workspace } = await requireWorkspace(event, 'analyst')
  const workspaceId = workspace.id
  const body = await readValid(event, setBuildSchema)
  const { name, request } = checkBuildRequest(body)
  const build = await startSetBuild(useDB(), useQueue, workspaceId, user.id, name, request)
  setResponseStatus(event, 202)
  return publicSetBuild(build)
})
