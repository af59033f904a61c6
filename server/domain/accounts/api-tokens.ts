// Personal API tokens: created for one workspace with a role no higher than the user's own there
// and an expiry; the secret is shown once and only its SHA-256 is stored (the secret carries 256
// random bits, so a fast hash is enough — common practice for high-entropy tokens); revocable;
// every use updates `lastUsedAt` and writes an audit event.
import { randomBytes } from 'node:crypto'
import { and, desc, eq, isNull } from 'drizzle-orm'
import type { DB } from '../../database/client'
import { tables as t } from '../../database/client'
import type { ApiToken } from '../../database/schema'
import { roleAtLeast } from '../../../shared/utils/roles'
import type { ApiTokenCreate, ApiTokenPublic } from '../../../shared/utils/token-schemas'
import { audit } from '../audit'
import { fail } from '../errors'
import { hashToken } from './tokens'

/** Every secret starts so; it lets scanners and people recognise a Sheaf token. */
export const API_TOKEN_PREFIX = 'sheaf_pat_'
/** The shape of a secret: the prefix and 43 base64url characters (32 random bytes). */
export const API_TOKEN_PATTERN = /^sheaf_pat_[A-Za-z0-9_-]{43}$/
/** How many characters of the secret are kept to show in the list. */
const SHOWN = API_TOKEN_PREFIX.length + 6

const DAY_MS = 86_400_000

/** Create a token; answers the row and the secret, which is never available again. */
export async function createApiToken(db: DB, userId: string, input: ApiTokenCreate, now = new Date()) {
  const [membership] = await db.select({ role: t.memberships.role }).from(t.memberships)
    .where(and(eq(t.memberships.workspaceId, input.workspaceId), eq(t.memberships.userId, userId)))
  if (!membership) fail(400, 'Check the highlighted fields', { fields: { workspaceId: 'You are not a member of this workspace' } })
  if (!roleAtLeast(membership.role, input.role)) {
    fail(400, 'Check the highlighted fields', { fields: { role: `Your role in this workspace is ${membership.role}; a token cannot have more` } })
  }
  const secret = API_TOKEN_PREFIX + randomBytes(32).toString('base64url')
  const row = await db.transaction(async (tx) => {
    const [row] = await tx.insert(t.apiTokens).values({
      userId, workspaceId: input.workspaceId, name: input.name, role: input.role,
      tokenHash: hashToken(secret), prefix: secret.slice(0, SHOWN),
      expiresAt: new Date(now.getTime() + input.expiresInDays * DAY_MS)
    }).returning()
    await audit(tx, {
      workspaceId: input.workspaceId, actorId: userId, action: 'api_token.created', subjectType: 'api_token',
      subjectId: row!.id, detail: { name: input.name, role: input.role, expiresAt: row!.expiresAt.toISOString() }
    })
    return row!
  })
  return { secret, token: row }
}

/** The user's tokens, newest first, with their workspace's name. */
export async function listApiTokens(db: DB, userId: string): Promise<ApiTokenPublic[]> {
  const rows = await db.select({ token: t.apiTokens, workspaceName: t.workspaces.name }).from(t.apiTokens)
    .innerJoin(t.workspaces, eq(t.workspaces.id, t.apiTokens.workspaceId))
    .where(eq(t.apiTokens.userId, userId))
    .orderBy(desc(t.apiTokens.createdAt))
  return rows.map(r => publicApiToken(r.token, r.workspaceName))
}

/** A token without its hash, dates as ISO text. */
export function publicApiToken(row: ApiToken, workspaceName: string): ApiTokenPublic {
  return {
    id: row.id, name: row.name, workspaceId: row.workspaceId, workspaceName, role: row.role, prefix: row.prefix,
    createdAt: row.createdAt.toISOString(), expiresAt: row.expiresAt.toISOString(),
    lastUsedAt: row.lastUsedAt?.toISOString() ?? null, revokedAt: row.revokedAt?.toISOString() ?? null
  }
}

/** Revoke one of the user's tokens (another user's is 404); revoking twice is harmless. */
export async function revokeApiToken(db: DB, userId: string, tokenId: string) {
  const [row] = await db.select().from(t.apiTokens).where(and(eq(t.apiTokens.id, tokenId), eq(t.apiTokens.userId, userId)))
  if (!row) fail(404, 'API token not found')
  if (row.revokedAt) return row
  return db.transaction(async (tx) => {
    const [updated] = await tx.update(t.apiTokens).set({ revokedAt: new Date() })
      .where(and(eq(t.apiTokens.id, tokenId), isNull(t.apiTokens.revokedAt))).returning()
    await audit(tx, { workspaceId: row.workspaceId, actorId: userId, action: 'api_token.revoked', subjectType: 'api_token', subjectId: row.id })
    return updated ?? row
  })
}

/** What a request carrying a valid token may act as. */
export interface TokenCaller {
  tokenId: string
  workspaceId: string
  role: ApiToken['role']
  user: { id: string, email: string, name: string, emailVerified: boolean }
}

/**
 * The caller a secret stands for, or a reason it does not: malformed, unknown, revoked or
 * expired (the messages never say which of unknown and malformed).
 */
export async function resolveApiToken(db: DB, secret: string, now = new Date()): Promise<TokenCaller | { refused: string }> {
  if (!API_TOKEN_PATTERN.test(secret)) return { refused: 'This API token is not valid' }
  const [row] = await db.select({ token: t.apiTokens, user: t.users }).from(t.apiTokens)
    .innerJoin(t.users, eq(t.users.id, t.apiTokens.userId))
    .where(eq(t.apiTokens.tokenHash, hashToken(secret)))
  if (!row) return { refused: 'This API token is not valid' }
  if (row.token.revokedAt) return { refused: 'This API token was revoked' }
  if (row.token.expiresAt <= now) return { refused: 'This API token has expired' }
  const { user, token } = row
  return {
    tokenId: token.id, workspaceId: token.workspaceId, role: token.role,
    user: { id: user.id, email: user.email, name: user.name, emailVerified: user.emailVerifiedAt != null }
  }
}

/** Record one use: the token's last use and an audit event with the method and path. */
export async function recordApiTokenUse(db: DB, caller: TokenCaller, request: { method: string, path: string, address: string }) {
  await db.transaction(async (tx) => {
    await tx.update(t.apiTokens).set({ lastUsedAt: new Date() }).where(eq(t.apiTokens.id, caller.tokenId))
    await audit(tx, {
      workspaceId: caller.workspaceId, actorId: caller.user.id, action: 'api_token.used', subjectType: 'api_token',
      subjectId: caller.tokenId, detail: { method: request.method, path: request.path.slice(0, 500), address: request.address }
    })
  })
}
