import type { BinColumn } from '#shared/bins'

/** A DIS-like bin layout used by the bins tests (invented for the tests, no physics claim). */
export const disColumns: BinColumn[] = [
  { key: 'xMin', label: 'x min', kind: 'range-lo', quantity: 'x', min: 0, exclusiveMin: true, max: 1, exclusiveMax: true, required: true },
  { key: 'xMax', label: 'x max', kind: 'range-hi', quantity: 'x', min: 0, exclusiveMin: true, max: 1, exclusiveMax: true, required: true },
  { key: 'q2Min', label: 'Q² min', unit: 'GeV²', kind: 'range-lo', quantity: 'Q²', min: 1, required: true },
  { key: 'q2Max', label: 'Q² max', unit: 'GeV²', kind: 'range-hi', quantity: 'Q²', min: 1, required: true },
  { key: 'target', label: 'target', kind: 'select', options: ['p', 'n', 'Fe'], required: true },
  { key: 'note', label: 'note', kind: 'text' }
]

export const goodRow = { xMin: 0.01, xMax: 0.02, q2Min: 10, q2Max: 20, target: 'p', note: null }
