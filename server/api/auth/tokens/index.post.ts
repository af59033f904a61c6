import { createApiToken, publicApiToken } from '../../../domain/accounts/api-tokens'
import { findMembership } from '../../../domain/lookups'
import { apiTokenCreateSchema } from '../../../../shared/utils/token-schemas'

// Create an API token for one workspace; the answer holds the secret, shown this once.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const body = await readValid(event, apiTokenCreateSchema)
  const { secret, token } = await createApiToken(useDB(), user.id, body)
  const { workspace } = await findMembership(useDB(), token.workspaceId, user.id, 'viewer')
  setResponseStatus(event, 201)
  return { secret, token: publicApiToken(token, workspace.name) }
})
