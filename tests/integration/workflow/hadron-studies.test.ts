// Studies with fragmentation functions through the API: which set slot takes which density
// (located 400s naming setIds[i] / secondSetId), a semi-inclusive multiplicity run on the queue
// with the fragmentation set as second set, and the hadron demo studies of the seed on TOY sets.
// The TOY sets are invented shapes written by the engine (not fits); the fragmentation ones are
// set files whose header says they hold fragmentation functions into one hadron.
import { eq } from 'drizzle-orm'
import { beforeAll, describe, expect, it } from 'vitest'
import { testDB, tables as t } from '../../support/db'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { bytesToFloat64 } from '../../../server/domain/results/float64'
import { loadErrorSet } from '../../../server/domain/sets/store'
import { kernelContextOf } from '../../../server/domain/studies/check'
import { evaluateDirect } from '../../../shared/physics/study/direct'
import { parseStudySpec } from '../../../shared/physics/study/spec'
import type { HadronSpecies } from '../../../shared/physics/fragmentation/species'
import { ANNIHILATION_DEMO, SIDIS_DEMO, seedHadronStudies } from '../../../scripts/seed/hadron-studies'
import { toySetBytes, uploadSet, waitForResult } from './helpers'

let ws: TestWorkspace
let pdf: string
let pion: string
let kaon: string
const api = () => `/api/workspaces/${ws.id}`
const db = testDB()

/** Uploads a TOY set file of fragmentation functions into `hadron`. */
async function fragmentationSet(name: string, hadron: HadronSpecies) {
  return (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name, errorMembers: 2, density: { type: 'fragmentation', hadron } }).bytes)).id
}

beforeAll(async () => {
  ws = await createWorkspace('Hadron desk')
  pdf = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'toy-pdf', errorMembers: 3 }).bytes)).id
  pion = await fragmentationSet('toy-ff-pi+', 'pi+')
  kaon = await fragmentationSet('toy-ff-K+', 'K+')
})

const sidis = { kernel: 'sidis-multiplicity', options: { target: { type: 'nucleus', z: 1, a: 2 } }, bins: [{ x: 0.1, zMin: 0.3, zMax: 0.5, q2: 10 }, { x: 0.2, z: 0.4, q2: 20 }] }

