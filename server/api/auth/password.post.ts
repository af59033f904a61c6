import { eq } from 'drizzle-orm'
import { tables as t } from '../../database/client'

// Change the password while signed in; every other session of the user ends.
export default defineEventHandler(async (event) => {
  const sessionUser = requireUser(event)
  const { currentPassword, newPassword } = await readValid(event, passwordChangeSchema)
  const user = (await findUserByEmail(sessionUser.email))!
  if (!await verifyPassword(currentPassword, user.passwordHash)) {
    throw createError({ statusCode: 400, statusMessage: 'Check the highlighted fields', data: { fields: { currentPassword: 'This is not your current password' } } })
  }
  const passwordHash = await hashPassword(newPassword)
  await useDB().transaction(async (tx) => {
    await tx.update(t.users).set({ passwordHash }).where(eq(t.users.id, user.id))
    await tx.delete(t.sessions).where(eq(t.sessions.userId, user.id))
    await audit({ actorId: user.id, action: 'user.password_changed', subjectType: 'user', subjectId: user.id }, tx)
  })
  await startSession(event, user.id)
  return { ok: true }
})
