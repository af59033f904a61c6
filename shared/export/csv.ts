/**
 * Sheaf's one CSV writer: every CSV that Sheaf writes (band and matrix exports, the bins grid's
 * export, the command line) goes through {@link writeCsv}. Records follow RFC 4180; quoting is
 * done by papaparse's `unparse`, the cell rules below by this module.
 *
 * Rules:
 * - Line ends: every line, the last one included, ends with CRLF.
 * - Quoting: a field is enclosed in double quotes, with each quote inside doubled, when it
 *   contains a comma, a double quote, CR or LF. RFC 4180 lets any field be quoted; Sheaf also
 *   quotes a field that starts or ends with white space (so readers that trim keep it), one that
 *   starts with `#` (so a reader skipping `#` comment lines keeps the record), one holding a
 *   byte-order mark, and a record's only field when it is empty (so the line is not read as a
 *   blank line).
 * - Numbers: a finite number is written in the shortest decimal form that reads back as the same
 *   double (ECMAScript's Number-to-String: 0.1, 0.00001234, 1e-7, 1.5e+300; −0 as 0), so no
 *   digit is lost and none is invented.
 * - Non-finite numbers: NaN, +∞ and −∞ give an empty field, as null and undefined do; the texts
 *   "NaN" and "Infinity" are never written for a number.
 * - Booleans as `true` / `false`; text as it is.
 * - Comment lines (provenance, cautions) come first, each as `# text` (`#` alone when empty), a
 *   comment with line breaks giving one `#` line per line. Comment lines are not part of RFC 4180:
 *   tell the reader to skip lines starting with `#` (papaparse `comments: '#'`, csv-parse
 *   `comment: '#'`, Sheaf's readCsv `comment: '#'`).
 */
import Papa from 'papaparse'

/** What one CSV field can be given as. */
export type CsvCell = string | number | boolean | null | undefined

export interface CsvWriteOptions {
  /** Lines written before the records, each prefixed with `# ` (provenance, cautions). */
  comments?: readonly string[]
}

/** The line end of every line Sheaf writes (RFC 4180). */
export const CSV_EOL = '\r\n'

/**
 * A number as CSV text: the shortest exact decimal form, or '' when it is not finite.
 * @example csvNumber(0.1 + 0.2) // '0.30000000000000004'
 * @example csvNumber(Number.NaN) // ''
 */
export function csvNumber(value: number): string {
  return Number.isFinite(value) ? String(value) : ''
}

/** A cell as unquoted text, by the rules above. */
function cellText(value: CsvCell): string {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return csvNumber(value)
  return String(value)
}

/** Quoting papaparse does not do by itself (it quotes a byte-order mark and edge spaces): edge white space, a leading '#'. */
const extraQuotes = (text: string) => text !== text.trim() || text.startsWith('#')

/**
 * One record as a line of CSV, without its line end.
 * @example csvLine(['a', 'b,c', 'say "hi"', 1e-7, Number.NaN]) // 'a,"b,c","say ""hi""",1e-7,'
 */
export function csvLine(record: readonly CsvCell[]): string {
  const fields = record.map(cellText)
  const onlyEmpty = fields.length === 1 && fields[0] === ''
  return Papa.unparse([fields], {
    newline: CSV_EOL,
    quotes: onlyEmpty ? true : (text: string) => extraQuotes(text)
  })
}

/**
 * Records as RFC 4180 text with CRLF line ends, the comment lines first.
 * @example writeCsv([['x', 'q2'], [0.1, 10]], { comments: ['set: A'] }) // '# set: A\r\nx,q2\r\n0.1,10\r\n'
 */
export function writeCsv(records: readonly (readonly CsvCell[])[], options: CsvWriteOptions = {}): string {
  const comments = (options.comments ?? []).flatMap(c => c.split(/\r\n|\r|\n/)).map(c => (c ? `# ${c}` : '#'))
  return [...comments, ...records.map(csvLine)].map(line => line + CSV_EOL).join('')
}
