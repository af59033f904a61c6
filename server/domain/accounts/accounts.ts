import { and, eq, gt, isNull } from 'drizzle-orm'
import { tables as t, type DB, type Tx } from '../../database/client'
import type { User } from '../../database/schema'
import { fail } from '../errors'
import { sendMail } from '../mail/send'
import { resetPasswordMail, verifyEmailMail } from '../mail/templates'
import { appLink, type Settings } from '../settings'
import { hashToken, newToken, TOKEN_LIFETIME_MS } from './tokens'

type Purpose = 'verify_email' | 'reset_password'

/** What the API shows of a user: never the hash. */
export const publicUser = (u: User) => ({ id: u.id, email: u.email, name: u.name, emailVerified: u.emailVerifiedAt !== null })

export async function findUserByEmail(db: DB, email: string) {
  const [user] = await db.select().from(t.users).where(eq(t.users.email, email.toLowerCase()))
  return user
}

async function issueToken(tx: Tx, userId: string, purpose: Purpose, lifetimeMs: number) {
  const { token, hash } = newToken()
  await tx.insert(t.authTokens).values({ userId, purpose, tokenHash: hash, expiresAt: new Date(Date.now() + lifetimeMs) })
  return token
}

/** Issue a verification token and mail its link, inside `tx` so a failed send leaves nothing. */
export async function sendVerificationMail(tx: Tx, settings: Settings, user: User) {
  const token = await issueToken(tx, user.id, 'verify_email', TOKEN_LIFETIME_MS.verifyEmail)
  await sendMail(settings, user.email, verifyEmailMail(user.name, appLink(settings, '/verify', { token })))
}

export async function sendResetMail(tx: Tx, settings: Settings, user: User) {
  const token = await issueToken(tx, user.id, 'reset_password', TOKEN_LIFETIME_MS.resetPassword)
  await sendMail(settings, user.email, resetPasswordMail(user.name, appLink(settings, '/reset', { token })))
}

/** Mark the token used and return its user id, or 400 if it is unknown, expired or used. */
export async function consumeToken(tx: Tx, token: string, purpose: Purpose): Promise<string> {
  const [row] = await tx.update(t.authTokens).set({ usedAt: new Date() })
    .where(and(
      eq(t.authTokens.tokenHash, hashToken(token)), eq(t.authTokens.purpose, purpose),
      isNull(t.authTokens.usedAt), gt(t.authTokens.expiresAt, new Date())
    ))
    .returning({ userId: t.authTokens.userId })
  if (!row) fail(400, 'This link has expired or was already used', { fields: { token: 'Ask for a new link' } })
  return row.userId
}
