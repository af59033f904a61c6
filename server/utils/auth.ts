import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle'
import type { H3Event } from 'h3'
import { Lucia, TimeSpan } from 'lucia'
import { tables as t } from '../database/client'
import { recordApiTokenUse, resolveApiToken } from '../domain/accounts/api-tokens'

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

/**
 * The secret of an `Authorization: Bearer …` header, or undefined. A request that carries one is
 * authenticated by it alone: its cookies are ignored, so it needs no Origin check (a browser
 * never adds this header to a cross-site request by itself).
 */
export function bearerSecret(event: H3Event): string | undefined {
  const header = getRequestHeader(event, 'authorization')
  if (!header) return undefined
  const match = /^Bearer[ \t]+(\S*)\s*$/i.exec(header)
  return match ? match[1] : undefined
}

/** True when the request has an Authorization header (Bearer or not): cookies are then ignored. */
export const hasAuthorization = (event: H3Event) => getRequestHeader(event, 'authorization') != null

/**
 * Authenticate an API request by its Authorization header: puts the token's caller on
 * `event.context.apiToken` (and no session user, so account routes refuse it), or throws 401 for
 * a missing, malformed, unknown, revoked or expired token, 429 when throttled. Every accepted use
 * is recorded (last use, audit event).
 */
export async function authenticateBearer(event: H3Event): Promise<void> {
  event.context.user = null
  event.context.session = null
  event.context.apiToken = null
  const secret = bearerSecret(event)
  if (secret === undefined) {
    throw createError({ statusCode: 401, statusMessage: 'Authorization header: use "Bearer <API token>"' })
  }
  await countTokenLookup(event)
  const caller = await resolveApiToken(useDB(), secret)
  if ('refused' in caller) throw createError({ statusCode: 401, statusMessage: caller.refused })
  await countTokenUse(event, caller.tokenId)
  await recordApiTokenUse(useDB(), caller, { method: event.method, path: event.path, address: clientAddress(event) })
  event.context.apiToken = caller
}
