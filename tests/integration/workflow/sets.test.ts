// The error-set library through the API: upload (good, malformed, too large), list, detail,
// download, rename, delete, densities with bands and ratios, sum rules, and sets built from fits
// on the queue.
import { createHash } from 'node:crypto'
import { readFileSync } from 'node:fs'
import { request } from 'node:http'
import { beforeAll, describe, expect, it } from 'vitest'
import { testEnv } from '../../support/env'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { waitForBuild as waitForBuildOf } from './build-helpers'
import { f2Spec, postForm, toySetBytes, uploadSet, waitForResult } from './helpers'

let ws: TestWorkspace
const sample = (name: string) => new Uint8Array(readFileSync(new URL(`../../../samples/${name}`, import.meta.url)))
const fit = (name: string) => JSON.parse(readFileSync(new URL(`../../../samples/fits/${name}`, import.meta.url), 'utf8'))

beforeAll(async () => {
  ws = await createWorkspace('Set library')
})

const base = () => `/api/workspaces/${ws.id}/sets`

const waitForBuild = (buildId: string) => waitForBuildOf(ws.viewer.client, ws.id, buildId)

describe('uploading sets', () => {
  it('stores a valid set with its metadata and gives the same bytes back', async () => {
    const { bytes, set } = toySetBytes({ kind: 'replicas', errorMembers: 12, name: 'upload-replicas' })
    const res = await postForm(ws.analyst.client, base(), { file: { bytes, name: 'mine.sheafset' } })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({
      name: 'upload-replicas', kind: 'replicas', memberCount: 13, family: set.header.family, version: set.header.version,
      confidenceLevelPercent: set.header.confidenceLevelPercent, xMin: set.x[0], xMax: set.x[set.x.length - 1],
      q2MinGeV2: set.q2[0], q2MaxGeV2: set.q2[set.q2.length - 1], target: { type: 'proton' }, origin: 'upload',
      fileName: 'mine.sheafset', sizeBytes: bytes.byteLength, addedBy: { id: ws.analyst.id }
    })
    expect(res.body.content).toBeUndefined()
    const list = await ws.viewer.client.get(base())
    expect(list.body.sets.map((s: { id: string }) => s.id)).toContain(res.body.id)
    const detail = await ws.viewer.client.get(`${base()}/${res.body.id}`)
    expect(detail.body).toMatchObject({ header: { kind: 'replicas', memberCount: 13 }, resultCount: 0 })
    const file = await fetch(`${testEnv().appUrl}${base()}/${res.body.id}/file`, { headers: { cookie: [...ws.viewer.client.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'x-forwarded-for': ws.viewer.client.address } })
    expect(file.status).toBe(200)
    const back = new Uint8Array(await file.arrayBuffer())
    expect(createHash('sha256').update(back).digest('hex')).toBe(createHash('sha256').update(bytes).digest('hex'))
    expect(file.headers.get('content-disposition')).toContain('mine.sheafset')
  })

  it.each([
    ['bad-magic.sheafset', /SHEAF-ERROR-SET/, { byteOffset: 0 }],
    ['bad-x-outside.sheafset', /x node 5/, { xIndex: 5 }],
    ['bad-nan.sheafset', /member 2/, { member: 2, flavour: 21 }],
    ['bad-member-count.sheafset', /memberCount|members/, { path: 'set.memberCount' }],
    ['bad-body-length.sheafset', /bytes/, { member: 2 }]
  ])('refuses %s with a located message and stores nothing', async (file, message, location) => {
    const before = (await ws.viewer.client.get(base())).body.sets.length
    const res = await postForm(ws.analyst.client, base(), { file: { bytes: sample(`sets/${file}`), name: file } })
    expect(res.status).toBe(400)
    expect(res.body.statusMessage).toContain(file)
    expect(res.body.data.issues).toHaveLength(1)
    expect(res.body.data.issues[0].message).toMatch(message)
    expect(res.body.data.issues[0]).toMatchObject(location)
    expect((await ws.viewer.client.get(base())).body.sets.length).toBe(before)
  })

  it('says what is missing in a request that is not a set upload', async () => {
    const json = await ws.analyst.client.post(base(), { file: 'x' })
    expect(json.status).toBe(400)
    expect(json.body.statusMessage).toMatch(/multipart/)
    const noFile = await postForm(ws.analyst.client, base(), { name: 'no file' })
    expect(noFile.status).toBe(400)
    expect(noFile.body.statusMessage).toMatch(/form field "file"/)
  })

  it('answers 413 for a body over the size limit before it has arrived', async () => {
    const c = ws.analyst.client
    const url = new URL(`${c.baseUrl}${base()}`)
    const status = await new Promise<number>((resolve, reject) => {
      const req = request(url, {
        method: 'POST',
        headers: {
          'content-type': 'multipart/form-data; boundary=sheaf', 'content-length': String(65 * 1024 * 1024),
          'cookie': [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'origin': c.origin!, 'x-forwarded-for': c.address
        }
      }, (res) => { res.resume(); resolve(res.statusCode!); req.destroy() })
      req.on('error', reject)
      req.write('--sheaf\r\n')
    })
    expect(status).toBe(413)
  })

  it('refuses a second set with the same name and version (409)', async () => {
    const { bytes } = toySetBytes({ name: 'twin' })
    await uploadSet(ws.analyst.client, ws.id, bytes)
    const again = await postForm(ws.analyst.client, base(), { file: { bytes, name: 'twin.sheafset' } })
    expect(again.status).toBe(409)
    expect(again.body.statusMessage).toMatch(/twin/)
    const renamed = await postForm(ws.analyst.client, base(), { file: { bytes, name: 'twin.sheafset' }, name: 'twin (copy)' })
    expect(renamed.status).toBe(201)
    expect(renamed.body.name).toBe('twin (copy)')
  })
})

describe('renaming and deleting sets', () => {
  it('renames (analyst), refusing an empty or taken name', async () => {
    const a = await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'rename-a' }).bytes)
    await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'rename-b' }).bytes)
    const empty = await ws.analyst.client.patch(`${base()}/${a.id}`, { name: '  ' })
    expect(empty.status).toBe(400)
    expect(empty.body.data.fields.name).toMatch(/cannot be empty/)
    expect((await ws.analyst.client.patch(`${base()}/${a.id}`, { name: 'rename-b' })).status).toBe(409)
    const ok = await ws.analyst.client.patch(`${base()}/${a.id}`, { name: 'rename-c' })
    expect(ok.status).toBe(200)
    expect(ok.body.name).toBe('rename-c')
  })

  it('refuses to delete a set a result uses (409) and deletes an unused one (owner)', async () => {
    const used = await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'in-use', errorMembers: 2 }).bytes)
    const study = await ws.analyst.client.post(`/api/workspaces/${ws.id}/studies`, { name: 'uses a set', spec: f2Spec(2), setIds: [used.id] })
    const run = await ws.analyst.client.post(`/api/workspaces/${ws.id}/studies/${study.body.id}/run`, {})
    await waitForResult(ws.analyst.client, ws.id, run.body.results[0].id)
    const refused = await ws.owner.client.delete(`${base()}/${used.id}`)
    expect(refused.status).toBe(409)
    expect(refused.body.statusMessage).toMatch(/used by 1 result/)
    const unused = await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'unused' }).bytes)
    const other = await ws.analyst.client.post(`/api/workspaces/${ws.id}/studies`, { name: 'lists it', spec: f2Spec(2), setIds: [unused.id, used.id] })
    expect((await ws.owner.client.delete(`${base()}/${unused.id}`)).status).toBe(200)
    expect((await ws.viewer.client.get(`${base()}/${unused.id}`)).status).toBe(404)
    // The study keeps its other set and loses the deleted one.
    expect((await ws.viewer.client.get(`/api/workspaces/${ws.id}/studies/${other.body.id}`)).body.setIds).toEqual([used.id])
  })
})

