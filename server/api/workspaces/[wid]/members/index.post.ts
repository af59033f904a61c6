import { createInvitation } from '../../../../domain/accounts/members'
// Invite a colleague by e-mail with a role (owners only).
export default defineEventHandler(async (event) => {
  const { user, workspace } = await requireWorkspace(event, 'owner')
  const body = await readValid(event, inviteSchema)
  const invitation = await createInvitation(useDB(), useSettings(), workspace, user, body.email, body.role)
  setResponseStatus(event, 201)
  return invitation
})
