/**
 * CSV reading and writing. The reader sits behind the {@link CsvReader} interface; its parsing is
 * done by csv-parse (its browser build, so the same code runs in the page and in Node), and this
 * module turns what csv-parse reports into records with the line each starts on and problems
 * located by line and character, with messages a physicist understands.
 *
 * Accepted beyond RFC 4180 (common practice for files written by spreadsheets): LF or lone CR
 * line ends as well as CRLF, even mixed in one file, a leading byte-order mark, blank lines
 * (skipped), and optionally comment lines starting with `#` (skipped only at the start of a
 * record). Text between a closing quote and the next delimiter is a problem, spaces included.
 */
import { parse, type CsvError, type InfoRecord, type Options } from 'csv-parse/browser/esm/sync'

/** A record as csv-parse hands it to `on_record` with `raw: true` (its types show the bare fields). */
interface RawRecord {
  record: string[]
  /** The text read for it, from the end of the record before: skipped lines included. */
  raw: string
}

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

const STRAY_QUOTE = 'quote inside an unquoted field; quote the whole field and double the quote'
const NEVER_CLOSED = 'quoted field is never closed'

/** Start offset of every line of `text` (line ends are '\n' only). */
function lineStarts(text: string): number[] {
  const starts = [0]
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) starts.push(i + 1)
  return starts
}

/** 1-based line and column of `offset`, by bisection over `starts`. */
function locate(starts: readonly number[], offset: number): { line: number, column: number } {
  let lo = 0
  let hi = starts.length - 1
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1
    if (starts[mid]! <= offset) lo = mid
    else hi = mid - 1
  }
  return { line: lo + 1, column: offset - starts[lo]! + 1 }
}

/**
 * Index in `rest` of the quote that opened a field never closed. Inside such a field quotes
 * only come doubled (a lone one would have closed it or been a problem of its own), and the
 * opening quote follows a delimiter or a line start: it begins the last run of an odd number
 * of quotes.
 */
function unclosedQuote(rest: string): number {
  for (let end = rest.length - 1; end >= 0; end--) {
    if (rest[end] !== '"') continue
    let start = end
    while (start > 0 && rest[start - 1] === '"') start--
    if ((end - start + 1) % 2 === 1) return start
    end = start
  }
  return 0
}

/**
 * Reads RFC 4180 text. Quoted fields may hold the delimiter, `""` for a quote, and line breaks
 * (returned as they are in the file). A quote inside an unquoted field, text after a closing
 * quote, and a quote never closed are problems; after one, reading resumes at the next line.
 *
 * Method: csv-parse reads the text with every line end made '\n' (it takes one kind of line end
 * per file, and counts a CRLF inside a quoted field as two lines). Each record's line is the
 * line csv-parse reports at its end, less the line breaks inside its fields; the file's own
 * line ends are then put back into quoted fields. On a problem csv-parse stops; its `raw` text
 * (everything read since the last record) ends at the offending character, which gives the
 * character column, and reading starts again at the next line.
 *
 * @example readCsv('a,"b ""c"""\r\n1,2').records // → [{ fields: ['a', 'b "c"'], line: 1 }, { fields: ['1', '2'], line: 2 }]
 */
export const readCsv: CsvReader = (text, options = {}) => {
  const delimiter = options.delimiter ?? ','
  const comment = options.comment || undefined
  const maxProblems = options.maxProblems ?? 50
  if (delimiter.length !== 1 || delimiter === '"' || delimiter === '\n' || delimiter === '\r' || delimiter === '\uFEFF') {
    throw new RangeError(`CSV delimiter must be one character other than a quote or a line break, got '${delimiter}'`)
  }
  if (comment !== undefined && (comment === delimiter || /["\r\n]/.test(comment))) {
    throw new RangeError(`CSV comment marker must differ from the delimiter and hold no quote or line break, got '${comment}'`)
  }
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text
  const flat = src.includes('\r') ? src.replace(/\r\n?/g, '\n') : src
  /** The file's own line ends, in order, where some are not '\n'. */
  const lineEnds = flat === src ? null : src.match(/\r\n|\r|\n/g)!
  const starts = lineStarts(flat)
  const n = flat.length
  const records: CsvRecord[] = []
  const problems: CsvProblem[] = []

  /** The record's fields with the k-th line break in them put back as the file wrote it. */
  const ownLineEnds = (fields: string[], line: number) => {
    if (!lineEnds) return fields
    let k = line - 1 // lineEnds[line - 1] ends the record's first line
    return fields.map(f => (f.includes('\n') ? f.replace(/\n/g, () => lineEnds[k++]!) : f))
  }
  const breaks = (field: string) => field.split('\n').length - 1

  /** Reads from the start of line `firstLine` until the first problem; returns the offset to read on from. */
  const readFrom = (firstLine: number): number => {
    const from = starts[firstLine - 1]!
    let consumed = from // offset just after the last record read
    const onRecord = ({ record, raw }: RawRecord, info: InfoRecord) => {
      consumed += raw.length
      const endLine = firstLine + info.lines - 1
      const line = endLine - record.reduce((sum, f) => sum + breaks(f), 0)
      records.push({ fields: ownLineEnds(record, line), line })
      return null
    }
    try {
      parse(flat.slice(from), {
        delimiter,
        quote: '"',
        escape: '"',
        comment: comment ?? null,
        comment_no_infix: true,
        skip_empty_lines: true,
        relax_column_count: true,
        bom: false,
        raw: true,
        on_record: onRecord as unknown as Options['on_record']
      })
      return n
    }
    catch (e) {
      const error = e as CsvError & { raw?: string }
      const raw = error.raw ?? ''
      const last = consumed + raw.length - 1 // the character csv-parse stopped at
      let at: number
      let message: string
      if (error.code === 'INVALID_OPENING_QUOTE') {
        at = last
        message = STRAY_QUOTE
      }
      else if (error.code === 'CSV_INVALID_CLOSING_QUOTE') {
        at = last + 1
        message = `unexpected '${flat[at]}' after a closing quote; a quoted field must end at a '${delimiter}' or a line end`
      }
      else if (error.code === 'CSV_QUOTE_NOT_CLOSED') {
        problems.push({ ...locate(starts, consumed + unclosedQuote(raw)), message: NEVER_CLOSED })
        return n
      }
      else {
        throw e
      }
      const where = locate(starts, at)
      problems.push({ ...where, message })
      return where.line < starts.length ? starts[where.line]! : n
    }
  }

  for (let from = 0; from < n && problems.length < maxProblems;) {
    from = readFrom(locate(starts, from).line)
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
