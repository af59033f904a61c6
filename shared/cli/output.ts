/**
 * Formatting results for stdout: JSON (indented, number arrays on one line, typed arrays as
 * plain arrays, NaN and ±∞ as null) and CSV (RFC 4180 quoting, numbers at full precision).
 */

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

/** One CSV cell: numbers at full precision (non-finite → empty), text quoted when needed. */
function cell(value: unknown): string {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : ''
  const text = String(value)
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text
}

/**
 * CSV text: a header line and one line per row, each ending in a newline.
 * @example toCsv(['x', 'q2'], [[0.1, 10]]) // 'x,q2\n0.1,10\n'
 */
export function toCsv(header: readonly string[], rows: ReadonlyArray<readonly unknown[]>): string {
  return [header, ...rows].map(r => `${r.map(cell).join(',')}\n`).join('')
}
