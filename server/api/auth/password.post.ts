import { eq } from 'drizzle-orm'
import { tables as t } from '../../database/client'
import { audit } from '../../domain/audit'
import { fail } from '../../domain/errors'
import { findUserByEmail } from '../../domain/accounts/accounts'
import { hashPassword, verifyPassword } from '../../domain/accounts/password'

// Change the password while signed in; every other session of the user ends.
export default defineEventHandler(async (event) => {
  const sessionUser = requireUser(event)
  const { currentPassword, newPassword } = await readValid(event, passwordChangeSchema)
  const user = (await findUserByEmail(useDB(), sessionUser.email))!
  if (!await verifyPassword(currentPassword, user.passwordHash)) {
    fail(400, 'Check the highlighted fields', { fields: { currentPassword: 'This is not your current password' } })
  }
  const passwordHash = await hashPassword(newPassword)
  await useDB().transaction(async (tx) => {
    await tx.update(t.users).set({ passwordHash }).where(eq(t.users.id, user.id))
    await tx.delete(t.sessions).where(eq(t.sessions.userId, user.id))
    await audit(tx, { actorId: user.id, action: 'user.password_changed', subjectType: 'user', subjectId: user.id })
  })
  await startSession(event, user.id)
  return { ok: true }
})
