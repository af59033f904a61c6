// A 100-replica, 200-bin Drell–Yan study from Run to band through the API and the queue: every
// bin gets a band. How long it takes is measured by the benchmark (npm run bench), not here.
import { describe, expect, it } from 'vitest'
import { createWorkspace } from '../../support/users'
import { toySetBytes, uploadSet, waitForResult } from './helpers'

describe('a 100-replica, 200-bin study', () => {
  it('goes from Run to a band on every bin', async () => {
    const ws = await createWorkspace('Timing')
    const a = ws.analyst.client
    const set = await uploadSet(a, ws.id, toySetBytes({ name: 'timing-replicas', kind: 'replicas', errorMembers: 100, nx: 60, nq: 24 }).bytes)
    const bins = Array.from({ length: 200 }, (_, i) => ({ m: 60 + i, yMin: -1, yMax: 1 }))
    const study = await a.post(`/api/workspaces/${ws.id}/studies`, { name: 'Drell–Yan mass scan', spec: { kernel: 'drell-yan', options: { sqrtSGeV: 13000 }, bins }, setIds: [set.id] })
    expect(study.status).toBe(201)
    const run = await a.post(`/api/workspaces/${ws.id}/studies/${study.body.id}/run`, {})
    const rid = run.body.results[0].id
    const end = await waitForResult(a, ws.id, rid, undefined, 60_000)
    const result = await a.get(`/api/workspaces/${ws.id}/results/${rid}`)
    expect(end.state).toBe('done')
    expect(result.body.bands.central).toHaveLength(200)
    expect(result.body.bands.plus.every((v: number) => Number.isFinite(v) && v > 0)).toBe(true)
  })
})