describe('which set slot takes which density', () => {
  it('refuses fragmentation sets as main sets of a multiplicity and parton densities as its second set, naming each field', async () => {
    const res = await ws.analyst.client.post(`${api()}/studies`, { name: 'swapped', spec: sidis, setIds: [pion], secondSetId: pdf })
    expect(res.status).toBe(400)
    expect(res.body.statusMessage).toMatch(/^2 sets do not fit their slots: setIds\[0\]: toy-ff-pi\+ \S+ holds fragmentation functions into π⁺, but the kernel sidis-multiplicity reads parton densities in its main sets/)
    expect(res.body.data.issues).toEqual([
      expect.objectContaining({ path: ['setIds', 0] }),
      { path: ['secondSetId'], message: expect.stringMatching(/^secondSetId: toy-pdf .* holds parton densities, but the kernel sidis-multiplicity reads fragmentation functions in its second set$/) }
    ])
  })

  it('needs the fragmentation set of a multiplicity, refuses one in a parton kernel and a second set where none is read', async () => {
    const missing = await ws.analyst.client.post(`${api()}/studies/validate`, { spec: sidis, setIds: [pdf] })
    expect(missing.status).toBe(400)
    expect(missing.body.data.issues).toEqual([{ path: ['secondSetId'], message: 'secondSetId: the kernel sidis-multiplicity needs a second set holding fragmentation functions' }])
    const f2 = await ws.analyst.client.post(`${api()}/studies`, { name: 'f2', spec: { kernel: 'dis-nc-f2', bins: [{ x: 0.1, q2: 10 }] }, setIds: [pdf, kaon] })
    expect(f2.status).toBe(400)
    expect(f2.body.data.issues).toEqual([expect.objectContaining({ path: ['setIds', 1], message: expect.stringMatching(/^setIds\[1\]: toy-ff-K\+ .* fragmentation functions into K⁺, but the kernel dis-nc-f2 reads parton densities/) })])
    const epem = await ws.analyst.client.post(`${api()}/studies`, { name: 'ee', spec: { kernel: 'epem-hadron', bins: [{ sqrtS: 91.2, z: 0.3 }] }, setIds: [pion], secondSetId: kaon })
    expect(epem.status).toBe(400)
    expect(epem.body.data.issues[0].message).toMatch(/^secondSetId: the kernel epem-hadron reads no second set; remove toy-ff-K\+/)
    const [count] = await db.select({ id: t.studies.id }).from(t.studies).where(eq(t.studies.workspaceId, ws.id))
    expect(count).toBeUndefined()
  })

  it('runs a multiplicity on the queue: the parton members vary with the fragmentation set central, then the fragmentation members with the parton set central', async () => {
    const created = await ws.analyst.client.post(`${api()}/studies`, { name: 'π⁺ on D', spec: sidis, setIds: [pdf], secondSetId: pion })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    expect(created.body).toMatchObject({ unit: '1', secondSetId: pion })
    const run = await ws.analyst.client.post(`${api()}/studies/${created.body.id}/run`, {})
    expect(run.status, JSON.stringify(run.body)).toBe(202)
    const [result] = run.body.results as Array<{ id: string }>
    expect((await waitForResult(ws.analyst.client, ws.id, result!.id)).state).toBe('done')
    const [stored] = await db.select().from(t.resultValues).where(eq(t.resultValues.resultId, result!.id))
    const values = bytesToFloat64(stored!.values)
    // The same study evaluated directly (no plan) on the stored sets: the worker's plumbing, not physics.
    const main = await loadErrorSet(db, pdf)
    const second = await loadErrorSet(db, pion)
    const spec = parseStudySpec(sidis)
    const partonPart = evaluateDirect(spec, main, { ...kernelContextOf(main.header), second: { ...second, members: [second.members[0]!] } })
    // The fragmentation part: its error members (member 0 is the central pairing above).
    const fragmentationPart = evaluateDirect(spec, { ...main, members: [main.members[0]!] }, { ...kernelContextOf(main.header), second: { ...second, members: second.members.slice(1) } })
    const direct = [...partonPart, ...fragmentationPart]
    expect(values.length).toBe(direct.length)
    values.forEach((v, i) => expect(Math.abs(v - direct[i]!), `value ${i}`).toBeLessThanOrEqual(1e-10 * Math.abs(direct[i]!)))
    const csv = await ws.viewer.client.get(`${api()}/results/${result!.id}/export?format=csv`)
    expect(csv.status).toBe(200)
    expect(String(csv.body)).toContain('M^h')
    expect(String(csv.body)).toContain('Leading-order')
  })
})

describe('the hadron demo studies of the seed', () => {
  it('seedHadronStudies creates the multiplicity and e⁺e⁻ studies with finished results, and a second call changes nothing', async () => {
    const analystId = ws.analyst.id
    const sets = { partonSetId: pdf, pionSetId: pion, annihilationSetIds: [pion, kaon] }
    const first = await seedHadronStudies(db, { workspaceId: ws.id, analystId, sets })
    expect(first.studies.map(s => s.name)).toEqual([SIDIS_DEMO.name, ANNIHILATION_DEMO.name])
    expect(first.computed).toBe(3)
    const [multiplicity, annihilation] = first.studies
    expect(multiplicity).toMatchObject({ setIds: [pdf], secondSetId: pion, spec: { kernel: 'sidis-multiplicity', options: { target: { type: 'nucleus', z: 1, a: 2 } } } })
    expect(annihilation).toMatchObject({ setIds: [pion, kaon], secondSetId: null, spec: { kernel: 'epem-hadron' } })
    expect(new Set(annihilation!.spec.bins.map(b => b.sqrtS))).toEqual(new Set([10.58, 91.19]))
    const results = await db.select().from(t.results).where(eq(t.results.studyId, annihilation!.id))
    expect(results.map(r => r.state)).toEqual(['done', 'done'])
    const again = await seedHadronStudies(db, { workspaceId: ws.id, analystId, sets })
    expect(again.computed).toBe(0)
    expect(again.studies.map(s => s.id)).toEqual(first.studies.map(s => s.id))
  })

  it('refuses a parton-density set where the e⁺e⁻ study needs fragmentation functions', async () => {
    await expect(seedHadronStudies(db, { workspaceId: ws.id, analystId: ws.analyst.id, sets: { partonSetId: pdf, pionSetId: pion, annihilationSetIds: [pdf] } }))
      .rejects.toThrow(/KFR-03 .*setIds\[0\]: toy-pdf .* holds parton densities, but the kernel epem-hadron reads fragmentation functions/)
  })
})
