// The demo scenario that npm start seeds (scripts/seed/02-demo-sets.ts, 03-demo-studies.ts), run
// the way npm start runs it, on the test database: the invented sets as the engine builds them,
// the studies with finished results, bands that the engine gives again from the stored member
// values, the samples/bins files as the bins grid imports them, and a second run that changes
// nothing. Everything here is invented demo data; no value below is a published number.
import { execFileSync } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { and, count, eq, inArray } from 'drizzle-orm'
import { beforeAll, describe, expect, it } from 'vitest'
import { DEMO_USERS, DEMO_WORKSPACE } from '../../scripts/seed/01-demo-users'
import { DEMO_FAMILY, DEMO_FRAGMENTATION, DEMO_SETS } from '../../scripts/seed/02-demo-sets'
import { DEMO_STUDIES } from '../../scripts/seed/03-demo-studies'
import { bytesToFloat64 } from '../../server/domain/results/float64'
import { loadErrorSet } from '../../server/domain/sets/store'
import { kernelContextOf, pairRoles } from '../../server/domain/studies/check'
import { importBinsCsv } from '../../shared/bins'
import { kernelDefinition } from '../../shared/physics/kernels/registry'
import { evaluateDirect } from '../../shared/physics/study/direct'
import { kernelVariables, type StudySpec } from '../../shared/physics/study/spec'
import type { SetHeader } from '../../shared/physics/types'
import { computeBands, isPrescription } from '../../shared/physics/uncertainty/bands'
import { binsFromRows, domainCheck, gridColumns, layoutsOf } from '../../stores/study-view'
import { tables as t, testDB } from '../support/db'
import { ApiClient } from '../support/http'

const root = fileURLToPath(new URL('../..', import.meta.url))
const db = testDB()

/** Runs the whole seed as npm start does (a child process); its wall time in ms. */
function seed() {
  const started = performance.now()
  execFileSync(`${root}node_modules/.bin/tsx`, ['scripts/seed.ts'], { cwd: root, env: process.env, encoding: 'utf8' })
  return performance.now() - started
}

/** Relative agreement scaled by the larger magnitude. */
const close = (a: number, b: number, rel: number) => Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b), 1e-300)
const fit = (file: string) => JSON.parse(readFileSync(`${root}samples/fits/${file}`, 'utf8'))
const sample = (path: string) => readFileSync(`${root}samples/${path}`, 'utf8')

let workspaceId: string
let before: unknown
let after: unknown

/** Every row the demo steps write, with the columns that would change if something were redone. */
async function snapshot() {
  const sets = await db.select({ id: t.errorSets.id, sha256: t.errorSets.sha256, updatedAt: t.errorSets.updatedAt })
    .from(t.errorSets).where(eq(t.errorSets.workspaceId, workspaceId)).orderBy(t.errorSets.id)
  const studies = await db.select({ id: t.studies.id, revision: t.studies.revision, updatedAt: t.studies.updatedAt })
    .from(t.studies).where(eq(t.studies.workspaceId, workspaceId)).orderBy(t.studies.id)
  const studyIds = studies.map(s => s.id)
  const results = await db.select({ id: t.results.id, state: t.results.state, reviewState: t.results.reviewState, finishedAt: t.results.finishedAt, updatedAt: t.results.updatedAt })
    .from(t.results).where(inArray(t.results.studyId, studyIds)).orderBy(t.results.id)
  const resultIds = results.map(r => r.id)
  const counted = async (table: typeof t.resultValues | typeof t.resultBands | typeof t.resultReviews) =>
    (await db.select({ n: count() }).from(table).where(inArray(table.resultId, resultIds)))[0]!.n
  return {
    sets, studies, results,
    values: await db.select({ id: t.resultValues.resultId, createdAt: t.resultValues.createdAt }).from(t.resultValues).where(inArray(t.resultValues.resultId, resultIds)).orderBy(t.resultValues.resultId),
    bands: await counted(t.resultBands),
    reviews: await counted(t.resultReviews),
    measurements: (await db.select({ n: count() }).from(t.measurements).where(inArray(t.measurements.studyId, studyIds)))[0]!.n,
    audit: (await db.select({ n: count() }).from(t.auditEvents).where(eq(t.auditEvents.workspaceId, workspaceId)))[0]!.n
  }
}

async function demoStudy(name: string) {
  const [study] = await db.select().from(t.studies).where(and(eq(t.studies.workspaceId, workspaceId), eq(t.studies.name, name)))
  return study!
}

const setByName = async (name: string) => (await db.select().from(t.errorSets).where(and(eq(t.errorSets.workspaceId, workspaceId), eq(t.errorSets.name, name))))[0]!

