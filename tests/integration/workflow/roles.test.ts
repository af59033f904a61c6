// Every workflow route: anonymous 401, outsider 404, each role below the minimum 403, the minimal
// role 2xx; and rows of one workspace answer 404 through another workspace's path.
import { beforeAll, describe, expect, it } from 'vitest'
import { roleMatrixFailures, type WorkspaceRoute } from '../../support/roles'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { f2Spec, toySetBytes, uploadSet, waitForResult } from './helpers'

let ws: TestWorkspace
let other: TestWorkspace
const ids = { set: '', study: '', result: '', measurement: '' }
const otherIds = { set: '', study: '', result: '', measurement: '' }
const csv = (n: number) => ['value,stat', ...Array.from({ length: n }, (_, i) => `${0.3 + 0.01 * i},0.01`)].join('\n')

/** A set, a study on it with a finished result, and a measurement, made by the analyst of `w`. */
async function populate(w: TestWorkspace, into: typeof ids) {
  const a = w.analyst.client
  into.set = (await uploadSet(a, w.id, toySetBytes({ errorMembers: 3 }).bytes)).id
  const study = await a.post(`/api/workspaces/${w.id}/studies`, { name: 'matrix study', spec: f2Spec(3), setIds: [into.set] })
  expect(study.status).toBe(201)
  into.study = study.body.id
  const run = await a.post(`/api/workspaces/${w.id}/studies/${into.study}/run`, {})
  expect(run.status).toBe(202)
  into.result = run.body.results[0].id
  expect((await waitForResult(a, w.id, into.result)).state).toBe('done')
  const m = await a.post(`/api/workspaces/${w.id}/studies/${into.study}/measurements`, { name: 'data', csv: csv(3) })
  expect(m.status).toBe(201)
  into.measurement = m.body.id
}

beforeAll(async () => {
  ;[ws, other] = await Promise.all([createWorkspace('Workflow roles'), createWorkspace('Other collaboration')])
  await Promise.all([populate(ws, ids), populate(other, otherIds)])
})

const base = (w: TestWorkspace) => `/api/workspaces/${w.id}`
const set = (w: TestWorkspace) => `${base(w)}/sets/${ids.set}`
const study = (w: TestWorkspace) => `${base(w)}/studies/${ids.study}`
const result = (w: TestWorkspace) => `${base(w)}/results/${ids.result}`
const measurement = (w: TestWorkspace) => `${study(w)}/measurements/${ids.measurement}`

