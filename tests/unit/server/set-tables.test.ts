import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { gzipSync } from 'node:zlib'
import { afterAll, describe, expect, it } from 'vitest'
import { parquetWriteBuffer } from 'hyparquet-writer'
import { parseSetFile } from '../../../shared/physics/sets/parse'
import type { ErrorSet } from '../../../shared/physics/types'
import type { SetTableHeader } from '../../../shared/utils/set-table-schemas'
import { DomainError } from '../../../server/domain/errors'
import { readSetTable } from '../../../server/domain/sets/table-import'
import { delimitedChunks, parquetTable } from '../../../server/domain/sets/table-write'

const dir = mkdtempSync(join(tmpdir(), 'sheaf-table-test-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

const sample = (name: string) => parseSetFile(readFileSync(join(__dirname, '../../../samples/sets', name)))
const headerOf = (set: ErrorSet): SetTableHeader => {
  const { memberCount: _m, order: _o, ...rest } = set.header
  return rest
}
const file = (name: string, bytes: string | Uint8Array) => {
  const path = join(dir, name)
  writeFileSync(path, bytes)
  return path
}
const bits = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength)
const csv = (set: ErrorSet, layout: 'long' | 'wide', d: ',' | '\t' = ',') => [...delimitedChunks(set, layout, d)].join('')

async function rejection(path: string, name: string, header: SetTableHeader) {
  try {
    await readSetTable(path, name, header, 1e9)
  } catch (err) {
    expect(err).toBeInstanceOf(DomainError)
    return err as DomainError
  }
  throw new Error('the table was accepted')
}

describe('set tables: export then import gives the same member values bit for bit', { timeout: 120_000 }, () => {
  // toy-hessian has heavy-quark thresholds, so two Q² values are nodes twice (below, above).
  it.each(['toy-hessian.sheafset', 'toy-replicas.sheafset'])('%s through every format and layout', async (name) => {
    const set = sample(name)
    expect(new Set(set.q2).size).toBeLessThanOrEqual(set.q2.length)
    const tables: Array<[string, string | Uint8Array]> = [
      ['long.csv', csv(set, 'long')], ['wide.csv', csv(set, 'wide')],
      ['long.tsv', csv(set, 'long', '\t')], ['wide.tsv.gz', gzipSync(csv(set, 'wide', '\t'))], ['long.csv.gz', gzipSync(csv(set, 'long'))],
      ['long.parquet', parquetTable(set, 'long')], ['wide.parquet', parquetTable(set, 'wide')]
    ]
    for (const [tableName, bytes] of tables) {
      const { set: back, stats } = await readSetTable(file(tableName, bytes), tableName, headerOf(set), 1e9)
      expect(back.members.length, tableName).toBe(set.members.length)
      back.members.forEach((m, k) => expect(bits(m).equals(bits(set.members[k]!)), `${tableName} member ${k}`).toBe(true))
      expect(bits(back.x).equals(bits(set.x))).toBe(true)
      expect(bits(back.q2).equals(bits(set.q2))).toBe(true)
      expect(back.flavours).toEqual(set.flavours)
      expect(back.header).toEqual(set.header)
      expect(stats.layout).toBe(tableName.startsWith('long') ? 'long' : 'wide')
    }
  })

  it('keeps the sign of zero and full-precision doubles in text', async () => {
    const set = sample('toy-hessian.sheafset')
    const members = set.members.map(m => Float64Array.from(m))
    members[1]![0] = 0.1 + 0.2 // 0.30000000000000004 needs all 17 digits
    members[2]![0] = -0
    members[2]![1] = 5e-324 // the smallest subnormal double
    const changed: ErrorSet = { ...set, members }
    const { set: back } = await readSetTable(file('z.csv', csv(changed, 'long')), 'z.csv', headerOf(set), 1e9)
    expect(back.members[1]![0]).toBe(0.30000000000000004)
    expect(Object.is(back.members[2]![0], -0)).toBe(true)
    expect(back.members[2]![1]).toBe(5e-324)
  })
})

describe('set tables: bad files are refused with the place named', { timeout: 60_000 }, () => {
  const set = sample('toy-hessian.sheafset')
  const header = headerOf(set)
  const lines = csv(set, 'long').split('\r\n')

  it('names line and column of a cell that is not a number', async () => {
    const bad = [...lines]
    bad[3] = bad[3]!.replace(/,[^,]*$/, ',abc')
    const err = await rejection(file('bad-cell.csv', bad.join('\r\n')), 'bad-cell.csv', header)
    expect(err.statusCode).toBe(400)
    expect(err.message).toBe('bad-cell.csv: line 4, column 5 (xf): x·f must be a finite number')
    expect(err.data?.issues?.[0]).toMatchObject({ line: 4, column: 5, file: 'bad-cell.csv' })
  })

  it('names the column of a header that is not the layout', async () => {
    const bad = [...lines]
    bad[0] = 'member,x,Q,pdg,xf'
    const err = await rejection(file('bad-header.csv', bad.join('\r\n')), 'bad-header.csv', header)
    expect(err.message).toMatch(/^bad-header\.csv: line 1, column 3: expected the column "q2" but found "Q"/)
  })

  it('names an x outside (0, 1), a flavour that is no parton and a fractional member', async () => {
    const cases: Array<[RegExp, string, string]> = [
      [/^0,[^,]*,/, '0,1.5,', 'column 2 (x): x must be a number in (0, 1)'],
      [/,-?\d+,([^,]*)$/, ',7,$1', 'column 4 (pdg): the PDG code must be a parton code'],
      [/^0,/, '0.5,', 'column 1 (member): the member must be a whole number']
    ]
    for (const [pattern, replacement, message] of cases) {
      const bad = [...lines]
      bad[1] = bad[1]!.replace(pattern, replacement)
      const err = await rejection(file('bad.csv', bad.join('\r\n')), 'bad.csv', header)
      expect(err.message).toContain(`line 2, ${message}`)
    }
  })

  it('finds a missing value and a duplicate row', async () => {
    const missing = lines.filter((_, i) => i !== 10)
    const err = await rejection(file('missing.csv', missing.join('\r\n')), 'missing.csv', header)
    expect(err.message).toMatch(/the grid is incomplete: member 0, x = [\d.e-]+, Q² = [\d.e+]+ GeV², PDG -?\d+ has no row/)

    // Row 10 twice, row 11 missing: same row count, one duplicate (located) — the file's line 11 holds the copy.
    const duplicate = lines.map((l, i) => i === 11 ? lines[10]! : l)
    const dup = await rejection(file('duplicate.csv', duplicate.join('\r\n')), 'duplicate.csv', header)
    expect(dup.message).toMatch(/^duplicate\.csv: line 12: member 0, .* appears a second time$/)
  })

  it('names row group and row in a Parquet file', async () => {
    const xf = new Float64Array([0.5, 0.4, Number.NaN])
    const bytes = parquetWriteBuffer({
      columnData: [
        { name: 'member', data: new Int32Array([0, 0, 0]), type: 'INT32' }, { name: 'x', data: new Float64Array([0.1, 0.2, 0.3]), type: 'DOUBLE' },
        { name: 'q2', data: new Float64Array([10, 10, 10]), type: 'DOUBLE' }, { name: 'pdg', data: new Int32Array([21, 21, 21]), type: 'INT32' },
        { name: 'xf', data: xf, type: 'DOUBLE' }
      ]
    })
    const err = await rejection(file('bad.parquet', new Uint8Array(bytes)), 'bad.parquet', header)
    expect(err.message).toBe('bad.parquet: row group 1, row 3, column 5 (xf): x·f must be a finite number')
  })

  it('refuses a damaged gzip stream, an unknown file type and a set the engine refuses', async () => {
    const gz = gzipSync(lines.join('\r\n'))
    const damaged = await rejection(file('damaged.csv.gz', gz.subarray(0, gz.length / 2)), 'damaged.csv.gz', header)
    expect(damaged.statusCode).toBe(400)
    const unknown = await rejection(file('table.xlsx', 'member,x'), 'table.xlsx', header)
    expect(unknown.message).toMatch(/name the file \.csv, \.tsv/)
    // Hessian pairs need an odd member count (central + pairs): drop the last member.
    const last = set.members.length - 1
    const even = lines.filter((l, i) => i === 0 || !l.startsWith(`${last},`))
    const refused = await rejection(file('even.csv', even.join('\r\n')), 'even.csv', header)
    expect(refused.message).toMatch(/^even\.csv does not make a valid set: /)
  })

  it('refuses a grid larger than the set limit before allocating it', async () => {
    await expect(readSetTable(file('big.csv', lines.join('\r\n')), 'big.csv', header, 1000)).rejects.toMatchObject({ statusCode: 413 })
  })
})

describe('the sample tables in samples/tables', { timeout: 60_000 }, () => {
  const at = (name: string) => join(__dirname, '../../../samples/tables', name)
  const header = JSON.parse(readFileSync(at('toy-table.header.json'), 'utf8')) as SetTableHeader

  it.each(['toy-table-long.csv', 'toy-table-wide.tsv', 'toy-table-wide.csv.gz', 'toy-table-long.parquet'])('%s imports as the same 5-member set', async (name) => {
    const { set, stats } = await readSetTable(at(name), name, header, 1e9)
    expect(set.members.length).toBe(5)
    expect(stats.values).toBe(5 * 5 * 8 * 7)
    const reference = (await readSetTable(at('toy-table-long.csv'), 'toy-table-long.csv', header, 1e9)).set
    set.members.forEach((m, k) => expect(bits(m).equals(bits(reference.members[k]!))).toBe(true))
  })

  it.each([
    ['bad-cell.csv', 'bad-cell.csv: line 6, column 5 (xf): x·f must be a finite number'],
    ['bad-missing-row.csv', /^bad-missing-row\.csv: the grid is incomplete: member 0, x = .*, PDG -?\d+ has no row/]
  ] as const)('%s is refused with its place', async (name, message) => {
    const err = await rejection(at(name), name, header)
    expect(err.message).toMatch(message)
  })
})
