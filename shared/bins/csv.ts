/**
 * CSV reading and writing. The reader sits behind the {@link CsvReader} interface; its parsing is
 * done by papaparse, and this module adds what papaparse leaves out: the physical line of every
 * record, located problems with messages a physicist understands, and line ends of more than one
 * kind in one file.
 *
 * Accepted beyond RFC 4180 (common practice for files written by spreadsheets): LF or lone CR
 * line ends as well as CRLF, a leading byte-order mark, blank lines (skipped), spaces between a
 * closing quote and the next delimiter, and optionally comment lines starting with `#` (skipped
 * only at the start of a record).
 */
import Papa from 'papaparse'
import type { ParseError } from 'papaparse'

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

/** Start offset of every line of `text` (line ends are '\n' only), for offset → line, column. */
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
 * Reads RFC 4180 text. Quoted fields may hold the delimiter, `""` for a quote, and line breaks
 * (returned as they are in the file). A quote inside an unquoted field, text after a closing
 * quote, and a quote never closed are problems; after one, reading resumes at the next line.
 *
 * Method: papaparse reads the text with every line end made '\n' (papaparse takes one kind of
 * line end per file); each row papaparse returns is then walked field by field from the row's
 * start, which gives its line, finds quotes papaparse accepts inside unquoted fields, and puts
 * back the file's own line ends inside quoted fields. After a problem papaparse starts again at
 * the next line. Papaparse's Delimiter and FieldMismatch errors cannot arise here (the delimiter
 * is given and there is no header mode; callers check field counts with their own messages).
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

  const nextLine = (offset: number) => {
    const eol = flat.indexOf('\n', offset)
    return eol < 0 ? n : eol + 1
  }
  const skipComments = (offset: number) => {
    let at = offset
    while (comment !== undefined && at < n && flat.startsWith(comment, at)) at = nextLine(at)
    return at
  }
  /** The record's fields with the k-th line break in them put back as the file wrote it. */
  const ownLineEnds = (fields: string[], line: number) => {
    if (!lineEnds) return fields
    let k = line - 1 // lineEnds[line - 1] ends the record's first line
    return fields.map(f => (f.includes('\n') ? f.replace(/\n/g, () => lineEnds[k++]!) : f))
  }
  /** The first problem of a row starting at `start`: where it is, what it is, where to resume. */
  const rowProblem = (start: number, base: number, fields: readonly string[], error: ParseError | undefined) => {
    // Papaparse reports quote errors just after the opening quote of the field.
    const open = error?.index === undefined ? n : base + error.index - 1
    let at = start
    for (const value of fields) {
      if (at >= open) break
      if (flat[at] === '"') {
        at += value.length + (value.split('"').length - 1) + 2
        while (at < n && flat[at] !== delimiter && flat[at] !== '\n') at++ // spaces papaparse allows
      }
      else {
        const quote = value.indexOf('"')
        if (quote >= 0) return { at: at + quote, message: STRAY_QUOTE, resume: nextLine(at + quote) }
        at += value.length
      }
      at++
    }
    if (!error) return undefined
    if (error.code === 'MissingQuotes') return { at: open, message: NEVER_CLOSED, resume: n }
    if (error.code === 'InvalidQuotes') {
      let close = flat.indexOf('"', open + 1)
      while (flat[close + 1] === '"') close = flat.indexOf('"', close + 2)
      const after = close + 1
      return {
        at: after,
        message: `unexpected '${flat[after]}' after a closing quote; a quoted field must end at a '${delimiter}' or a line end`,
        resume: nextLine(after)
      }
    }
    return { at: start, message: error.message, resume: nextLine(start) }
  }

  /** Reads from `from` until the first problem; returns where to read on. */
  const readFrom = (from: number) => {
    // Papaparse drops a byte-order mark at the start of its input; offsets count from after it.
    const base = from + (flat.charCodeAt(from) === 0xfeff ? 1 : 0)
    let rowEnd = base
    let resume = n
    Papa.parse<string[]>(flat.slice(from), {
      delimiter,
      newline: '\n',
      quoteChar: '"',
      escapeChar: '"',
      comments: comment ?? false,
      skipEmptyLines: false,
      step: (result, parser) => {
        const start = skipComments(rowEnd)
        rowEnd = base + result.meta.cursor
        const problem = rowProblem(start, base, result.data, result.errors[0])
        if (problem) {
          problems.push({ ...locate(starts, problem.at), message: problem.message })
          resume = problem.resume
          parser.abort()
          return
        }
        if (start >= n || flat[start] === '\n') return // blank line
        const { line } = locate(starts, start)
        records.push({ fields: ownLineEnds(result.data, line), line })
      }
    })
    return resume
  }

  for (let from = 0; from < n && problems.length < maxProblems;) from = readFrom(from)
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
