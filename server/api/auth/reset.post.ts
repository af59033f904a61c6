import { eq, sql } from 'drizzle-orm'
import { tables as t } from '../../database/client'
import { audit } from '../../domain/audit'
import { consumeToken, publicUser } from '../../domain/accounts/accounts'
import { hashPassword } from '../../domain/accounts/password'

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
    await audit(tx, { actorId: userId, action: 'user.password_reset', subjectType: 'user', subjectId: userId })
    return row!
  })
  await clearSigninFailures(event, user.email)
  return { user: publicUser(user) }
})
