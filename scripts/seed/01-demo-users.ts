import { and, eq } from 'drizzle-orm'
import { tables as t } from '../../server/database/client'
import { hashPassword } from '../../server/domain/accounts/password'
import type { Role } from '../../shared/utils/roles'
import type { SeedContext } from './context'

// Invented demo collaboration and people; the passwords are listed in README.md.
export const DEMO_WORKSPACE = 'Kestrel Forward Collaboration'
export const DEMO_USERS: { email: string, name: string, password: string, role: Role }[] = [
  { email: 'owner@demo.sheaf.test', name: 'Maren Okafor-Lind', password: 'sheaf-owner-demo-1', role: 'owner' },
  { email: 'analyst@demo.sheaf.test', name: 'Teodor Vasquez-Hale', password: 'sheaf-analyst-demo-1', role: 'analyst' },
  { email: 'viewer@demo.sheaf.test', name: 'Ilse Brandvold', password: 'sheaf-viewer-demo-1', role: 'viewer' }
]

export async function run({ db, log, state }: SeedContext) {
  const ids: Record<Role, string> = { owner: '', analyst: '', viewer: '' }
  for (const u of DEMO_USERS) {
    const [existing] = await db.select({ id: t.users.id }).from(t.users).where(eq(t.users.email, u.email))
    ids[u.role] = existing?.id ?? (await db.insert(t.users).values({
      email: u.email, name: u.name, passwordHash: await hashPassword(u.password), emailVerifiedAt: new Date()
    }).returning({ id: t.users.id }))[0]!.id
  }
  let [ws] = await db.select({ id: t.workspaces.id }).from(t.workspaces)
    .where(and(eq(t.workspaces.name, DEMO_WORKSPACE), eq(t.workspaces.createdBy, ids.owner)))
  ws ??= (await db.insert(t.workspaces).values({ name: DEMO_WORKSPACE, createdBy: ids.owner }).returning({ id: t.workspaces.id }))[0]!
  for (const u of DEMO_USERS) {
    await db.insert(t.memberships).values({ workspaceId: ws.id, userId: ids[u.role], role: u.role }).onConflictDoNothing()
  }
  state.demoWorkspaceId = ws.id
  state.demoUserIds = ids
  log(`demo workspace "${DEMO_WORKSPACE}" with ${DEMO_USERS.length} members`)
}
