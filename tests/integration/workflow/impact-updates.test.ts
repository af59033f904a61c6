// Updating a set by a measurement through the API: refused requests answer a located 4xx and
// store or queue nothing; a replica set is reweighted and a Hessian set profiled on the queue,
// the derived set appears in the library with its provenance, its members load, and the study
// run on it gives the band the update predicted. TOY sets (engine-generated, not fits) and an
// invented measurement: no number here is a physics result.
import { count, eq } from 'drizzle-orm'
import { beforeAll, describe, expect, it } from 'vitest'
import { testDB, tables as t } from '../../support/db'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { parseSetFile } from '../../../shared/physics/sets/parse'
import { f2Spec, toySetBytes, uploadSet, waitForResult } from './helpers'

let ws: TestWorkspace
let hessian: string
let replicas: string
let studyId: string
let measurementId: string
const api = () => `/api/workspaces/${ws.id}`
const updates = () => `${api()}/studies/${studyId}/updates`

async function waitForUpdate(id: string, ms = 60_000) {
  const deadline = Date.now() + ms
  for (;;) {
    const res = await ws.viewer.client.get(`${updates()}/${id}`)
    expect(res.status).toBe(200)
    if (['done', 'failed', 'cancelled'].includes(res.body.state)) return res.body
    if (Date.now() > deadline) throw new Error(`update ${id} still ${res.body.state} after ${ms} ms`)
    await new Promise(r => setTimeout(r, 150))
  }
}

/** The stored set file of `setId`, downloaded and parsed (its members load). */
async function setFile(setId: string) {
  const c = ws.viewer.client
  const res = await fetch(`${c.baseUrl}${api()}/sets/${setId}/file`, { headers: { 'cookie': [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'x-forwarded-for': c.address } })
  expect(res.status).toBe(200)
  return parseSetFile(new Uint8Array(await res.arrayBuffer()))
}

const rowCounts = async () => ({
  updates: (await testDB().select({ n: count() }).from(t.impactUpdates))[0]!.n,
  sets: (await testDB().select({ n: count() }).from(t.errorSets).where(eq(t.errorSets.workspaceId, ws.id)))[0]!.n
})

beforeAll(async () => {
  ws = await createWorkspace('Update desk')
  hessian = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'upd-h', errorMembers: 5 }).bytes)).id
  replicas = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'upd-r', kind: 'replicas', errorMembers: 60 }).bytes)).id
  const study = await ws.analyst.client.post(`${api()}/studies`, { name: 'F2 to update', spec: f2Spec(4), setIds: [hessian, replicas] })
  expect(study.status).toBe(201)
  studyId = study.body.id
  const run = await ws.analyst.client.post(`${api()}/studies/${studyId}/run`, {})
  for (const r of run.body.results) expect((await waitForResult(ws.analyst.client, ws.id, r.id)).state).toBe('done')
  // Invented data: half a band above the replica set's mean, errors the size of its band.
  const compare = (await ws.viewer.client.get(`${api()}/studies/${studyId}/comparison?setIds=${replicas}`)).body
  const band = compare.sets[0].band as { central: number[], plus: number[] }
  const csv = ['value,stat', ...band.central.map((c, i) => `${c + 0.5 * band.plus[i]!},${band.plus[i]}`)].join('\n')
  const m = await ws.analyst.client.post(`${api()}/studies/${studyId}/measurements`, { name: 'invented data', csv })
  expect(m.status, JSON.stringify(m.body)).toBe(201)
  measurementId = m.body.id
})

describe('refused requests', () => {
  it('answers a located 4xx and stores and queues nothing', async () => {
    const before = await rowCounts()
    const cases: Array<[Record<string, unknown>, number, string | RegExp]> = [
      [{ setId: replicas }, 400, 'measurementId'],
      [{ setId: '00000000-0000-4000-8000-000000000000', measurementId }, 400, 'setId'],
      [{ setId: replicas, measurementId: '00000000-0000-4000-8000-000000000000' }, 400, 'measurementId'],
      [{ setId: replicas, measurementId, tolerance: 1 }, 400, 'tolerance'],
      [{ setId: hessian, measurementId, replicas: 10 }, 400, 'replicas'],
      [{ setId: replicas, measurementId, replicas: 1 }, 400, 'replicas'],
      [{ setId: hessian, measurementId, tolerance: -1 }, 400, 'tolerance'],
      [{ setId: replicas, measurementId, extra: 1 }, 400, /extra|Unrecognized|unknown/i]
    ]
    for (const [body, status, where] of cases) {
      const res = await ws.analyst.client.post(updates(), body)
      expect(res.status, JSON.stringify(body)).toBe(status)
      const located = JSON.stringify(res.body.data ?? res.body)
      if (typeof where === 'string') expect(located, JSON.stringify(body)).toContain(where)
      else expect(located).toMatch(where)
    }
    // A name and version already in the library: 409 naming the field.
    const taken = await ws.analyst.client.post(updates(), { setId: hessian, measurementId, name: 'upd-h', version: (await ws.viewer.client.get(`${api()}/sets/${hessian}`)).body.version })
    expect(taken.status).toBe(409)
    expect(taken.body.data.fields.name).toMatch(/already/)
    expect(await rowCounts()).toEqual(before)
  })

  it('lets viewers read and only analysts start', async () => {
    expect((await ws.viewer.client.post(updates(), { setId: replicas, measurementId })).status).toBe(403)
    expect((await ws.outsider.client.get(updates())).status).toBe(404)
    expect((await ws.viewer.client.get(updates())).status).toBe(200)
    expect((await ws.viewer.client.get(`${updates()}/00000000-0000-4000-8000-000000000000`)).status).toBe(404)
  })
})

