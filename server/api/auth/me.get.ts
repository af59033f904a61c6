import { membershipsOf } from '../../domain/accounts/members'

export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  return { user, memberships: await membershipsOf(useDB(), user.id) }
})
