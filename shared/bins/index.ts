// The bins grid's model: column definitions, checks, CSV in and out. No Vue, no DOM.

// Types
export type { BinColumn, BinColumnKind, BinRow, CellError, CellValue, RowCheck, RowProblem } from './types'
// Checks
export { cellLocation, checkCell, emptyRow, errorsByCell, normalizeCell, rangePairs, validateRows } from './validate'
// CSV
export { csvField, detectDelimiter, readCsv, writeCsv } from './csv'
export type { CsvProblem, CsvReadOptions, CsvReadResult, CsvReader, CsvRecord, CsvWriteOptions } from './csv'
export { exportBinsCsv, importBinsCsv } from './io'
export type { BinsCsvImport, CsvImportError } from './io'
// Grid display
export { columnHeader, formatResultCell, toGridData } from './grid'
export type { ResultColumn } from './grid'
