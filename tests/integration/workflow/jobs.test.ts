// GET /api/workspaces/[wid]/jobs: the workspace's study runs and set builds in one list, newest
// first, with state, progress, set and version, who asked and the counts per state; filters by
// kind and state; another workspace's work never shows. Run again and Cancel from the monitor.
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
    expect(entry).toMatchObject({ studyId: study.body.id, setId: set.id, setName: 'jobs-hessian', version: 1, queuePosition: null, cancelRequested: false })
    expect(entry.setVersion).toEqual(expect.any(String))
    expect(entry).toHaveProperty('phase')
    expect(entry.detail).toMatch(/^\d+ members × 3 bins$/)
    expect(seen.body.counts).toEqual({ queued: 0, running: 0, done: 1, failed: 0, cancelled: 0 })
    expect(new Date(entry.finishedAt).getTime()).toBeGreaterThanOrEqual(new Date(entry.startedAt).getTime())

    const elsewhere = await other.owner.client.get(`/api/workspaces/${other.id}/jobs`)
    expect(elsewhere.body.jobs.map((j: { id: string }) => j.id)).not.toContain(rid)
    expect((await other.owner.client.get(`/api/workspaces/${ws.id}/jobs`)).status).toBe(404)
  })
  it('filters by kind and state, and refuses a bad filter with the parameter named', async () => {
    const ws = await createWorkspace('Jobs filters')
    const a = ws.analyst.client
    const set = await uploadSet(a, ws.id, toySetBytes({ name: 'jobs-filter', kind: 'hessian-pairs', errorMembers: 2 }).bytes)
    const study = await a.post(`/api/workspaces/${ws.id}/studies`, { name: 'Filter study', spec: f2Spec(2), setIds: [set.id] })
    const run = await a.post(`/api/workspaces/${ws.id}/studies/${study.body.id}/run`, {})
    const rid = run.body.results[0].id
    expect((await waitForResult(a, ws.id, rid)).state).toBe('done')

    const ids = async (q: string) => (await a.get(`/api/workspaces/${ws.id}/jobs${q}`)).body.jobs.map((j: { id: string }) => j.id)
    expect(await ids('?kind=run')).toEqual([rid])
    expect(await ids('?kind=build')).toEqual([])
    expect(await ids('?state=done')).toEqual([rid])
    expect(await ids('?state=failed')).toEqual([])

    for (const [q, field] of [['?state=finished', 'state'], ['?kind=squares', 'kind'], ['?limit=0', 'limit'], ['?limit=many', 'limit'], ['?sort=up', 'sort']] as const) {
      const bad = await a.get(`/api/workspaces/${ws.id}/jobs${q}`)
      expect(bad.status, q).toBe(400)
      expect(JSON.stringify(bad.body.data), q).toContain(field)
    }
  })

  it('runs a finished run again as the next version (analysts), and cancels it while queued or running', async () => {
    const ws = await createWorkspace('Jobs rerun')
    const a = ws.analyst.client
    const set = await uploadSet(a, ws.id, toySetBytes({ name: 'jobs-rerun', kind: 'hessian-pairs', errorMembers: 2 }).bytes)
    const study = await a.post(`/api/workspaces/${ws.id}/studies`, { name: 'Rerun study', spec: f2Spec(2), setIds: [set.id] })
    const first = (await a.post(`/api/workspaces/${ws.id}/studies/${study.body.id}/run`, {})).body.results[0].id
    expect((await waitForResult(a, ws.id, first)).state).toBe('done')

    // What the monitor's "Run again" sends for a run.
    expect((await ws.viewer.client.post(`/api/workspaces/${ws.id}/studies/${study.body.id}/run`, { setIds: [set.id] })).status).toBe(403)
    const again = await a.post(`/api/workspaces/${ws.id}/studies/${study.body.id}/run`, { setIds: [set.id] })
    expect(again.status).toBe(202)
    const second = again.body.results[0]
    expect(second.version).toBe(2)
    const cancel = await a.post(`/api/workspaces/${ws.id}/results/${second.id}/cancel`, {})
    // It may have finished in between on a fast worker; otherwise it ends cancelled.
    if (cancel.status === 200) expect(['cancelled', 'done']).toContain((await waitForResult(a, ws.id, second.id)).state)
    else expect(cancel.status).toBe(409)
    const listed = (await a.get(`/api/workspaces/${ws.id}/jobs?kind=run`)).body.jobs
    expect(listed.map((j: { version: number }) => j.version)).toEqual([2, 1])
  })

  it('answers 404 for re-running a build the workspace does not have', async () => {
    const ws = await createWorkspace('Jobs build rerun')
    const other = await createWorkspace('Jobs build elsewhere')
    const missing = '00000000-0000-4000-8000-000000000000'
    expect((await ws.analyst.client.post(`/api/workspaces/${ws.id}/sets/builds/${missing}/rerun`, {})).status).toBe(404)
    expect((await other.analyst.client.post(`/api/workspaces/${ws.id}/sets/builds/${missing}/rerun`, {})).status).toBe(404)
  })
})
