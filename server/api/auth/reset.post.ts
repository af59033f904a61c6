import { eq, sql } from 'drizzle-orm'
import { tables as t } from '../../database/client'

export default defineEventHandler(async (event) => {
  const { token, password } = await readValid(event, resetSchema)
  const passwordHash = await hashPassword(password)
  const user = await useDB().transaction(async (tx) => {
    const userId = await consumeToken(tx, token, 'reset_password')
    // Following the mailed link also proves the address.
    const [row] = await tx.update(t.users)
      .set({ passwordHash, emailVerifiedAt: sql`coalesce(${t.users.emailVerifiedAt}, now())` })
      .where(eq(t.users.id, userId)).returning()
    await tx.delete(t.sessions).where(eq(t.sessions.userId, userId))
    await audit({ actorId: userId, action: 'user.password_reset', subjectType: 'user', subjectId: userId }, tx)
    return row!
  })
  await clearSigninFailures(user.email)
  return { user: publicUser(user) }
})
