import { describe, expect, it } from 'vitest'
import { ApiClient } from '../support/http'
import { createUser, TEST_PASSWORD, uniqueEmail } from '../support/users'

// Limits from server/utils/throttles.ts: 5 failures per account, 30 per address, 15 min.
describe('sign-in throttle', () => {
  it('locks an account after five failures, even for the right password, with Retry-After', async () => {
    const user = await createUser({ signIn: false })
    for (let i = 0; i < 5; i++) {
      const client = new ApiClient() // a new address each time: only the account key counts
      expect((await client.post('/api/auth/signin', { email: user.email, password: `wrong-pass-${i}` })).status).toBe(401)
    }
    const locked = await new ApiClient().post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD })
    expect(locked.status).toBe(429)
    const retry = Number(locked.headers.get('retry-after'))
    expect(retry).toBeGreaterThan(800)
    expect(retry).toBeLessThanOrEqual(900)
    expect(locked.body.data.retryAfterSeconds).toBe(retry)
  })

  it('clears the account counter on a successful sign-in', async () => {
    const user = await createUser({ signIn: false })
    const client = new ApiClient()
    for (let i = 0; i < 4; i++) await client.post('/api/auth/signin', { email: user.email, password: 'wrong-pass-1' })
    await client.signIn(user.email, TEST_PASSWORD)
    for (let i = 0; i < 4; i++) await client.post('/api/auth/signin', { email: user.email, password: 'wrong-pass-1' })
    expect((await client.post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD })).status).toBe(200)
  })

  it('locks an address after thirty failures across accounts', async () => {
    const client = new ApiClient()
    for (let i = 0; i < 30; i++) {
      const res = await client.post('/api/auth/signin', { email: uniqueEmail('spray'), password: 'wrong-pass-1' })
      expect(res.status).toBe(401)
    }
    const user = await createUser({ signIn: false })
    const locked = await client.post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD })
    expect(locked.status).toBe(429)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(0)
    // Another address is unaffected.
    expect((await new ApiClient().post('/api/auth/signin', { email: user.email, password: TEST_PASSWORD })).status).toBe(200)
  })
})
