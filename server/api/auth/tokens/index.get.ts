import { listApiTokens } from '../../../domain/accounts/api-tokens'

// The signed-in user's API tokens (never their secrets), newest first.
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  return { tokens: await listApiTokens(useDB(), user.id) }
})
