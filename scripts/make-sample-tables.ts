/**
 * Writes the sample set tables in samples/tables/: one small TOY set (made-up analytic
 * functions, shared/physics/sets/toy.ts; not a fit) as long CSV, wide TSV, gzipped CSV and
 * Parquet with its JSON sidecar, and two deliberately bad tables for the located messages.
 *
 *   npx tsx scripts/make-sample-tables.ts
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { gzipSync } from 'node:zlib'
import { toyErrorSet, toyQ2Nodes, toyXNodes } from '../shared/physics/sets/toy'
import type { FlavourScheme } from '../shared/physics/types'
import { delimitedChunks, parquetTable } from '../server/domain/sets/table-write'

const dir = fileURLToPath(new URL('../samples/tables/', import.meta.url))
mkdirSync(dir, { recursive: true })
const write = (name: string, bytes: string | Uint8Array) => {
  writeFileSync(`${dir}${name}`, bytes)
  console.log(`${name}: ${typeof bytes === 'string' ? Buffer.byteLength(bytes) : bytes.length} bytes`)
}

const scheme: FlavourScheme = { type: 'fixed', nf: 3, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const set = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 2, x: toyXNodes(8, 1e-4, 0.9), q2: toyQ2Nodes({ q2MinGeV2: 2, q2MaxGeV2: 1e4, count: 5 }), scheme, name: 'toy-table' })
const { memberCount: _m, order: _o, ...header } = set.header
const text = (layout: 'long' | 'wide', d: ',' | '\t') => [...delimitedChunks(set, layout, d)].join('')

write('toy-table.header.json', JSON.stringify(header, null, 2) + '\n')
write('toy-table-long.csv', text('long', ','))
write('toy-table-wide.tsv', text('wide', '\t'))
write('toy-table-wide.csv.gz', gzipSync(text('wide', ',')))
write('toy-table-long.parquet', parquetTable(set, 'long'))

const lines = text('long', ',').split('\r\n')
// Line 6, column 5: "n/a" is no number.
write('bad-cell.csv', lines.map((l, i) => (i === 5 ? l.replace(/,[^,]*$/, ',n/a') : l)).join('\r\n'))
// The row on line 40 is gone: the grid is incomplete.
write('bad-missing-row.csv', lines.filter((_, i) => i !== 39).join('\r\n'))
