import { acceptInvitation } from '../../domain/accounts/members'
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const token = tokenParam(event, 'Invitation')
  return await acceptInvitation(useDB(), token, user)
})
