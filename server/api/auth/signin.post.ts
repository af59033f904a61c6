export default defineEventHandler(async (event) => {
  const { email, password } = await readValid(event, signinSchema)
  await assertSigninAllowed(event, email)
  const user = await findUserByEmail(email)
  const ok = await verifyPassword(password, user?.passwordHash ?? await decoyPasswordHash())
  if (!user || !ok) {
    await recordSigninFailure(event, email)
    throw createError({ statusCode: 401, statusMessage: 'The e-mail or password is wrong', data: { fields: { password: 'The e-mail or password is wrong' } } })
  }
  if (!user.emailVerifiedAt) {
    throw createError({
      statusCode: 403,
      statusMessage: 'Confirm your e-mail address first: follow the link we sent',
      data: { reason: 'unverified' }
    })
  }
  await clearSigninFailures(email)
  await startSession(event, user.id)
  await audit({ actorId: user.id, action: 'user.signed_in', subjectType: 'user', subjectId: user.id, detail: { address: clientAddress(event) } })
  return { user: publicUser(user) }
})
