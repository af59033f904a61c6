import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import { roleAtLeast, type Role } from '../../shared/utils/roles'
import { tables as t } from '../database/client'
import type { Membership, Workspace } from '../database/schema'

export type WorkspaceAccess = { user: SessionUser, workspace: Workspace, membership: Membership }

/**
 * The membership of `userId` in workspace `workspaceId` with at least `minRole`:
 * 404 when the workspace is missing or the user is not a member, 403 when the role is too low.
 */
export async function requireMembership(workspaceId: string, userId: string, minRole: Role) {
  const [row] = await useDB()
    .select({ membership: t.memberships, workspace: t.workspaces })
    .from(t.memberships)
    .innerJoin(t.workspaces, eq(t.workspaces.id, t.memberships.workspaceId))
    .where(and(eq(t.memberships.workspaceId, workspaceId), eq(t.memberships.userId, userId)))
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Workspace not found' })
  if (!roleAtLeast(row.membership.role, minRole)) {
    throw createError({ statusCode: 403, statusMessage: `This needs the ${minRole} role or higher`, data: { role: row.membership.role, required: minRole } })
  }
  return row
}

/**
 * For routes under /api/workspaces/[wid]/…: the signed-in user (401), the `wid` parameter
 * (404 if malformed) and the membership with at least `minRole` (404/403).
 */
export async function requireWorkspace(event: H3Event, minRole: Role): Promise<WorkspaceAccess> {
  const user = requireUser(event)
  const workspaceId = uuidParam(event, 'wid', 'Workspace')
  const { membership, workspace } = await requireMembership(workspaceId, user.id, minRole)
  return { user, workspace, membership }
}
