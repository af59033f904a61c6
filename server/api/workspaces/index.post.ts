import { tables as t } from '../../database/client'
import { audit } from '../../domain/audit'

// Whoever creates a workspace is its owner.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const { name } = await readValid(event, workspaceCreateSchema)
  const workspace = await useDB().transaction(async (tx) => {
    const [ws] = await tx.insert(t.workspaces).values({ name, createdBy: user.id }).returning()
    await tx.insert(t.memberships).values({ workspaceId: ws!.id, userId: user.id, role: 'owner' })
    await audit(tx, { workspaceId: ws!.id, actorId: user.id, action: 'workspace.created', subjectType: 'workspace', subjectId: ws!.id, detail: { name } })
    return ws!
  })
  setResponseStatus(event, 201)
  return { id: workspace.id, name: workspace.name, role: 'owner' as const, createdAt: workspace.createdAt }
})
