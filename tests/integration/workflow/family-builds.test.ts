// A nuclear family built for several nuclei in one queued job: the request names the nuclei
// (symbols or Z, A), the job's progress counts every nucleus's members, the sets land in the
// library under the family with their own names, targets and A-dependence; bad nuclei are
// refused at once with their place and nothing is stored or queued.
import { readFileSync } from 'node:fs'
import { beforeAll, describe, expect, it } from 'vitest'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { buildTraces, waitForBuild as waitForBuildOf } from './build-helpers'

let ws: TestWorkspace
const fit = (name: string) => JSON.parse(readFileSync(new URL(`../../../samples/fits/${name}`, import.meta.url), 'utf8'))
const family = fit('ostrand-25.json')
const quillon = fit('quillon-22.json')
const coarse = { x: { count: 30, min: 1e-4, max: 0.95 }, q2: { count: 8, maxGeV2: 1e4 } }
const builds = () => `/api/workspaces/${ws.id}/sets/builds`

beforeAll(async () => {
  ws = await createWorkspace('Nuclear families')
})

const traces = () => buildTraces(ws.id)
const waitForBuild = (buildId: string) => waitForBuildOf(ws.viewer.client, ws.id, buildId)

describe('building a nuclear family for a list of nuclei', () => {
  it('builds C, Ar, Fe and Pb in one job: four sets of the family, progress over all 92 members', async () => {
    // The demo seed's grid (80 x × 40 Q² nodes): the job's own time is printed, not asserted.
    const demoGrid = { x: { count: 80, min: 1e-5, max: 0.99 }, q2: { count: 40, maxGeV2: 1e8 } }
    const res = await ws.analyst.client.post(builds(), { input: family, baseline: quillon, grid: demoGrid, nuclei: ['C', 'Ar', { z: 26, a: 56 }, 'Pb'] })
    expect(res.status, JSON.stringify(res.body)).toBe(202)
    expect(res.body.nuclei.map((n: { name: string }) => n.name)).toEqual(['Ostrand-25-C12', 'Ostrand-25-Ar40', 'Ostrand-25-Fe56', 'Ostrand-25-Pb208'])
    const done = await waitForBuild(res.body.id)
    expect(done.state, done.error).toBe('done')
    console.info(`[family-build] four sets on the queue: ${Date.parse(done.finishedAt) - Date.parse(done.startedAt)} ms from start to stored`)
    // 11 fit parameters: 23 Hessian members per nucleus.
    expect(done.progress).toEqual({ done: 92, total: 92 })
    expect(done.setIds).toHaveLength(4)
    expect(done.setId).toBe(done.setIds[0])
    const library = (await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets`)).body
    const sets = (library.sets ?? library).filter((s: { family: string }) => s.family === 'Ostrand')
    expect(sets.map((s: { name: string }) => s.name).sort()).toEqual(['Ostrand-25-Ar40', 'Ostrand-25-C12', 'Ostrand-25-Fe56', 'Ostrand-25-Pb208'])
    const iron = sets.find((s: { name: string }) => s.name === 'Ostrand-25-Fe56')
    expect(iron).toMatchObject({ target: { type: 'nucleus', z: 26, a: 56 }, memberCount: 23, version: '25.0', origin: 'build' })
    const detail = (await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets/${iron.id}`)).body
    expect(detail.header.provenance).toMatch(/nucleus Z = 26, A = 56 from family Ostrand/)
    expect(detail.header.provenance).toMatch(/shadow_v·A\^\(gamma_A\)/)
    // A second request for the same sets is refused before anything is queued.
    const before = await traces()
    const again = await ws.analyst.client.post(builds(), { input: family, baseline: quillon, grid: coarse, nuclei: ['Fe'] })
    expect(again.status).toBe(409)
    expect(await traces()).toEqual(before)
  })

  it.each([
    ['an unknown symbol', { nuclei: ['C', 'Qq'] }, 400, 'nuclei[1]', /unknown target symbol "Qq"/],
    ['Z above A', { nuclei: [{ z: 30, a: 20 }] }, 422, 'nuclei[0]', /Z = 30 exceeds A = 20/],
    ['a mass number above 300', { nuclei: [{ z: 90, a: 400 }] }, 422, 'nuclei[0]', /A = 400 is above 300/],
    ['the same nucleus twice', { nuclei: ['Fe', { z: 26, a: 56 }] }, 400, 'nuclei[1]', /repeats nuclei\[0\]/]
  ])('refuses %s with its place and queues nothing', async (_label, extra, status, path, message) => {
    const before = await traces()
    const res = await ws.analyst.client.post(builds(), { input: family, baseline: quillon, grid: coarse, ...extra })
    expect(res.status, JSON.stringify(res.body)).toBe(status)
    const issue = res.body.data.issues.find((i: { path: string }) => i.path === path)
    expect(issue, JSON.stringify(res.body.data)).toBeDefined()
    expect(issue.message).toMatch(message)
    expect(await traces()).toEqual(before)
  })

  it('refuses nuclei for a proton input (400 at nuclei), and a nucleus whose A-dependence diverges (422 naming the nucleus and the term)', async () => {
    const before = await traces()
    const proton = await ws.analyst.client.post(builds(), { input: quillon, grid: coarse, nuclei: ['Fe'] })
    expect(proton.status).toBe(400)
    expect(proton.body.data.issues[0]).toMatchObject({ path: 'nuclei' })
    const steep = structuredClone(family)
    // 208^131 ≈ 10^303.7 still fits a double, 238^131 ≈ 10^311 does not: lead (the document's own target) and carbon compile, uranium does not.
    steep.parameters.find((p: { name: string }) => p.name === 'gamma_A').value = 131
    const res = await ws.analyst.client.post(builds(), { input: steep, baseline: quillon, grid: coarse, nuclei: ['C', 'U'] })
    expect(res.status, JSON.stringify(res.body)).toBe(422)
    expect(res.body.data.issues[0]).toMatchObject({ path: 'modifications[0].terms[1]', document: 'input for nuclei[1] (Z = 92, A = 238)' })
    expect(res.body.data.issues[0].message).toMatch(/not a finite number/)
    expect(await traces()).toEqual(before)
  })
})
