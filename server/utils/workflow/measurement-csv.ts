// Reading a measurement to compare a study with: a CSV of points and an optional correlation
// matrix (CSV or JSON). Every problem is located by line and column. No Nitro imports.
//
// Sheaf's measurement CSV: a header line, then one line per bin of the study, in bin order.
//   value   measured value (required), in the unit of the study's observable
//   stat    statistical error, one standard deviation, uncorrelated between points
//   syst    systematic error; uncorrelated unless a correlation matrix says otherwise
//   shift:<name>  any number of fully correlated sources, the signed shift of each point
//   bin     optional 1-based bin number; when present it must count 1, 2, 3 …
// Lines starting with # are comments. At least one of stat, syst or a shift column is needed.
// The optional correlation matrix is N × N (N points): CSV without a header, or a JSON array of
// rows. It applies to the syst column (`correlationOf: 'syst'`) or to the total error
// √(stat² + syst²) (`'total'`, the usual form of published matrices).
import { readCsv } from '../../../shared/bins/csv'

export interface LocatedIssue {
  message: string
  /** 1-based line of the file (or row of the JSON matrix). */
  line?: number
  /** 1-based column (field number). */
  column?: number
  /** Which file: the points or the correlation matrix. */
  file?: 'points' | 'correlation'
}