describe('updating the sets', () => {
  it('reweights the replica set and saves the unweighted set with its provenance', async () => {
    const start = await ws.analyst.client.post(updates(), { setId: replicas, measurementId, replicas: 80, seed: 7 })
    expect(start.status, JSON.stringify(start.body)).toBe(202)
    expect(start.body).toMatchObject({ method: 'reweight', request: { name: 'upd-r-reweighted', replicas: 80, seed: 7 } })
    // The answer is the row as it stands once queued: a free worker may already have taken it.
    expect(['queued', 'running', 'done']).toContain(start.body.state)
    const done = await waitForUpdate(start.body.id)
    expect(done.state, done.error).toBe('done')
    expect(done.progress).toMatchObject({ done: 4, total: 4, percent: 100 })
    const s = done.summary
    // 1 ≤ N_eff ≤ N by its definition as an exponentiated entropy (arXiv:1012.0836).
    expect(s.reweight.effectiveReplicas).toBeGreaterThanOrEqual(1)
    expect(s.reweight.effectiveReplicas).toBeLessThanOrEqual(60)
    expect(s.reweight.profile.alpha.length).toBe(s.reweight.profile.density.length)
    expect(s.before.central).toHaveLength(4)

    const library = (await ws.viewer.client.get(`${api()}/sets`)).body.sets as Array<{ id: string, name: string, kind: string, memberCount: number }>
    const saved = library.find(x => x.id === done.setId)!
    expect(saved).toMatchObject({ name: 'upd-r-reweighted', kind: 'replicas', memberCount: 81 })
    const detail = (await ws.viewer.client.get(`${api()}/sets/${done.setId}`)).body
    const parentVersion = (await ws.viewer.client.get(`${api()}/sets/${replicas}`)).body.version
    expect(detail.header.provenance).toContain(`Parent set: upd-r ${parentVersion}`)
    expect(detail.header.provenance).toContain('invented data')
    expect(detail.header.provenance).toContain('F2 to update')
    expect(detail.header.provenance).toContain(`N_eff = ${s.reweight.effectiveReplicas.toFixed(1)} of 60`)
    expect((await ws.viewer.client.get(`${api()}/sets/${done.setId}/update`)).body.update).toMatchObject({ id: done.id, parentSetId: replicas, measurementId })

    // Unweighting copies replicas (arXiv:1108.1758): every new replica is one of the parent's,
    // and member 0 is their mean.
    const set = await setFile(done.setId)
    const parent = await setFile(replicas)
    const key = (m: Float64Array) => Array.from(m.subarray(0, 50)).join(',')
    const parentKeys = new Set(parent.members.slice(1).map(key))
    for (const m of set.members.slice(1)) expect(parentKeys.has(key(m))).toBe(true)
    const mean = set.members.slice(1).reduce((acc, m) => acc + m[123]!, 0) / 80
    expect(set.members[0]![123]).toBeCloseTo(mean, 12)

    // The study run on the saved set: F₂ is linear in the densities, so its replicas' mean ± sd
    // is the band the update predicted for it.
    expect((await ws.analyst.client.patch(`${api()}/studies/${studyId}`, { setIds: [hessian, replicas, done.setId] })).status).toBe(200)
    const run = await ws.analyst.client.post(`${api()}/studies/${studyId}/run`, { setIds: [done.setId] })
    expect(run.status).toBe(202)
    expect((await waitForResult(ws.analyst.client, ws.id, run.body.results[0].id)).state).toBe('done')
    const after = (await ws.viewer.client.get(`${api()}/studies/${studyId}/comparison?setIds=${done.setId}`)).body.sets[0].band
    for (let b = 0; b < 4; b++) {
      expect(after.central[b]).toBeCloseTo(s.after.central[b], 9)
      expect(after.plus[b] / s.after.plus[b]).toBeCloseTo(1, 6)
    }
  })

  it('profiles the Hessian set and saves the profiled set with its shifts', async () => {
    const start = await ws.analyst.client.post(updates(), { setId: hessian, measurementId })
    expect(start.status, JSON.stringify(start.body)).toBe(202)
    const done = await waitForUpdate(start.body.id)
    expect(done.state, done.error).toBe('done')
    const s = done.summary
    expect(s.method).toBe('profile')
    expect(s.profile.shifts).toHaveLength(5)
    // The minimum of χ²_data + T²Σz² is at most its value at z = 0 (χ² before), and the data part
    // at most the sum: the data χ² cannot rise (definition of the minimum).
    expect(s.chi2After).toBeLessThanOrEqual(s.chi2Before + 1e-9)
    const detail = (await ws.viewer.client.get(`${api()}/sets/${done.setId}`)).body
    expect(detail).toMatchObject({ name: 'upd-h-profiled', kind: 'hessian-pairs', memberCount: 11 })
    expect(detail.header.provenance).toContain('Parent set: upd-h')
    expect(detail.header.provenance).toMatch(/shifts z1 = -?\d/)
    expect(detail.header.provenance).toContain('invented data')
    const set = await setFile(done.setId)
    expect(set.members).toHaveLength(11)
    const list = (await ws.viewer.client.get(updates())).body.updates as Array<{ id: string }>
    expect(list.map(u => u.id)).toEqual(expect.arrayContaining([done.id]))
  })
})
