/**
 * Formatting results for stdout: JSON (indented, number arrays on one line, typed arrays as
 * plain arrays, NaN and ±∞ as null) and CSV (shared/export/csv.ts: RFC 4180, CRLF, non-finite
 * numbers as empty cells).
 */
import { writeCsv, type CsvCell } from '../../shared/export/csv'

/**
 * JSON text of a result, with a trailing newline. Objects are indented by two spaces; an array
 * holding only numbers, and an object holding only numbers, strings, booleans or null, stay on
 * one line, so that a members × bins matrix reads as one row per member and a table as one
 * line per row. Typed arrays are written as arrays; non-finite numbers as null (as JSON.stringify does).
 * @example toJson({ values: new Float64Array([1, 2]) }) // '{\n  "values": [1, 2]\n}\n'
 */
export function toJson(value: unknown): string {
  return `${write(value, '')}\n`
}

function write(value: unknown, indent: string): string {
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    return write(Array.from(value as unknown as ArrayLike<number>), indent)
  }
  if (Array.isArray(value)) {
    if (value.length === 0) return '[]'
    if (value.every(v => typeof v === 'number' || v === null)) return `[${value.map(v => JSON.stringify(v)).join(', ')}]`
    const inner = `${indent}  `
    return `[\n${value.map(v => inner + write(v ?? null, inner)).join(',\n')}\n${indent}]`
  }
  if (value !== null && typeof value === 'object' && typeof (value as { toJSON?: unknown }).toJSON !== 'function') {
    const entries = Object.entries(value).filter(([, v]) => v !== undefined && typeof v !== 'function')
    if (entries.length === 0) return '{}'
    if (entries.every(([, v]) => v === null || typeof v !== 'object')) {
      return `{ ${entries.map(([k, v]) => `${JSON.stringify(k)}: ${JSON.stringify(v) ?? 'null'}`).join(', ')} }`
    }
    const inner = `${indent}  `
    return `{\n${entries.map(([k, v]) => `${inner}${JSON.stringify(k)}: ${write(v, inner)}`).join(',\n')}\n${indent}}`
  }
  return JSON.stringify(value) ?? 'null'
}

/**
 * CSV text: a header line and one line per row, written by Sheaf's one CSV writer (CRLF line
 * ends, RFC 4180 quoting, numbers in their shortest exact form, non-finite numbers as empty cells).
 * @example toCsv(['x', 'q2'], [[0.1, 10]]) // 'x,q2\r\n0.1,10\r\n'
 */
export function toCsv(header: readonly string[], rows: ReadonlyArray<readonly CsvCell[]>): string {
  return writeCsv([header, ...rows])
}
