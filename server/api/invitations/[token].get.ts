import { findOpenInvitation } from '../../domain/accounts/members'
// What an invitation link offers, so the page can show it before the visitor signs in.
export default defineEventHandler(async (event) => {
  const token = tokenParam(event, 'Invitation')
  const { invitation, workspaceName, inviterName } = await findOpenInvitation(useDB(), token)
  return { workspaceName, inviterName, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt }
})
