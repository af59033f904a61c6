// Export of a set's members as a neutral table (table-format.ts): CSV or TSV written as a stream
// of chunks (optionally gzipped by the caller), or Parquet (hyparquet-writer) with DOUBLE value
// columns. Rows in the set file's body order (member, Q², x, flavour), so a threshold Q² node's
// value below the threshold comes before the one above, as the importer expects.
import { Readable } from 'node:stream'
import { parquetWriteBuffer } from 'hyparquet-writer'
import { fileSetHeader, fractionAxisOf } from '../../../shared/physics/sets/header'
import type { ErrorSet, SetHeader } from '../../../shared/physics/types'
import { tableNames, writeDecimal } from './table-format'

export type TableLayoutName = 'long' | 'wide'

/** The header row of a layout (member, z, q2, … and zD for a fragmentation set). */
export function tableColumns(set: ErrorSet, layout: TableLayoutName): string[] {
  const { keys, value } = tableNames(fractionAxisOf(set.header.density))
  return layout === 'long' ? [...keys, 'pdg', value] : [...keys, ...set.flavours.map(String)]
}

/**
 * The JSON sidecar of a table: the set's header as a version-2 file writes it (density always
 * said, no target for a fragmentation set) without `memberCount` and `order`, which the import
 * takes from the table.
 */
export function tableSidecar(header: SetHeader) {
  const { memberCount: _count, order: _order, ...rest } = fileSetHeader(header)
  return rest
}

/**
 * The rows of a CSV (`,`) or TSV (tab) table as text chunks of about 1 MB; line ends CRLF (RFC
 * 4180). No cell needs quoting: every cell is a number or a column name without a delimiter.
 * @example Readable.from(delimitedChunks(set, 'long', ',')).pipe(res)
 */
export function* delimitedChunks(set: ErrorSet, layout: TableLayoutName, delimiter: ',' | '\t'): Generator<string> {
  const nx = set.x.length
  const nq = set.q2.length
  const nf = set.flavours.length
  const xs = Array.from(set.x, writeDecimal)
  const qs = Array.from(set.q2, writeDecimal)
  const fs = set.flavours.map(String)
  let chunk = tableColumns(set, layout).join(delimiter) + '\r\n'
  for (let m = 0; m < set.members.length; m++) {
    const values = set.members[m]!
    for (let iq = 0; iq < nq; iq++) {
      for (let ix = 0; ix < nx; ix++) {
        const base = (iq * nx + ix) * nf
        const key = `${m}${delimiter}${xs[ix]}${delimiter}${qs[iq]}${delimiter}`
        if (layout === 'long') {
          for (let f = 0; f < nf; f++) chunk += `${key}${fs[f]}${delimiter}${writeDecimal(values[base + f]!)}\r\n`
        } else {
          let line = key
          for (let f = 0; f < nf; f++) line += (f ? delimiter : '') + writeDecimal(values[base + f]!)
          chunk += line + '\r\n'
        }
        if (chunk.length > 1 << 20) {
          yield chunk
          chunk = ''
        }
      }
    }
  }
  if (chunk) yield chunk
}

/** The CSV/TSV table as a byte stream. */
export const delimitedStream = (set: ErrorSet, layout: TableLayoutName, delimiter: ',' | '\t') =>
  Readable.from(delimitedChunks(set, layout, delimiter), { objectMode: false })

/** Rows per Parquet row group in an export (our number: about 3 MB of values per group in long form). */
export const PARQUET_ROW_GROUP = 100_000

/**
 * The table as a Parquet file: member and pdg INT32, x, q2 and the values DOUBLE (bit-exact),
 * the set's sidecar header (tableSidecar) in the key-value metadata under "sheaf.header".
 */
export function parquetTable(set: ErrorSet, layout: TableLayoutName): Uint8Array {
  const nx = set.x.length
  const nq = set.q2.length
  const nf = set.flavours.length
  const rows = set.members.length * nq * nx * (layout === 'long' ? nf : 1)
  const member = new Int32Array(rows)
  const x = new Float64Array(rows)
  const q2 = new Float64Array(rows)
  const pdg = layout === 'long' ? new Int32Array(rows) : undefined
  const values = layout === 'long' ? [new Float64Array(rows)] : set.flavours.map(() => new Float64Array(rows))
  let r = 0
  for (let m = 0; m < set.members.length; m++) {
    const v = set.members[m]!
    for (let iq = 0; iq < nq; iq++) {
      for (let ix = 0; ix < nx; ix++) {
        const base = (iq * nx + ix) * nf
        if (pdg) {
          for (let f = 0; f < nf; f++, r++) {
            member[r] = m; x[r] = set.x[ix]!; q2[r] = set.q2[iq]!; pdg[r] = set.flavours[f]!; values[0]![r] = v[base + f]!
          }
        } else {
          member[r] = m; x[r] = set.x[ix]!; q2[r] = set.q2[iq]!
          for (let f = 0; f < nf; f++) values[f]![r] = v[base + f]!
          r++
        }
      }
    }
  }
  const names = tableColumns(set, layout)
  const columnData = [
    { name: 'member', data: member, type: 'INT32' as const, nullable: false },
    { name: names[1]!, data: x, type: 'DOUBLE' as const, nullable: false },
    { name: 'q2', data: q2, type: 'DOUBLE' as const, nullable: false },
    ...(pdg
      ? [{ name: 'pdg', data: pdg, type: 'INT32' as const, nullable: false }, { name: names[4]!, data: values[0]!, type: 'DOUBLE' as const, nullable: false }]
      : set.flavours.map((f, i) => ({ name: String(f), data: values[i]!, type: 'DOUBLE' as const, nullable: false })))
  ]
  const buffer = parquetWriteBuffer({
    columnData, rowGroupSize: PARQUET_ROW_GROUP,
    kvMetadata: [{ key: 'sheaf.header', value: JSON.stringify(tableSidecar(set.header)) }]
  })
  return new Uint8Array(buffer)
}
