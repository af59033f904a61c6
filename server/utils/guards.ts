// The one guard style of the routes: each guard takes the event, reads the signed-in user and the
// route's parameters, and returns the rows or throws 401 (not signed in), 404 (missing, malformed
// id, or another workspace's) or 403 (role too low).
import type { H3Event } from 'h3'
import {
  findMeasurement, findMembership, findResult, findSet, findSetBuild, findStudy
} from '../domain/lookups'
import type { TokenCaller } from '../domain/accounts/api-tokens'
import { roleAtLeast, type Role } from '../../shared/utils/roles'
import { findImpactUpdate } from '../domain/impact/updates'

export type SessionUser = { id: string, email: string, name: string, emailVerified: boolean }

/**
 * The signed-in user, or 401. Set by server/middleware/02.session.ts. A request made with an API
 * token gets 403: tokens reach workspace routes only, never the account (password, profile,
 * tokens, invitations, creating workspaces).
 */
export function requireUser(event: H3Event): SessionUser {
  if (event.context.apiToken) {
    throw createError({ statusCode: 403, statusMessage: 'API tokens reach workspace routes only; sign in to manage your account' })
  }
  const user = event.context.user as SessionUser | null | undefined
  if (!user) throw createError({ statusCode: 401, statusMessage: 'Sign in to continue' })
  return user
}

/** The API token of this request (set by utils/auth.ts authenticateBearer), or null. */
export const requestToken = (event: H3Event) => (event.context.apiToken as TokenCaller | null | undefined) ?? null

/**
 * Routes under /api/workspaces/[wid]/…: the user, the workspace and the membership with at least
 * `minRole`. With an API token, the same checks on the token's user, plus: another workspace
 * than the token's is 404, and the token's own role must reach `minRole` too (403).
 */
export async function requireWorkspace(event: H3Event, minRole: Role) {
  const token = requestToken(event)
  const user = token ? token.user : requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  if (token && token.workspaceId !== workspaceId) throw createError({ statusCode: 404, statusMessage: 'Workspace not found' })
  const { membership, workspace } = await findMembership(useDB(), workspaceId, user.id, minRole)
  if (token && !roleAtLeast(token.role, minRole)) {
    throw createError({
      statusCode: 403,
      statusMessage: `This needs the ${minRole} role or higher; this API token has ${token.role}`,
      data: { role: token.role, required: minRole }
    })
  }
  // The role the request acts with: a token never acts above its own role.
  const acting = token && !roleAtLeast(token.role, membership.role) ? { ...membership, role: token.role } : membership
  return { user, workspace, membership: acting }
}

/** …/sets/[sid]: an error set of the workspace (without its file bytes). */
export async function requireSet(event: H3Event, minRole: Role) {
  const access = await requireWorkspace(event, minRole)
  const set = await findSet(useDB(), access.workspace.id, uuidParam(event, 'sid', 'Error set'))
  return { ...access, set }
}

/** …/sets/builds/[bid]: a set build of the workspace. */
export async function requireSetBuild(event: H3Event, minRole: Role) {
  const access = await requireWorkspace(event, minRole)
  const build = await findSetBuild(useDB(), access.workspace.id, uuidParam(event, 'bid', 'Set build'))
  return { ...access, build }
}

/** …/studies/[id]: a study of the workspace. */
export async function requireStudy(event: H3Event, minRole: Role) {
  const access = await requireWorkspace(event, minRole)
  const study = await findStudy(useDB(), access.workspace.id, uuidParam(event, 'id', 'Study'))
  return { ...access, study }
}

/** …/results/[rid]: a result of the workspace, with its study. */
export async function requireResult(event: H3Event, minRole: Role) {
  const access = await requireWorkspace(event, minRole)
  const row = await findResult(useDB(), access.workspace.id, uuidParam(event, 'rid', 'Result'))
  return { ...access, ...row }
}

/** …/studies/[id]/measurements/[mid]: a measurement of a study of the workspace. */
export async function requireMeasurement(event: H3Event, minRole: Role) {
  const access = await requireStudy(event, minRole)
  const measurement = await findMeasurement(useDB(), access.study.id, uuidParam(event, 'mid', 'Measurement'))
  return { ...access, measurement }
}

// ---- set updates by a measurement (server/domain/impact)
/** …/studies/[id]/updates/[uid]: an update of a set by a measurement, of a study of the workspace. */
export async function requireImpactUpdate(event: H3Event, minRole: Role) {
  const access = await requireStudy(event, minRole)
  const update = await findImpactUpdate(useDB(), access.study.id, uuidParam(event, 'uid', 'Set update'))
  return { ...access, update }
}
