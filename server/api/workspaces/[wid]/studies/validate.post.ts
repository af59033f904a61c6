import { validateStudy } from '../../../../domain/studies/studies'
// Check a draft study without saving it (for the grid's messages): 200 { ok: true, spec } with
// the spec as the engine completes it, or the same 400/422 with data.issues as a save.
export default defineEventHandler(async (event) => {
  const { workspace } = await requireWorkspace(event, 'viewer')
  const workspaceId = workspace.id
  const body = await readValid(event, studyDraftSchema, { maxBytes: JSON_BODY_LIMITS.study })
  const { spec } = await validateStudy(useDB(), workspaceId, body)
  return { ok: true, spec }
})
