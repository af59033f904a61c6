import { asc, eq } from 'drizzle-orm'
import { tables as t } from '../../database/client'

export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const rows = await useDB()
    .select({ id: t.workspaces.id, name: t.workspaces.name, role: t.memberships.role, createdAt: t.workspaces.createdAt })
    .from(t.memberships)
    .innerJoin(t.workspaces, eq(t.workspaces.id, t.memberships.workspaceId))
    .where(eq(t.memberships.userId, user.id))
    .orderBy(asc(t.workspaces.name))
  return { workspaces: rows }
})
