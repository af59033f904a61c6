/**
 * Reading a measurement to compare a study with: a CSV of points and an optional correlation
 * matrix (CSV or JSON). Every problem is located by file, line and column. Pure and
 * isomorphic: the CSV syntax is read by readCsv (csv-parse) from shared/bins.
 *
 * Sheaf's measurement CSV: a header line, then one line per bin of the study, in bin order.
 *   value   measured value (required), in the unit of the study's observable
 *   stat    statistical error, one standard deviation, uncorrelated between points
 *   syst    systematic error; uncorrelated unless a correlation matrix says otherwise
 *   shift:<name>  any number of fully correlated sources, the signed shift of each point
 *   bin     optional 1-based bin number; when present it must count 1, 2, 3 …
 * Lines starting with # are comments; lines whose fields are all blank are skipped. At least
 * one of stat, syst or a shift column is needed, and every point needs a non-zero error.
 * The optional correlation matrix is N × N (N points): CSV without a header, or a JSON array of
 * rows. The uploader says which errors it applies to: the stat column (`correlationOf: 'stat'`),
 * the syst column (`'syst'`) or the total error √(stat² + syst²) (`'total'`), and how the syst
 * column combines when the matrix is not of syst (`systCombination`: uncorrelated or fully
 * correlated between points); engine-measurement.ts builds the covariance. It must be symmetric with
 * a unit diagonal and positive definite (a fully correlated source belongs in a shift column).
 */
import { CholeskyDecomposition, Matrix } from 'ml-matrix'
import { readCsv, type CsvProblem } from '../bins/csv'
import type { LocatedIssue, MeasurementData } from './types'

export type { CorrelationOf, LocatedIssue, MeasurementData, SystCombination } from './types'
export { engineMeasurement, measurementCovariance, measurementTreatment } from './engine-measurement'

/** Decimal number as people write it: optional sign, digits with an optional point, optional exponent. */
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/
const NOT_FINITE = /^[+-]?(nan|inf|infinity)$/i

/** The number a cell holds, or why it holds none. */
function readNumber(text: string): number | { why: string } {
  const t = text.trim()
  if (t === '') return { why: 'the cell is empty; expected a number' }
  if (NOT_FINITE.test(t)) return { why: `"${t}" is not a finite number` }
  if (!NUMBER.test(t)) return { why: `"${t}" is not a number` }
  const v = Number(t)
  return Number.isFinite(v) ? v : { why: `"${t}" is too large for a double-precision number` }
}

const syntaxIssue = (p: CsvProblem, file: LocatedIssue['file']): LocatedIssue =>
  ({ message: `${p.message} (character ${p.column} of the line)`, line: p.line, file })

const isBlank = (fields: readonly string[]) => fields.every(f => f.trim() === '')

type Points = Omit<MeasurementData, 'correlation' | 'correlationOf' | 'systCombination'>

/** Column names compared loosely: case and spaces around the name (and after `shift:`) do not matter. */
function columnKey(field: string): string {
  const name = field.trim().toLowerCase()
  return name.startsWith('shift:') ? `shift:${name.slice(6).trim()}` : name
}

