import { eq } from 'drizzle-orm'
import { tables as t } from '../../../database/client'
import { publicApiToken, revokeApiToken } from '../../../domain/accounts/api-tokens'

// Revoke one of the signed-in user's API tokens; it stops working at once.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const row = await revokeApiToken(useDB(), user.id, uuidParam(event, 'tid', 'API token'))
  const [workspace] = await useDB().select({ name: t.workspaces.name }).from(t.workspaces).where(eq(t.workspaces.id, row.workspaceId))
  return { token: publicApiToken(row, workspace?.name ?? '') }
})
