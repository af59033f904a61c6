import { gzipSync } from 'node:zlib'
import { beforeAll, describe, expect, it } from 'vitest'
import { parseSetFile } from '../../shared/physics/sets/parse'
import { delimitedChunks } from '../../server/domain/sets/table-write'
import { createToken, type TokenClient } from '../support/tokens'
import { createWorkspace, type TestWorkspace } from '../support/users'
import { toySetBytes } from './workflow/helpers'

/** A multipart POST authenticated by the client's API token only. */
async function postTable(client: TokenClient, path: string, parts: Record<string, string | { bytes: Uint8Array, name: string }>) {
  const form = new FormData()
  for (const [k, v] of Object.entries(parts)) {
    if (typeof v === 'string') form.append(k, v)
    else form.append(k, new Blob([v.bytes as BlobPart]), v.name)
  }
  const res = await fetch(client.baseUrl + path, { method: 'POST', headers: { authorization: `Bearer ${client.secret}`, 'x-forwarded-for': client.address }, body: form })
  const text = await res.text()
  return { status: res.status, body: text ? JSON.parse(text) : null }
}

async function download(client: TokenClient, path: string) {
  const res = await fetch(client.baseUrl + path, { headers: { authorization: `Bearer ${client.secret}`, 'x-forwarded-for': client.address } })
  return { status: res.status, type: res.headers.get('content-type'), bytes: new Uint8Array(await res.arrayBuffer()) }
}

const bits = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength)

describe('set tables over the API', () => {
  let ws: TestWorkspace
  let analyst: TokenClient
  const { set } = toySetBytes({ name: 'table-toy', nx: 12, nq: 8 })
  const { memberCount: _m, order: _o, ...header } = set.header
  const csv = [...delimitedChunks(set, 'long', ',')].join('')
  beforeAll(async () => {
    ws = await createWorkspace('Tables')
    analyst = (await createToken(ws.analyst, ws.id, 'analyst')).client
  })

  it('imports a gzipped long CSV with a JSON sidecar, exports it as wide Parquet, and the re-import has the same bits', async () => {
    const first = await postTable(analyst, `/api/workspaces/${ws.id}/sets/import`, {
      sidecar: { bytes: new TextEncoder().encode(JSON.stringify(header)), name: 'toy.header.json' },
      file: { bytes: gzipSync(csv), name: 'toy-long.csv.gz' }
    })
    expect(first.status).toBe(201)
    expect(first.body).toMatchObject({ name: 'table-toy', memberCount: set.members.length, import: { format: 'csv', gzip: true, layout: 'long' } })

    const sidecar = await download(analyst, `/api/workspaces/${ws.id}/sets/${first.body.id}/table?header=1`)
    expect(sidecar.status).toBe(200)
    const exportedHeader = JSON.parse(new TextDecoder().decode(sidecar.bytes))
    // The sidecar says the density since the set format's version 2 (absent in memory = parton densities).
    expect(exportedHeader).toEqual({ ...header, density: { type: 'parton' } })
    const parquet = await download(analyst, `/api/workspaces/${ws.id}/sets/${first.body.id}/table?format=parquet&layout=wide`)
    expect(parquet.status).toBe(200)
    expect(parquet.type).toBe('application/vnd.apache.parquet')

    const second = await postTable(analyst, `/api/workspaces/${ws.id}/sets/import`, {
      header: JSON.stringify({ ...exportedHeader, version: '2' }),
      file: { bytes: parquet.bytes, name: 'toy-wide.parquet' }
    })
    expect(second.status).toBe(201)
    const a = parseSetFile((await download(analyst, `/api/workspaces/${ws.id}/sets/${first.body.id}/file`)).bytes)
    const b = parseSetFile((await download(analyst, `/api/workspaces/${ws.id}/sets/${second.body.id}/file`)).bytes)
    expect(b.members.length).toBe(set.members.length)
    b.members.forEach((m, k) => {
      expect(bits(m).equals(bits(a.members[k]!))).toBe(true)
      expect(bits(m).equals(bits(set.members[k]!))).toBe(true)
    })

    // CSV and TSV exports stream the same rows the test wrote.
    const text = await download(analyst, `/api/workspaces/${ws.id}/sets/${first.body.id}/table?format=csv&layout=long`)
    expect(new TextDecoder().decode(text.bytes)).toBe(csv)
    expect((await download(analyst, `/api/workspaces/${ws.id}/sets/${first.body.id}/table?format=xlsx`)).status).toBe(400)
  })

  it('refuses a bad table with line and column and stores nothing', async () => {
    const before = (await analyst.get(`/api/workspaces/${ws.id}/sets`)).body.sets.length
    const lines = csv.split('\r\n')
    lines[7] = lines[7]!.replace(/,[^,]*$/, ',1e999x')
    const res = await postTable(analyst, `/api/workspaces/${ws.id}/sets/import`, {
      header: JSON.stringify({ ...header, version: 'bad' }), file: { bytes: new TextEncoder().encode(lines.join('\r\n')), name: 'bad.csv' }
    })
    expect(res.status).toBe(400)
    expect(res.body.statusMessage).toBe('bad.csv: line 8, column 5 (xf): x·f must be a finite number')
    expect(res.body.data.issues[0]).toMatchObject({ file: 'bad.csv', line: 8, column: 5 })

    const noHeader = await postTable(analyst, `/api/workspaces/${ws.id}/sets/import`, { file: { bytes: new TextEncoder().encode(csv), name: 'a.csv' } })
    expect(noHeader.status).toBe(400)
    expect(noHeader.body.data.fields.header).toBeTruthy()
    const badHeader = await postTable(analyst, `/api/workspaces/${ws.id}/sets/import`, {
      header: JSON.stringify({ ...header, kind: 'both' }), file: { bytes: new TextEncoder().encode(csv), name: 'a.csv' }
    })
    expect(badHeader.status).toBe(400)
    expect(Object.keys(badHeader.body.data.fields)).toEqual(['header.kind'])
    expect((await analyst.get(`/api/workspaces/${ws.id}/sets`)).body.sets.length).toBe(before)
  })

  it('keeps the role checks: a viewer token may export but not import, another workspace is 404', async () => {
    const viewer = (await createToken(ws.owner, ws.id, 'viewer')).client
    const res = await postTable(viewer, `/api/workspaces/${ws.id}/sets/import`, { header: JSON.stringify(header), file: { bytes: new TextEncoder().encode(csv), name: 'a.csv' } })
    expect(res.status).toBe(403)
    const other = await createWorkspace('Other tables')
    const elsewhere = await postTable(analyst, `/api/workspaces/${other.id}/sets/import`, { header: JSON.stringify(header), file: { bytes: new TextEncoder().encode(csv), name: 'a.csv' } })
    expect(elsewhere.status).toBe(404)
  })
})
