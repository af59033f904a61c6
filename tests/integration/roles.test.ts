import { beforeAll, describe, expect, it } from 'vitest'
import { roleMatrixFailures, type WorkspaceRoute } from '../support/roles'
import { createWorkspace, uniqueEmail, type TestWorkspace } from '../support/users'

const FAKE_ID = '00000000-0000-4000-8000-000000000000'

// Every route under /api/workspaces/[wid]/… with the weakest role allowed to use it.
const ROUTES: WorkspaceRoute[] = [
  { method: 'GET', path: ws => `/api/workspaces/${ws.id}`, minRole: 'viewer' },
  { method: 'GET', path: ws => `/api/workspaces/${ws.id}/members`, minRole: 'viewer' },
  { method: 'POST', path: ws => `/api/workspaces/${ws.id}/members`, body: () => ({ email: uniqueEmail('matrix'), role: 'viewer' }), minRole: 'owner' },
  { method: 'PATCH', path: ws => `/api/workspaces/${ws.id}/members/${ws.viewer.id}`, body: () => ({ role: 'viewer' }), minRole: 'owner' },
  { method: 'DELETE', path: ws => `/api/workspaces/${ws.id}/members/${ws.outsider.id}`, minRole: 'owner', tryAllowed: false },
  { method: 'DELETE', path: ws => `/api/workspaces/${ws.id}/invitations/${FAKE_ID}`, minRole: 'owner', tryAllowed: false },
  { method: 'GET', path: ws => `/api/workspaces/${ws.id}/jobs`, minRole: 'viewer' }
]

describe('role matrix on workspace routes', () => {
  let ws: TestWorkspace
  beforeAll(async () => { ws = await createWorkspace('Matrix') })

  it('answers 401 anonymous, 404 non-member, 403 too-low role, 2xx at the needed role', async () => {
    expect(await roleMatrixFailures(ws, ROUTES)).toEqual([])
  })

  it('answers 404 for a workspace that does not exist or a malformed id', async () => {
    for (const wid of [FAKE_ID, 'not-a-uuid']) {
      for (const path of [`/api/workspaces/${wid}`, `/api/workspaces/${wid}/members`, `/api/workspaces/${wid}/jobs`]) {
        expect((await ws.owner.client.get(path)).status, path).toBe(404)
      }
    }
  })

  it('says which role is needed', async () => {
    const res = await ws.viewer.client.post(`/api/workspaces/${ws.id}/members`, { email: uniqueEmail('role'), role: 'viewer' })
    expect(res.status).toBe(403)
    expect(res.body.statusMessage).toBe('This needs the owner role or higher')
  })
})