const routes: WorkspaceRoute[] = [
  { method: 'GET', path: w => `${base(w)}/sets`, minRole: 'viewer' },
  { method: 'POST', path: w => `${base(w)}/sets`, minRole: 'analyst', tryAllowed: false },
  { method: 'GET', path: set, minRole: 'viewer' },
  { method: 'PATCH', path: set, body: () => ({ name: 'renamed in the matrix' }), minRole: 'analyst' },
  { method: 'DELETE', path: set, minRole: 'owner', tryAllowed: false },
  { method: 'GET', path: w => `${set(w)}/file`, minRole: 'viewer' },
  { method: 'POST', path: w => `${base(w)}/sets/import`, minRole: 'analyst', tryAllowed: false },
  { method: 'GET', path: w => `${set(w)}/table?format=csv`, minRole: 'viewer' },
  { method: 'GET', path: w => `${set(w)}/densities?q2=10&flavours=21,uv`, minRole: 'viewer' },
  { method: 'GET', path: w => `${set(w)}/sum-rules?q2=10`, minRole: 'viewer' },
  { method: 'POST', path: w => `${base(w)}/sets/builds`, body: () => ({ input: {} }), minRole: 'analyst', tryAllowed: false },
  { method: 'POST', path: w => `${base(w)}/sets/examples`, minRole: 'analyst', tryAllowed: false },
  { method: 'GET', path: w => `${base(w)}/studies`, minRole: 'viewer' },
  { method: 'POST', path: w => `${base(w)}/studies`, body: () => ({ name: 'another', spec: f2Spec(2), setIds: [ids.set] }), minRole: 'analyst' },
  { method: 'POST', path: w => `${base(w)}/studies/validate`, body: () => ({ spec: f2Spec(2), setIds: [ids.set] }), minRole: 'viewer' },
  { method: 'GET', path: study, minRole: 'viewer' },
  { method: 'PATCH', path: study, body: () => ({ description: 'edited in the matrix' }), minRole: 'analyst' },
  { method: 'DELETE', path: study, minRole: 'owner', tryAllowed: false },
  { method: 'POST', path: w => `${study(w)}/run`, minRole: 'analyst', tryAllowed: false },
  { method: 'GET', path: w => `${study(w)}/comparison`, minRole: 'viewer' },
  { method: 'GET', path: w => `${study(w)}/export?format=latex`, minRole: 'viewer' },
  { method: 'GET', path: w => `${study(w)}/measurements`, minRole: 'viewer' },
  { method: 'POST', path: w => `${study(w)}/measurements`, body: () => ({ name: 'more data', csv: csv(3) }), minRole: 'analyst' },
  { method: 'GET', path: measurement, minRole: 'viewer' },
  { method: 'GET', path: w => `${measurement(w)}/chi2`, minRole: 'viewer' },
  { method: 'DELETE', path: measurement, minRole: 'analyst', tryAllowed: false },
  { method: 'GET', path: result, minRole: 'viewer' },
  { method: 'GET', path: w => `${result(w)}/progress`, minRole: 'viewer' },
  { method: 'GET', path: w => `${result(w)}/events`, minRole: 'viewer' },
  { method: 'GET', path: w => `${result(w)}/matrices`, minRole: 'viewer' },
  { method: 'GET', path: w => `${result(w)}/contributions?bin=1`, minRole: 'viewer' },
  { method: 'GET', path: w => `${result(w)}/export?format=csv`, minRole: 'viewer' },
  { method: 'POST', path: w => `${result(w)}/cancel`, minRole: 'analyst', tryAllowed: false },
  { method: 'DELETE', path: result, minRole: 'analyst', tryAllowed: false },
  { method: 'POST', path: w => `${result(w)}/submit`, minRole: 'analyst', tryAllowed: false },
  { method: 'POST', path: w => `${result(w)}/approve`, minRole: 'owner', tryAllowed: false },
  { method: 'POST', path: w => `${result(w)}/return`, body: () => ({ comment: 'redo' }), minRole: 'owner', tryAllowed: false }
]

describe('workflow role matrix', () => {
  it('answers 401 / 404 / 403 / 2xx on every route as the roles require', async () => {
    expect(await roleMatrixFailures(ws, routes)).toEqual([])
  })

  it('answers 404 for a row of another workspace reached through your own workspace', async () => {
    const a = ws.owner.client
    const mine = base(ws)
    const paths = [
      `${mine}/sets/${otherIds.set}`, `${mine}/sets/${otherIds.set}/file`,
      `${mine}/studies/${otherIds.study}`, `${mine}/studies/${otherIds.study}/comparison`, `${mine}/studies/${otherIds.study}/export?format=csv`,
      `${mine}/studies/${otherIds.study}/measurements/${otherIds.measurement}`,
      `${mine}/studies/${ids.study}/measurements/${otherIds.measurement}`,
      `${mine}/results/${otherIds.result}`, `${mine}/results/${otherIds.result}/export?format=json`
    ]
    for (const p of paths) expect((await a.get(p)).status, p).toBe(404)
    expect((await a.patch(`${mine}/sets/${otherIds.set}`, { name: 'stolen' })).status).toBe(404)
    expect((await a.post(`${mine}/studies/${otherIds.study}/run`, {})).status).toBe(404)
    expect((await a.post(`${mine}/results/${otherIds.result}/approve`, {})).status).toBe(404)
    expect((await a.delete(`${mine}/sets/${otherIds.set}`)).status).toBe(404)
    // A study may not name a set of another workspace.
    const res = await a.post(`${mine}/studies`, { name: 'foreign set', spec: f2Spec(2), setIds: [otherIds.set] })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].message).toMatch(/no error set .* in this workspace/)
  })

  it('answers 404 for malformed ids instead of failing', async () => {
    const a = ws.owner.client
    for (const p of [`${base(ws)}/sets/not-a-uuid`, `${base(ws)}/studies/123`, `${base(ws)}/results/x/progress`]) {
      expect((await a.get(p)).status, p).toBe(404)
    }
  })
})
