import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { toyErrorSet, toyQ2Nodes, toyXNodes } from '../../../shared/physics/sets'
import type { ErrorSet, FlavourScheme } from '../../../shared/physics/types'
import { DomainError } from '../../../server/domain/errors'
import { parseTableHeader, readSetTable } from '../../../server/domain/sets/table-import'
import { delimitedChunks, parquetTable, tableColumns, tableSidecar } from '../../../server/domain/sets/table-write'

// A fragmentation set's table names its fraction column z and its long value column zD
// (server/domain/sets/table-format.ts); the sidecar says the density and hadron and has no target
// (shared/physics/sets/format.ts, version 2). Expectations follow from those definitions.

const dir = mkdtempSync(join(tmpdir(), 'sheaf-ff-table-test-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))
const file = (name: string, bytes: string | Uint8Array) => {
  const path = join(dir, name)
  writeFileSync(path, bytes)
  return path
}
const bits = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength)
const scheme: FlavourScheme = { type: 'variable', nf: 5, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const set = toyErrorSet({
  kind: 'hessian-pairs', errorMembers: 2, x: toyXNodes(8, 0.01, 0.9), scheme, name: 'toy-ff-K-',
  q2: toyQ2Nodes({ q2MinGeV2: 1, q2MaxGeV2: 1e4, count: 8, thresholdsGeV2: [1.51 ** 2, 4.92 ** 2] }),
  density: { type: 'fragmentation', hadron: 'K-' }
})
const csv = (layout: 'long' | 'wide') => [...delimitedChunks(set, layout, ',')].join('')
const sidecar = JSON.stringify(tableSidecar(set.header))

async function rejection(action: () => Promise<unknown> | unknown) {
  try {
    await action()
  } catch (err) {
    expect(err).toBeInstanceOf(DomainError)
    return err as DomainError
  }
  throw new Error('the table was accepted')
}

describe('set tables of a fragmentation set', () => {
  it('are written with the columns member, z, q2, pdg, zD and a sidecar saying density and hadron, without target', () => {
    expect(tableColumns(set, 'long')).toEqual(['member', 'z', 'q2', 'pdg', 'zD'])
    expect(tableColumns(set, 'wide').slice(0, 3)).toEqual(['member', 'z', 'q2'])
    expect(csv('long').split('\r\n')[0]).toBe('member,z,q2,pdg,zD')
    const header = JSON.parse(sidecar)
    expect(header.density).toEqual({ type: 'fragmentation', hadron: 'K-' })
    expect(header).not.toHaveProperty('target')
  })

  it.each([
    ['long.csv', () => csv('long')],
    ['wide.csv', () => csv('wide')],
    ['long.parquet', () => parquetTable(set, 'long')],
    ['wide.parquet', () => parquetTable(set, 'wide')]
  ])('import %s with the sidecar: the same fragmentation set, bit for bit', async (name, bytes) => {
    const header = parseTableHeader(sidecar, 'The sidecar')
    const { set: back } = await readSetTable(file(name, bytes()), name, header, 1e9)
    expect(back.header).toEqual(set.header)
    expect(back.header.density).toEqual({ type: 'fragmentation', hadron: 'K-' })
    expect(bits(back.x).equals(bits(set.x))).toBe(true)
    expect(bits(back.q2).equals(bits(set.q2))).toBe(true)
    back.members.forEach((m, k) => expect(bits(m).equals(bits(set.members[k]!))).toBe(true))
  })

  it('a table with an x column under a fragmentation header is refused at line 1, column 2', async () => {
    const text = csv('long').replace('member,z,q2,pdg,zD', 'member,x,q2,pdg,xf')
    const e = await rejection(() => readSetTable(file('x.csv', text), 'x.csv', parseTableHeader(sidecar, 'The sidecar'), 1e9))
    expect(e.statusCode).toBe(400)
    expect(e.message).toContain('x.csv: line 1, column 2: expected the column "z" but found "x"; the header says fragmentation functions')
  })

  it('a z value outside (0, 1) is located by line, column and name', async () => {
    const lines = csv('long').split('\r\n')
    lines[3] = lines[3]!.replace(/^(\d+),[^,]+,/, '$1,1.5,')
    const e = await rejection(() => readSetTable(file('bad.csv', lines.join('\r\n')), 'bad.csv', parseTableHeader(sidecar, 'The sidecar'), 1e9))
    expect(e.message).toContain('line 4, column 2 (z): z must be a number in (0, 1)')
  })

  it.each([
    ['a fragmentation header with a target', { target: { type: 'proton' } }, 'header.target', 'has no target'],
    ['a wrong hadron key', { density: { type: 'fragmentation', hadron: 'kaon' } }, 'header.density.hadron', 'hadron must be one of'],
    ['a parton header without a target', { density: { type: 'parton' } }, 'header.target', 'needs header.target']
  ])('%s is a 400 naming the field', async (_name, change, field, text) => {
    const e = await rejection(() => parseTableHeader(JSON.stringify({ ...JSON.parse(sidecar), ...change }), 'The sidecar'))
    expect(e.statusCode).toBe(400)
    const fields = (e.data as { fields: Record<string, string> }).fields
    expect(Object.keys(fields)).toEqual([field])
    expect(fields[field]).toContain(text)
  })
})

describe('sample fragmentation tables (scripts/make-sample-fragmentation.ts)', () => {
  const samples = join(__dirname, '../../../samples/tables')
  const sidecarText = readFileSync(join(samples, 'toy-ff-table.header.json'), 'utf8')

  it('every form imports with the sidecar to the same set of fragmentation into π⁺', async () => {
    const header = parseTableHeader(sidecarText, 'The sidecar')
    const sets: ErrorSet[] = []
    for (const name of ['toy-ff-table-long.csv', 'toy-ff-table-wide.tsv', 'toy-ff-table-wide.csv.gz', 'toy-ff-table-long.parquet']) {
      const { set: back } = await readSetTable(join(samples, name), name, header, 1e9)
      expect(back.header.density, name).toEqual({ type: 'fragmentation', hadron: 'pi+' })
      sets.push(back)
    }
    for (const s of sets.slice(1)) s.members.forEach((m, k) => expect(bits(m).equals(bits(sets[0]!.members[k]!))).toBe(true))
  })

  it('bad-ff-x-column.csv is refused at line 1, column 2', async () => {
    const e = await rejection(() => readSetTable(join(samples, 'bad-ff-x-column.csv'), 'bad-ff-x-column.csv', parseTableHeader(sidecarText, 'The sidecar'), 1e9))
    expect(e.message).toContain('line 1, column 2: expected the column "z" but found "x"')
  })
})
