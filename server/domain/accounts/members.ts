import { and, asc, eq, gt, isNull, sql } from 'drizzle-orm'
import { tables as t, type DB, type Tx } from '../../database/client'
import type { Workspace } from '../../database/schema'
import type { Role } from '../../../shared/utils/roles'
import { audit } from '../audit'
import { fail } from '../errors'
import { sendMail } from '../mail/send'
import { invitationMail } from '../mail/templates'
import { appLink, type Settings } from '../settings'
import { hashToken, newToken, TOKEN_LIFETIME_MS } from './tokens'

/** Who acts: the signed-in user. */
export interface Actor { id: string, email: string, name: string }

async function isMember(tx: Tx, workspaceId: string, email: string) {
  const [row] = await tx.select({ one: sql`1` }).from(t.memberships)
    .innerJoin(t.users, eq(t.users.id, t.memberships.userId))
    .where(and(eq(t.memberships.workspaceId, workspaceId), eq(t.users.email, email)))
  return Boolean(row)
}

/** Create (or renew) the invitation of `email` and mail its link; 409 if already a member. */
export async function createInvitation(db: DB, settings: Settings, workspace: Workspace, inviter: Actor, email: string, role: Role) {
  return db.transaction(async (tx) => {
    if (await isMember(tx, workspace.id, email)) {
      fail(409, `${email} is already a member`, { fields: { email: 'Already a member of this workspace' } })
    }
    // A new invitation replaces any pending one for the same address.
    await tx.update(t.invitations).set({ revokedAt: new Date() })
      .where(and(eq(t.invitations.workspaceId, workspace.id), eq(t.invitations.email, email), isNull(t.invitations.acceptedAt), isNull(t.invitations.revokedAt)))
    const { token, hash } = newToken()
    const [inv] = await tx.insert(t.invitations).values({
      workspaceId: workspace.id, email, role, tokenHash: hash, invitedBy: inviter.id,
      expiresAt: new Date(Date.now() + TOKEN_LIFETIME_MS.invitation)
    }).returning()
    await audit(tx, { workspaceId: workspace.id, actorId: inviter.id, action: 'invitation.created', subjectType: 'invitation', subjectId: inv!.id, detail: { email, role } })
    await sendMail(settings, email, invitationMail(inviter.name, workspace.name, role, appLink(settings, `/invitations/${token}`)))
    return { id: inv!.id, email, role, expiresAt: inv!.expiresAt }
  })
}

/** Lock the workspace's owner rows and fail with 409 if `userId` is the only owner. */
async function assertNotLastOwner(tx: Tx, workspaceId: string, userId: string, what: string) {
  const owners = await tx.select({ userId: t.memberships.userId }).from(t.memberships)
    .where(and(eq(t.memberships.workspaceId, workspaceId), eq(t.memberships.role, 'owner')))
    .for('update')
  if (owners.length === 1 && owners[0]!.userId === userId) {
    fail(409, `The last owner cannot ${what}; make someone else owner first`)
  }
}

export async function changeMemberRole(db: DB, workspaceId: string, actorId: string, userId: string, role: Role) {
  return db.transaction(async (tx) => {
    if (role !== 'owner') await assertNotLastOwner(tx, workspaceId, userId, 'step down')
    const [row] = await tx.update(t.memberships).set({ role })
      .where(and(eq(t.memberships.workspaceId, workspaceId), eq(t.memberships.userId, userId))).returning()
    if (!row) fail(404, 'Member not found')
    await audit(tx, { workspaceId, actorId, action: 'member.role_changed', subjectType: 'user', subjectId: userId, detail: { role } })
    return { userId, role: row.role }
  })
}

export async function removeMember(db: DB, workspaceId: string, actorId: string, userId: string) {
  await db.transaction(async (tx) => {
    await assertNotLastOwner(tx, workspaceId, userId, 'leave')
    const [row] = await tx.delete(t.memberships)
      .where(and(eq(t.memberships.workspaceId, workspaceId), eq(t.memberships.userId, userId))).returning()
    if (!row) fail(404, 'Member not found')
    await audit(tx, { workspaceId, actorId, action: 'member.removed', subjectType: 'user', subjectId: userId })
  })
}

/** A pending, unexpired invitation by its link token, with its workspace name; 404 otherwise. */
export async function findOpenInvitation(db: DB | Tx, token: string) {
  const [row] = await db.select({ invitation: t.invitations, workspaceName: t.workspaces.name, inviterName: t.users.name })
    .from(t.invitations)
    .innerJoin(t.workspaces, eq(t.workspaces.id, t.invitations.workspaceId))
    .leftJoin(t.users, eq(t.users.id, t.invitations.invitedBy))
    .where(and(
      eq(t.invitations.tokenHash, hashToken(token)), isNull(t.invitations.acceptedAt),
      isNull(t.invitations.revokedAt), gt(t.invitations.expiresAt, new Date())
    ))
  if (!row) fail(404, 'This invitation has expired, was revoked or was already used')
  return row
}

/** Join the workspace as the invited role; the signed-in user's e-mail must match the invitation. */
export async function acceptInvitation(db: DB, token: string, user: Actor) {
  return db.transaction(async (tx) => {
    const { invitation: inv, workspaceName } = await findOpenInvitation(tx, token)
    if (inv.email !== user.email) {
      fail(403, `This invitation was sent to ${inv.email}; sign in with that address`)
    }
    await tx.update(t.invitations).set({ acceptedAt: new Date(), acceptedBy: user.id }).where(eq(t.invitations.id, inv.id))
    await tx.insert(t.memberships).values({ workspaceId: inv.workspaceId, userId: user.id, role: inv.role })
      .onConflictDoNothing()
    await audit(tx, { workspaceId: inv.workspaceId, actorId: user.id, action: 'invitation.accepted', subjectType: 'invitation', subjectId: inv.id, detail: { role: inv.role } })
    return { workspaceId: inv.workspaceId, name: workspaceName, role: inv.role }
  })
}

/** The workspaces `userId` belongs to, by name, with the role in each (what `/api/auth/me` sends). */
export function membershipsOf(db: DB, userId: string) {
  return db.select({ workspaceId: t.workspaces.id, name: t.workspaces.name, role: t.memberships.role })
    .from(t.memberships)
    .innerJoin(t.workspaces, eq(t.workspaces.id, t.memberships.workspaceId))
    .where(eq(t.memberships.userId, userId))
    .orderBy(asc(t.workspaces.name))
}