describe('densities and sum rules of a set', () => {
  let hessian: string
  let replicas: string
  beforeAll(async () => {
    hessian = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'dens-h', errorMembers: 4 }).bytes)).id
    replicas = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'dens-r', kind: 'replicas', errorMembers: 30 }).bytes)).id
  })

  it('gives x·f with the band per flavour, and the ratio to a set is 1 against itself', async () => {
    const res = await ws.viewer.client.get(`${base()}/${hessian}/densities?q2=100&flavours=21,2,uv,22&points=50&ratioTo=${hessian}`)
    expect(res.status).toBe(200)
    expect(res.body.x).toHaveLength(50)
    expect(res.body.prescription).toBe('hessian-symmetric')
    const [g, u, uv, photon] = res.body.flavours
    expect(g.flavour).toBe(21)
    expect(g.band.central).toHaveLength(50)
    expect(g.band.plus.every((v: number) => v > 0)).toBe(true)
    expect(uv.flavour).toBe('uv')
    // u_v = u − ū ≤ u wherever ū ≥ 0.
    expect(uv.band.central.every((v: number, i: number) => v <= u.band.central[i] + 1e-15)).toBe(true)
    expect(photon).toMatchObject({ flavour: 22, carried: false })
    expect(g.ratio.central.every((v: number) => Math.abs(v - 1) < 1e-12)).toBe(true)
    const asym = await ws.viewer.client.get(`${base()}/${hessian}/densities?q2=100&prescription=hessian-asymmetric&cl=90`)
    expect(asym.body).toMatchObject({ prescription: 'hessian-asymmetric', clPercent: 90 })
  })

  it('refuses a Q² off the grid (422), an unknown flavour and a prescription of another kind (400)', async () => {
    const far = await ws.viewer.client.get(`${base()}/${hessian}/densities?q2=1e9`)
    expect(far.status).toBe(422)
    expect(far.body.statusMessage).toMatch(/outside the grid/)
    const flavour = await ws.viewer.client.get(`${base()}/${hessian}/densities?q2=10&flavours=7`)
    expect(flavour.status).toBe(400)
    expect(JSON.stringify(flavour.body.data)).toMatch(/Unknown flavour 7/)
    const wrong = await ws.viewer.client.get(`${base()}/${replicas}/densities?q2=10&prescription=hessian-symmetric`)
    expect(wrong.status).toBe(400)
    expect(wrong.body.statusMessage).toMatch(/does not apply to a replicas set/)
  })

  it('reads out the sum rules of every member with the band', async () => {
    const res = await ws.viewer.client.get(`${base()}/${replicas}/sum-rules?q2=10`)
    expect(res.status).toBe(200)
    expect(res.body.rules.map((r: { id: string }) => r.id)).toEqual(['momentum', 'uValence', 'dValence', 'sValence'])
    // The TOY momentum integral converges; each rule is either a number with its band or says why not.
    expect(res.body.rules[0]).toMatchObject({ id: 'momentum', error: null })
    for (const r of res.body.rules) {
      if (r.error === null) expect(Number.isFinite(r.central) && r.plus >= 0 && r.minus >= 0).toBe(true)
      else expect(r.error).toMatch(/diverges/)
    }
  })
})

