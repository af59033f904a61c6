import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import type { RowCheck } from '#shared/bins'
import { useBinsDraftStore } from '~/stores/bins-draft'
import { disColumns, goodRow } from './columns'

const rowsOf = (n: number) => Array.from({ length: n }, (_, i) => ({ ...goodRow, note: `bin ${i + 1}` }))

describe('the draft store\'s per-row checks', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it('re-checks only the rows an edit replaced, and keeps the verdicts when the same check is set again', () => {
    const store = useBinsDraftStore()
    store.load(rowsOf(1000), disColumns)
    let calls = 0
    const check: RowCheck = (row) => { calls++; return row.note === 'bad' ? [{ column: 'note', reason: 'not this label' }] : [] }
    store.setRowChecks(check)
    expect(store.errors).toEqual([])
    expect(calls).toBe(1000)
    store.updateCells([{ row: 7, column: 'note', value: 'bad' }])
    expect(store.errors).toEqual([{ row: 7, column: 'note', reason: 'not this label', message: 'row 8, column note: not this label' }])
    expect(calls).toBe(1001)
    store.setRowChecks(check)
    store.setExtraChecks((_row, i) => (i === 3 ? [{ column: 'xMax', reason: 'out of reach' }] : []))
    expect(store.errors.map(e => [e.row, e.column])).toEqual([[3, 'xMax'], [7, 'note']])
    expect(calls).toBe(1001)
    // a removed row moves the later verdicts up with their rows
    store.removeRows([0])
    expect(store.errors.map(e => [e.row, e.column])).toEqual([[3, 'xMax'], [6, 'note']])
    expect(calls).toBe(1001)
  })
})
