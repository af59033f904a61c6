/**
 * A small RFC 4180 reader and writer. The reader sits behind the {@link CsvReader} interface so
 * that a well-known parser can replace it without touching the callers.
 *
 * Accepted beyond RFC 4180 (common practice for files written by spreadsheets): LF or lone CR
 * line ends as well as CRLF, a leading byte-order mark, blank lines (skipped), and optionally
 * comment lines starting with `#` (skipped only at the start of a record).
 */

/** One record and the 1-based physical line on which it starts. */
export interface CsvRecord {
  fields: string[]
  line: number
}

/** A syntax problem: 1-based line and character column, and what is wrong. */
export interface CsvProblem {
  line: number
  column: number
  message: string
}

export interface CsvReadOptions {
  /** Field separator; default ','. */
  delimiter?: string
  /** Lines starting with this text are skipped (e.g. '#'); default: none. */
  comment?: string
  /** Stop after this many problems; default 50. */
  maxProblems?: number
}

export interface CsvReadResult {
  records: CsvRecord[]
  problems: CsvProblem[]
}

/** The interface every CSV reader used by Sheaf implements. */
export type CsvReader = (text: string, options?: CsvReadOptions) => CsvReadResult

/**
 * Reads RFC 4180 text. Quoted fields may hold the delimiter, `""` for a quote, and line breaks.
 * A quote inside an unquoted field, text after a closing quote, and a quote never closed are
 * problems; after one, reading resumes at the next line.
 *
 * @example readCsv('a,"b ""c"""\r\n1,2').records // → [{ fields: ['a', 'b "c"'], line: 1 }, { fields: ['1', '2'], line: 2 }]
 */
export const readCsv: CsvReader = (text, options = {}) => {
  const delimiter = options.delimiter ?? ','
  const comment = options.comment
  const maxProblems = options.maxProblems ?? 50
  if (delimiter.length !== 1 || delimiter === '"' || delimiter === '\n' || delimiter === '\r') {
    throw new RangeError(`CSV delimiter must be one character other than a quote or a line break, got '${delimiter}'`)
  }
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text
  const records: CsvRecord[] = []
  const problems: CsvProblem[] = []
  let i = 0
  let line = 1
  let lineStart = 0
  const n = src.length

  const isEol = (c: string | undefined) => c === '\n' || c === '\r'
  /** Consumes one line end at i (CRLF, LF or CR). */
  const eatEol = () => {
    if (src[i] === '\r' && src[i + 1] === '\n') i += 2
    else i += 1
    line += 1
    lineStart = i
  }
  const skipToNextLine = () => {
    while (i < n && !isEol(src[i])) i++
    if (i < n) eatEol()
  }

  while (i < n && problems.length < maxProblems) {
    if (isEol(src[i])) { eatEol(); continue } // blank line
    if (comment && src.startsWith(comment, i)) { skipToNextLine(); continue }
    const recordLine = line
    const fields: string[] = []
    let bad = false
    for (;;) {
      // one field starting at i
      if (src[i] === '"') {
        const openLine = line
        const openColumn = i - lineStart + 1
        i++
        let value = ''
        let closed = false
        while (i < n) {
          const c = src[i]!
          if (c === '"') {
            if (src[i + 1] === '"') { value += '"'; i += 2; continue }
            i++
            closed = true
            break
          }
          if (c === '\r' || c === '\n') {
            value += c === '\r' && src[i + 1] === '\n' ? '\r\n' : c
            eatEol()
            continue
          }
          value += c
          i++
        }
        if (!closed) {
          problems.push({ line: openLine, column: openColumn, message: 'quoted field is never closed' })
          bad = true
          break
        }
        if (i < n && src[i] !== delimiter && !isEol(src[i])) {
          problems.push({ line, column: i - lineStart + 1, message: `unexpected '${src[i]}' after a closing quote; a quoted field must end at a '${delimiter}' or a line end` })
          bad = true
          break
        }
        fields.push(value)
      }
      else {
        const start = i
        while (i < n && src[i] !== delimiter && !isEol(src[i])) {
          if (src[i] === '"') break
          i++
        }
        if (src[i] === '"') {
          problems.push({ line, column: i - lineStart + 1, message: 'quote inside an unquoted field; quote the whole field and double the quote' })
          bad = true
          break
        }
        fields.push(src.slice(start, i))
      }
      if (i < n && src[i] === delimiter) { i++; continue }
      break // line end or end of text
    }
    if (bad) { skipToNextLine(); continue }
    records.push({ fields, line: recordLine })
    if (i < n) eatEol()
  }
  return { records, problems }
}

/** A value as one CSV field: empty for null/undefined, numbers in their shortest exact form. */
export function csvField(value: unknown, delimiter = ','): string {
  if (value === null || value === undefined) return ''
  const text = String(value)
  const needsQuotes = text.includes(delimiter) || text.includes('"') || text.includes('\n') || text.includes('\r')
    || text !== text.trim() || text.startsWith('#')
  return needsQuotes ? `"${text.replaceAll('"', '""')}"` : text
}

export interface CsvWriteOptions {
  delimiter?: string
  /** Line end; RFC 4180 says CRLF (the default). */
  eol?: '\r\n' | '\n'
  /** Lines written first, each prefixed with '# ' (provenance, cautions). */
  comments?: readonly string[]
}

/** Writes records as RFC 4180 text, ending with a line end. */
export function writeCsv(records: readonly (readonly unknown[])[], options: CsvWriteOptions = {}): string {
  const delimiter = options.delimiter ?? ','
  const eol = options.eol ?? '\r\n'
  const head = (options.comments ?? []).flatMap(c => c.split(/\r?\n/)).map(c => (c ? `# ${c}` : '#'))
  const body = records.map(r => r.map(v => csvField(v, delimiter)).join(delimiter))
  return [...head, ...body].map(l => l + eol).join('')
}

/** The most likely delimiter of a header line: ',' unless ';' or a tab is more frequent. */
export function detectDelimiter(firstLine: string): ',' | ';' | '\t' {
  const count = (c: string) => firstLine.split(c).length - 1
  const candidates: Array<',' | ';' | '\t'> = [',', ';', '\t']
  return candidates.reduce((best, c) => (count(c) > count(best) ? c : best), ',')
}
