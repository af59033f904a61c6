/**
 * The bins grid's data model, independent of any kernel: a study's bins are rows of cells, the
 * columns are described by {@link BinColumn}. The kernel library (or the lead's wiring) turns a
 * kernel's kinematics into columns; nothing here knows what x or Q² mean.
 */

/** What a column holds and how it is checked. */
export type BinColumnKind = 'number' | 'range-lo' | 'range-hi' | 'select' | 'text'

/** One column of the bins grid. */
export interface BinColumn {
  /** Machine name, used as the CSV header and as the row object's property (`xMin`). */
  key: string
  /** What the user reads in the grid header and in messages (`x min`). */
  label: string
  /** Unit shown in the header and appended to bound messages (`GeV²`); omit if dimensionless. */
  unit?: string
  kind: BinColumnKind
  /** Allowed values of a 'select' column. */
  options?: string[]
  /** Lower bound of a numeric column (inclusive unless `exclusiveMin`). */
  min?: number
  /** Upper bound of a numeric column (inclusive unless `exclusiveMax`). */
  max?: number
  exclusiveMin?: boolean
  exclusiveMax?: boolean
  /** An empty cell is an error. */
  required?: boolean
  /**
   * Name of the quantity in bound messages ("x must be below 1"); defaults to the label.
   * For a range pair both ends usually share it (`x`).
   */
  quantity?: string
  /**
   * For 'range-lo': the key of its 'range-hi' partner. Default: the first 'range-hi' column
   * after it in column order.
   */
  pairWith?: string
}

/** One cell's value after normalisation: a number, a text, or empty. */
export type CellValue = number | string | null

/** One bin: cell values by column key. Unknown keys are kept and ignored. */
export type BinRow = Record<string, CellValue>

/**
 * A problem with one cell. `row` is the 0-based row index; `message` is complete and located,
 * with 1-based row numbers as the grid shows them: "row 12, column x max: x must be below 1".
 */
export interface CellError {
  row: number
  /** Column key. */
  column: string
  /** The located sentence shown in the message list. */
  message: string
  /** The same without the location ("x must be below 1"), for a cell tooltip. */
  reason: string
}

/** What an extra check reports for one row: which column is wrong and why (no location). */
export interface RowProblem {
  column: string
  reason: string
}

/**
 * An extra check run on every row that passed the column checks (so its numbers are finite
 * and its ranges ordered), e.g. "outside the set's Q² range". Receives the normalised row and
 * its 0-based index.
 */
export type RowCheck = (row: Readonly<BinRow>, index: number) => RowProblem[] | null | undefined
