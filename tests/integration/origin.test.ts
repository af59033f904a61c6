import { describe, expect, it } from 'vitest'
import { testEnv } from '../support/env'
import { ApiClient } from '../support/http'
import { rawRequest } from '../support/raw-http'
import { startSecondApp } from '../support/second-app'
import { createUser, uniqueEmail } from '../support/users'

const app = new URL(testEnv().appUrl)

// Every state-changing API request must carry our own Origin (or, failing that, Referer),
// compared by scheme, host and port with APP_ORIGIN; and the server answers only for its own Host.
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

  it('refuses our own host under another scheme or port, and an opaque origin', async () => {
    const user = await createUser()
    const others = [`https://${app.host}`, `http://${app.hostname}:${Number(app.port) + 1}`, `http://${app.hostname}`, `ws://${app.host}`, 'null']
    for (const origin of others) {
      const res = await user.client.request('POST', '/api/workspaces', { name: 'Forged' }, { origin })
      expect(res.status, origin).toBe(403)
    }
    const ours = await user.client.request('POST', '/api/workspaces', { name: 'Ours' }, { origin: app.origin })
    expect(ours.status).toBe(201)
  })

  it('falls back to the Referer header, compared by scheme, host and port as well', async () => {
    const client = new ApiClient(undefined, null)
    const ours = await client.request('POST', '/api/auth/signin', body, { referer: `${testEnv().appUrl}/signin` })
    expect(ours.status).toBe(401)
    const theirs = await client.request('POST', '/api/auth/signin', body, { referer: 'http://evil.example/page' })
    expect(theirs.status).toBe(403)
    const otherScheme = await client.request('POST', '/api/auth/signin', body, { referer: `https://${app.host}/signin` })
    expect(otherScheme.status).toBe(403)
  })

  it('lets reads through without Origin', async () => {
    const res = await new ApiClient(undefined, null).get('/api/health')
    expect(res.status).toBe(200)
  })
})

describe('Host allow-list', () => {
  it('answers 421 to a foreign Host on pages, API reads and writes (DNS rebinding), even with a matching Origin', async () => {
    const evil = `evil.example:${app.port}`
    const checks = [
      { path: '/api/health' },
      { path: '/signin' },
      { path: '/api/outbox' },
      { path: '/api/auth/signin', method: 'POST', origin: `http://${evil}` }
    ]
    for (const c of checks) {
      const res = await rawRequest(`${app.origin}${c.path}`, {
        method: c.method,
        headers: { 'host': evil, 'content-type': 'application/json', ...(c.origin ? { origin: c.origin } : {}) },
        body: c.method ? JSON.stringify({ email: 'nobody@tests.sheaf.test', password: 'whatever-123' }) : undefined
      })
      expect(res.status, c.path).toBe(421)
      expect(res.body).toMatch(/does not answer for the host evil\.example/)
    }
  })

  it('refuses our address under another port or name, and accepts it spelt differently', async () => {
    const refused = [`${app.hostname}:${Number(app.port) + 1}`, `localhost:${app.port}`, app.hostname, `${app.host}.evil.example`, `${app.host}@evil.example`]
    for (const host of refused) {
      expect((await rawRequest(`${app.origin}/api/health`, { headers: { host } })).status, host).toBe(421)
    }
    expect((await rawRequest(`${app.origin}/api/health`, { headers: { host: app.host.toUpperCase() } })).status).toBe(200)
  })

  it('answers for SHEAF_ALLOWED_HOSTS as well, with their Origins under the scheme of APP_ORIGIN', async () => {
    const second = await startSecondApp(190, { SHEAF_ALLOWED_HOSTS: 'sheaf.localhost, LOCALHOST:{port}'.replace('{port}', String(Number(app.port) + 190)) })
    try {
      const alias = `localhost:${second.port}`
      const health = await rawRequest(`${second.url}/api/health`, { headers: { host: alias } })
      expect(health.status).toBe(200)
      expect((await rawRequest(`${second.url}/api/health`, { headers: { host: 'sheaf.localhost' } })).status).toBe(200)
      expect((await rawRequest(`${second.url}/api/health`, { headers: { host: `sheaf.localhost:${second.port}` } })).status).toBe(421)

      const signin = (origin: string) => rawRequest(`${second.url}/api/auth/signin`, {
        method: 'POST',
        headers: { 'host': alias, origin, 'content-type': 'application/json' },
        body: JSON.stringify({ email: uniqueEmail('alias'), password: 'whatever-123' })
      })
      expect((await signin(`http://${alias}`)).status).toBe(401)
      expect((await signin('http://sheaf.localhost')).status).toBe(401)
      expect((await signin(`https://${alias}`)).status).toBe(403)
      expect((await signin(`http://localhost:${second.port + 1}`)).status).toBe(403)
    } finally {
      await second.stop()
    }
  })
})
