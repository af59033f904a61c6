import { and, asc, eq, gt, isNull } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'

// Members for everyone in the workspace; pending invitations for owners only.
export default defineEventHandler(async (event) => {
  const { workspace, membership } = await requireWorkspace(event, 'viewer')
  const db = useDB()
  const members = await db
    .select({ userId: t.users.id, email: t.users.email, name: t.users.name, role: t.memberships.role, joinedAt: t.memberships.createdAt })
    .from(t.memberships)
    .innerJoin(t.users, eq(t.users.id, t.memberships.userId))
    .where(eq(t.memberships.workspaceId, workspace.id))
    .orderBy(asc(t.users.name))
  const invitations = membership.role !== 'owner'
    ? []
    : await db
        .select({ id: t.invitations.id, email: t.invitations.email, role: t.invitations.role, expiresAt: t.invitations.expiresAt, createdAt: t.invitations.createdAt })
        .from(t.invitations)
        .where(and(
          eq(t.invitations.workspaceId, workspace.id), isNull(t.invitations.acceptedAt),
          isNull(t.invitations.revokedAt), gt(t.invitations.expiresAt, new Date())
        ))
        .orderBy(asc(t.invitations.email))
  return { members, invitations }
})
