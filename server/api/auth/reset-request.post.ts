import { findUserByEmail, sendResetMail } from '../../domain/accounts/accounts'
// Always answers the same, so the form does not reveal which addresses have accounts.
export default defineEventHandler(async (event) => {
  const { email } = await readValid(event, resetRequestSchema)
  const user = await findUserByEmail(useDB(), email)
  if (user && await mayMail(email)) {
    await useDB().transaction(tx => sendResetMail(tx, useSettings(), user))
  }
  return { ok: true }
})
