import { writeCsv } from '../export/csv'
import { detectDelimiter, readCsv } from './csv'
import type { CsvReader } from './csv'
import type { BinColumn, BinRow, RowCheck } from './types'
import { emptyRow, normalizeCell, validateRows } from './validate'

/** A problem in an imported file, located by 1-based line and, where it applies, column. */
export interface CsvImportError {
  line: number
  /** Column key for a cell problem; the CSV's own character column is in the message. */
  column?: string
  message: string
}

export interface BinsCsvImport {
  /** The bins read, in file order; empty when `errors` has anything fatal. */
  rows: BinRow[]
  /** Line of the file each row came from. */
  lines: number[]
  /** Fatal: the file cannot be read as bins (syntax, field count, missing required column). */
  errors: CsvImportError[]
  /**
   * Cell problems of the rows read (bad numbers, bounds, ranges, extra checks), located by file
   * line. Not fatal: the grid loads such rows and highlights the cells.
   */
  cellErrors: CsvImportError[]
  /** Header columns that match no bin column and were ignored. */
  ignoredColumns: string[]
}

/** Header text compared loosely: case, spaces, and a trailing unit in [..] or (..) do not matter. */
const headerKey = (text: string) => text.replace(/\s*[[(][^\])]*[\])]\s*$/, '').replace(/[\s_]+/g, '').toLowerCase()

/**
 * Reads bins from CSV text whose header names the columns (by key or by label, optionally with
 * a unit: `x min [—]`). Delimiter ',', ';' or tab is detected from the header; `#` lines are
 * comments. Columns missing from the file are left empty (an error if required).
 *
 * @example importBinsCsv('xMin,xMax\n0.1,0.2\n', columns).rows // → [{ xMin: 0.1, xMax: 0.2 }]
 */
export function importBinsCsv(text: string, columns: readonly BinColumn[], options: { reader?: CsvReader, extraChecks?: RowCheck | readonly RowCheck[] } = {}): BinsCsvImport {
  const reader = options.reader ?? readCsv
  const firstLine = text.replace(/^\uFEFF/, '').split(/\r?\n|\r/).find(l => l.trim() !== '' && !l.startsWith('#')) ?? ''
  const { records, problems } = reader(text, { delimiter: detectDelimiter(firstLine), comment: '#' })
  const errors: CsvImportError[] = problems.map(p => ({ line: p.line, message: `line ${p.line}, character ${p.column}: ${p.message}` }))
  const result = (rows: BinRow[] = [], lines: number[] = [], cellErrors: CsvImportError[] = [], ignoredColumns: string[] = []): BinsCsvImport =>
    ({ rows: errors.length ? [] : rows, lines: errors.length ? [] : lines, errors, cellErrors, ignoredColumns })
  const [header, ...data] = records
  if (!header) {
    if (!errors.length) errors.push({ line: 1, message: 'line 1: the file is empty; expected a header line naming the bin columns' })
    return result()
  }
  const byName = new Map<string, BinColumn>()
  for (const c of columns) {
    byName.set(headerKey(c.key), c)
    byName.set(headerKey(c.label), c)
  }
  const slots: (BinColumn | undefined)[] = header.fields.map(f => byName.get(headerKey(f)))
  const ignoredColumns = header.fields.filter((_, j) => !slots[j]).map(f => f.trim())
  slots.forEach((c, j) => {
    if (c && slots.indexOf(c) !== j) errors.push({ line: header.line, column: c.key, message: `line ${header.line}: column ${c.label} appears twice in the header (fields ${slots.indexOf(c) + 1} and ${j + 1})` })
  })
  for (const c of columns) {
    if (c.required && !slots.includes(c)) errors.push({ line: header.line, column: c.key, message: `line ${header.line}: the header has no column ${c.label} (${c.key}), which is required` })
  }
  const rows: BinRow[] = []
  const lines: number[] = []
  for (const record of data) {
    if (record.fields.every(f => f.trim() === '')) continue
    if (record.fields.length !== header.fields.length) {
      errors.push({ line: record.line, message: `line ${record.line}: ${record.fields.length} fields, but the header has ${header.fields.length}` })
      continue
    }
    const row = emptyRow(columns)
    record.fields.forEach((f, j) => {
      const c = slots[j]
      if (c) row[c.key] = normalizeCell(f, c)
    })
    rows.push(row)
    lines.push(record.line)
  }
  const labels = new Map(columns.map(c => [c.key, c.label]))
  const cellErrors = validateRows(rows, columns, options.extraChecks).map(e => ({
    line: lines[e.row]!,
    column: e.column,
    message: `line ${lines[e.row]}, column ${labels.get(e.column)}: ${e.reason}`
  }))
  return result(rows, lines, cellErrors, ignoredColumns)
}

/**
 * Bins as CSV: a header of column keys, one line per row, optional `# ` comment lines first.
 * Written by Sheaf's one CSV writer (shared/export/csv.ts: CRLF line ends, RFC 4180 quoting,
 * numbers in their shortest exact form so import ∘ export is the identity, empty cells for
 * empty or non-finite values).
 */
export function exportBinsCsv(rows: readonly Readonly<BinRow>[], columns: readonly BinColumn[], options: { comments?: readonly string[] } = {}): string {
  return writeCsv([columns.map(c => c.key), ...rows.map(r => columns.map(c => r[c.key] ?? null))], { comments: options.comments })
}
