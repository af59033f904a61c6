import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle'
import type { H3Event } from 'h3'
import { Lucia, TimeSpan } from 'lucia'
import { tables as t } from '../database/client'

function buildLucia() {
  const adapter = new DrizzlePostgreSQLAdapter(useDB(), t.sessions, t.users)
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(30, 'd'),
    sessionCookie: {
      name: 'sheaf_session',
      attributes: { sameSite: 'lax', secure: useSettings().secureCookies, path: '/' }
    },
    getUserAttributes: a => ({ email: a.email, name: a.name, emailVerified: a.emailVerifiedAt != null })
  })
}

let lucia: ReturnType<typeof buildLucia> | undefined
export const useLucia = () => (lucia ??= buildLucia())

declare module 'lucia' {
  interface Register {
    Lucia: ReturnType<typeof buildLucia>
    UserId: string
    DatabaseUserAttributes: { email: string, name: string, emailVerifiedAt: Date | null }
  }
}

/** Start a session for `userId` and set its cookie. */
export async function startSession(event: H3Event, userId: string) {
  const session = await useLucia().createSession(userId, {})
  const cookie = useLucia().createSessionCookie(session.id)
  setCookie(event, cookie.name, cookie.value, cookie.attributes)
  return session
}

/** End the current session (if any) and blank the cookie. */
export async function endSession(event: H3Event) {
  const session = event.context.session as { id: string } | null | undefined
  if (session) await useLucia().invalidateSession(session.id)
  const blank = useLucia().createBlankSessionCookie()
  setCookie(event, blank.name, blank.value, blank.attributes)
}
