export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const token = tokenParam(event, 'Invitation')
  return await acceptInvitation(token, user)
})
