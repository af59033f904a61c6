import { and, eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { tables, testDB } from '../support/db'
import { ApiClient } from '../support/http'
import { linkIn, waitForMail } from '../support/outbox'
import { createUser, createWorkspace, uniqueEmail } from '../support/users'

const tokenOf = (url: URL) => url.pathname.split('/').pop()!

describe('workspaces', () => {
  it('makes the creator owner and lists only the user\'s workspaces', async () => {
    const alice = await createUser({ tag: 'alice' })
    const bob = await createUser({ tag: 'bob' })
    const created = await alice.client.post('/api/workspaces', { name: '  Forward muon group ' })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ name: 'Forward muon group', role: 'owner' })
    expect((await alice.client.get('/api/workspaces')).body.workspaces.map((w: { id: string }) => w.id)).toEqual([created.body.id])
    expect((await bob.client.get('/api/workspaces')).body.workspaces).toEqual([])
    const [event] = await testDB().select().from(tables.auditEvents)
      .where(and(eq(tables.auditEvents.workspaceId, created.body.id), eq(tables.auditEvents.action, 'workspace.created')))
    expect(event).toMatchObject({ actorId: alice.id, subjectType: 'workspace' })
  })

  it('rejects a bad name with the field named', async () => {
    const user = await createUser()
    const res = await user.client.post('/api/workspaces', { name: 'x' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.name).toBe('Use at least 2 characters')
  })
})

describe('invitations', () => {
  it('invites by e-mail; the invitee signs up, verifies, accepts and gets the role', async () => {
    const ws = await createWorkspace('Invite test')
    const email = uniqueEmail('invitee')
    const invite = await ws.owner.client.post(`/api/workspaces/${ws.id}/members`, { email, role: 'analyst' })
    expect(invite.status).toBe(201)
    const mail = await waitForMail(email, /invited you to Invite test/)
    const link = linkIn(mail.textBody, '/invitations/')

    const preview = await new ApiClient().get(`/api/invitations/${tokenOf(link)}`)
    expect(preview.body).toMatchObject({ workspaceName: 'Invite test', role: 'analyst', email, inviterName: ws.owner.name })

    const invitee = new ApiClient()
    await invitee.post('/api/auth/register', { email, name: 'New Colleague', password: 'bjorken-scaling-1' })
    const verify = linkIn((await waitForMail(email, /Confirm/)).textBody, '/verify')
    await invitee.post('/api/auth/verify', { token: verify.searchParams.get('token') })
    await invitee.signIn(email, 'bjorken-scaling-1')
    const accepted = await invitee.post(`/api/invitations/${tokenOf(link)}`)
    expect(accepted.status).toBe(200)
    expect(accepted.body).toMatchObject({ workspaceId: ws.id, role: 'analyst' })
    expect((await invitee.get('/api/auth/me')).body.memberships).toEqual([{ workspaceId: ws.id, name: 'Invite test', role: 'analyst' }])
    expect((await invitee.post(`/api/invitations/${tokenOf(link)}`)).status).toBe(404) // single use
  })

  it('refuses an invitation for another address, an existing member, and a revoked link', async () => {
    const ws = await createWorkspace()
    const email = uniqueEmail('target')
    await ws.owner.client.post(`/api/workspaces/${ws.id}/members`, { email, role: 'viewer' })
    const link = linkIn((await waitForMail(email, /invited you/)).textBody, '/invitations/')
    const wrong = await ws.outsider.client.post(`/api/invitations/${tokenOf(link)}`)
    expect(wrong.status).toBe(403)
    expect(wrong.body.statusMessage).toContain(email)

    const dup = await ws.owner.client.post(`/api/workspaces/${ws.id}/members`, { email: ws.viewer.email, role: 'analyst' })
    expect(dup.status).toBe(409)
    expect(dup.body.data.fields.email).toMatch(/Already a member/)

    const list = await ws.owner.client.get(`/api/workspaces/${ws.id}/members`)
    const pending = list.body.invitations.find((i: { email: string }) => i.email === email)
    expect((await ws.owner.client.delete(`/api/workspaces/${ws.id}/invitations/${pending.id}`)).status).toBe(200)
    expect((await new ApiClient().get(`/api/invitations/${tokenOf(link)}`)).status).toBe(404)
    expect((await new ApiClient().get('/api/invitations/short')).status).toBe(404)
  })

  it('validates the invitation body', async () => {
    const ws = await createWorkspace()
    const res = await ws.owner.client.post(`/api/workspaces/${ws.id}/members`, { email: 'x', role: 'boss' })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(['email', 'role'])
  })
})

describe('members', () => {
  it('lists members for everyone and invitations for owners only', async () => {
    const ws = await createWorkspace()
    await ws.owner.client.post(`/api/workspaces/${ws.id}/members`, { email: uniqueEmail('pending'), role: 'viewer' })
    const asViewer = await ws.viewer.client.get(`/api/workspaces/${ws.id}/members`)
    expect(asViewer.body.members.map((m: { role: string }) => m.role).sort()).toEqual(['analyst', 'owner', 'viewer'])
    expect(asViewer.body.invitations).toEqual([])
    expect((await ws.owner.client.get(`/api/workspaces/${ws.id}/members`)).body.invitations).toHaveLength(1)
  })

  it('changes roles, keeps the last owner, removes members and lets members leave', async () => {
    const ws = await createWorkspace()
    const url = (uid: string) => `/api/workspaces/${ws.id}/members/${uid}`
    const promote = await ws.owner.client.patch(url(ws.viewer.id), { role: 'analyst' })
    expect(promote.body).toEqual({ userId: ws.viewer.id, role: 'analyst' })
    expect((await ws.owner.client.patch(url(ws.owner.id), { role: 'viewer' })).status).toBe(409)
    expect((await ws.owner.client.delete(url(ws.owner.id))).status).toBe(409)
    expect((await ws.owner.client.patch(url(ws.outsider.id), { role: 'viewer' })).status).toBe(404)

    expect((await ws.owner.client.delete(url(ws.viewer.id))).status).toBe(200)
    expect((await ws.viewer.client.get(`/api/workspaces/${ws.id}`)).status).toBe(404)
    expect((await ws.analyst.client.delete(url(ws.analyst.id))).status).toBe(200) // leaving
    expect((await ws.analyst.client.get(`/api/workspaces/${ws.id}`)).status).toBe(404)

    // With a second owner, the first may step down.
    const second = await createUser()
    await testDB().insert(tables.memberships).values({ workspaceId: ws.id, userId: second.id, role: 'owner' })
    expect((await ws.owner.client.patch(url(ws.owner.id), { role: 'analyst' })).status).toBe(200)
  })
})
