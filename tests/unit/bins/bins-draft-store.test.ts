import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import { useBinsDraftStore } from '~/stores/bins-draft'
import { disColumns, goodRow } from './columns'

const rowsOf = (n: number) => Array.from({ length: n }, (_, i) => ({ ...goodRow, note: `bin ${i + 1}` }))
const notes = (rows: readonly Record<string, unknown>[]) => rows.map(r => r.note)

describe('useBinsDraftStore', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it('loads rows as both draft and saved state, normalising values', () => {
    const store = useBinsDraftStore()
    store.load([{ ...goodRow, xMin: '0.01', id: 'b1' }], disColumns, 'study-1')
    expect(store.studyId).toBe('study-1')
    expect(store.rows[0]).toEqual({ ...goodRow, id: 'b1' })
    expect(store.dirty).toBe(false)
    expect(store.errors).toEqual([])
  })

  it('applies a batch of cell edits as one new row array, copying only edited rows', () => {
    const store = useBinsDraftStore()
    store.load(rowsOf(3), disColumns)
    const before = store.rows
    store.updateCells([{ row: 0, column: 'xMax', value: '1' }, { row: 0, column: 'target', value: 'Fe' }, { row: 2, column: 'q2Min', value: '' }])
    expect(store.rows).not.toBe(before)
    expect(store.rows[1]).toBe(before[1])
    expect(store.rows[0]).toMatchObject({ xMax: 1, target: 'Fe' })
    expect(before[0]!.xMax).toBe(0.02)
    expect(store.dirty).toBe(true)
    expect(store.errors.map(e => e.message)).toEqual(['row 1, column x max: x must be below 1', 'row 3, column Q² min: a value is required'])
    expect(store.invalidRowCount).toBe(2)
    expect(store.cellErrors.get('0:xMax')![0]!.reason).toBe('x must be below 1')
  })

  it('is no longer dirty when an edit is typed back to the saved value', () => {
    const store = useBinsDraftStore()
    store.load(rowsOf(2), disColumns)
    store.updateCell(1, 'xMin', 0.05)
    expect(store.dirty).toBe(true)
    store.updateCell(1, 'xMin', '0.01')
    expect(store.dirty).toBe(false)
  })

  it('inserts, removes and moves rows', () => {
    const store = useBinsDraftStore()
    store.load(rowsOf(5), disColumns)
    store.insertRows(1, 2)
    expect(notes(store.rows)).toEqual(['bin 1', null, null, 'bin 2', 'bin 3', 'bin 4', 'bin 5'])
    expect(store.errors.filter(e => e.row === 1).map(e => e.column)).toEqual(['xMin', 'xMax', 'q2Min', 'q2Max', 'target'])
    store.removeRows([1, 2])
    expect(notes(store.rows)).toEqual(['bin 1', 'bin 2', 'bin 3', 'bin 4', 'bin 5'])
    store.moveRows([0, 1], 3)
    expect(notes(store.rows)).toEqual(['bin 3', 'bin 4', 'bin 5', 'bin 1', 'bin 2'])
    store.moveRows([4], 0)
    expect(notes(store.rows)).toEqual(['bin 2', 'bin 3', 'bin 4', 'bin 5', 'bin 1'])
    store.insertRows()
    expect(store.rows).toHaveLength(6)
  })

  it('refuses edits outside the rows or columns with a located message', () => {
    const store = useBinsDraftStore()
    store.load(rowsOf(2), disColumns)
    expect(() => store.updateCell(5, 'xMin', 1)).toThrow('Bin row 6 does not exist; the study has 2 bins')
    expect(() => store.updateCell(0, 'sqrtS', 1)).toThrow("Bins have no column 'sqrtS'")
    expect(() => store.removeRows([2])).toThrow(RangeError)
  })

  it('resets to the saved rows and marks a save', () => {
    const store = useBinsDraftStore()
    store.load(rowsOf(2), disColumns)
    store.replace(rowsOf(4))
    expect(store.dirty).toBe(true)
    store.resetToSaved()
    expect(store.rows).toHaveLength(2)
    expect(store.dirty).toBe(false)
    store.removeRows([0])
    store.markSaved()
    expect(store.dirty).toBe(false)
    expect(store.savedRows).toHaveLength(1)
    store.markSaved([{ ...goodRow, id: 'from-server', xMin: '0.01' }])
    expect(store.rows[0]).toEqual({ ...goodRow, id: 'from-server' })
  })

  it('undoes and redoes edits, structural ones included, and forgets redo after a new edit', () => {
    const store = useBinsDraftStore()
    store.load(rowsOf(3), disColumns)
    expect(store.canUndo).toBe(false)
    store.updateCell(0, 'note', 'edited')
    store.removeRows([2])
    store.moveRows([1], 0)
    expect(notes(store.rows)).toEqual(['bin 2', 'edited'])
    store.undo()
    expect(notes(store.rows)).toEqual(['edited', 'bin 2'])
    store.undo()
    store.undo()
    expect(notes(store.rows)).toEqual(['bin 1', 'bin 2', 'bin 3'])
    expect(store.dirty).toBe(false)
    expect(store.canUndo).toBe(false)
    store.redo()
    expect(notes(store.rows)).toEqual(['edited', 'bin 2', 'bin 3'])
    store.insertRows(0)
    expect(store.canRedo).toBe(false)
    store.resetToSaved()
    store.undo()
    expect(store.rows).toHaveLength(4)
  })

  it('runs extra checks set by the caller', () => {
    const store = useBinsDraftStore()
    store.load(rowsOf(2), disColumns)
    store.setExtraChecks((row, i) => (i === 1 ? [{ column: 'q2Max', reason: "outside the set's Q² range" }] : []))
    expect(store.errors.map(e => e.message)).toEqual(["row 2, column Q² max: outside the set's Q² range"])
    store.setExtraChecks(null)
    expect(store.errors).toEqual([])
  })

  it('takes a 10,000-row paste in one update', () => {
    const store = useBinsDraftStore()
    store.load(rowsOf(10_000), disColumns)
    store.updateCells(Array.from({ length: 10_000 }, (_, row) => ({ row, column: 'q2Max', value: '30' })))
    expect(store.errors).toEqual([])
    expect(store.dirty).toBe(true)
    expect(store.rows.every(r => r.q2Max === '30' || r.q2Max === 30)).toBe(true)
  })
})
