// Streaming readers of set tables: CSV and TSV (gzipped or not) line by line, Parquet
// through hyparquet one row group at a time. Each hands every record to a RecordSink as numbers
// with its location; neither holds more than a chunk (CSV) or a row group (Parquet) in memory.
import { createReadStream } from 'node:fs'
import { open } from 'node:fs/promises'
import { createGunzip } from 'node:zlib'
import { asyncBufferFromFile, parquetMetadataAsync, parquetRead, parquetSchema } from 'hyparquet'
import { layoutOf, readDecimal, tableError, TableError, type FractionAxis, type TableLayout } from './table-format'
import type { RecordSink } from './table-grid'

export type TableFormat = 'csv' | 'tsv' | 'parquet'

/** A readable table: its layout and a way to stream its records (may be called more than once). */
export interface TableSource { layout: TableLayout, read: (sink: RecordSink) => Promise<void> }

/** The table's format from its file name and first bytes; TableError for anything else. */
export async function detectFormat(path: string, fileName: string): Promise<{ format: TableFormat, gzip: boolean }> {
  const handle = await open(path, 'r')
  const head = Buffer.alloc(4)
  try {
    await handle.read(head, 0, 4, 0)
  } finally {
    await handle.close()
  }
  const gzip = head[0] === 0x1f && head[1] === 0x8b
  if (head.toString('latin1') === 'PAR1') return { format: 'parquet', gzip: false }
  const name = fileName.toLowerCase().replace(/\.gz$/, '')
  if (name.endsWith('.tsv') || name.endsWith('.tab')) return { format: 'tsv', gzip }
  if (name.endsWith('.csv') || name.endsWith('.txt')) return { format: 'csv', gzip }
  if (name.endsWith('.parquet')) throw new TableError(`${fileName} does not start with the Parquet magic bytes PAR1`)
  throw new TableError(`${fileName}: name the file .csv, .tsv, .csv.gz, .tsv.gz or .parquet`)
}

/**
 * Calls `onLine(text, lineNumber)` for every non-blank line of a (gzipped) text file, streaming
 * in 1 MiB chunks. Hand-written rather than csv-parse: a numeric table has no quoting to speak
 * of, and this loop reads about three times as many rows per second (scripts/bench-table.ts
 * prints both). Returning `false` from onLine stops the reading.
 */
async function eachLine(path: string, gzip: boolean, onLine: (text: string, line: number) => boolean | undefined): Promise<void> {
  const file = createReadStream(path, { highWaterMark: 1 << 20 })
  const source = gzip ? file.pipe(createGunzip()) : file
  if (gzip) file.on('error', err => source.destroy(err))
  source.setEncoding('utf8')
  let rest = ''
  let line = 0
  let first = true
  try {
    for await (const chunk of source as AsyncIterable<string>) {
      let text = rest + chunk
      if (first) {
        if (text.charCodeAt(0) === 0xFEFF) text = text.slice(1)
        first = false
      }
      let from = 0
      for (let nl = text.indexOf('\n', from); nl >= 0; nl = text.indexOf('\n', from)) {
        line++
        const end = nl > from && text.charCodeAt(nl - 1) === 13 ? nl - 1 : nl
        if (end > from && onLine(text.slice(from, end), line) === false) return
        from = nl + 1
      }
      rest = text.slice(from)
    }
    if (rest.length) {
      line++
      const end = rest.charCodeAt(rest.length - 1) === 13 ? rest.length - 1 : rest.length
      if (end > 0) onLine(rest.slice(0, end), line)
    }
  } catch (err) {
    if (err instanceof TableError) throw err
    const code = (err as { code?: string }).code ?? ''
    if (gzip && code.startsWith('Z_')) throw tableError({ line: line + 1 }, `the gzip stream is damaged (${(err as Error).message})`)
    throw err
  } finally {
    file.destroy()
    source.destroy()
  }
}

/** One cell as text: surrounding spaces dropped, and one pair of double quotes (RFC 4180) taken off. */
function cellText(raw: string): string {
  const t = raw.trim()
  return t.length >= 2 && t.charCodeAt(0) === 34 && t.charCodeAt(t.length - 1) === 34 ? t.slice(1, -1).replace(/""/g, '"') : t
}

/** A CSV or TSV table: the header row names the layout, every later row is a record. */
export async function delimitedSource(path: string, format: 'csv' | 'tsv', gzip: boolean, axis: FractionAxis = 'x'): Promise<TableSource> {
  const delimiter = format === 'tsv' ? '\t' : ','
  let header: { cells: string[], line: number } | undefined
  await eachLine(path, gzip, (text, line) => {
    header = { cells: text.split(delimiter).map(cellText), line }
    return false
  })
  if (!header) throw new TableError('the table is empty: it needs a header row and data rows')
  const { line: headerLine, cells: names } = header
  const layout = layoutOf(names, column => ({ line: headerLine, column }), axis)
  const width = names.length
  const read = async (sink: RecordSink) => {
    const cells = new Float64Array(width)
    await eachLine(path, gzip, (text, line) => {
      if (line <= headerLine) return undefined
      const at = (column: number) => ({ line, column })
      let from = 0
      let i = 0
      for (; i < width; i++) {
        let to = text.indexOf(delimiter, from)
        if (to < 0) to = text.length
        else if (i === width - 1) throw tableError(at(width + 1), `the row has more cells than the header's ${width} columns`)
        const raw = text.slice(from, to)
        let v = readDecimal(raw)
        if (Number.isNaN(v)) v = readDecimal(cellText(raw))
        cells[i] = v
        from = to + 1
        if (to === text.length) { i++; break }
      }
      if (i < width) throw tableError(at(i + 1), `the row has ${i} cells; the header has ${width} columns`)
      sink(cells, at)
      return undefined
    })
  }
  return { layout, read }
}

const asNumber = (v: unknown) => typeof v === 'number' ? v : typeof v === 'bigint' ? Number(v) : Number.NaN

/** A Parquet table: its top-level column names give the layout; read one row group at a time. */
export async function parquetSource(path: string, axis: FractionAxis = 'x'): Promise<TableSource> {
  const file = await asyncBufferFromFile(path)
  let metadata
  try {
    metadata = await parquetMetadataAsync(file)
  } catch (err) {
    throw new TableError(`the Parquet file cannot be read: ${(err as Error).message}`)
  }
  const columns = parquetSchema(metadata).children.map(c => c.element.name)
  const layout = layoutOf(columns, column => ({ rowGroup: 0, column, columnName: columns[column - 1] }), axis)
  const read = async (sink: RecordSink) => {
    let rowStart = 0
    for (let g = 0; g < metadata.row_groups.length; g++) {
      const rows = Number(metadata.row_groups[g]!.num_rows)
      let data: unknown[][] = []
      try {
        await parquetRead({ file, metadata, columns, rowStart, rowEnd: rowStart + rows, onComplete: (d) => { data = d as unknown[][] } })
      } catch (err) {
        throw tableError({ rowGroup: g + 1 }, `the row group cannot be read: ${(err as Error).message}`)
      }
      const cells = new Float64Array(columns.length)
      for (let r = 0; r < data.length; r++) {
        const row = data[r]!
        for (let i = 0; i < columns.length; i++) cells[i] = asNumber(row[i])
        sink(cells, column => ({ rowGroup: g + 1, row: r + 1, column, columnName: columns[column - 1] }))
      }
      rowStart += rows
    }
  }
  return { layout, read }
}
