import { audit } from '../../domain/audit'
import { fail } from '../../domain/errors'
import { findUserByEmail, publicUser } from '../../domain/accounts/accounts'
import { decoyPasswordHash, verifyPassword } from '../../domain/accounts/password'
// The attempt is counted before the password is checked (server/utils/throttles.ts), so a burst
// of concurrent guesses gets no more real checks than the limits allow.
export default defineEventHandler(async (event) => {
  const { email, password } = await readValid(event, signinSchema)
  await countSigninAttempt(event, email)
  const user = await findUserByEmail(useDB(), email)
  const ok = await verifyPassword(password, user?.passwordHash ?? await decoyPasswordHash())
  if (!user || !ok) {
    fail(401, 'The e-mail or password is wrong', { fields: { password: 'The e-mail or password is wrong' } })
  }
  await signinSucceeded(event, email)
  if (!user.emailVerifiedAt) {
    fail(403, 'Confirm your e-mail address first: follow the link we sent', { reason: 'unverified' })
  }
  await startSession(event, user.id)
  await audit(useDB(), { actorId: user.id, action: 'user.signed_in', subjectType: 'user', subjectId: user.id, detail: { address: clientAddress(event) } })
  return { user: publicUser(user) }
})
