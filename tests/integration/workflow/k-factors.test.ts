// Per-bin K-factors through the API: a study created with K-factors is refused with the bin and
// column named when they are wrong (nothing stored), runs with every member K-scaled, and its
// result and exports report the K-factor uncertainty apart, the source and the caution.
import { and, count, eq } from 'drizzle-orm'
import { beforeAll, describe, expect, it } from 'vitest'
import { testDB, tables as t } from '../../support/db'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { bytesToFloat64 } from '../../../server/domain/results/float64'
import { K_FACTOR_CAUTION, RESULT_CAUTION } from '../../../shared/export/caution'
import { f2Spec, toySetBytes, uploadSet, waitForResult } from './helpers'

let ws: TestWorkspace
let hessian: string
const api = () => `/api/workspaces/${ws.id}`

beforeAll(async () => {
  ws = await createWorkspace('K-factor desk')
  hessian = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'kfac-h', errorMembers: 4 }).bytes)).id
})

async function runStudy(name: string, spec: unknown) {
  const created = await ws.analyst.client.post(`${api()}/studies`, { name, spec, setIds: [hessian], clPercent: 68 })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  const run = await ws.analyst.client.post(`${api()}/studies/${created.body.id}/run`, {})
  expect(run.status, JSON.stringify(run.body)).toBe(202)
  const id = run.body.results[0].id as string
  expect((await waitForResult(ws.analyst.client, ws.id, id)).state).toBe('done')
  const [row] = await testDB().select().from(t.resultValues).where(eq(t.resultValues.resultId, id))
  return { studyId: created.body.id as string, resultId: id, values: bytesToFloat64(row!.values) }
}

const studiesNamed = async (name: string) =>
  (await testDB().select({ n: count() }).from(t.studies).where(and(eq(t.studies.workspaceId, ws.id), eq(t.studies.name, name))))[0]!.n