beforeAll(async () => {
  const first = seed()
  const [ws] = await db.select({ id: t.workspaces.id }).from(t.workspaces).innerJoin(t.users, eq(t.users.id, t.workspaces.createdBy))
    .where(and(eq(t.workspaces.name, DEMO_WORKSPACE), eq(t.users.email, DEMO_USERS[0]!.email)))
  workspaceId = ws!.id
  before = await snapshot()
  const second = seed()
  after = await snapshot()
  console.log(`[seed-demo] first run ${Math.round(first)} ms (building unless another test seeded first), second run ${Math.round(second)} ms`)
}, 180_000)

describe('demo seed', () => {
  it('is idempotent: a second run adds, changes and recomputes nothing', () => {
    // Its wall time is printed above; timings belong in the benchmarks, not in a test.
    expect(after).toEqual(before)
  })

  it('builds the invented proton sets and the A-dependent nuclear family for C, Ar, Fe and Pb with the engine from samples/fits', async () => {
    const quillon = fit('quillon-22.json')
    const brindle = fit('brindle-mc-1.json')
    const ostrand = fit('ostrand-25.json')
    // Invented fits: 21 Quillon parameters and 11 Ostrand-25 parameters as their descriptions say.
    expect(quillon.parameters).toHaveLength(21)
    expect(ostrand.parameters).toHaveLength(11)
    const symbol: Record<number, string> = { 6: 'C', 18: 'Ar', 26: 'Fe', 82: 'Pb' }
    const expected = [
      { name: quillon.name, version: quillon.version, kind: 'hessian-pairs', members: 1 + 2 * quillon.parameters.length, cl: 90, target: { type: 'proton' } },
      { name: brindle.name, version: brindle.version, kind: 'replicas', members: 1 + brindle.members.count, cl: 68, target: { type: 'proton' } },
      ...DEMO_FAMILY.nuclei.map(n => ({
        name: `${ostrand.name}-${symbol[n.z]}${n.a}`, version: ostrand.version, kind: 'hessian-pairs', members: 1 + 2 * ostrand.parameters.length, cl: 68, target: { type: 'nucleus', z: n.z, a: n.a }
      }))
    ]
    expect(DEMO_SETS).toHaveLength(2)
    expect(DEMO_FAMILY.nuclei.map(n => symbol[n.z])).toEqual(['C', 'Ar', 'Fe', 'Pb'])
    const [analyst] = await db.select({ id: t.users.id }).from(t.users).where(eq(t.users.email, DEMO_USERS[1]!.email))
    for (const e of expected) {
      const row = await setByName(e.name)
      expect(row, e.name).toMatchObject({ version: e.version, kind: e.kind, memberCount: e.members, confidenceLevelPercent: e.cl, target: e.target, origin: 'build', addedBy: analyst!.id })
      // The grid covers the demo kinematics: x down to 1e-5, Q² up to 1e8 GeV².
      expect(row.xMin).toBeLessThanOrEqual(1e-5 * (1 + 1e-12))
      expect(row.q2Max).toBeGreaterThanOrEqual(1e8 * (1 - 1e-12))
      const set = await loadErrorSet(db, row.id)
      expect(set.members).toHaveLength(e.members)
      expect(set.header.kind).toBe(e.kind)
      expect(set.header.confidenceLevelPercent).toBe(e.cl)
    }
    const brindleSet = await loadErrorSet(db, (await setByName(brindle.name)).id)
    expect(brindleSet.header.provenance).toContain(`seed ${brindle.members.seed}`)
    // Each nucleus's set says which nucleus and which A-dependence it was built with.
    const ironRow = await setByName(`${ostrand.name}-Fe56`)
    const ironSet = await loadErrorSet(db, ironRow.id)
    expect(ironSet.header.family).toBe(ostrand.family)
    expect(ironSet.header.provenance).toMatch(/nucleus Z = 26, A = 56 from family Ostrand .*A-dependence/)
    // The neutrino iron studies run on the iron set.
    for (const name of ['KNU-04 · ν Fe charged-current F₂', 'KNU-04 · ν Fe charged-current xF₃']) expect((await demoStudy(name)).setIds).toContain(ironRow.id)
  })

  it('builds the invented fragmentation family Verrel-FF-26 (π⁺, π⁻, K⁺, K⁻) with timelike evolution, π⁻ and K⁻ the charge conjugates of π⁺ and K⁺', async () => {
    expect(DEMO_FRAGMENTATION.fits.map(f => fit(f.fit).name)).toEqual(['Verrel-FF-26-pi+', 'Verrel-FF-26-pi-', 'Verrel-FF-26-K+', 'Verrel-FF-26-K-'])
    const sets = new Map<string, Awaited<ReturnType<typeof loadErrorSet>>>()
    for (const f of DEMO_FRAGMENTATION.fits) {
      const doc = fit(f.fit)
      const row = await setByName(doc.name)
      expect(row, doc.name).toMatchObject({ family: 'Verrel-FF-26', version: doc.version, kind: 'hessian-pairs', memberCount: 1 + 2 * doc.parameters.length, confidenceLevelPercent: 90, origin: 'build' })
      const set = await loadErrorSet(db, row.id)
      expect(set.header.density).toEqual({ type: 'fragmentation', hadron: doc.density.hadron })
      expect(set.header.provenance).toMatch(/fragmentation functions z·D.*timelike.*rough/)
      sets.set(doc.density.hadron, set)
    }
    // Charge conjugation D_q^{h̄}(z, Q²) = D_q̄^{h}(z, Q²) on every member, node and flavour: the
    // documents conjugate the flavours, and LO evolution treats q and q̄ alike (exact to rounding).
    for (const [h, hbar] of [['pi+', 'pi-'], ['K+', 'K-']] as const) {
      const a = sets.get(h)!
      const b = sets.get(hbar)!
      const nf = a.flavours.length
      const partner = a.flavours.map(f => b.flavours.indexOf(f === 21 ? 21 : -f))
      let worst = 0
      a.members.forEach((m, k) => {
        for (let i = 0; i < m.length; i++) {
          const other = b.members[k]![i - (i % nf) + partner[i % nf]!]!
          worst = Math.max(worst, Math.abs(m[i]! - other) / Math.max(Math.abs(m[i]!), 1e-300))
        }
      })
      expect(worst, `${h} against ${hbar}`).toBeLessThanOrEqual(1e-12)
    }
  })

  it('stores every demo study with a finished result on each of its sets', async () => {
    const names = DEMO_STUDIES.map(d => d.name)
    const studies = await db.select().from(t.studies).where(and(eq(t.studies.workspaceId, workspaceId), inArray(t.studies.name, names)))
    expect(studies.map(s => s.name).sort()).toEqual([...names].sort())
    for (const d of DEMO_STUDIES) {
      const study = studies.find(s => s.name === d.name)!
      expect(study.description).toContain('Demo data')
      expect(study.setIds).toHaveLength(d.sets.length)
      const results = await db.select().from(t.results).where(eq(t.results.studyId, study.id))
      for (const setId of study.setIds) {
        const done = results.filter(r => r.setId === setId && r.state === 'done')
        expect(done, `${d.name} on ${setId}`).toHaveLength(1)
        expect(done[0]!.binCount).toBe((study.spec as StudySpec).bins.length)
      }
    }
    const kernels = new Set(studies.map(s => (s.spec as StudySpec).kernel))
    for (const k of ['dis-cc-f2', 'dis-cc-xf3', 'drell-yan', 'w-charge-asymmetry', 'w-plus', 'w-minus', 'nuclear-ratio']) expect(kernels).toContain(k)
  })

  it('stores bands that computeBands gives again from the stored member values', async () => {
    const studies = await db.select().from(t.studies).where(eq(t.studies.workspaceId, workspaceId))
    const results = await db.select().from(t.results).where(inArray(t.results.studyId, studies.map(s => s.id)))
    let checked = 0
    for (const r of results) {
      const [set] = await db.select({ header: t.errorSets.header }).from(t.errorSets).where(eq(t.errorSets.id, r.setId))
      const header = set!.header as SetHeader
      const [stored] = await db.select().from(t.resultValues).where(eq(t.resultValues.resultId, r.id))
      const matrix = { members: stored!.memberCount, bins: stored!.binCount, values: bytesToFloat64(stored!.values) }
      const bands = await db.select().from(t.resultBands).where(eq(t.resultBands.resultId, r.id))
      expect(bands.length).toBeGreaterThan(0)
      for (const b of bands) {
        expect(isPrescription(b.prescription)).toBe(true)
        const fresh = computeBands(matrix, { kind: header.kind, prescription: b.prescription as never, clFrom: header.confidenceLevelPercent, clTo: b.clPercent, alphasMembers: header.alphasMembers })
        const json = b.bands
        for (const key of ['central', 'plus', 'minus'] as const) {
          expect(json[key]).toHaveLength(matrix.bins)
          json[key].forEach((v, i) => expect(close(v, fresh[key][i]!, 1e-12), `${r.id} ${b.prescription} ${key}[${i}]`).toBe(true))
        }
        checked++
      }
    }
    expect(checked).toBeGreaterThanOrEqual(2 * results.length)
  })

  it('reports the 90% CL Hessian set at 68% CL with the symmetric formula divided by 1.64485', async () => {
    // ΔX = ½ √(Σ_k (X_k⁺ − X_k⁻)²) (Nadolsky & Sullivan, hep-ph/0110378, eq. 3); a 90% two-sided
    // Gaussian interval is ±1.64485σ (PDG Review of Particle Physics 2024, "Statistics", table of
    // Gaussian coverage — from memory), so the 68% band is the 90% one divided by 1.64485.
    const study = await demoStudy('KHM-13 · High-mass Drell–Yan background')
    const quillon = await setByName('Quillon-22')
    const [r] = await db.select().from(t.results).where(and(eq(t.results.studyId, study.id), eq(t.results.setId, quillon.id), eq(t.results.state, 'done')))
    const [stored] = await db.select().from(t.resultValues).where(eq(t.resultValues.resultId, r!.id))
    const [band] = await db.select().from(t.resultBands).where(and(eq(t.resultBands.resultId, r!.id), eq(t.resultBands.prescription, 'hessian-symmetric')))
    expect(study.clPercent).toBe(68)
    expect(band!.clPercent).toBe(68)
    const v = bytesToFloat64(stored!.values)
    const bins = stored!.binCount
    const pairs = (stored!.memberCount - 1) / 2
    expect(pairs).toBe(21)
    for (let b = 0; b < bins; b++) {
      let sum = 0
      for (let k = 0; k < pairs; k++) sum += (v[(2 * k + 1) * bins + b]! - v[(2 * k + 2) * bins + b]!) ** 2
      const expected68 = 0.5 * Math.sqrt(sum) / 1.64485
      expect(close(band!.bands.plus[b]!, expected68, 1e-5), `bin ${b + 1}`).toBe(true)
    }
  })

  it('stores member values that direct interpolation of the stored set gives again', async () => {
    const studies = await db.select().from(t.studies).where(eq(t.studies.workspaceId, workspaceId))
    for (const study of studies) {
      const spec = study.spec as StudySpec
      const second = study.secondSetId ? await loadErrorSet(db, study.secondSetId) : null
      for (const setId of study.setIds) {
        const [r] = await db.select().from(t.results).where(and(eq(t.results.studyId, study.id), eq(t.results.setId, setId), eq(t.results.state, 'done')))
        const [stored] = await db.select().from(t.resultValues).where(eq(t.resultValues.resultId, r!.id))
        const values = bytesToFloat64(stored!.values)
        const roles = pairRoles(await loadErrorSet(db, setId), second)
        const context = kernelContextOf(roles.main.header as SetHeader)
        // Every member where the main set varies (with the second set's member of the same index
        // when the run paired them, else its central member); the central pairing where the nuclear set does.
        const paired = r!.specSnapshot.second?.variation === 'paired'
        const direct = roles.varyingRole === 'main'
          ? evaluateDirect(spec, roles.main, { ...context, ...(roles.second ? { second: { ...roles.second, members: paired ? roles.second.members : [roles.second.members[0]!] } } : {}) })
          : evaluateDirect(spec, { ...roles.main, members: [roles.main.members[0]!] }, { ...context, second: { ...roles.second!, members: [roles.second!.members[0]!] } })
        expect(direct.length).toBeLessThanOrEqual(values.length)
        direct.forEach((d, i) => expect(close(values[i]!, d, 1e-9), `${study.name} value ${i}`).toBe(true))
      }
    }
  })

  it('reads the samples/bins files into the studies\' bins with the grid\'s columns, and locates the bad cells', async () => {
    for (const d of DEMO_STUDIES) {
      const spec = (await demoStudy(d.name)).spec as StudySpec
      const variables = kernelVariables(kernelDefinition(spec.kernel), spec.options)
      const columns = gridColumns(variables, layoutsOf(variables, spec.bins))
      const read = importBinsCsv(sample(`bins/${d.binsFile}`), columns, { extraChecks: domainCheck(variables) })
      expect(read.errors, d.binsFile).toEqual([])
      expect(read.cellErrors, d.binsFile).toEqual([])
      expect(read.ignoredColumns).toEqual([])
      expect(binsFromRows(read.rows, columns)).toEqual(spec.bins)
    }
    const variables = kernelVariables(kernelDefinition('dis-cc-f2'), { beam: 'neutrino' })
    const columns = gridColumns(variables, { x: 'point', q2: 'point' })
    const bad = importBinsCsv(sample('bins/bad-x-above-one.csv'), columns, { extraChecks: domainCheck(variables) })
    expect(bad.errors).toEqual([])
    expect(bad.cellErrors).toEqual([
      expect.objectContaining({ line: 9, column: 'x', message: expect.stringContaining('x must be in (0, 1)') }),
      expect.objectContaining({ line: 11, column: 'q2', message: expect.stringContaining('\'thirty\' is not a number') })
    ])
  })

  it('shows reviews and a χ² against the pseudo-measurement to the demo viewer', async () => {
    const viewer = new ApiClient()
    await viewer.signIn(DEMO_USERS[2]!.email, DEMO_USERS[2]!.password)
    const dy = await demoStudy('KHM-13 · High-mass Drell–Yan background')
    const list = await viewer.get(`/api/workspaces/${workspaceId}/studies/${dy.id}/measurements`)
    expect(list.status).toBe(200)
    expect(list.body.measurements).toHaveLength(1)
    const m = list.body.measurements[0]
    expect(m.pointCount).toBe((dy.spec as StudySpec).bins.length)
    const chi2 = await viewer.get(`/api/workspaces/${workspaceId}/studies/${dy.id}/measurements/${m.id}/chi2`)
    expect(chi2.status).toBe(200)
    expect(chi2.body.sets).toHaveLength(2)
    for (const s of chi2.body.sets) {
      expect(s.error).toBeNull()
      expect(s.experimental.points).toBe(m.pointCount)
      expect(Number.isFinite(s.experimental.chi2) && s.experimental.chi2 > 0).toBe(true)
      // Adding the PDF covariance can only lower χ² (a larger covariance).
      expect(s.withPdf.chi2).toBeLessThanOrEqual(s.experimental.chi2 + 1e-9)
    }
    // The same files uploaded as the form sends them, saying the matrix is of the systematic
    // errors, give the seeded measurement's χ² on every set; read as a matrix of the total errors
    // (what the form used to assume) they give another χ².
    const analyst = new ApiClient()
    await analyst.signIn(DEMO_USERS[1]!.email, DEMO_USERS[1]!.password)
    const url = `/api/workspaces/${workspaceId}/studies/${dy.id}/measurements`
    const files = { csv: sample('measurements/drell-yan-high-mass-pseudodata.csv'), correlation: sample('measurements/drell-yan-high-mass-correlation.csv') }
    const syst = await analyst.post(url, { name: 'uploaded, syst', ...files, correlationOf: 'syst', systCombination: 'uncorrelated' })
    expect(syst.status, JSON.stringify(syst.body)).toBe(201)
    const total = await analyst.post(url, { name: 'uploaded, total', ...files, correlationOf: 'total' })
    expect(total.status).toBe(201)
    const bySet = async (id: string) => new Map(((await viewer.get(`${url}/${id}/chi2`)).body.sets as Array<{ setId: string, experimental: { chi2: number } }>).map(s => [s.setId, s.experimental.chi2]))
    const seeded = new Map((chi2.body.sets as Array<{ setId: string, experimental: { chi2: number } }>).map(s => [s.setId, s.experimental.chi2]))
    const viaForm = await bySet(syst.body.id)
    const asTotal = await bySet(total.body.id)
    for (const [setId, value] of seeded) {
      expect(close(viaForm.get(setId)!, value, 1e-9)).toBe(true)
      expect(close(asTotal.get(setId)!, value, 0.05)).toBe(false)
    }
    for (const id of [syst.body.id, total.body.id]) expect((await analyst.delete(`${url}/${id}`)).status).toBe(200)
    const states = await db.select({ state: t.results.reviewState, studyId: t.results.studyId }).from(t.results)
      .innerJoin(t.studies, eq(t.studies.id, t.results.studyId)).where(eq(t.studies.workspaceId, workspaceId))
    expect(states.filter(s => s.state === 'submitted').length).toBeGreaterThanOrEqual(1)
    expect(states.filter(s => s.state === 'approved').length).toBeGreaterThanOrEqual(1)
    const asym = await demoStudy('KEW-13 · W charge asymmetry in rapidity')
    const [approved] = await db.select().from(t.results).where(and(eq(t.results.studyId, asym.id), eq(t.results.reviewState, 'approved')))
    const shown = await viewer.get(`/api/workspaces/${workspaceId}/results/${approved!.id}`)
    expect(shown.status).toBe(200)
    expect(shown.body.frozen).toBe(true)
    expect(shown.body.bands.central).toHaveLength(16)
  })
})
