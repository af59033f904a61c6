import { createGzip } from 'node:zlib'
import { loadErrorSet } from '../../../../../domain/sets/store'
import { delimitedStream, parquetTable, tableSidecar } from '../../../../../domain/sets/table-write'

// Export an error set's members as a neutral table (viewers): ?format=csv|tsv|parquet,
// ?layout=long|wide, ?gzip=1 (CSV/TSV), or ?header=1 for the JSON sidecar holding the set header.
// Importing the table with its sidecar gives the same member values bit for bit.
export default defineEventHandler(async (event) => {
  const { set: row } = await requireSet(event, 'viewer')
  const query = queryValid(event, setTableExportQuerySchema)
  const set = await loadErrorSet(useDB(), row.id)
  const base = `${row.name}-${row.version}`.replace(/[^\w.-]+/g, '_')
  if (query.header === '1') {
    setResponseHeaders(event, { 'content-type': 'application/json', 'content-disposition': `attachment; filename="${base}.header.json"` })
    return tableSidecar(set.header)
  }
  if (query.format === 'parquet') {
    setResponseHeaders(event, { 'content-type': 'application/vnd.apache.parquet', 'content-disposition': `attachment; filename="${base}-${query.layout}.parquet"` })
    return Buffer.from(parquetTable(set, query.layout).buffer)
  }
  const text = delimitedStream(set, query.layout, query.format === 'tsv' ? '\t' : ',')
  const name = `${base}-${query.layout}.${query.format}${query.gzip === '1' ? '.gz' : ''}`
  setResponseHeaders(event, {
    'content-type': query.gzip === '1' ? 'application/gzip' : query.format === 'tsv' ? 'text/tab-separated-values; charset=utf-8' : 'text/csv; charset=utf-8',
    'content-disposition': `attachment; filename="${name}"`
  })
  return sendStream(event, query.gzip === '1' ? text.pipe(createGzip()) : text)
})
