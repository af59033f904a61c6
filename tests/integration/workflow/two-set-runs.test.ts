// Studies on two sets through the API and the worker: varySecondSet without a second set is a
// located 400 that stores nothing; two sets of one family are paired (identical sets give a ratio
// of exactly 1 with no band, and every export says the members were paired); a second set of
// another layout varies apart on request, with both sets' members run and the parts exported.
import { and, count, eq } from 'drizzle-orm'
import { beforeAll, describe, expect, it } from 'vitest'
import { testDB, tables as t } from '../../support/db'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { toySetBytes, uploadSet, waitForResult } from './helpers'

let ws: TestWorkspace
let a: string
let b: string
let small: string
const api = () => `/api/workspaces/${ws.id}`
// F₂ on the second set's "nucleus" Z = 1, A = 1 (a proton) over F₂ on the main set's proton.
const ratioSpec = (extra: Record<string, unknown> = {}) => ({
  kernel: 'nuclear-ratio', options: { base: 'dis-nc-f2', nucleus: { z: 1, a: 1 } },
  bins: [{ x: 0.001, q2: 10 }, { x: 0.05, q2: 30 }, { x: 0.3, q2: 100 }], ...extra
})

beforeAll(async () => {
  ws = await createWorkspace('Two-set desk')
  // The same TOY numbers under two names: one family (sheaf-toy), one layout → paired.
  a = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'pair-a', errorMembers: 4 }).bytes)).id
  b = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'pair-b', errorMembers: 4 }).bytes)).id
  small = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'pair-small', errorMembers: 2 }).bytes)).id
})

async function run(name: string, spec: unknown, second: string) {
  const created = await ws.analyst.client.post(`${api()}/studies`, { name, spec, setIds: [a], secondSetId: second, clPercent: 68 })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  const started = await ws.analyst.client.post(`${api()}/studies/${created.body.id}/run`, {})
  expect(started.status, JSON.stringify(started.body)).toBe(202)
  const id = started.body.results[0].id as string
  const ended = await waitForResult(ws.analyst.client, ws.id, id)
  expect(ended.state, ended.error ?? '').toBe('done')
  return { id, progress: ended.progress }
}
const exported = async (id: string, format: string) => (await ws.viewer.client.get(`${api()}/results/${id}/export?format=${format}`)).body as string
/** The JSON export (the client parses JSON answers itself). */
const exportedJson = async (id: string) => (await ws.viewer.client.get(`${api()}/results/${id}/export?format=json`)).body as { provenance: { secondSet?: unknown } }

describe('studies on two sets', () => {
  it('refuses varySecondSet without a second set, located at the field, and stores nothing', async () => {
    const res = await ws.analyst.client.post(`${api()}/studies`, { name: 'vary nothing', spec: ratioSpec({ varySecondSet: true }), setIds: [a] })
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/varySecondSet: the study has no second set to vary/)
    expect(res.body.data.issues).toContainEqual(expect.objectContaining({ path: ['varySecondSet'] }))
    const [row] = await testDB().select({ n: count() }).from(t.studies).where(and(eq(t.studies.workspaceId, ws.id), eq(t.studies.name, 'vary nothing')))
    expect(row!.n).toBe(0)
  })

  it('pairs two sets of one family: identical sets give a ratio of exactly 1 with no band, labelled in every export', async () => {
    const { id, progress } = await run('paired', ratioSpec(), b)
    expect(progress.total).toBe(9)
    const result = (await ws.viewer.client.get(`${api()}/results/${id}`)).body
    expect(result.second).toMatchObject({ id: b, variation: 'paired', memberCount: 9 })
    expect(result.bands.central).toEqual([1, 1, 1])
    expect(result.bands.plus).toEqual([0, 0, 0])
    expect(result.bands.minus).toEqual([0, 0, 0])
    const csv = await exported(id, 'csv')
    expect(csv).toContain('# second set: pair-b version 1 (hessian-pairs, family sheaf-toy); correlated: members paired')
    expect(csv).toMatch(/bands: hessian-symmetric = PDF, [^;]+ \(correlated: members paired\)/)
    expect(await exported(id, 'latex')).toContain('correlated: members paired')
    expect((await exportedJson(id)).provenance.secondSet).toMatchObject({ variation: 'paired' })
  })

  it('varies a second set of another layout apart on request: both sets\' members, the parts and their combination exported', async () => {
    const held = await run('held', ratioSpec(), small)
    expect(held.progress.total).toBe(9)
    const { id, progress } = await run('apart', ratioSpec({ varySecondSet: true }), small)
    expect(progress.total).toBe(9 + 5 - 1)
    const result = (await ws.viewer.client.get(`${api()}/results/${id}`)).body
    expect(result.second).toMatchObject({ variation: 'apart' })
    const heldBands = (await ws.viewer.client.get(`${api()}/results/${held.id}`)).body.bands
    expect(result.bands.apart.set.plus).toEqual(heldBands.plus)
    result.bands.plus.forEach((p: number, i: number) => expect(p).toBeCloseTo(Math.hypot(result.bands.apart.set.plus[i], result.bands.apart.second.plus[i]), 12))
    const csv = await exported(id, 'csv')
    expect(csv).toContain('sets varied apart, combined in quadrature')
    expect(csv).toContain('plus[hessian-symmetric-set]')
    expect(csv).toContain('plus[hessian-symmetric-second]')
    // Covariance: the two parts' covariances added; its diagonal is the combined symmetric band².
    const covariance = (await exported(id, 'covariance')).split('\r\n').filter(l => l && !l.startsWith('#'))
    const diagonal = covariance.slice(1).map((line, i) => Number(line.split(',')[i + 1]))
    diagonal.forEach((v, i) => expect(Math.sqrt(v)).toBeCloseTo(result.bands.plus[i], 10))
  })
})
