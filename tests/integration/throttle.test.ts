import { describe, expect, it } from 'vitest'
import { ApiClient, type ApiResponse } from '../support/http'
import { linkIn, waitForMail } from '../support/outbox'
import { createUser, TEST_PASSWORD, uniqueEmail } from '../support/users'
import { SIGNIN_RULES } from '../../server/utils/throttles'

// Limits from server/utils/throttles.ts, 15-minute windows: 5 attempts per account from one
// address, 30 per address across accounts, 100 per account from all addresses. Each ApiClient
// has its own address (X-Forwarded-For; the test app trusts it).
const { pair, address, account } = SIGNIN_RULES

const count = (answers: ApiResponse[], status: number) => answers.filter(a => a.status === status).length

function expectRefusal(res: ApiResponse) {
  expect(res.status).toBe(429)
  const retry = Number(res.headers.get('retry-after'))
  expect(retry).toBeGreaterThan(0)
  expect(retry).toBeLessThanOrEqual(900)
  expect(res.body.data.retryAfterSeconds).toBe(retry)
  expect(res.body.statusMessage).toMatch(/^Too many sign-in attempts; try again in \d+ (min|s)$/)
}

describe('sign-in throttle', () => {
  it(`checks at most ${pair.limit} passwords of a burst of 25 concurrent guesses from one address`, async () => {
    const user = await createUser({ signIn: false })
    const guesser = new ApiClient()
    const answers = await Promise.all(Array.from({ length: 25 }, (_, i) =>
      guesser.post('/api/auth/signin', { email: user.email, password: `wrong-pass-${i}` })))
    // 401 means the password was checked; every other guess was refused before that.
    expect(count(answers, 401)).toBe(pair.limit)
    expect(count(answers, 429)).toBe(25 - pair.limit)
    expectRefusal(answers.find(a => a.status === 429)!)
    const locked = await guesser.post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD })
    expectRefusal(locked)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(800)
    expect(locked.body.statusMessage).toMatch(/try again in 1[45] min/)
  })

  it('locks the guessing address out of the account, not the owner on another address', async () => {
    const user = await createUser({ signIn: false })
    const guesser = new ApiClient()
    for (let i = 0; i < pair.limit; i++) {
      expect((await guesser.post('/api/auth/signin', { email: user.email, password: `wrong-pass-${i}` })).status).toBe(401)
    }
    expectRefusal(await guesser.post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD }))
    // The owner elsewhere signs in, and that does not unlock the guessing address.
    const owner = new ApiClient()
    await owner.signIn(user.email, TEST_PASSWORD)
    expect((await owner.get('/api/auth/me')).status).toBe(200)
    expectRefusal(await guesser.post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD }))
    // The guessing address may still try other accounts.
    const other = await createUser({ signIn: false })
    expect((await guesser.post('/api/auth/signin', { email: other.email, password: TEST_PASSWORD })).status).toBe(200)
  })

  it('clears the count of an address and account on a successful sign-in', async () => {
    const user = await createUser({ signIn: false })
    const client = new ApiClient()
    for (let round = 0; round < 2; round++) {
      for (let i = 0; i < pair.limit - 1; i++) {
        expect((await client.post('/api/auth/signin', { email: user.email, password: 'wrong-pass-1' })).status).toBe(401)
      }
      await client.signIn(user.email, TEST_PASSWORD)
    }
  })

  it(`locks an address after ${address.limit} attempts across accounts`, async () => {
    const client = new ApiClient()
    for (let i = 0; i < address.limit; i++) {
      const res = await client.post('/api/auth/signin', { email: uniqueEmail('spray'), password: 'wrong-pass-1' })
      expect(res.status).toBe(401)
    }
    const user = await createUser({ signIn: false })
    expectRefusal(await client.post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD }))
    // Another address is unaffected.
    expect((await new ApiClient().post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD })).status).toBe(200)
  })

  it(`stops guessing spread over many addresses at ${account.limit} attempts per account`, async () => {
    const user = await createUser({ signIn: false })
    const guesses = account.limit + 10
    const answers = await Promise.all(Array.from({ length: guesses }, (_, i) =>
      new ApiClient().post('/api/auth/signin', { email: user.email, password: `wrong-pass-${i}` })))
    expect(count(answers, 401)).toBe(account.limit)
    expect(count(answers, 429)).toBe(guesses - account.limit)
    // The ceiling holds for everyone until the window ends.
    expectRefusal(await new ApiClient().post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD }))
  })

  it('lets the owner back in from the locked address after a password reset', async () => {
    const user = await createUser({ signIn: false })
    const client = new ApiClient()
    for (let i = 0; i < pair.limit; i++) await client.post('/api/auth/signin', { email: user.email, password: `wrong-pass-${i}` })
    expectRefusal(await client.post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD }))
    expect((await client.post('/api/auth/reset-request', { email: user.email })).status).toBe(200)
    const mail = await waitForMail(user.email, /new Sheaf password/)
    const token = linkIn(mail.textBody, '/reset').searchParams.get('token')!
    expect((await client.post('/api/auth/reset', { token, password: 'new-password-55' })).status).toBe(200)
    expect((await client.post('/api/auth/signin', { email: user.email, password: 'new-password-55' })).status).toBe(200)
  })
})