describe('building a set from a fit', () => {
  it('builds a Hessian set on the queue whose members keep the momentum and valence sum rules', async () => {
    const input = fit('minimal-input.json')
    const res = await ws.analyst.client.post(`${base()}/builds`, { name: 'built-minimal', input, grid: { x: { count: 40, min: 1e-5, max: 0.98 }, q2: { count: 12, maxGeV2: 1e4 } } })
    expect(res.status).toBe(202)
    expect(res.body).toMatchObject({ name: 'built-minimal' })
    // The worker may pick the job up before the route re-reads the row: either state is honest.
    expect(['queued', 'running']).toContain(res.body.state)
    const build = await waitForBuild(res.body.id)
    expect(build.error).toBeNull()
    expect(build.state).toBe('done')
    expect(build.progress.done).toBe(build.progress.total)
    const set = await ws.viewer.client.get(`${base()}/${build.setId}`)
    expect(set.body).toMatchObject({ name: 'built-minimal', origin: 'build', kind: 'hessian-pairs', memberCount: 1 + 2 * input.parameters.length })
    // The input imposes the sum rules; LO evolution conserves them (shared/physics/README.md, sum rules: ∫x(Σ+g) = 1,
    // ∫u_v = 2, ∫d_v = 1). Tolerance: the engine's small-x tail estimate (integrateX docs).
    const rules = await ws.viewer.client.get(`${base()}/${build.setId}/sum-rules?q2=100`)
    const byId = Object.fromEntries(rules.body.rules.map((r: { id: string, central: number }) => [r.id, r.central]))
    expect(byId.momentum).toBeCloseTo(1, 2)
    expect(byId.uValence).toBeCloseTo(2, 2)
    expect(byId.dValence).toBeCloseTo(1, 2)
  })

  it('refuses a bad input document naming the JSON path, and a request without members', async () => {
    const input = fit('minimal-input.json')
    input.pieces[0].terms[0].a = 'a_unknown'
    const res = await ws.analyst.client.post(`${base()}/builds`, { input })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toMatch(/^pieces\[0\]\.terms\[0\]/)
    const { members: _m, ...noMembers } = fit('minimal-input.json')
    const none = await ws.analyst.client.post(`${base()}/builds`, { input: noMembers })
    expect(none.status).toBe(400)
    expect(none.body.statusMessage).toMatch(/Hessian \(tolerance\) or replicas/)
  })

  it('cancels a build', async () => {
    const input = fit('minimal-input.json')
    const res = await ws.analyst.client.post(`${base()}/builds`, { input, members: { type: 'replicas', count: 400, seed: 7 } })
    expect(res.status).toBe(202)
    const cancel = await ws.analyst.client.post(`${base()}/builds/${res.body.id}/cancel`, {})
    expect(cancel.status).toBe(200)
    const build = await waitForBuild(res.body.id)
    expect(build.state).toBe('cancelled')
    expect(build.setId).toBeNull()
    expect((await ws.analyst.client.post(`${base()}/builds/${res.body.id}/cancel`, {})).status).toBe(409)
  })
})
