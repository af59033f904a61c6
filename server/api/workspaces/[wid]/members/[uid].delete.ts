import { removeMember } from '../../../../domain/accounts/members'
// Owners remove anyone; any member may remove themselves (leave). The last owner stays.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const userId = uuidParam(event, 'uid', 'Member')
  const { workspace } = await requireWorkspace(event, userId === user.id ? 'viewer' : 'owner')
  await removeMember(useDB(), workspace.id, user.id, userId)
  return { ok: true }
})
