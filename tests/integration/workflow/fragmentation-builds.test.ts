// A set build of a fragmentation input through the web app: the request carries a parametrised
// input that declares "density": fragmentation into one hadron species; the job evolves its
// Hessian members with the timelike kernels and stores a set whose header says so. Inputs the
// engine must not build are refused at once (400/422 naming the JSON path and the member), with no
// row, job or audit entry left behind. The input is the INVENTED demo fit Verrel-FF-26-pi+.
import { readFileSync } from 'node:fs'
import { beforeAll, describe, expect, it } from 'vitest'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { buildTraces, waitForBuild as waitForBuildOf } from './build-helpers'

let ws: TestWorkspace
const fit = (name: string) => JSON.parse(readFileSync(new URL(`../../../samples/fits/${name}`, import.meta.url), 'utf8'))
const pion = fit('verrel-ff-26-pi+.json')
const coarse = { x: { count: 30, min: 0.01, max: 0.95 }, q2: { count: 8, maxGeV2: 1e4 } }
const builds = () => `/api/workspaces/${ws.id}/sets/builds`

beforeAll(async () => {
  ws = await createWorkspace('Fragmentation builds')
})

const traces = () => buildTraces(ws.id)

describe('building fragmentation functions from a fit', () => {
  it('builds Hessian pairs of a π⁺ fragmentation fit into a set whose header says fragmentation into pi+', async () => {
    const res = await ws.analyst.client.post(builds(), { input: pion, grid: coarse })
    expect(res.status, JSON.stringify(res.body)).toBe(202)
    const done = await waitForBuildOf(ws.viewer.client, ws.id, res.body.id)
    expect(done.state, done.error).toBe('done')
    expect(done.progress).toEqual({ done: 13, total: 13 })
    const detail = (await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets/${done.setId}`)).body
    expect(detail.header).toMatchObject({ name: 'Verrel-FF-26-pi+', family: 'Verrel-FF-26', kind: 'hessian-pairs', memberCount: 13, density: { type: 'fragmentation', hadron: 'pi+' } })
    expect(detail.header.provenance).toMatch(/LO timelike/)
  })

  const variant = (edit: (doc: typeof pion) => void) => {
    const doc = structuredClone(pion)
    doc.name = 'Verrel-FF-26-pi+-variant'
    edit(doc)
    return doc
  }

  it.each([
    ['parton-density sum rules', 400, 'sumRules', /do not apply to fragmentation functions/, (d: typeof pion) => { d.sumRules = { momentum: 'gluon' } }],
    ['an unknown hadron species', 400, 'density.hadron', /hadron must be one of pi\+, pi-/, (d: typeof pion) => { d.density = { type: 'fragmentation', hadron: 'pion' } }],
    ['a nuclear target', 400, 'target', /not a target/, (d: typeof pion) => { d.target = { type: 'nucleus', z: 26, a: 56 } }],
    // 4 × the favoured amplitude: ∫ z·D_u dz = 4 × 0.32 = 1.28 > 1 already at the central values.
    ['a parton giving more than its whole momentum to π⁺', 422, 'pieces', /the central member: ∫ z·D dz of parton (u|d̄) is 1\.28\d* > 1/, (d: typeof pion) => { d.parameters[0].value *= 4 }],
    // A negative unfavoured piece: z·D < 0 on the grid.
    ['a negative fragmentation function', 422, 'pieces', /the central member: z·D of parton .* is -.* < 0 at z = /, (d: typeof pion) => { d.parameters[3].value = -0.4 }],
    // Hessian shifts of a huge covariance reach negative amplitudes: located at the tolerance.
    ['members that turn negative', 422, 'members.tolerance', /member \d+ \(eigenvector \d+, (up|down)\).*z·D of parton .* < 0/, (d: typeof pion) => { d.covariance[3][3] = 1 }]
  ] as const)('refuses %s (%i at %s) and leaves no row, job or audit entry', async (_label, status, path, message, edit) => {
    const before = await traces()
    const res = await ws.analyst.client.post(builds(), { input: variant(edit), grid: coarse })
    expect(res.status, JSON.stringify(res.body)).toBe(status)
    const issue = res.body.data.issues.find((i: { path?: string }) => i.path === path)
    expect(issue, JSON.stringify(res.body.data.issues)).toBeDefined()
    expect(issue.message).toMatch(message)
    expect(await traces()).toEqual(before)
  })
})
