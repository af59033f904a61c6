/**
 * Writes the sample fragmentation sets: a TOY set of fragmentation functions into π⁺ (made-up
 * analytic forms, shared/physics/sets/toy-fragmentation.ts; not a fit, not an evolution) as a
 * version-2 set file in samples/sets/ and as set tables (long CSV, wide TSV, gzipped CSV, Parquet,
 * JSON sidecar) in samples/tables/, with a few deliberately bad files for the located messages
 * (each listed in samples/sets/README.md and samples/README.md). The parton-density samples are
 * written by make-sample-sets.ts and make-sample-tables.ts and are left as they are (version 1).
 *
 *   npx tsx scripts/make-sample-fragmentation.ts
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { gzipSync } from 'node:zlib'
import { SET_FILE_PREAMBLE_BYTES, assembleSetFile, readSetHeader, toyErrorSet, toyQ2Nodes, toyXNodes, writeSetFile } from '../shared/physics/sets'
import type { FlavourScheme } from '../shared/physics/types'
import { delimitedChunks, parquetTable, tableSidecar } from '../server/domain/sets/table-write'

const root = fileURLToPath(new URL('../samples/', import.meta.url))
const write = (folder: 'sets' | 'tables', name: string, bytes: string | Uint8Array) => {
  mkdirSync(`${root}${folder}`, { recursive: true })
  writeFileSync(`${root}${folder}/${name}`, bytes)
  console.log(`${folder}/${name}: ${typeof bytes === 'string' ? Buffer.byteLength(bytes) : bytes.length} bytes`)
}
const density = { type: 'fragmentation', hadron: 'pi+' } as const

// --- The set file: z in [0.01, 0.95], Q² in [1, 10⁵] GeV² with the charm and bottom thresholds --
const variable: FlavourScheme = { type: 'variable', nf: 5, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const z = toyXNodes(20, 0.01, 0.95)
const q2 = toyQ2Nodes({ q2MinGeV2: 1, q2MaxGeV2: 1e5, count: 20, thresholdsGeV2: [1.51 ** 2, 4.92 ** 2] })
const ff = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 4, x: z, q2, scheme: variable, name: 'toy-ff-pi+', amplitude: 0.05, density })
const good = writeSetFile(ff, { encoding: 'float32-le' })
write('sets', 'toy-ff-piplus.sheafset', good)

// Malformed fragmentation headers (the body is the good one's).
const { bodyOffset } = readSetHeader(good)
const header = () => JSON.parse(new TextDecoder().decode(good.subarray(SET_FILE_PREAMBLE_BYTES, bodyOffset))) as Record<string, any>
const body = good.subarray(bodyOffset)
{
  const h = header()
  h.set.target = { type: 'proton' }
  write('sets', 'bad-ff-target.sheafset', assembleSetFile(h, body))
}
{
  const h = header()
  h.set.density.hadron = 'pion+'
  write('sets', 'bad-ff-hadron.sheafset', assembleSetFile(h, body))
}
{
  const h = header()
  h.grid.x = h.grid.z
  delete h.grid.z
  write('sets', 'bad-ff-axis.sheafset', assembleSetFile(h, body))
}

// --- The tables: a smaller set (8 z × 5 Q², fixed three flavours) -------------------------------
const fixed: FlavourScheme = { type: 'fixed', nf: 3, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }
const small = toyErrorSet({ kind: 'hessian-pairs', errorMembers: 2, x: toyXNodes(8, 0.01, 0.9), q2: toyQ2Nodes({ q2MinGeV2: 2, q2MaxGeV2: 1e4, count: 5 }), scheme: fixed, name: 'toy-ff-table', amplitude: 0.05, density })
const text = (layout: 'long' | 'wide', d: ',' | '\t') => [...delimitedChunks(small, layout, d)].join('')
write('tables', 'toy-ff-table.header.json', JSON.stringify(tableSidecar(small.header), null, 2) + '\n')
write('tables', 'toy-ff-table-long.csv', text('long', ','))
write('tables', 'toy-ff-table-wide.tsv', text('wide', '\t'))
write('tables', 'toy-ff-table-wide.csv.gz', gzipSync(text('wide', ',')))
write('tables', 'toy-ff-table-long.parquet', parquetTable(small, 'long'))
// The fraction column named x under a fragmentation sidecar: refused at line 1, column 2.
write('tables', 'bad-ff-x-column.csv', text('long', ',').replace('member,z,q2,pdg,zD', 'member,x,q2,pdg,xf'))
