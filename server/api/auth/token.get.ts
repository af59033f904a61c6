// The API token this request carries: its workspace and role (for scripts to check their set-up).
export default defineEventHandler((event) => {
  const token = requestToken(event)
  if (!token) throw createError({ statusCode: 401, statusMessage: 'Send an API token as "Authorization: Bearer <token>"' })
  return { workspaceId: token.workspaceId, role: token.role, user: { id: token.user.id, name: token.user.name } }
})
