// Check a draft study without saving it (for the grid's messages): 200 { ok: true, spec } with
// the spec as the engine completes it, or the same 400/422 with data.issues as a save.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const body = await readValid(event, studyDraftSchema)
  await requireMembership(workspaceId, user.id, 'viewer')
  const { spec } = await validateStudy(workspaceId, body)
  return { ok: true, spec }
})
