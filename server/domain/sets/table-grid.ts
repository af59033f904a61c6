// From table rows to a complete member grid, in two passes over the file so that memory holds
// the grid's values and never the table: the survey (pass 1) checks every cell and collects the
// axes; the fill (pass 2) puts each value in its place and finds duplicates; then every member,
// node and flavour must be present exactly once.
import { isPartonCode, PARTON_CODES_TEXT } from '../../../shared/physics/partons'
import { MAX_TABLE_MEMBERS, tableError, TableError, tableNames, type TableLayout, type TableLocation } from './table-format'

/** One record of a table as numbers (NaN for a cell that is not a number), with its location. */
export type RecordSink = (cells: ArrayLike<number>, at: (column: number) => TableLocation) => void

const names = (layout: TableLayout) => {
  const { keys, value } = tableNames(layout.axis)
  return layout.kind === 'long' ? [...keys, 'pdg', value] : [...keys, ...layout.flavours.map(String)]
}

/** Checks one record's cells; throws a located TableError for the first bad one. */
function checkRecord(layout: TableLayout, columns: readonly string[], cells: ArrayLike<number>, at: (column: number) => TableLocation) {
  const bad = (i: number, message: string) => tableError({ ...at(i + 1), columnName: columns[i] }, message)
  if (cells.length !== columns.length) throw tableError(at(cells.length + 1), `the row has ${cells.length} cells; the header has ${columns.length} columns`)
  const m = cells[0]!
  if (!Number.isInteger(m) || m < 0 || m >= MAX_TABLE_MEMBERS) throw bad(0, `the member must be a whole number from 0 (central) to ${MAX_TABLE_MEMBERS - 1}`)
  const x = cells[1]!
  const value = layout.axis === 'z' ? 'z·D' : 'x·f'
  if (!(x > 0 && x < 1)) throw bad(1, `${layout.axis} must be a number in (0, 1)`)
  const q2 = cells[2]!
  if (!(q2 > 0 && Number.isFinite(q2))) throw bad(2, 'Q² must be a positive number of GeV²')
  if (layout.kind === 'long') {
    if (!isPartonCode(cells[3]!)) throw bad(3, `the PDG code must be a parton code: ${PARTON_CODES_TEXT}`)
    if (!Number.isFinite(cells[4]!)) throw bad(4, `${value} must be a finite number`)
  } else {
    for (let i = 3; i < cells.length; i++) if (!Number.isFinite(cells[i]!)) throw bad(i, `${value} must be a finite number`)
  }
}

/** Pass 1: every cell checked, the axes and the rows per Q² value counted. */
export class GridSurvey {
  readonly x = new Set<number>()
  readonly q2Rows = new Map<number, number>()
  readonly flavours = new Set<number>()
  maxMember = -1
  records = 0
  private readonly columns: string[]
  private lastQ2 = Number.NaN
  private lastQ2Count = 0
  constructor(readonly layout: TableLayout) {
    this.columns = names(layout)
    if (layout.kind === 'wide') for (const f of layout.flavours) this.flavours.add(f)
  }

  readonly add: RecordSink = (cells, at) => {
    checkRecord(this.layout, this.columns, cells, at)
    this.records++
    const m = cells[0]!
    if (m > this.maxMember) this.maxMember = m
    this.x.add(cells[1]!)
    // Rows come in runs of one Q²: count the run, store it when the Q² changes.
    const q2 = cells[2]!
    if (q2 === this.lastQ2) {
      this.lastQ2Count++
    } else {
      this.flushQ2()
      this.lastQ2 = q2
      this.lastQ2Count = 1
    }
    if (this.layout.kind === 'long') this.flavours.add(cells[3]!)
  }

  private flushQ2() {
    if (this.lastQ2Count) this.q2Rows.set(this.lastQ2, (this.q2Rows.get(this.lastQ2) ?? 0) + this.lastQ2Count)
    this.lastQ2Count = 0
  }

  /** Call after the last record. */
  end() {
    this.flushQ2()
  }
}

export interface FilledGrid { x: Float64Array, q2: Float64Array, flavours: number[], members: Float64Array[] }

/** Pass 2: the values in their places. `maxValueBytes` bounds the grid before it is allocated (413 past it). */
export class GridFill {
  private readonly xIndex: Map<number, number>
  private readonly q2Index: Map<number, number>
  private readonly fIndex: Map<number, number>
  readonly x: Float64Array
  readonly q2: Float64Array
  readonly flavours: number[]
  readonly memberCount: number
  private readonly values: Float64Array
  private readonly filled: Uint8Array
  private readonly perMember: number

