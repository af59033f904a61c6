import type { BinColumn, BinRow, CellError, CellValue, RowCheck } from './types'

/** A decimal number as people type or paste it: 12, -0.5, .5, 1e-3, 2.5E+4 (no thousands separators). */
const NUMBER_TEXT = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/

const isNumeric = (column: BinColumn) => column.kind === 'number' || column.kind === 'range-lo' || column.kind === 'range-hi'

/**
 * The stored form of a typed, pasted or imported value: empty text becomes null, numeric text
 * in a numeric column becomes a number, anything else is kept as trimmed text so that the
 * check can say what is wrong with it.
 */
export function normalizeCell(value: unknown, column: BinColumn): CellValue {
  if (value === null || value === undefined) return null
  if (typeof value === 'number') return value
  const text = String(value).trim()
  if (text === '') return null
  if (isNumeric(column) && NUMBER_TEXT.test(text)) return Number(text)
  return text
}

/** Each 'range-lo' column key with its 'range-hi' partner (explicit `pairWith`, else the next 'range-hi'). */
export function rangePairs(columns: readonly BinColumn[]): Array<[BinColumn, BinColumn]> {
  const pairs: Array<[BinColumn, BinColumn]> = []
  columns.forEach((column, i) => {
    if (column.kind !== 'range-lo') return
    const hi = column.pairWith
      ? columns.find(c => c.key === column.pairWith)
      : columns.slice(i + 1).find(c => c.kind === 'range-hi')
    if (!hi || hi.kind !== 'range-hi') {
      throw new RangeError(`Column ${column.key} starts a range but has no 'range-hi' partner${column.pairWith ? ` named ${column.pairWith}` : ''}`)
    }
    pairs.push([column, hi])
  })
  return pairs
}

const withUnit = (value: number, column: BinColumn) => (column.unit ? `${value} ${column.unit}` : String(value))

/** Why a single cell is wrong on its own, or null. */
export function checkCell(value: CellValue, column: BinColumn): string | null {
  if (value === null) return column.required ? 'a value is required' : null
  const quantity = column.quantity ?? column.label
  if (isNumeric(column)) {
    if (typeof value !== 'number') return `'${value}' is not a number`
    if (!Number.isFinite(value)) return 'must be a finite number'
    if (column.min !== undefined) {
      if (column.exclusiveMin && !(value > column.min)) return `${quantity} must be above ${withUnit(column.min, column)}`
      if (!column.exclusiveMin && !(value >= column.min)) return `${quantity} must be at least ${withUnit(column.min, column)}`
    }
    if (column.max !== undefined) {
      if (column.exclusiveMax && !(value < column.max)) return `${quantity} must be below ${withUnit(column.max, column)}`
      if (!column.exclusiveMax && !(value <= column.max)) return `${quantity} must be at most ${withUnit(column.max, column)}`
    }
    return null
  }
  if (column.kind === 'select') {
    const options = column.options ?? []
    if (!options.includes(String(value))) return `'${value}' is not one of ${options.join(', ')}`
  }
  return null
}

/** "row 12, column x max: " — rows counted from 1 as the grid shows them. */
export const cellLocation = (row: number, column: BinColumn) => `row ${row + 1}, column ${column.label}`

/**
 * Every problem in the bins, in row order then column order.
 *
 * Column checks: required cells, numbers (finite, within min/max), select options, and each
 * range pair lo < hi (reported on the 'range-hi' cell). `extraChecks` run only on rows that pass
 * the column checks, and their problems get the same located message.
 *
 * @example validateRows([{ xMin: 0.5, xMax: 1 }], columns)
 *   // → [{ row: 0, column: 'xMax', reason: 'x must be below 1', message: 'row 1, column x max: x must be below 1' }]
 */
export function validateRows(rows: readonly Readonly<BinRow>[], columns: readonly BinColumn[], extraChecks?: RowCheck | readonly RowCheck[]): CellError[] {
  const pairs = rangePairs(columns)
  const byKey = new Map(columns.map(c => [c.key, c]))
  const checks = extraChecks === undefined ? [] : Array.isArray(extraChecks) ? extraChecks : [extraChecks as RowCheck]
  const errors: CellError[] = []
  const push = (row: number, column: BinColumn, reason: string) => {
    errors.push({ row, column: column.key, reason, message: `${cellLocation(row, column)}: ${reason}` })
  }
  rows.forEach((row, index) => {
    const before = errors.length
    let rowErrors: Set<string> | null = null // made for a row with a problem only (10,000 rows at a load)
    for (const column of columns) {
      const reason = checkCell(row[column.key] ?? null, column)
      if (reason) {
        push(index, column, reason)
        rowErrors ??= new Set()
        rowErrors.add(column.key)
      }
    }
    for (const [lo, hi] of pairs) {
      const a = row[lo.key]
      const b = row[hi.key]
      if (rowErrors?.has(lo.key) || rowErrors?.has(hi.key) || typeof a !== 'number' || typeof b !== 'number') continue
      if (!(a < b)) push(index, hi, `must be above ${lo.label} (${withUnit(a, lo)})`)
    }
    if (errors.length > before) return
    for (const check of checks) {
      for (const problem of check(row, index) ?? []) {
        const column = byKey.get(problem.column)
        if (!column) throw new RangeError(`An extra bin check reported unknown column '${problem.column}'`)
        push(index, column, problem.reason)
      }
    }
  })
  const order = new Map(columns.map((c, i) => [c.key, i]))
  return errors.sort((p, q) => p.row - q.row || order.get(p.column)! - order.get(q.column)!)
}

/** Errors grouped by cell, keyed `${row}:${columnKey}`, for highlighting. */
export function errorsByCell(errors: readonly CellError[]): Map<string, CellError[]> {
  const map = new Map<string, CellError[]>()
  for (const error of errors) {
    const key = `${error.row}:${error.column}`
    const list = map.get(key)
    if (list) list.push(error)
    else map.set(key, [error])
  }
  return map
}

/** A fresh row with every column empty. */
export const emptyRow = (columns: readonly BinColumn[]): BinRow => Object.fromEntries(columns.map(c => [c.key, null]))
