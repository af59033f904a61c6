import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { beforeAll, describe, expect, it } from 'vitest'
import { parseSetFile } from '../../../shared/physics/sets/parse'
import { createWorkspace, type TestWorkspace } from '../../support/users'
import { postForm, toySetBytes, uploadSet } from './helpers'

// Fragmentation sets over the API: uploaded and listed with their density, refused with the place
// of a bad header, imported from a z table with its sidecar, exported again, and plotted by the
// densities route (z·D with linear spacing; valence combinations and mixed ratios refused).
const samples = fileURLToPath(new URL('../../../samples/', import.meta.url))
const sample = (path: string) => new Uint8Array(readFileSync(`${samples}${path}`))

describe('fragmentation sets over the API', () => {
  let ws: TestWorkspace
  let ffId: string
  let protonId: string
  beforeAll(async () => {
    ws = await createWorkspace('Fragmentation API')
    ffId = (await uploadSet(ws.analyst.client, ws.id, sample('sets/toy-ff-piplus.sheafset'))).id
    protonId = (await uploadSet(ws.analyst.client, ws.id, toySetBytes({ name: 'proton-toy', nx: 12, nq: 8 }).bytes)).id
  })

  it('lists each set with what it holds; a fragmentation set has its range in z', async () => {
    const list = await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets`)
    expect(list.status).toBe(200)
    const ff = list.body.sets.find((s: { id: string }) => s.id === ffId)
    expect(ff).toMatchObject({ name: 'toy-ff-pi+', density: { type: 'fragmentation', hadron: 'pi+' }, xMin: 0.01, xMax: 0.95 })
    expect(list.body.sets.find((s: { id: string }) => s.id === protonId).density).toEqual({ type: 'parton' })
  })

  it.each([
    ['sets/bad-ff-target.sheafset', 'set.target', 'has no target'],
    ['sets/bad-ff-hadron.sheafset', 'set.density.hadron', 'hadron must be one of'],
    ['sets/bad-ff-axis.sheafset', 'grid.x', 'names its momentum-fraction axis z']
  ])('%s is a 400 with the header path and byte offset, and nothing is stored', async (file, path, text) => {
    const before = (await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets`)).body.sets.length
    const res = await postForm(ws.analyst.client, `/api/workspaces/${ws.id}/sets`, { file: { bytes: sample(file), name: file.slice(5) } })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0]).toMatchObject({ path, byteOffset: 20 })
    expect(res.body.data.issues[0].message).toContain(text)
    expect((await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets`)).body.sets).toHaveLength(before)
  })

  it('imports the z table with its sidecar, and exports a z table and a sidecar without target', async () => {
    const res = await postForm(ws.analyst.client, `/api/workspaces/${ws.id}/sets/import`, {
      sidecar: { bytes: sample('tables/toy-ff-table.header.json'), name: 'toy-ff-table.header.json' },
      file: { bytes: sample('tables/toy-ff-table-wide.csv.gz'), name: 'toy-ff-table-wide.csv.gz' }
    })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: 'toy-ff-table', density: { type: 'fragmentation', hadron: 'pi+' } })
    const sidecar = await ws.viewer.client.get(`/api/workspaces/${ws.id}/sets/${res.body.id}/table?header=1`)
    expect(sidecar.body.density).toEqual({ type: 'fragmentation', hadron: 'pi+' })
    expect(sidecar.body).not.toHaveProperty('target')
    const table = await fetch(`${ws.viewer.client.baseUrl}/api/workspaces/${ws.id}/sets/${res.body.id}/table?format=csv&layout=long`, {
      headers: { cookie: [...ws.viewer.client.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'x-forwarded-for': ws.viewer.client.address }
    })
    expect((await table.text()).split('\r\n')[0]).toBe('member,z,q2,pdg,zD')
    // The stored file is version 2 with the density and the z nodes.
    const file = await fetch(`${ws.viewer.client.baseUrl}/api/workspaces/${ws.id}/sets/${res.body.id}/file`, {
      headers: { cookie: [...ws.viewer.client.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'x-forwarded-for': ws.viewer.client.address }
    })
    const set = parseSetFile(new Uint8Array(await file.arrayBuffer()))
    expect(set.header.density).toEqual({ type: 'fragmentation', hadron: 'pi+' })
  })

  it('the densities route gives z·D bands on linear z; refuses uv and a ratio to a parton set, naming the field', async () => {
    const base = `/api/workspaces/${ws.id}/sets/${ffId}/densities`
    const ok = await ws.viewer.client.get(`${base}?q2=10&flavours=2,-2,21&points=10&spacing=linear`)
    expect(ok.status).toBe(200)
    expect(ok.body.density).toEqual({ type: 'fragmentation', hadron: 'pi+' })
    expect(ok.body.x[0]).toBe(0.01)
    expect(ok.body.x[9]).toBe(0.95)
    // Linear spacing: equal steps of (0.95 − 0.01)/9 (hand arithmetic).
    expect(ok.body.x[1] - ok.body.x[0]).toBeCloseTo(0.94 / 9, 12)
    expect(ok.body.flavours.map((f: { flavour: number }) => f.flavour)).toEqual([2, -2, 21])
    const valence = await ws.viewer.client.get(`${base}?q2=10&flavours=uv`)
    expect(valence.status).toBe(400)
    expect(valence.body.data.fields).toHaveProperty('flavours')
    const ratio = await ws.viewer.client.get(`${base}?q2=10&flavours=2&ratioTo=${protonId}`)
    expect(ratio.status).toBe(400)
    expect(ratio.body.message).toContain('holds parton densities in the proton')
    expect(ratio.body.data.fields).toHaveProperty('ratioTo')
  })
})
