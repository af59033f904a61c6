import { defineStore, skipHydrate } from 'pinia'
import { computed, ref, shallowRef } from 'vue'
import { cellLocation, emptyRow, errorsByCell, normalizeCell, validateRows } from '#shared/bins'
import type { BinColumn, BinRow, CellError, RowCheck } from '#shared/bins'

const NONE: Array<Pick<CellError, 'column' | 'reason'>> = []

/** Draft steps kept for undo. */
const HISTORY = 100

/** One cell edit: 0-based row, column key, the value as typed or pasted. */
export interface CellEdit {
  row: number
  column: string
  value: unknown
}

/**
 * The bins of one study while they are being edited, until the user saves them explicitly.
 *
 * Rows are replaced, never mutated in place (`rows` is a shallow ref): an edit copies the row
 * array and the edited rows only, so 10,000 bins stay cheap and `rows !== before` tells a
 * watcher that something changed. Values are normalised on the way in (numeric text in a
 * numeric column becomes a number; anything else stays text so the check can name it).
 *
 * Usage: `load(serverRows, columns, studyId)` after fetching; the grid calls `updateCells`,
 * `insertRows`, `removeRows`, `moveRows`; the page saves `rows` with `$fetch` and then calls
 * `markSaved()`; `dirty` drives the unsaved-changes guard; `undo`/`redo` step through drafts. `setExtraChecks` takes functions
 * (e.g. the engine's reach check): call it on the client only, functions do not serialise.
 */
