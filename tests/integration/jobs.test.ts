import { describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/http'
import { createWorkspace } from '../support/users'

async function waitForState(client: ApiClient, path: string, states: string[], timeoutMs = 20_000) {
  const seen: number[] = []
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const { body } = await client.get(path)
    seen.push(body.progress)
    if (states.includes(body.state)) return { job: body, seen }
    await new Promise(r => setTimeout(r, 100))
  }
  throw new Error(`job at ${path} did not reach ${states.join('/')} in ${timeoutMs} ms`)
}

describe('demo job round trip', () => {
  it('enqueues from the route, reports progress from the worker and stores the result', async () => {
    const ws = await createWorkspace('Jobs')
    const res = await ws.analyst.client.post(`/api/workspaces/${ws.id}/jobs`, { numbers: [3, -4, 0.5, 12], stepMs: 250 })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ kind: 'demo.square', state: 'queued', progress: 0 })
    const path = `/api/workspaces/${ws.id}/jobs/${res.body.id}`
    const { job, seen } = await waitForState(ws.viewer.client, path, ['succeeded', 'failed'])
    expect(job.state).toBe('succeeded')
    expect(job.result).toEqual({ squares: [9, 16, 0.25, 144], sum: 169.25 })
    expect(job.progress).toBe(1)
    expect(seen.some(p => p > 0 && p < 1)).toBe(true) // intermediate progress was visible
    const list = await ws.viewer.client.get(`/api/workspaces/${ws.id}/jobs`)
    expect(list.body.jobs.map((j: { id: string }) => j.id)).toContain(res.body.id)
  })

  it('rejects bad numbers with the field named', async () => {
    const ws = await createWorkspace('Jobs')
    const tooMany = await ws.analyst.client.post(`/api/workspaces/${ws.id}/jobs`, { numbers: Array.from({ length: 51 }, (_, i) => i) })
    expect(tooMany.status).toBe(400)
    expect(tooMany.body.data.fields.numbers).toBe('Give at most 50 numbers')
    const notNumber = await ws.analyst.client.post(`/api/workspaces/${ws.id}/jobs`, { numbers: [1, 'two'] })
    expect(notNumber.status).toBe(400)
    expect(notNumber.body.data.fields['numbers.1']).toBe('Each entry must be a number')
  })

  it('does not show one workspace\'s job to another workspace', async () => {
    const a = await createWorkspace('Alpha')
    const b = await createWorkspace('Beta')
    const job = await a.analyst.client.post(`/api/workspaces/${a.id}/jobs`, { numbers: [1], stepMs: 0 })
    expect((await b.owner.client.get(`/api/workspaces/${b.id}/jobs/${job.body.id}`)).status).toBe(404)
  })
})
