// What the worker used to accept and then fail on is refused when it is asked for: a set build
// the evolution cannot carry out answers 422 (400 for a malformed request) at once, naming the
// JSON path, and leaves no build row, queued job or audit entry; a measurement with a value that
// is not a double or a correlation matrix that is not positive definite is refused with its
// file, line and column and nothing is stored.
import { readFileSync } from 'node:fs'
import { beforeAll, describe, expect, it } from 'vitest'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { buildTraces } from './build-helpers'
import { f2Spec } from './helpers'

let ws: TestWorkspace
const minimal = JSON.parse(readFileSync(new URL('../../../samples/fits/minimal-input.json', import.meta.url), 'utf8'))
const edit = (f: (d: any) => void) => {
  const d = structuredClone(minimal)
  f(d)
  return d
}
const builds = () => `/api/workspaces/${ws.id}/sets/builds`

beforeAll(async () => {
  ws = await createWorkspace('Up-front checks')
})

/** Build rows and build audit entries of the workspace: none may appear for a refused request. */
const traces = () => buildTraces(ws.id)

describe('a set build the evolution would refuse', () => {
  it.each([
    ['a large-x exponent b ≤ −1', { input: edit((d) => { d.pieces[2].terms[0].b = -1.5 }) }, 'pieces[2].terms[0].b', /b = -1\.5 at the central values: .*needs b > −1/],
    ['a small-x exponent a ≤ −1', { input: edit((d) => { d.pieces[3].terms[0].a = -1.2 }) }, 'pieces[3].terms[0].a', /needs a > −1/],
    ['a valence exponent a ≤ 0 through its parameter', { input: edit((d) => { d.parameters[0].value = -0.2 }) }, 'pieces[0].terms[0].a', /a \(parameter a_uv\) = -0\.2 .*unless a > 0/],
    ['two Q² nodes', { input: minimal, grid: { x: { count: 40, min: 1e-5, max: 0.98 }, q2: { count: 2, maxGeV2: 1e4 } } }, 'grid.q2.count', /2 Q² nodes are too few: .*at least 4/],
    ['x_min = 1e-300', { input: minimal, grid: { x: { count: 40, min: 1e-300, max: 0.98 } } }, 'grid.x.min', /x_min = 1e-300 is below 1e-9/],
    ['a start scale below the Landau pole', { input: edit((d) => { d.startScaleGeV2 = 0.001 }) }, 'startScaleGeV2', /below the Landau pole Λ² ≈ .* GeV²/],
    ['an absurd tolerance', { input: minimal, members: { type: 'hessian', tolerance: 1e300, confidenceLevelPercent: 68 } }, 'members.tolerance', /T = 1e\+300 is outside 0\.1…20/],
    ['a tolerance that makes every member the central one', { input: minimal, members: { type: 'hessian', tolerance: 1e-300, confidenceLevelPercent: 68 } }, 'members.tolerance', /outside 0\.1…20/],
    // Variances of 100 move a_uv by ±10 in the Hessian members: a_uv = 0.7 − 10 diverges.
    ['an absurd covariance', { input: edit((d) => { d.covariance = [[100, 0, 0, 0], [0, 100, 0, 0], [0, 0, 100, 0], [0, 0, 0, 100]] }) }, 'pieces[0].terms[0].a', /at member \d+ \(eigenvector \d+, down\)/],
    ['a covariance that is not positive definite', { input: edit((d) => { d.covariance = [[1, 2, 0, 0], [2, 1, 0, 0], [0, 0, 1, 0], [0, 0, 0, 1]] }) }, 'covariance', /not positive definite/]
  ])('answers 422 at once for %s, naming the path, and stores and queues nothing', async (_label, body, path, message) => {
    const before = await traces()
    const res = await ws.analyst.client.post(builds(), body)
    expect(res.status, JSON.stringify(res.body)).toBe(422)
    const issue = res.body.data.issues.find((i: { path: string }) => i.path === path)
    expect(issue, JSON.stringify(res.body.data.issues)).toBeDefined()
    expect(issue.message).toMatch(message)
    expect(res.body.statusMessage).toMatch(/The input document has \d+ problems?/)
    expect(await traces()).toEqual(before)
  })

  it('refuses a baseline sent with a proton input (400) and stores nothing', async () => {
    const before = await traces()
    const res = await ws.analyst.client.post(builds(), { input: minimal, baseline: minimal })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0]).toMatchObject({ path: 'baseline', message: expect.stringMatching(/only to a nuclear modification/) })
    expect(await traces()).toEqual(before)
  })

  it('still accepts the same fit within the limits (202)', async () => {
    const res = await ws.analyst.client.post(builds(), { name: 'fine', input: minimal, grid: { x: { count: 20, min: 1e-9, max: 0.98 }, q2: { count: 4, maxGeV2: 1e4 } } })
    expect(res.status, JSON.stringify(res.body)).toBe(202)
    await ws.analyst.client.post(`${builds()}/${res.body.id}/cancel`, {})
  })

  it('refuses a second build of the same name and version while the first waits (409), storing nothing', async () => {
    const body = { name: 'twin', input: minimal, grid: { x: { count: 20, min: 1e-9, max: 0.98 }, q2: { count: 4, maxGeV2: 1e4 } } }
    const first = await ws.analyst.client.post(builds(), body)
    expect(first.status, JSON.stringify(first.body)).toBe(202)
    const before = await traces()
    const second = await ws.analyst.client.post(builds(), body)
    expect(second.status, JSON.stringify(second.body)).toBe(409)
    expect(second.body.statusMessage).toMatch(/twin version 1 is already queued or running/)
    expect(second.body.data.fields.name).toMatch(/already being built/)
    expect(await traces()).toEqual(before)
    await ws.analyst.client.post(`${builds()}/${first.body.id}/cancel`, {})
  })
})

describe('a measurement the χ² could not use', () => {
  let url: string
  beforeAll(async () => {
    const study = await ws.analyst.client.post(`/api/workspaces/${ws.id}/studies`, { name: 'measured', spec: f2Spec(4) })
    expect(study.status).toBe(201)
    url = `/api/workspaces/${ws.id}/studies/${study.body.id}/measurements`
  })
  const count = async () => (await ws.viewer.client.get(url)).body.measurements.length

  it('refuses a value beyond double precision with its line and column, storing nothing', async () => {
    const res = await ws.analyst.client.post(url, { name: 'huge', csv: 'value,stat\n1,0.1\n1e309,0.1\n1,0.1\n1,0.1' })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0]).toMatchObject({ file: 'points', line: 3, column: 1, message: expect.stringMatching(/"1e309" is too large/) })
    expect(await count()).toBe(0)
  })

  it('refuses a correlation matrix that is not positive definite, storing nothing', async () => {
    // Rows 1 and 2 correlated by 0.9 with row 3, but anti-correlated with each other by −0.9:
    // the leading 3 × 3 block has determinant 1 + 2·(−0.9)(0.9)(0.9) − 3·0.81 = −2.888 < 0.
    const correlation = '1,-0.9,0.9,0\n-0.9,1,0.9,0\n0.9,0.9,1,0\n0,0,0,1'
    const res = await ws.analyst.client.post(url, { name: 'npd', csv: 'value,stat,syst\n1,1,1\n1,1,1\n1,1,1\n1,1,1', correlation })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0]).toMatchObject({ file: 'correlation', line: 3, message: expect.stringMatching(/not positive definite/) })
    expect(await count()).toBe(0)
  })
})