/** What is stored in measurements.data. */
export interface MeasurementData {
  values: number[]
  stat: number[] | null
  syst: number[] | null
  sources: Array<{ name: string, shifts: number[] }>
  correlation: number[][] | null
  correlationOf: 'syst' | 'total'
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/

function parseNumber(text: string): number | null {
  const t = text.trim()
  return NUMBER.test(t) ? Number(t) : null
}

/** Reads the points CSV; `issues` is empty when the data is usable. */
export function parseMeasurementPoints(text: string): { data: Omit<MeasurementData, 'correlation' | 'correlationOf'>, issues: LocatedIssue[] } {
  const issues: LocatedIssue[] = []
  const empty = { values: [], stat: null, syst: null, sources: [] }
  const { records, problems } = readCsv(text, { comment: '#' })
  for (const p of problems) issues.push({ message: p.message, line: p.line, column: p.column, file: 'points' })
  if (issues.length) return { data: empty, issues }
  const [head, ...rows] = records
  if (!head) return { data: empty, issues: [{ message: 'The file is empty: expected a header line and one line per bin', file: 'points' }] }
  const names = head.fields.map(f => f.trim().toLowerCase())
  const col = (name: string) => names.indexOf(name)
  const known = (n: string) => ['value', 'stat', 'syst', 'bin'].includes(n) || n.startsWith('shift:')
  names.forEach((n, i) => {
    if (!known(n)) issues.push({ message: `Unknown column "${head.fields[i]}": use value, stat, syst, bin or shift:<name>`, line: head.line, column: i + 1, file: 'points' })
    else if (names.indexOf(n) !== i) issues.push({ message: `Column "${n}" appears twice`, line: head.line, column: i + 1, file: 'points' })
  })
  if (col('value') < 0) issues.push({ message: 'The header needs a "value" column', line: head.line, file: 'points' })
  const errorColumns = names.filter(n => n === 'stat' || n === 'syst' || n.startsWith('shift:'))
  if (errorColumns.length === 0) issues.push({ message: 'The header needs at least one error column: stat, syst or shift:<name>', line: head.line, file: 'points' })
  if (rows.length === 0) issues.push({ message: 'No points after the header line', line: head.line, file: 'points' })
  if (issues.length) return { data: empty, issues }

  const columns = names.map(() => [] as number[])
  rows.forEach((row, r) => {
    if (row.fields.length !== names.length) {
      issues.push({ message: `Expected ${names.length} fields as in the header, found ${row.fields.length}`, line: row.line, file: 'points' })
      return
    }
    row.fields.forEach((field, c) => {
      const v = parseNumber(field)
      const name = names[c]!
      if (v === null) {
        issues.push({ message: `${name}: "${field.trim()}" is not a number`, line: row.line, column: c + 1, file: 'points' })
      } else if ((name === 'stat' || name === 'syst') && v < 0) {
        issues.push({ message: `${name}: an error is a magnitude and must be ≥ 0 (found ${v})`, line: row.line, column: c + 1, file: 'points' })
      } else if (name === 'bin' && v !== r + 1) {
        issues.push({ message: `bin: expected bin ${r + 1} here (points come in bin order), found ${field.trim()}`, line: row.line, column: c + 1, file: 'points' })
      } else {
        columns[c]!.push(v)
      }
    })
  })
  if (issues.length) return { data: empty, issues }
  const get = (name: string) => (col(name) >= 0 ? columns[col(name)]! : null)
  return {
    data: {
      values: get('value')!,
      stat: get('stat'),
      syst: get('syst'),
      sources: names.flatMap((n, i) => (n.startsWith('shift:') ? [{ name: head.fields[i]!.trim().slice(6), shifts: columns[i]! }] : []))
    },
    issues
  }
}

/** Reads an N × N correlation matrix from CSV or JSON text. */
export function parseCorrelationMatrix(text: string, points: number): { matrix: number[][], issues: LocatedIssue[] } {
  const issues: LocatedIssue[] = []
  let rows: Array<{ cells: unknown[], line: number }>
  const trimmed = text.trim()
  if (trimmed.startsWith('[')) {
    let value: unknown
    try {
      value = JSON.parse(trimmed)
    } catch (e) {
      return { matrix: [], issues: [{ message: `The correlation matrix is not valid JSON (${(e as Error).message})`, file: 'correlation' }] }
    }
    if (!Array.isArray(value) || !value.every(Array.isArray)) {
      return { matrix: [], issues: [{ message: 'The JSON correlation matrix must be an array of rows (arrays of numbers)', file: 'correlation' }] }
    }
    rows = (value as unknown[][]).map((cells, i) => ({ cells, line: i + 1 }))
  } else {
    const { records, problems } = readCsv(text, { comment: '#' })
    for (const p of problems) issues.push({ message: p.message, line: p.line, column: p.column, file: 'correlation' })
    rows = records.map(r => ({ cells: r.fields, line: r.line }))
  }
  if (rows.length !== points) {
    issues.push({ message: `The correlation matrix has ${rows.length} rows but the measurement has ${points} points`, file: 'correlation' })
  }
  const matrix = rows.map(({ cells, line }) => {
    if (cells.length !== points) issues.push({ message: `Expected ${points} entries in this row, found ${cells.length}`, line, file: 'correlation' })
    return cells.map((cell, c) => {
      const v = typeof cell === 'number' ? cell : typeof cell === 'string' ? parseNumber(cell) : null
      if (v === null || !Number.isFinite(v)) issues.push({ message: `"${String(cell)}" is not a number`, line, column: c + 1, file: 'correlation' })
      else if (Math.abs(v) > 1) issues.push({ message: `A correlation lies in [−1, 1]; found ${v}`, line, column: c + 1, file: 'correlation' })
      return v ?? Number.NaN
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
  return { matrix, issues }
}

/**
 * The engine's Measurement for stored data: with a 'total' correlation the full covariance
 * ρ_ij σ_i σ_j (σ² = stat² + syst²) plus the shift sources; otherwise stat, syst with their
 * correlation, and the shift sources as correlated sources.
 */
export function engineMeasurement(d: MeasurementData) {
  const n = d.values.length
  const sources = d.sources.map(s => s.shifts)
  if (d.correlation && d.correlationOf === 'total') {
    const sigma = d.values.map((_, i) => Math.hypot(d.stat?.[i] ?? 0, d.syst?.[i] ?? 0))
    const values = new Float64Array(n * n)
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let c = d.correlation[i]![j]! * sigma[i]! * sigma[j]!
        for (const s of sources) c += s[i]! * s[j]!
        values[i * n + j] = c
      }
    }
    return { values: d.values, covariance: { size: n, values } }
  }
  return {
    values: d.values,
    ...(d.stat ? { stat: d.stat } : {}),
    ...(d.syst ? { syst: d.syst } : {}),
    ...(d.correlation && d.syst ? { systCorrelation: { size: n, values: Float64Array.from(d.correlation.flat()) } } : {}),
    ...(sources.length ? { correlatedSources: sources } : {})
  }
}
