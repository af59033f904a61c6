// Reads the lucia session cookie on API requests and puts user/session on event.context; a
// request with an Authorization header is authenticated by its API token instead (utils/auth.ts).
export default defineEventHandler(async (event) => {
  if (!event.path.startsWith('/api/')) return
  if (hasAuthorization(event)) return authenticateBearer(event)
  const lucia = useLucia()
  const sessionId = getCookie(event, lucia.sessionCookieName) ?? null
  event.context.user = null
  event.context.session = null
  if (!sessionId) return
  const { session, user } = await lucia.validateSession(sessionId)
  if (session?.fresh) {
    const c = lucia.createSessionCookie(session.id)
    setCookie(event, c.name, c.value, c.attributes)
  }
  if (!session) {
    const c = lucia.createBlankSessionCookie()
    setCookie(event, c.name, c.value, c.attributes)
    return
  }
  event.context.user = { id: user.id, email: user.email, name: user.name, emailVerified: user.emailVerified }
  event.context.session = session
})