  constructor(readonly survey: GridSurvey, maxValueBytes: number) {
    if (survey.records === 0) throw new TableError('the table has a header but no rows')
    this.memberCount = survey.maxMember + 1
    this.x = Float64Array.from([...survey.x].sort((a, b) => a - b))
    const layout = survey.layout
    this.flavours = layout.kind === 'wide' ? [...layout.flavours] : [...survey.flavours].sort((a, b) => a - b)
    const nx = this.x.length
    const nf = this.flavours.length
    // Rows a complete grid has at one Q² node; a value with more rows than that is a threshold node taken twice.
    const perNode = this.memberCount * nx * (layout.kind === 'long' ? nf : 1)
    const q2: number[] = []
    for (const v of [...survey.q2Rows.keys()].sort((a, b) => a - b)) {
      q2.push(v)
      if (survey.q2Rows.get(v)! > perNode) q2.push(v)
    }
    this.q2 = Float64Array.from(q2)
    this.perMember = nx * q2.length * nf
    const cells = this.perMember * this.memberCount
    if (cells * 8 > maxValueBytes) {
      throw new TableError(`the grid (${this.memberCount} members × ${q2.length} Q² × ${nx} ${layout.axis} × ${nf} flavours = ${cells} values) is larger than the set limit of ${Math.floor(maxValueBytes / 8)} values`, {})
    }
    this.xIndex = new Map([...this.x].map((v, i) => [v, i]))
    this.q2Index = new Map()
    q2.forEach((v, i) => { if (!this.q2Index.has(v)) this.q2Index.set(v, i) })
    this.fIndex = new Map(this.flavours.map((f, i) => [f, i]))
    this.values = new Float64Array(cells)
    this.filled = new Uint8Array(cells)
  }

  private put(m: number, x: number, q2: number, f: number, xf: number, at: TableLocation) {
    const nx = this.x.length
    const nf = this.flavours.length
    const iq = this.q2Index.get(q2)
    const ix = this.xIndex.get(x)
    const ifl = this.fIndex.get(f)
    if (iq === undefined || ix === undefined || ifl === undefined) {
      throw tableError(at, 'this row was not in the file when it was first read; the file changed while it was imported')
    }
    let k = ((m * this.q2.length + iq) * nx + ix) * nf + ifl
    if (this.filled[k]) {
      const twice = iq + 1 < this.q2.length && this.q2[iq + 1] === q2
      if (twice) k += nx * nf
      if (!twice || this.filled[k]) {
        throw tableError(at, `member ${m}, ${this.survey.layout.axis} = ${x}, Q² = ${q2} GeV², PDG ${f} appears ${twice ? 'a third time (a threshold node may appear twice)' : 'a second time'}`)
      }
    }
    this.filled[k] = 1
    this.values[k] = xf
  }

  readonly add: RecordSink = (cells, at) => {
    const layout = this.survey.layout
    const row = { ...at(1), column: undefined, columnName: undefined } // the whole row, not one cell
    if (layout.kind === 'long') {
      this.put(cells[0]!, cells[1]!, cells[2]!, cells[3]!, cells[4]!, row)
    } else {
      for (let i = 0; i < layout.flavours.length; i++) this.put(cells[0]!, cells[1]!, cells[2]!, layout.flavours[i]!, cells[3 + i]!, row)
    }
  }

  /** The complete grid; TableError naming the first missing cell and how many more are missing. */
  finish(): FilledGrid {
    const first = this.filled.indexOf(0)
    if (first >= 0) {
      let missing = 0
      for (let k = first; k < this.filled.length; k++) if (!this.filled[k]) missing++
      const nf = this.flavours.length
      const nx = this.x.length
      const m = Math.floor(first / this.perMember)
      const rest = first % this.perMember
      const iq = Math.floor(rest / (nx * nf))
      const ix = Math.floor((rest % (nx * nf)) / nf)
      const f = this.flavours[rest % nf]
      const side = this.q2[iq - 1] === this.q2[iq] ? ' (second row at this threshold Q², the value above it)' : ''
      const axis = this.survey.layout.axis
      throw new TableError(
        `the grid is incomplete: member ${m}, ${axis} = ${this.x[ix]}, Q² = ${this.q2[iq]} GeV²${side}, PDG ${f} has no row`
        + (missing > 1 ? ` (and ${missing - 1} more values are missing)` : '')
        + `; every member 0…${this.memberCount - 1} needs every ${axis}, Q² and flavour once`
      )
    }
    const members: Float64Array[] = []
    for (let m = 0; m < this.memberCount; m++) members.push(this.values.subarray(m * this.perMember, (m + 1) * this.perMember))
    return { x: this.x, q2: this.q2, flavours: this.flavours, members }
  }
}
