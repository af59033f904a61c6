import { changeMemberRole } from '../../../../domain/accounts/members'
// Change a member's role (owners only); the last owner cannot step down.
export default defineEventHandler(async (event) => {
  const { user, workspace } = await requireWorkspace(event, 'owner')
  const userId = uuidParam(event, 'uid', 'Member')
  const { role } = await readValid(event, rolePatchSchema)
  return await changeMemberRole(useDB(), workspace.id, user.id, userId, role)
})
