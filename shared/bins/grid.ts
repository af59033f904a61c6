import type { BinColumn, BinRow, CellValue } from './types'

/**
 * A read-only column appended to the bins grid after a run (central, +Δ, −Δ, relative %),
 * its values aligned with the bins (index i is bin i; missing or null shows an empty cell).
 */
export interface ResultColumn {
  key: string
  label: string
  values: ArrayLike<number | null>
  /** Significant digits shown (the cell keeps the full number for copy); default 5. */
  digits?: number
}

/** Header text of a bin column: its label with the unit in brackets. */
export const columnHeader = (column: Pick<BinColumn, 'label' | 'unit'>) => (column.unit ? `${column.label} [${column.unit}]` : column.label)

/** The grid's array-of-arrays data: the bin cells of each row in column order. */
export function toGridData(rows: readonly Readonly<BinRow>[], columns: readonly BinColumn[]): CellValue[][] {
  return rows.map(row => columns.map(c => row[c.key] ?? null))
}

/** A result number as shown in the grid: `digits` significant digits, no trailing zeros. */
export function formatResultCell(value: unknown, digits = 5): string {
  if (typeof value !== 'number' || !Number.isFinite(value)) return ''
  if (value === 0) return '0'
  const magnitude = Math.abs(value)
  if (magnitude >= 1e-3 && magnitude < 1e6) return String(Number(value.toPrecision(digits)))
  return value.toExponential(digits - 1).replace(/\.?0+e/, 'e')
}
