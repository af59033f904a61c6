// The neutral set tables (our layout, documented in README.md "Set tables"):
//   long: member, x, q2, pdg, xf           — one row per member, x node, Q² node and flavour
//   wide: member, x, q2, <pdg>, <pdg>, …   — one row per member, x and Q² node, one column per PDG code
// member is the member index (0 = central), x and q2 (GeV²) the grid node, xf = x·f(x, Q²). A
// fragmentation set's table (its header says density fragmentation) names the fraction column z
// and the long form's value column zD = z·D(z, Q²): member, z, q2, pdg, zD. At a
// heavy-quark threshold of a variable-flavour scheme Q² = m_h² is a node twice: the first row of
// a (member, x, flavour) at that Q² is the value just below the threshold, the second just above.
// Numbers are written in the shortest form that reads back to the same double, so a table
// exported and imported again gives bit-identical member values.
import { isPartonCode, PARTON_CODES_TEXT } from '../../../shared/physics/partons'

export const LONG_COLUMNS = ['member', 'x', 'q2', 'pdg', 'xf'] as const
export const WIDE_KEY_COLUMNS = ['member', 'x', 'q2'] as const

/** Where a problem is: line and column of a CSV/TSV, or row group and row of a Parquet file (all 1-based). */
export interface TableLocation { line?: number, column?: number, columnName?: string, rowGroup?: number, row?: number }

/** A table that cannot become a set: what and where. Turned into a 400 with data.issues. */
export class TableError extends RangeError {
  constructor(message: string, readonly location: TableLocation = {}) {
    super(message)
    this.name = 'TableError'
  }

  /** "line 12, column 3 (q2)" or "row group 2, row 5 (xf)". */
  static where(l: TableLocation): string {
    const parts: string[] = []
    if (l.rowGroup !== undefined) parts.push(`row group ${l.rowGroup}`)
    if (l.row !== undefined) parts.push(`row ${l.row}`)
    if (l.line !== undefined) parts.push(`line ${l.line}`)
    if (l.column !== undefined) parts.push(`column ${l.column}`)
    const at = parts.join(', ')
    return l.columnName ? `${at} (${l.columnName})` : at
  }

  toJSON() { return { message: this.message, ...this.location } }
}

/** A located TableError: "line 3, column 2 (x): …". */
export const tableError = (where: TableLocation, message: string) => {
  const at = TableError.where(where)
  return new TableError(at ? `${at}: ${message}` : message, where)
}

/** The momentum-fraction axis of a table: x for parton densities, z for fragmentation functions. */
export type FractionAxis = 'x' | 'z'

export type TableLayout = ({ kind: 'long' } | { kind: 'wide', flavours: number[] }) & { axis: FractionAxis }

/** The column names of a table's key columns and of its long form's value column, for an axis. */
export function tableNames(axis: FractionAxis): { keys: readonly string[], value: string } {
  return axis === 'z' ? { keys: ['member', 'z', 'q2'], value: 'zD' } : { keys: WIDE_KEY_COLUMNS, value: 'xf' }
}

/**
 * The layout named by a header row, for a set whose fraction axis is `axis` (its header's
 * density); TableError naming the first column that does not fit.
 */
export function layoutOf(names: readonly string[], at: (column: number) => TableLocation, axis: FractionAxis = 'x'): TableLayout {
  const clean = names.map(n => n.trim())
  const lower = clean.map(n => n.toLowerCase())
  const { keys, value } = tableNames(axis)
  const holds = axis === 'z' ? 'the header says fragmentation functions, so ' : ''
  const expect = `${holds}the columns are member, ${axis}, q2, then pdg and ${value} (long form) or one column per PDG code (wide form)`
  for (let i = 0; i < 3; i++) {
    if (lower[i] !== keys[i]) {
      throw tableError(at(i + 1), `expected the column "${keys[i]}" but found "${clean[i] ?? ''}"; ${expect}`)
    }
  }
  if (lower.length === 5 && lower[3] === 'pdg' && lower[4] === value.toLowerCase()) return { kind: 'long', axis }
  if (lower.length < 4) throw tableError(at(lower.length + 1), `a flavour column is missing; ${expect}`)
  const flavours: number[] = []
  for (let i = 3; i < clean.length; i++) {
    const code = /^[+-]?\d{1,3}$/.test(clean[i]!) ? Number(clean[i]) : Number.NaN
    if (!isPartonCode(code)) {
      throw tableError(at(i + 1), `the column "${clean[i]}" is not a PDG parton code (${PARTON_CODES_TEXT}); ${expect}`)
    }
    if (flavours.includes(code)) throw tableError(at(i + 1), `the flavour column ${code} appears twice`)
    flavours.push(code)
  }
  return { kind: 'wide', flavours, axis }
}

const DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/

/** A decimal number as text (no hex, no Infinity, no empty cell), or NaN. */
export function readDecimal(text: string): number {
  return DECIMAL.test(text) ? Number(text) : Number.NaN
}

/** A double as the shortest text that reads back to the same bits (keeps the sign of zero). */
export const writeDecimal = (v: number) => (Object.is(v, -0) ? '-0' : String(v))

/** Most members a table may hold (a guard before any allocation; replica sets have at most a few thousand). */
export const MAX_TABLE_MEMBERS = 100_000
