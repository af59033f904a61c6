import { tables as t } from '../../database/client'

export default defineEventHandler(async (event) => {
  const body = await readValid(event, registerSchema)
  const passwordHash = await hashPassword(body.password)
  const user = await useDB().transaction(async (tx) => {
    const [row] = await tx.insert(t.users)
      .values({ email: body.email, name: body.name, passwordHash })
      .onConflictDoNothing({ target: t.users.email })
      .returning()
    if (!row) {
      throw createError({
        statusCode: 409,
        statusMessage: 'An account with this e-mail already exists',
        data: { fields: { email: 'Already registered: sign in or reset the password' } }
      })
    }
    await sendVerificationMail(tx, row)
    await audit({ actorId: row.id, action: 'user.registered', subjectType: 'user', subjectId: row.id }, tx)
    return row
  })
  setResponseStatus(event, 201)
  return { user: publicUser(user), verificationSent: true }
})
