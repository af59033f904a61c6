import { createHash } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import { beforeAll, describe, expect, it } from 'vitest'
import { tables, testDB } from '../support/db'
import { ApiClient } from '../support/http'
import { createToken, TokenClient } from '../support/tokens'
import { createWorkspace, uniqueEmail, type TestWorkspace } from '../support/users'

describe('personal API tokens', () => {
  let ws: TestWorkspace
  let other: TestWorkspace
  beforeAll(async () => {
    ws = await createWorkspace('Token workspace')
    other = await createWorkspace('Other workspace')
  })

  it('shows the secret once, stores only its SHA-256, lists the token without it', async () => {
    const created = await ws.analyst.client.post('/api/auth/tokens', { name: 'notebook', workspaceId: ws.id, role: 'viewer', expiresInDays: 7 })
    expect(created.status).toBe(201)
    const secret = created.body.secret as string
    expect(secret).toMatch(/^sheaf_pat_[A-Za-z0-9_-]{43}$/)
    expect(created.body.token).toMatchObject({ name: 'notebook', role: 'viewer', workspaceId: ws.id, workspaceName: 'Token workspace', lastUsedAt: null, revokedAt: null })
    const days = (Date.parse(created.body.token.expiresAt) - Date.parse(created.body.token.createdAt)) / 86_400_000
    expect(days).toBeCloseTo(7, 3)

    const [row] = await testDB().select().from(tables.apiTokens).where(eq(tables.apiTokens.id, created.body.token.id))
    expect(row!.tokenHash).toBe(createHash('sha256').update(secret).digest('hex'))
    expect(JSON.stringify(row)).not.toContain(secret.slice(10))

    const list = await ws.analyst.client.get('/api/auth/tokens')
    expect(list.status).toBe(200)
    expect(list.body.tokens.map((t: { id: string }) => t.id)).toContain(created.body.token.id)
    expect(JSON.stringify(list.body)).not.toContain(secret.slice(10))
    // Other users do not see it.
    expect((await ws.viewer.client.get('/api/auth/tokens')).body.tokens).toEqual([])
  })

  it('refuses a role above the user\'s own, a workspace the user is not in, and bad fields, storing nothing', async () => {
    const before = (await testDB().select().from(tables.apiTokens).where(eq(tables.apiTokens.userId, ws.viewer.id))).length
    const tooHigh = await ws.viewer.client.post('/api/auth/tokens', { name: 'x', workspaceId: ws.id, role: 'analyst', expiresInDays: 5 })
    expect(tooHigh.status).toBe(400)
    expect(tooHigh.body.data.fields.role).toMatch(/viewer/)
    const notMember = await ws.viewer.client.post('/api/auth/tokens', { name: 'x', workspaceId: other.id, role: 'viewer', expiresInDays: 5 })
    expect(notMember.status).toBe(400)
    expect(notMember.body.data.fields.workspaceId).toBeTruthy()
    const bad = await ws.viewer.client.post('/api/auth/tokens', { name: '', workspaceId: 'nope', role: 'god', expiresInDays: 1000 })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['expiresInDays', 'name', 'role', 'workspaceId'])
    expect((await new ApiClient().post('/api/auth/tokens', { name: 'x', workspaceId: ws.id, role: 'viewer', expiresInDays: 1 })).status).toBe(401)
    const after = (await testDB().select().from(tables.apiTokens).where(eq(tables.apiTokens.userId, ws.viewer.id))).length
    expect(after).toBe(before)
  })

  it('applies the same role checks as a session, capped by the token\'s own role, without an Origin header', async () => {
    const ownerAsViewer = await createToken(ws.owner, ws.id, 'viewer')
    const ownerToken = await createToken(ws.owner, ws.id, 'owner')
    const analystToken = await createToken(ws.analyst, ws.id, 'analyst')

    const read = await ownerAsViewer.client.get(`/api/workspaces/${ws.id}`)
    expect(read.status).toBe(200)
    expect(read.body.role).toBe('viewer')
    expect((await ownerAsViewer.client.get(`/api/workspaces/${ws.id}/jobs`)).status).toBe(200)

    const invite = (c: TokenClient) => c.post(`/api/workspaces/${ws.id}/members`, { email: uniqueEmail('tok'), role: 'viewer' })
    const capped = await invite(ownerAsViewer.client)
    expect(capped.status).toBe(403)
    expect(capped.body.statusMessage).toMatch(/this API token has viewer/)
    expect((await invite(analystToken.client)).status).toBe(403)
    expect((await invite(ownerToken.client)).status).toBe(201)
  })

  it('answers 404 for another workspace, even one where the user is a member', async () => {
    const token = await createToken(ws.owner, ws.id, 'owner')
    const mine = await ws.owner.client.post('/api/workspaces', { name: 'Owner second workspace' })
    expect(mine.status).toBe(201)
    for (const wid of [mine.body.id, other.id]) {
      expect((await token.client.get(`/api/workspaces/${wid}`)).status).toBe(404)
      expect((await token.client.get(`/api/workspaces/${wid}/jobs`)).status).toBe(404)
    }
  })

  it('never reaches the account: password, profile, tokens, workspaces, invitations', async () => {
    const { client, secret } = await createToken(ws.owner, ws.id, 'owner')
    const calls = [
      client.post('/api/auth/password', { currentPassword: ws.owner.password, newPassword: 'another-pass-77' }),
      client.patch('/api/auth/me', { name: 'Renamed' }),
      client.get('/api/auth/me'),
      client.get('/api/auth/tokens'),
      client.post('/api/auth/tokens', { name: 'child', workspaceId: ws.id, role: 'viewer', expiresInDays: 1 }),
      client.post('/api/workspaces', { name: 'By token' }),
      client.get('/api/workspaces')
    ]
    for (const res of await Promise.all(calls)) {
      expect(res.status).toBe(403)
      expect(res.body.statusMessage).toMatch(/API tokens reach workspace routes only/)
    }
    const who = await client.get('/api/auth/token')
    expect(who.body).toMatchObject({ workspaceId: ws.id, role: 'owner', user: { id: ws.owner.id } })
    expect(secret).toBeTruthy()
  })

  it('ignores the session cookie when an Authorization header is present; a cookie request still needs its Origin', async () => {
    // A signed-in client sending a bad token is refused: the cookie does not count.
    const bad = await ws.owner.client.request('GET', `/api/workspaces/${ws.id}`, undefined, { authorization: 'Bearer sheaf_pat_' + 'A'.repeat(43) })
    expect(bad.status).toBe(401)
    const basic = await ws.owner.client.request('GET', `/api/workspaces/${ws.id}`, undefined, { authorization: 'Basic Zm9vOmJhcg==' })
    expect(basic.status).toBe(401)
    // The same session without Origin on a change: still refused.
    const noOrigin = new ApiClient(undefined, null)
    for (const [k, v] of ws.owner.client.cookies) noOrigin.cookies.set(k, v)
    expect((await noOrigin.post(`/api/workspaces/${ws.id}/members`, { email: uniqueEmail('x'), role: 'viewer' })).status).toBe(403)
  })

  it('records every use: last use and one audit event per request', async () => {
    const { client, token } = await createToken(ws.viewer, ws.id, 'viewer')
    await client.get(`/api/workspaces/${ws.id}`)
    await client.get(`/api/workspaces/${ws.id}/members`)
    const events = await testDB().select().from(tables.auditEvents)
      .where(and(eq(tables.auditEvents.action, 'api_token.used'), eq(tables.auditEvents.subjectId, token.id)))
    expect(events.map(e => (e.detail as { path: string }).path).sort()).toEqual([`/api/workspaces/${ws.id}`, `/api/workspaces/${ws.id}/members`])
    expect(events.every(e => e.actorId === ws.viewer.id && e.workspaceId === ws.id)).toBe(true)
    const listed = (await ws.viewer.client.get('/api/auth/tokens')).body.tokens.find((t: { id: string }) => t.id === token.id)
    expect(listed.lastUsedAt).not.toBeNull()
  })

  it('stops a revoked or expired token at once, and only the owner can revoke', async () => {
    const { client, token } = await createToken(ws.analyst, ws.id, 'analyst')
    expect((await client.get(`/api/workspaces/${ws.id}`)).status).toBe(200)
    expect((await ws.owner.client.delete(`/api/auth/tokens/${token.id}`)).status).toBe(404)
    const revoked = await ws.analyst.client.delete(`/api/auth/tokens/${token.id}`)
    expect(revoked.status).toBe(200)
    expect(revoked.body.token.revokedAt).not.toBeNull()
    const after = await client.get(`/api/workspaces/${ws.id}`)
    expect(after.status).toBe(401)
    expect(after.body.statusMessage).toMatch(/revoked/)

    const expiring = await createToken(ws.analyst, ws.id, 'viewer')
    await testDB().update(tables.apiTokens).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(tables.apiTokens.id, expiring.token.id))
    const expired = await expiring.client.get(`/api/workspaces/${ws.id}`)
    expect(expired.status).toBe(401)
    expect(expired.body.statusMessage).toMatch(/expired/)

    // A user who leaves the workspace takes the token's access along.
    const viewerToken = await createToken(ws.viewer, ws.id, 'viewer')
    await testDB().delete(tables.memberships).where(and(eq(tables.memberships.workspaceId, ws.id), eq(tables.memberships.userId, ws.viewer.id)))
    expect((await viewerToken.client.get(`/api/workspaces/${ws.id}`)).status).toBe(404)
    await testDB().insert(tables.memberships).values({ workspaceId: ws.id, userId: ws.viewer.id, role: 'viewer' })
  })

  it('throttles refused tokens per client address', async () => {
    const guesser = new TokenClient('sheaf_pat_' + 'B'.repeat(43))
    const statuses: number[] = []
    for (let i = 0; i < 31; i++) statuses.push((await guesser.get(`/api/workspaces/${ws.id}`)).status)
    expect(statuses.slice(0, 30).every(s => s === 401)).toBe(true)
    const last = await guesser.get(`/api/workspaces/${ws.id}`)
    expect(last.status).toBe(429)
    expect(Number(last.headers.get('retry-after'))).toBeGreaterThan(0)
    // A good token from another address is unaffected.
    const good = await createToken(ws.owner, ws.id, 'viewer')
    expect((await good.client.get(`/api/workspaces/${ws.id}`)).status).toBe(200)
  })
})
