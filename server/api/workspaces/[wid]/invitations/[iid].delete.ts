import { and, eq, isNull } from 'drizzle-orm'
import { tables as t } from '../../../../database/client'
import { audit } from '../../../../domain/audit'
import { fail } from '../../../../domain/errors'

// Revoke a pending invitation (owners only).
export default defineEventHandler(async (event) => {
  const { user, workspace } = await requireWorkspace(event, 'owner')
  const id = uuidParam(event, 'iid', 'Invitation')
  await useDB().transaction(async (tx) => {
    const [row] = await tx.update(t.invitations).set({ revokedAt: new Date() })
      .where(and(eq(t.invitations.id, id), eq(t.invitations.workspaceId, workspace.id), isNull(t.invitations.acceptedAt), isNull(t.invitations.revokedAt)))
      .returning()
    if (!row) fail(404, 'Invitation not found')
    await audit(tx, { workspaceId: workspace.id, actorId: user.id, action: 'invitation.revoked', subjectType: 'invitation', subjectId: id, detail: { email: row.email } })
  })
  return { ok: true }
})
