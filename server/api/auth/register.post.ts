import { tables as t } from '../../database/client'
import { audit } from '../../domain/audit'
import { fail } from '../../domain/errors'
import { publicUser, sendVerificationMail } from '../../domain/accounts/accounts'
import { hashPassword } from '../../domain/accounts/password'

export default defineEventHandler(async (event) => {
  const body = await readValid(event, registerSchema)
  const passwordHash = await hashPassword(body.password)
  const user = await useDB().transaction(async (tx) => {
    const [row] = await tx.insert(t.users)
      .values({ email: body.email, name: body.name, passwordHash })
      .onConflictDoNothing({ target: t.users.email })
      .returning()
    if (!row) {
      fail(409, 'An account with this e-mail already exists', { fields: { email: 'Already registered: sign in or reset the password' } })
    }
    await audit(tx, { actorId: row.id, action: 'user.registered', subjectType: 'user', subjectId: row.id })
    // Last, so that nothing after the mail can roll the account back.
    await sendVerificationMail(tx, useSettings(), row)
    return row
  })
  setResponseStatus(event, 201)
  return { user: publicUser(user), verificationSent: true }
})
