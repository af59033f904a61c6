import { eq } from 'drizzle-orm'
import { tables as t } from '../../database/client'
import { publicUser } from '../../domain/accounts/accounts'

export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const { name } = await readValid(event, profileSchema)
  const [row] = await useDB().update(t.users).set({ name }).where(eq(t.users.id, user.id)).returning()
  return { user: publicUser(row!) }
})
