// The study page's server render is kept per viewer and per version of what it shows
// (server/utils/page-cache.ts). Asked again it must be the same page; but a change of the study,
// a new version, another user, a changed role or name, or an ended session must never get a kept
// render of before.
import { eq } from 'drizzle-orm'
import { describe, expect, it } from 'vitest'
import { tables, testDB } from '../../support/db'
import { createWorkspace } from '../../support/users'
import { f2Spec, toySetBytes, uploadSet, waitForResult } from './helpers'

const RUN_BUTTON = />\s*Run on 1 set\s*</

describe('study page render kept per viewer and version', () => {
  it('is the same page when nothing changed, and a fresh one after any change it shows', async () => {
    const ws = await createWorkspace('Page cache')
    const a = ws.analyst.client
    const v = ws.viewer.client
    const set = await uploadSet(a, ws.id, toySetBytes({ name: 'page-cache-set', kind: 'hessian-pairs', errorMembers: 2 }).bytes)
    const made = await a.post(`/api/workspaces/${ws.id}/studies`, { name: 'Kept page study', spec: f2Spec(3), setIds: [set.id] })
    expect(made.status).toBe(201)
    const path = `/studies/${made.body.id}`

    const first = await a.get<string>(path)
    const again = await a.get<string>(path)
    expect(first.status).toBe(200)
    expect(again.status).toBe(200)
    expect(again.body).toBe(first.body)
    expect(again.headers.get('content-type')).toBe(first.headers.get('content-type'))
    expect(again.headers.get('content-security-policy')).toBe(first.headers.get('content-security-policy'))
    expect(first.body).toContain('Kept page study')
    expect(first.body).toMatch(RUN_BUTTON)

    // Another user of the workspace gets their own page: a viewer sees no Run button.
    const viewerPage = await v.get<string>(path)
    expect(viewerPage.status).toBe(200)
    expect(viewerPage.body).toContain('Kept page study')
    expect(viewerPage.body).not.toMatch(RUN_BUTTON)
    // A user outside the workspace never sees it, even asking for that workspace.
    ws.outsider.client.cookies.set('sheaf_workspace', ws.id)
    const outside = await ws.outsider.client.get<string>(path)
    expect(outside.body).not.toContain('Kept page study')

    // The viewer made analyst: the next page has the Run button.
    await testDB().update(tables.memberships).set({ role: 'analyst' }).where(eq(tables.memberships.userId, ws.viewer.id))
    expect((await v.get<string>(path)).body).toMatch(RUN_BUTTON)

    // A renamed study, and the analyst's new name, show at once.
    expect((await a.patch(`/api/workspaces/${ws.id}/studies/${made.body.id}`, { name: 'Renamed kept study' })).status).toBe(200)
    const renamed = await a.get<string>(path)
    expect(renamed.body).toContain('Renamed kept study')
    expect(renamed.body).not.toContain('Kept page study')
    expect((await a.patch('/api/auth/me', { name: 'Analyst Renamed' })).status).toBe(200)
    expect((await a.get<string>(path)).body).toContain('Analyst Renamed')

    // A run: its version is on the next page, as it goes and once done.
    const rid = (await a.post(`/api/workspaces/${ws.id}/studies/${made.body.id}/run`, {})).body.results[0].id
    expect((await waitForResult(a, ws.id, rid)).state).toBe('done')
    const ran = await a.get<string>(path)
    expect(ran.body).toMatch(/data-run-state="done"/)
    expect(ran.body).toContain('version 1')

    // Signed out: the sign-in page, never the kept render.
    expect((await a.post('/api/auth/signout', {})).status).toBe(200)
    const signedOut = await a.get<string>(path)
    expect(signedOut.body).not.toContain('Renamed kept study')
  })
})