export const useBinsDraftStore = defineStore('bins-draft', () => {
  const studyId = ref<string | null>(null)
  const columns = shallowRef<BinColumn[]>([])
  const rows = shallowRef<BinRow[]>([])
  const savedRows = shallowRef<BinRow[]>([])
  const extraChecks = shallowRef<RowCheck[]>([])
  // Checks that look at one row alone (the engine's domain check): their verdict is kept per row
  // object, so an edit re-checks only the rows it replaced, not all 10,000.
  const rowChecks = shallowRef<RowCheck[]>([])
  // Earlier and undone drafts. Rows are never mutated, so a snapshot is one array of shared rows.
  const undoStack = shallowRef<BinRow[][]>([])
  const redoStack = shallowRef<BinRow[][]>([])

  let verdicts = new WeakMap<BinRow, Array<Pick<CellError, 'column' | 'reason'>>>()
  let verdictsFor: unknown[] = []
  const errors = computed<CellError[]>(() => {
    const cols = columns.value
    const pure = rowChecks.value
    const indexed = extraChecks.value
    if (verdictsFor[0] !== cols || verdictsFor[1] !== pure) {
      verdicts = new WeakMap()
      verdictsFor = [cols, pure]
    }
    const byKey = new Map(cols.map(c => [c.key, c]))
    const out: CellError[] = []
    const list = rows.value
    // the rows not seen yet (all of them after a load or an import) are checked in one pass
    const fresh = list.filter(r => !verdicts.has(r))
    if (fresh.length) {
      const found = new Map<number, Array<Pick<CellError, 'column' | 'reason'>>>()
      for (const e of validateRows(fresh, cols, pure)) {
        const at = found.get(e.row)
        if (at) at.push({ column: e.column, reason: e.reason })
        else found.set(e.row, [{ column: e.column, reason: e.reason }])
      }
      fresh.forEach((r, k) => verdicts.set(r, found.get(k) ?? NONE))
    }
    for (let i = 0; i < list.length; i++) {
      const row = list[i]!
      const found = verdicts.get(row)!
      if (found.length) {
        for (const f of found) out.push({ row: i, column: f.column, reason: f.reason, message: `${cellLocation(i, byKey.get(f.column)!)}: ${f.reason}` })
        continue
      }
      for (const check of indexed) {
        for (const problem of check(row, i) ?? []) {
          const column = byKey.get(problem.column)
          if (!column) throw new RangeError(`An extra bin check reported unknown column '${problem.column}'`)
          out.push({ row: i, column: column.key, reason: problem.reason, message: `${cellLocation(i, column)}: ${problem.reason}` })
        }
      }
    }
    if (!indexed.length) return out
    const order = new Map(cols.map((c, k) => [c.key, k]))
    return out.sort((p, q) => p.row - q.row || order.get(p.column)! - order.get(q.column)!)
  })
  const cellErrors = computed(() => errorsByCell(errors.value))
  const invalidRowCount = computed(() => new Set(errors.value.map(e => e.row)).size)
  const dirty = computed(() => !sameRows(rows.value, savedRows.value, columns.value))
  const canUndo = computed(() => undoStack.value.length > 0)
  const canRedo = computed(() => redoStack.value.length > 0)

  /** Every edit goes through here: remember the draft before it, forget what was undone. */
  function commit(next: BinRow[]) {
    undoStack.value = [...undoStack.value.slice(-(HISTORY - 1)), rows.value]
    redoStack.value = []
    rows.value = next
  }

  const normalize = (row: Readonly<Record<string, unknown>>): BinRow => {
    const out: BinRow = { ...(row as BinRow) }
    for (const c of columns.value) out[c.key] = normalizeCell(row[c.key], c)
    return out
  }
  const checkIndex = (index: number, allowEnd = false) => {
    const limit = rows.value.length + (allowEnd ? 1 : 0)
    if (!Number.isInteger(index) || index < 0 || index >= limit) {
      throw new RangeError(`Bin row ${index + 1} does not exist; the study has ${rows.value.length} bins`)
    }
  }

  /** Starts editing a study: the given rows become both the draft and the saved state. */
  function load(next: readonly Readonly<Record<string, unknown>>[], nextColumns: readonly BinColumn[] = columns.value, id: string | null = studyId.value) {
    studyId.value = id
    columns.value = [...nextColumns]
    rows.value = next.map(normalize)
    savedRows.value = rows.value
    undoStack.value = []
    redoStack.value = []
  }

  /** Replaces every draft row (CSV import, paste of a whole table); the saved state is kept. */
  function replace(next: readonly Readonly<Record<string, unknown>>[]) {
    commit(next.map(normalize))
  }

  /** Applies a batch of cell edits at once (a paste or an autofill is one batch). */
  function updateCells(edits: readonly CellEdit[]) {
    if (!edits.length) return
    const byKey = new Map(columns.value.map(c => [c.key, c]))
    const next = rows.value.slice()
    const copied = new Set<number>()
    for (const edit of edits) {
      checkIndex(edit.row)
      const column = byKey.get(edit.column)
      if (!column) throw new RangeError(`Bins have no column '${edit.column}'`)
      if (!copied.has(edit.row)) {
        next[edit.row] = { ...next[edit.row]! }
        copied.add(edit.row)
      }
      next[edit.row]![column.key] = normalizeCell(edit.value, column)
    }
    commit(next)
  }

  function updateCell(row: number, column: string, value: unknown) {
    updateCells([{ row, column, value }])
  }

  /** Inserts `count` empty rows before index `at` (default: at the end). */
  function insertRows(at: number = rows.value.length, count = 1) {
    checkIndex(at, true)
    const next = rows.value.slice()
    next.splice(at, 0, ...Array.from({ length: count }, () => emptyRow(columns.value)))
    commit(next)
  }

  /** Removes the rows at the given 0-based indices. */
  function removeRows(indices: readonly number[]) {
    indices.forEach(i => checkIndex(i))
    const drop = new Set(indices)
    if (drop.size) commit(rows.value.filter((_, i) => !drop.has(i)))
  }

  /**
   * Moves the rows at `indices` (kept in their current order) so that the first of them ends up
   * at `finalIndex` of the resulting list (the grid's own row-move convention).
   */
  function moveRows(indices: readonly number[], finalIndex: number) {
    indices.forEach(i => checkIndex(i))
    const picked = [...new Set(indices)].sort((a, b) => a - b)
    const moving = picked.map(i => rows.value[i]!)
    const rest = rows.value.filter((_, i) => !picked.includes(i))
    const at = Math.max(0, Math.min(finalIndex, rest.length))
    commit([...rest.slice(0, at), ...moving, ...rest.slice(at)])
  }

  /** Throws away the draft edits. */
  function resetToSaved() {
    if (rows.value !== savedRows.value) commit(savedRows.value)
  }

  /** Steps back to the draft before the last edit (up to 100 steps). */
  function undo() {
    const previous = undoStack.value.at(-1)
    if (!previous) return
    undoStack.value = undoStack.value.slice(0, -1)
    redoStack.value = [...redoStack.value, rows.value]
    rows.value = previous
  }

  function redo() {
    const next = redoStack.value.at(-1)
    if (!next) return
    redoStack.value = redoStack.value.slice(0, -1)
    undoStack.value = [...undoStack.value, rows.value]
    rows.value = next
  }

  /** After a successful save: the draft (or the rows the server returned) is the saved state. */
  function markSaved(saved?: readonly Readonly<Record<string, unknown>>[]) {
    if (saved) rows.value = saved.map(normalize)
    savedRows.value = rows.value
  }

  /** Checks that may depend on the row's index (the server's located issues); run on every edit. */
  function setExtraChecks(checks: RowCheck | readonly RowCheck[] | null) {
    extraChecks.value = checks === null ? [] : Array.isArray(checks) ? [...checks] : [checks as RowCheck]
  }

  /** Checks of one row alone (same row, same verdict): their verdict is cached per row. */
  function setRowChecks(checks: RowCheck | readonly RowCheck[] | null) {
    const next = checks === null ? [] : Array.isArray(checks) ? [...checks] : [checks as RowCheck]
    // the same checks again keep the cached verdicts
    if (next.length !== rowChecks.value.length || next.some((c, i) => c !== rowChecks.value[i])) rowChecks.value = next
  }

  /** Every check, for reading a file the same way the grid checks it. */
  const allChecks = computed(() => [...rowChecks.value, ...extraChecks.value])

  return {
    // Not sent with a server-rendered page: the grid is drawn on the client only, and 10,000 rows
    // in the page's payload cost more to send and revive than to build from the study again.
    studyId: skipHydrate(studyId), columns: skipHydrate(columns), rows: skipHydrate(rows), savedRows: skipHydrate(savedRows), extraChecks: skipHydrate(extraChecks), rowChecks: skipHydrate(rowChecks), allChecks: skipHydrate(allChecks), undoStack: skipHydrate(undoStack), redoStack: skipHydrate(redoStack),
    errors, cellErrors, invalidRowCount, dirty, canUndo, canRedo,
    load, replace, updateCells, updateCell, insertRows, removeRows, moveRows, resetToSaved, markSaved, setExtraChecks, setRowChecks, undo, redo
  }
})

function sameRows(a: readonly BinRow[], b: readonly BinRow[], columns: readonly BinColumn[]): boolean {
  if (a === b) return true
  if (a.length !== b.length) return false
  for (let i = 0; i < a.length; i++) {
    const p = a[i]!
    const q = b[i]!
    if (p !== q && columns.some(c => (p[c.key] ?? null) !== (q[c.key] ?? null))) return false
  }
  return true
}
