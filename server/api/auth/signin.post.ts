import { audit } from '../../domain/audit'
import { fail } from '../../domain/errors'
import { findUserByEmail, publicUser } from '../../domain/accounts/accounts'
import { decoyPasswordHash, verifyPassword } from '../../domain/accounts/password'
export default defineEventHandler(async (event) => {
  const { email, password } = await readValid(event, signinSchema)
  await assertSigninAllowed(event, email)
  const user = await findUserByEmail(useDB(), email)
  const ok = await verifyPassword(password, user?.passwordHash ?? await decoyPasswordHash())
  if (!user || !ok) {
    await recordSigninFailure(event, email)
    fail(401, 'The e-mail or password is wrong', { fields: { password: 'The e-mail or password is wrong' } })
  }
  if (!user.emailVerifiedAt) {
    fail(403, 'Confirm your e-mail address first: follow the link we sent', { reason: 'unverified' })
  }
  await clearSigninFailures(email)
  await startSession(event, user.id)
  await audit(useDB(), { actorId: user.id, action: 'user.signed_in', subjectType: 'user', subjectId: user.id, detail: { address: clientAddress(event) } })
  return { user: publicUser(user) }
})
