import { describe, expect, it } from 'vitest'
import { testEnv } from '../support/env'
import { ApiClient } from '../support/http'
import { createUser } from '../support/users'

// Every state-changing API request must carry our own Origin (or, failing that, Referer).
describe('Origin check', () => {
  const body = { email: 'nobody@tests.sheaf.test', password: 'whatever-123' }

  it('refuses a POST without Origin and Referer', async () => {
    const res = await new ApiClient(undefined, null).post('/api/auth/signin', body)
    expect(res.status).toBe(403)
    expect(res.body.statusMessage).toMatch(/no Origin or Referer/)
  })

  it('refuses a POST from another site, even with a valid session', async () => {
    const user = await createUser()
    const res = await user.client.request('POST', '/api/workspaces', { name: 'Forged' }, { origin: 'http://evil.example' })
    expect(res.status).toBe(403)
    expect(res.body.statusMessage).toMatch(/evil\.example is not this site/)
    const del = await user.client.request('DELETE', '/api/workspaces/00000000-0000-4000-8000-000000000000/members/00000000-0000-4000-8000-000000000000', undefined, { origin: 'https://127.0.0.1.evil.example' })
    expect(del.status).toBe(403)
  })

  it('falls back to the Referer header', async () => {
    const client = new ApiClient(undefined, null)
    const ours = await client.request('POST', '/api/auth/signin', body, { referer: `${testEnv().appUrl}/signin` })
    expect(ours.status).toBe(401)
    const theirs = await client.request('POST', '/api/auth/signin', body, { referer: 'http://evil.example/page' })
    expect(theirs.status).toBe(403)
  })

  it('lets reads through without Origin', async () => {
    const res = await new ApiClient(undefined, null).get('/api/health')
    expect(res.status).toBe(200)
  })
})