/** Reads the points CSV; `issues` is empty when the data is usable. */
export function parseMeasurementPoints(text: string): { data: Points, issues: LocatedIssue[] } {
  const issues: LocatedIssue[] = []
  const empty: Points = { values: [], stat: null, syst: null, sources: [] }
  const { records, problems } = readCsv(text, { comment: '#' })
  for (const p of problems) issues.push(syntaxIssue(p, 'points'))
  if (issues.length) return { data: empty, issues }
  const [head, ...rows] = records.filter(r => !isBlank(r.fields))
  if (!head) return { data: empty, issues: [{ message: 'The file is empty: expected a header line and one line per bin', file: 'points' }] }
  const names = head.fields.map(columnKey)
  const col = (name: string) => names.indexOf(name)
  const known = (n: string) => ['value', 'stat', 'syst', 'bin'].includes(n) || n.startsWith('shift:')
  const at = (column: number) => ({ line: head.line, column, file: 'points' as const })
  names.forEach((n, i) => {
    const shown = head.fields[i]!.trim()
    if (n === '') issues.push({ message: `Column ${i + 1} has no name: use value, stat, syst, bin or shift:<name>`, ...at(i + 1) })
    else if (n === 'shift:') issues.push({ message: `Column "${shown}" needs a source name after "shift:", e.g. shift:luminosity`, ...at(i + 1) })
    else if (!known(n)) issues.push({ message: `Unknown column "${shown}": use value, stat, syst, bin or shift:<name>`, ...at(i + 1) })
    else if (col(n) !== i) issues.push({ message: `Column "${shown}" appears twice (columns ${col(n) + 1} and ${i + 1})`, ...at(i + 1) })
  })
  if (col('value') < 0) issues.push({ message: 'The header needs a "value" column', line: head.line, file: 'points' })
  const errorColumns = names.flatMap((n, i) => (n === 'stat' || n === 'syst' || (n.startsWith('shift:') && n !== 'shift:') ? [i] : []))
  if (errorColumns.length === 0) issues.push({ message: 'The header needs at least one error column: stat, syst or shift:<name>', line: head.line, file: 'points' })
  if (rows.length === 0) issues.push({ message: 'No points after the header line', line: head.line, file: 'points' })
  if (issues.length) return { data: empty, issues }

  const columns = names.map(() => [] as number[])
  rows.forEach((row, r) => {
    if (row.fields.length !== names.length) {
      const extra = row.fields.length > names.length ? { column: names.length + 1 } : {}
      issues.push({ message: `Expected ${names.length} fields as in the header (line ${head.line}), found ${row.fields.length}`, line: row.line, ...extra, file: 'points' })
      return
    }
    row.fields.forEach((field, c) => {
      const v = readNumber(field)
      const name = names[c]!
      const where = { line: row.line, column: c + 1, file: 'points' as const }
      if (typeof v !== 'number') issues.push({ message: `${name}: ${v.why}`, ...where })
      else if ((name === 'stat' || name === 'syst') && v < 0) issues.push({ message: `${name}: an error is a magnitude and must be ≥ 0 (found ${v})`, ...where })
      else if (name === 'bin' && v !== r + 1) issues.push({ message: `bin: expected bin ${r + 1} here (points come in bin order), found ${field.trim()}`, ...where })
      else columns[c]!.push(v)
    })
  })
  if (issues.length) return { data: empty, issues }
  rows.forEach((row, r) => {
    if (errorColumns.every(c => columns[c]![r] === 0)) {
      issues.push({ message: `Point ${r + 1} has no error: every error column is 0, so χ² cannot weigh it`, line: row.line, column: errorColumns[0]! + 1, file: 'points' })
    }
  })
  if (issues.length) return { data: empty, issues }
  const get = (name: string) => (col(name) >= 0 ? columns[col(name)]! : null)
  return {
    data: {
      values: get('value')!,
      stat: get('stat'),
      syst: get('syst'),
      sources: names.flatMap((n, i) => (n.startsWith('shift:') ? [{ name: head.fields[i]!.trim().slice(6).trim(), shifts: columns[i]! }] : []))
    },
    issues
  }
}

/** Line and column (1-based) of a character offset. */
function lineColumn(text: string, offset: number): { line: number, column: number } {
  const before = text.slice(0, offset)
  const lineStart = before.lastIndexOf('\n') + 1
  return { line: before.split('\n').length, column: offset - lineStart + 1 }
}

/** The JSON matrix's rows, or the issue that stops reading it. */
function jsonRows(text: string): Array<{ cells: unknown[], line: number }> | LocatedIssue {
  let value: unknown
  try {
    value = JSON.parse(text)
  }
  catch (e) {
    const message = (e as Error).message
    // JSON.parse names where for some errors only: "at position N" (V8), "at line L column C" (Firefox).
    const position = /at position (\d+)/.exec(message)
    const lineAndColumn = /at line (\d+) column (\d+)/.exec(message)
    const where = position
      ? lineColumn(text, Number(position[1]))
      : lineAndColumn ? { line: Number(lineAndColumn[1]), column: Number(lineAndColumn[2]) } : {}
    return { message: `The correlation matrix is not valid JSON (${message})`, ...where, file: 'correlation' }
  }
  if (!Array.isArray(value) || !value.every(Array.isArray)) {
    return { message: 'The JSON correlation matrix must be an array of rows (arrays of numbers)', file: 'correlation' }
  }
  return (value as unknown[][]).map((cells, i) => ({ cells, line: i + 1 }))
}

