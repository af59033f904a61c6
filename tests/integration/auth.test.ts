import { eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { tables, testDB } from '../support/db'
import { ApiClient } from '../support/http'
import { linkIn, waitForMail } from '../support/outbox'
import { createUser, TEST_PASSWORD, uniqueEmail } from '../support/users'

const PASSWORD = 'gluon-fusion-77'

async function register(client: ApiClient, email: string) {
  return client.post('/api/auth/register', { email, name: 'Nadia Quell', password: PASSWORD })
}

describe('register and verify', () => {
  it('rejects bad input with the field that is wrong', async () => {
    const res = await new ApiClient().post('/api/auth/register', { email: 'not-an-address', name: '', password: 'short' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields).toEqual({
      email: 'Enter a valid e-mail address', name: 'Enter your name', password: 'Use at least 10 characters'
    })
  })

  it('registers, mails a link, refuses sign-in until the link is followed, then signs in', async () => {
    const client = new ApiClient()
    const email = uniqueEmail('reg')
    const res = await register(client, email.toUpperCase())
    expect(res.status).toBe(201)
    expect(res.body.user).toMatchObject({ email, emailVerified: false })
    expect(res.body.user).not.toHaveProperty('passwordHash')

    const early = await client.post('/api/auth/signin', { email, password: PASSWORD })
    expect(early.status).toBe(403)
    expect(early.body.data.reason).toBe('unverified')

    const mail = await waitForMail(email, /Confirm your e-mail/)
    const link = linkIn(mail.textBody, '/verify')
    const token = link.searchParams.get('token')!
    const [stored] = await testDB().select().from(tables.authTokens).where(eq(tables.authTokens.userId, res.body.user.id))
    expect(stored!.tokenHash).not.toContain(token) // only the hash is kept

    const verified = await client.post('/api/auth/verify', { token })
    expect(verified.status).toBe(200)
    expect(verified.body.user.emailVerified).toBe(true)
    const again = await client.post('/api/auth/verify', { token })
    expect(again.status).toBe(400)
    expect(again.body.statusMessage).toMatch(/expired or was already used/)

    const signin = await client.post('/api/auth/signin', { email, password: PASSWORD })
    expect(signin.status).toBe(200)
    const me = await client.get('/api/auth/me')
    expect(me.body).toMatchObject({ user: { email, name: 'Nadia Quell', emailVerified: true }, memberships: [] })
  })

  it('refuses a second account for the same address', async () => {
    const email = uniqueEmail('dup')
    expect((await register(new ApiClient(), email)).status).toBe(201)
    const dup = await register(new ApiClient(), email)
    expect(dup.status).toBe(409)
    expect(dup.body.data.fields.email).toMatch(/Already registered/)
  })

  it('sends a fresh link on request and keeps quiet about unknown addresses', async () => {
    const email = uniqueEmail('resend')
    await register(new ApiClient(), email)
    const res = await new ApiClient().post('/api/auth/verify-resend', { email })
    expect(res.status).toBe(200)
    const unknown = await new ApiClient().post('/api/auth/verify-resend', { email: uniqueEmail('ghost') })
    expect(unknown.body).toEqual(res.body)
    const all = await testDB().select().from(tables.mailOutbox)
    expect(all.filter(m => m.mailTo.includes(email) && /Confirm/.test(m.subject))).toHaveLength(2)
  })
})

describe('sign in and sign out', () => {
  it('sets an httpOnly SameSite=Lax cookie and ends the session on sign-out', async () => {
    const user = await createUser({ signIn: false })
    const res = await user.client.post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD })
    expect(res.status).toBe(200)
    const cookie = res.headers.getSetCookie().find(c => c.startsWith('sheaf_session='))!
    expect(cookie).toMatch(/HttpOnly/)
    expect(cookie).toMatch(/SameSite=Lax/)
    expect(cookie).not.toMatch(/Secure/) // APP_ORIGIN is http in the tests
    const sessionId = user.client.cookies.get('sheaf_session')!

    expect((await user.client.get('/api/auth/me')).status).toBe(200)
    expect((await user.client.post('/api/auth/signout')).status).toBe(200)
    expect((await user.client.get('/api/auth/me')).status).toBe(401)
    // The old cookie is dead on the server too, not only blanked in this client.
    const replay = new ApiClient()
    replay.cookies.set('sheaf_session', sessionId)
    expect((await replay.get('/api/auth/me')).status).toBe(401)
  })

  it('answers 401 for a wrong password and for an unknown address alike', async () => {
    const user = await createUser({ signIn: false })
    const wrong = await new ApiClient().post('/api/auth/signin', { email: user.email, password: 'not-the-password-1' })
    const unknown = await new ApiClient().post('/api/auth/signin', { email: uniqueEmail('ghost'), password: 'not-the-password-1' })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(unknown.body.statusMessage).toBe(wrong.body.statusMessage)
  })
})

