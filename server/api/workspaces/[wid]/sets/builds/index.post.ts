import { checkBuildRequest, publicSetBuild, startSetBuild } from '../../../../../domain/sets/builds'
import { fail } from '../../../../../domain/errors'
// Build an error set from a parametrised fit (analysts): the input document is checked now
// (400 with data.issues naming each JSON path), the build runs on the queue. A nuclear
// modification with `nuclei` builds one set per nucleus in the same job.
export default defineEventHandler(async (event) => {
  const { user, workspace } = await requireWorkspace(event, 'analyst')
  const workspaceId = workspace.id
  const body = await readValid(event, setBuildSchema)
  const { name, request } = checkBuildRequest(body)
  // The document's own name becomes the set's name when the request gives none: it must fit
  // the set library as a typed name would.
  const named = setNameSchema.safeParse(name)
  if (!named.success) {
    const message = named.error.issues[0]!.message
    fail(400, `The set to build needs another name: ${message}`, { fields: { [body.name === undefined ? 'input.name' : 'name']: message } })
  }
  for (const [i, n] of (request.nuclei ?? []).entries()) {
    const ok = setNameSchema.safeParse(n.name)
    if (!ok.success) fail(400, `nuclei[${i}]: the set for Z = ${n.z}, A = ${n.a} needs another name: ${ok.error.issues[0]!.message}`, { fields: { [`nuclei[${i}].name`]: ok.error.issues[0]!.message } })
  }
  const build = await startSetBuild(useDB(), useQueue, workspaceId, user.id, named.data, request)
  setResponseStatus(event, 202)
  return publicSetBuild(build)
})