/**
 * The first k for which the leading k × k block of `matrix` is not positive definite (a
 * principal block of a positive definite matrix is positive definite, so k is found by
 * bisection), or 0 when the whole matrix is.
 */
function firstIndefiniteBlock(matrix: number[][]): number {
  const definite = (k: number) => new CholeskyDecomposition(new Matrix(matrix.slice(0, k).map(r => r.slice(0, k)))).isPositiveDefinite()
  if (definite(matrix.length)) return 0
  let lo = 1 // blocks up to lo are definite (a 1 × 1 block is the diagonal 1)
  let hi = matrix.length // block hi is not
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (definite(mid)) lo = mid
    else hi = mid
  }
  return hi
}

/** Reads an N × N correlation matrix from CSV or JSON text. */
export function parseCorrelationMatrix(text: string, points: number): { matrix: number[][], issues: LocatedIssue[] } {
  const issues: LocatedIssue[] = []
  let rows: Array<{ cells: unknown[], line: number }>
  const body = text.replace(/^\uFEFF/, '')
  if (body.trim().startsWith('[')) {
    const read = jsonRows(body)
    if (!Array.isArray(read)) return { matrix: [], issues: [read] }
    rows = read
  }
  else {
    const { records, problems } = readCsv(body, { comment: '#' })
    for (const p of problems) issues.push(syntaxIssue(p, 'correlation'))
    if (issues.length) return { matrix: [], issues }
    rows = records.filter(r => !isBlank(r.fields)).map(r => ({ cells: r.fields, line: r.line }))
    const first = rows[0]
    if (first && first.cells.every(c => typeof readNumber(String(c)) !== 'number')) {
      return { matrix: [], issues: [{ message: 'This line looks like a header: the correlation matrix is N × N numbers without a header line', line: first.line, column: 1, file: 'correlation' }] }
    }
  }
  if (rows.length !== points) {
    const extra = rows[points]
    issues.push({ message: `The correlation matrix has ${rows.length} rows but the measurement has ${points} points`, ...(extra ? { line: extra.line } : {}), file: 'correlation' })
  }
  const matrix = rows.map(({ cells, line }) => {
    if (cells.length !== points) {
      const extra = cells.length > points ? { column: points + 1 } : {}
      issues.push({ message: `Expected ${points} entries in this row, found ${cells.length}`, line, ...extra, file: 'correlation' })
    }
    return cells.map((cell, c) => {
      const v = typeof cell === 'number' ? cell : typeof cell === 'string' ? readNumber(cell) : { why: `${JSON.stringify(cell)} is not a number` }
      const where = { line, column: c + 1, file: 'correlation' as const }
      if (typeof v !== 'number') issues.push({ message: v.why, ...where })
      else if (Math.abs(v) > 1) issues.push({ message: `A correlation lies in [−1, 1]; found ${v}`, ...where })
      return typeof v === 'number' ? v : Number.NaN
    })
  })
  if (issues.length) return { matrix, issues }
  for (let i = 0; i < points; i++) {
    if (Math.abs(matrix[i]![i]! - 1) > 1e-9) issues.push({ message: `The diagonal must be 1; found ${matrix[i]![i]}`, line: rows[i]!.line, column: i + 1, file: 'correlation' })
    for (let j = 0; j < i; j++) {
      if (Math.abs(matrix[i]![j]! - matrix[j]![i]!) > 1e-9) {
        issues.push({ message: `The matrix must be symmetric: entry (${i + 1}, ${j + 1}) is ${matrix[i]![j]} but (${j + 1}, ${i + 1}) is ${matrix[j]![i]}`, line: rows[i]!.line, column: j + 1, file: 'correlation' })
      }
    }
  }
  if (issues.length) return { matrix, issues }
  const k = firstIndefiniteBlock(matrix)
  if (k > 0) {
    issues.push({
      message: `The correlation matrix is not positive definite: row ${k} cannot hold together with ${k === 2 ? 'row 1' : `rows 1 to ${k - 1}`} (no set of errors has these correlations; for a fully correlated source use a shift:<name> column)`,
      line: rows[k - 1]!.line,
      column: k,
      file: 'correlation'
    })
  }
  return { matrix, issues }
}
