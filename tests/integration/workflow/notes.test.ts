// What a physicist takes into a note and what a first user meets: the observable named from the
// bin layout (a unit-changing mix refused, located), all of a study's sets side by side in CSV,
// JSON and LaTeX with provenance and caution, and a new workspace's first run (example sets,
// sample files).
import { beforeAll, describe, expect, it } from 'vitest'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { ApiClient } from '../../support/http'
import { toySetBytes, uploadSet, waitForResult } from './helpers'

let ws: TestWorkspace
let hessian: string
let replicas: string
const api = () => `/api/workspaces/${ws.id}`

beforeAll(async () => {
  ws = await createWorkspace('Note desk')
  hessian = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'note-h', errorMembers: 4 }).bytes)).id
  replicas = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'note-r', kind: 'replicas', errorMembers: 20 }).bytes)).id
})

describe('the observable from the bin layout', () => {
  it('refuses a study whose bins change the unit (F₂ at a Q² point beside ∫ F₂ dQ²), naming bin and column', async () => {
    const res = await ws.analyst.client.post(`${api()}/studies`, {
      name: 'mixed', setIds: [hessian],
      spec: { kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }, { x: 0.01, q2Min: 10, q2Max: 20 }] }
    })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0]).toMatchObject({ bin: 2, column: 'q2Min' })
    expect(res.body.data.issues[0].message).toMatch(/^bin 2, column q2Min: this bin gives ∫ F₂ dQ² \[GeV²\] but bin 1 gives F₂ \[dimensionless\]/)
  })
})

describe('all of a study\'s sets side by side', () => {
  let studyId: string
  beforeAll(async () => {
    const created = await ws.analyst.client.post(`${api()}/studies`, {
      name: 'Side by side', setIds: [hessian, replicas],
      spec: { kernel: 'dis-nc-f2', bins: [{ xMin: 0.01, xMax: 0.02, q2: 10 }, { xMin: 0.02, xMax: 0.05, q2: 10 }, { xMin: 0.05, xMax: 0.1, q2: 10 }] }
    })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    studyId = created.body.id
    expect((await ws.viewer.client.get(`${api()}/studies/${studyId}/export?format=csv`)).status).toBe(409)
    const run = await ws.analyst.client.post(`${api()}/studies/${studyId}/run`, {})
    for (const r of run.body.results) expect((await waitForResult(ws.analyst.client, ws.id, r.id)).state).toBe('done')
  })

  it('writes CSV and JSON with each set\'s columns, provenance and the caution', async () => {
    const csv = await ws.viewer.client.get(`${api()}/studies/${studyId}/export?format=csv`)
    expect(csv.status).toBe(200)
    expect(csv.headers.get('content-disposition')).toMatch(/Side_by_side-all-sets\.csv/)
    const text = csv.body as string
    expect(text).toContain('# observable: ∫ F₂ dx')
    expect(text).toMatch(/# set note-h-\S+: note-h version \S+ \(hessian-pairs/)
    expect(text).toMatch(/# set note-r-\S+: note-r version \S+ \(replicas/)
    expect(text).toContain('# caution: Leading-order prediction')
    const head = text.split('\r\n').find(l => !l.startsWith('#'))!
    expect(head).toMatch(/^xMin,xMax,q2,central\[note-\w-[^\]]+\]/)
    expect(head.match(/central\[/g)).toHaveLength(2)
    const json = await ws.viewer.client.get(`${api()}/studies/${studyId}/export?format=json`)
    expect(json.body).toMatchObject({ format: 'sheaf-study-sets', study: { name: 'Side by side' }, caution: expect.stringMatching(/^Leading-order/) })
    expect(json.body.sets).toHaveLength(2)
    expect(json.body.bins).toHaveLength(3)
  })

  it('writes one LaTeX table with a column per set, a key and PDG rounding', async () => {
    const tex = (await ws.viewer.client.get(`${api()}/studies/${studyId}/export?format=latex`)).body as string
    expect(tex).toContain('\\begin{table}')
    expect(tex).toMatch(/Columns \(a\) note-\w \S+, .*; \(b\) note-\w \S+, /)
    expect(tex).toContain('$x_{\\min}$ & $x_{\\max}$ & $Q^{2}$ [GeV$^{2}$] & (a) & (b)')
    expect(tex).toContain('Leading-order prediction')
    expect(tex).not.toContain('\\_F')
    const bad = await ws.viewer.client.get(`${api()}/studies/${studyId}/export?format=pdf`)
    expect(bad.status).toBe(400)
  })
})

describe('a new workspace\'s first run', () => {
  it('adds the example sets once and lets a first study run on them', async () => {
    const fresh = await createWorkspace('First run desk')
    const base = `/api/workspaces/${fresh.id}`
    expect((await fresh.viewer.client.post(`${base}/sets/examples`, {})).status).toBe(403)
    const first = await fresh.analyst.client.post(`${base}/sets/examples`, {})
    expect(first.status).toBe(201)
    expect(first.body.added).toBe(2)
    expect(first.body.sets.map((s: { name: string }) => s.name).sort()).toEqual(['toy-hessian', 'toy-replicas'])
    const again = await fresh.analyst.client.post(`${base}/sets/examples`, {})
    expect(again.status).toBe(200)
    expect(again.body.added).toBe(0)
    expect((await fresh.viewer.client.get(`${base}/sets`)).body.sets).toHaveLength(2)
    const setIds = first.body.sets.map((s: { id: string }) => s.id)
    const study = await fresh.analyst.client.post(`${base}/studies`, { name: 'first', setIds, spec: { kernel: 'dis-nc-f2', bins: [{ x: 0.01, q2: 10 }] } })
    expect(study.status, JSON.stringify(study.body)).toBe(201)
  })

  it('serves the listed sample files to signed-in users only, and nothing else', async () => {
    const ok = await ws.viewer.client.get('/api/samples/bins/w-rapidity.csv')
    expect(ok.status).toBe(200)
    expect(ok.headers.get('content-type')).toMatch(/text\/csv/)
    expect((await ws.viewer.client.get('/api/samples/bins/..%2F..%2Fpackage.json')).status).toBe(404)
    expect((await ws.viewer.client.get('/api/samples/constructor/x')).status).toBe(404)
    expect((await new ApiClient().get('/api/samples/bins/w-rapidity.csv')).status).toBe(401)
  })
})
