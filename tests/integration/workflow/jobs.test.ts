// GET /api/workspaces/[wid]/jobs: the workspace's study runs and set builds in one list, newest
// first, with state, progress and who asked; another workspace's work never shows.
import { describe, expect, it } from 'vitest'
import { createWorkspace } from '../../support/users'
import { f2Spec, toySetBytes, uploadSet, waitForResult } from './helpers'

describe('the job list', () => {
  it('lists a finished run with its study, set, version and requester, for viewers too', async () => {
    const ws = await createWorkspace('Jobs list')
    const other = await createWorkspace('Jobs elsewhere')
    const a = ws.analyst.client
    const set = await uploadSet(a, ws.id, toySetBytes({ name: 'jobs-hessian', kind: 'hessian-pairs', errorMembers: 4 }).bytes)
    const study = await a.post(`/api/workspaces/${ws.id}/studies`, { name: 'Jobs study', spec: f2Spec(3), setIds: [set.id] })
    expect(study.status).toBe(201)
    const run = await a.post(`/api/workspaces/${ws.id}/studies/${study.body.id}/run`, {})
    expect(run.status).toBe(202)
    const rid = run.body.results[0].id
    expect((await waitForResult(a, ws.id, rid)).state).toBe('done')

    const seen = await ws.viewer.client.get(`/api/workspaces/${ws.id}/jobs`)
    expect(seen.status).toBe(200)
    const entry = seen.body.jobs.find((j: { id: string }) => j.id === rid)
    expect(entry).toMatchObject({
      kind: 'run', state: 'done', progress: 1, title: 'Jobs study',
      link: `/studies/${study.body.id}?result=${rid}`, requestedByName: ws.analyst.name, error: null
    })
    expect(entry.detail).toContain('version 1')
    expect(new Date(entry.finishedAt).getTime()).toBeGreaterThanOrEqual(new Date(entry.startedAt).getTime())

    const elsewhere = await other.owner.client.get(`/api/workspaces/${other.id}/jobs`)
    expect(elsewhere.body.jobs.map((j: { id: string }) => j.id)).not.toContain(rid)
    expect((await other.owner.client.get(`/api/workspaces/${ws.id}/jobs`)).status).toBe(404)
  })
})