describe('K-factors on a study', () => {
  it('refuses wrong K-factors with the bin and column named, and stores nothing', async () => {
    const cases: Array<[unknown, object]> = [
      [{ values: [1, 1] }, { column: 'kFactor', message: expect.stringMatching(/2 K-factors for 3 bins/) }],
      [{ values: [1, 0, 1] }, { bin: 2, column: 'kFactor', message: 'bin 2, column kFactor: a K-factor must be > 0' }],
      [{ values: [1, 1, 1], errors: [0, 0, -0.5] }, { bin: 3, column: 'kFactorError', message: expect.stringMatching(/^bin 3, column kFactorError: /) }],
      [{ values: [1, 'two', 1] }, { bin: 2, column: 'kFactor', message: expect.stringMatching(/must be a number/) }]
    ]
    for (const [kFactors, issue] of cases) {
      const res = await ws.analyst.client.post(`${api()}/studies`, { name: 'bad K', spec: { ...f2Spec(3), kFactors }, setIds: [hessian] })
      expect(res.status, JSON.stringify(kFactors)).toBe(400)
      expect(res.body.data.issues).toContainEqual(expect.objectContaining(issue))
    }
    expect(await studiesNamed('bad K')).toBe(0)
    // The same on an edit: refused, the saved study unchanged.
    const ok = await ws.analyst.client.post(`${api()}/studies`, { name: 'edit K', spec: f2Spec(3), setIds: [hessian] })
    const edit = await ws.analyst.client.patch(`${api()}/studies/${ok.body.id}`, { spec: { ...f2Spec(3), kFactors: { values: [1, 1, 1, 1] } } })
    expect(edit.status).toBe(400)
    expect(edit.body.data.issues[0].message).toMatch(/4 K-factors for 3 bins/)
    expect((await ws.viewer.client.get(`${api()}/studies/${ok.body.id}`)).body).toMatchObject({ revision: 1 })
    expect((await ws.viewer.client.get(`${api()}/studies/${ok.body.id}`)).body.spec.kFactors).toBeUndefined()
  })

  it('K = 1 leaves every stored value and band as without K-factors', async () => {
    const plain = await runStudy('no K', f2Spec(3))
    const ones = await runStudy('K of 1', { ...f2Spec(3), kFactors: { values: [1, 1, 1] } })
    expect(Array.from(ones.values)).toEqual(Array.from(plain.values))
    const a = (await ws.viewer.client.get(`${api()}/results/${plain.resultId}`)).body
    const b = (await ws.viewer.client.get(`${api()}/results/${ones.resultId}`)).body
    expect(b.bands).toEqual(a.bands)
    expect(b.scaleVariation).toEqual(a.scaleVariation)
    expect(a.kFactors).toBeNull()
    expect(a.caution).toBe(RESULT_CAUTION)
    expect(b.caution).toBe(`${RESULT_CAUTION} ${K_FACTOR_CAUTION}`)
  })

  it('runs with every member K-scaled, reports δK apart and in quadrature on request, and exports it all', async () => {
    const plain = await runStudy('plain for K', f2Spec(3))
    const k = { values: [1.2, 0.9, 1.5], errors: [0.06, 0, 0.15], source: 'NNLO/LO ratios, our note 7', addErrorInQuadrature: true }
    const scaled = await runStudy('with K', { ...f2Spec(3), kFactors: k })
    const members = plain.values.length / 3
    for (let m = 0; m < members; m++) {
      for (let i = 0; i < 3; i++) expect(scaled.values[m * 3 + i]).toBe(plain.values[m * 3 + i]! * k.values[i]!)
    }
    const detail = (await ws.viewer.client.get(`${api()}/results/${scaled.resultId}`)).body
    expect(detail.spec.kFactors).toEqual(k)
    const central = detail.bands.central as number[]
    const plainCentral = (await ws.viewer.client.get(`${api()}/results/${plain.resultId}`)).body.bands.central as number[]
    central.forEach((c, i) => expect(c).toBeCloseTo(plainCentral[i]! * k.values[i]!, 12))
    // δX = |X'| δK/K at 68% CL: |X'|·0.05, 0, |X'|·0.1; added in quadrature to the PDF band as asked.
    expect(detail.kFactors).toMatchObject({ values: k.values, errors: k.errors, source: k.source, addedInQuadrature: true })
    const err = detail.kFactors.error as number[]
    ;[0.05, 0, 0.1].forEach((r, i) => expect(err[i]).toBeCloseTo(Math.abs(central[i]!) * r, 12))
    detail.kFactors.combined.plus.forEach((p: number, i: number) => expect(p).toBeCloseTo(Math.hypot(detail.bands.plus[i], err[i]!), 12))

    const csv = (await ws.viewer.client.get(`${api()}/results/${scaled.resultId}/export?format=csv`)).body as string
    expect(csv).toContain('# K-factors: per-bin K-factors multiply every member before the bands')
    expect(csv).toContain('source: NNLO/LO ratios, our note 7')
    expect(csv).toContain(K_FACTOR_CAUTION)
    expect(csv).toMatch(/\nx,q2,kFactor,kFactorError,central\[hessian-symmetric\].*central\[k-factor\].*central\[pdf\+k-factor\]/)
    const json = (await ws.viewer.client.get(`${api()}/results/${scaled.resultId}/export?format=json`)).body
    expect(json.provenance.kFactors).toEqual({ source: k.source, withErrors: true, addedInQuadrature: true })
    expect(json.bins[0].kinematics).toMatchObject({ kFactor: 1.2, kFactorError: 0.06 })
    expect(json.bins[0].values['k-factor'].plus).toBeCloseTo(err[0]!, 12)
    const tex = (await ws.viewer.client.get(`${api()}/results/${scaled.resultId}/export?format=latex`)).body as string
    expect(tex).toContain('K-factors')
    expect(tex).toContain('Leading-order prediction')
    // The study's export of all its sets says the same.
    const study = (await ws.viewer.client.get(`${api()}/studies/${scaled.studyId}/export?format=csv`)).body as string
    expect(study).toContain('K-factors: per-bin K-factors')
    expect(study).toContain(K_FACTOR_CAUTION)
  })
})
