import { createHash, randomBytes } from 'node:crypto'

/** SHA-256 hex of a link token; only this is stored. */
export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex')

/** A fresh 256-bit link token (base64url, 43 characters) and its hash. */
export function newToken(): { token: string, hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashToken(token) }
}

export const HOUR_MS = 3_600_000
export const TOKEN_LIFETIME_MS = {
  verifyEmail: 48 * HOUR_MS,
  resetPassword: 1 * HOUR_MS,
  invitation: 7 * 24 * HOUR_MS
} as const