describe('password reset', () => {
  it('mails a one-hour link that sets a new password once and ends old sessions', async () => {
    const user = await createUser()
    const before = await new ApiClient().post('/api/auth/reset-request', { email: user.email })
    expect(before.status).toBe(200)
    const mail = await waitForMail(user.email, /new Sheaf password/)
    const token = linkIn(mail.textBody, '/reset').searchParams.get('token')!
    const [row] = await testDB().select().from(tables.authTokens).where(eq(tables.authTokens.userId, user.id))
    const lifetime = row!.expiresAt.getTime() - row!.createdAt.getTime()
    expect(Math.abs(lifetime - 3_600_000)).toBeLessThan(5_000)

    const weak = await new ApiClient().post('/api/auth/reset', { token, password: 'weak' })
    expect(weak.status).toBe(400)
    expect(weak.body.data.fields.password).toBeTruthy()

    const done = await new ApiClient().post('/api/auth/reset', { token, password: 'new-password-55' })
    expect(done.status).toBe(200)
    expect((await user.client.get('/api/auth/me')).status).toBe(401)
    expect((await new ApiClient().post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD })).status).toBe(401)
    expect((await new ApiClient().post('/api/auth/signin', { email: user.email, password: 'new-password-55' })).status).toBe(200)
    expect((await new ApiClient().post('/api/auth/reset', { token, password: 'another-one-66' })).status).toBe(400)
  })

  it('answers the same for an unknown address and sends nothing', async () => {
    const email = uniqueEmail('ghost')
    const res = await new ApiClient().post('/api/auth/reset-request', { email })
    expect(res.status).toBe(200)
    const rows = await testDB().select().from(tables.mailOutbox)
    expect(rows.some(m => m.mailTo.includes(email))).toBe(false)
  })

  it('refuses a malformed token with the field named', async () => {
    const res = await new ApiClient().post('/api/auth/reset', { token: 'x', password: 'new-password-55' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.token).toBe('This link is malformed')
  })
})

describe('account', () => {
  it('renames the user and changes the password after checking the current one', async () => {
    const user = await createUser()
    const renamed = await user.client.patch('/api/auth/me', { name: '  Ida Marsh ' })
    expect(renamed.body.user.name).toBe('Ida Marsh')
    const wrong = await user.client.post('/api/auth/password', { currentPassword: 'nope-nope-1', newPassword: 'fresh-pass-12' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.fields.currentPassword).toMatch(/not your current password/)
    const other = new ApiClient()
    await other.signIn(user.email, TEST_PASSWORD)
    const ok = await user.client.post('/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: 'fresh-pass-12' })
    expect(ok.status).toBe(200)
    expect((await user.client.get('/api/auth/me')).status).toBe(200) // this session was renewed
    expect((await other.get('/api/auth/me')).status).toBe(401) // the other one ended
  })

  it('needs a session', async () => {
    expect((await new ApiClient().get('/api/auth/me')).status).toBe(401)
    expect((await new ApiClient().patch('/api/auth/me', { name: 'X' })).status).toBe(401)
  })
})
