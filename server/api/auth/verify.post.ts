import { eq, sql } from 'drizzle-orm'
import { tables as t } from '../../database/client'
import { audit } from '../../domain/audit'
import { consumeToken, publicUser } from '../../domain/accounts/accounts'

export default defineEventHandler(async (event) => {
  const { token } = await readValid(event, tokenSchema)
  const user = await useDB().transaction(async (tx) => {
    const userId = await consumeToken(tx, token, 'verify_email')
    const [row] = await tx.update(t.users)
      .set({ emailVerifiedAt: sql`coalesce(${t.users.emailVerifiedAt}, now())` })
      .where(eq(t.users.id, userId)).returning()
    await audit(tx, { actorId: userId, action: 'user.email_verified', subjectType: 'user', subjectId: userId })
    return row!
  })
  return { user: publicUser(user) }
})
