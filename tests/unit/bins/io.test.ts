import { describe, expect, it } from 'vitest'
import { exportBinsCsv, importBinsCsv } from '#shared/bins'
import { disColumns, goodRow } from './columns'

describe('importBinsCsv', () => {
  it('reads a header by key or by label with unit, in any order, with CRLF and comments', () => {
    const text = '# bins for the test\r\nQ² min [GeV²],q2Max,x min,XMAX,target,comment\r\n10,20,0.01,0.02,p,ignored\r\n'
    const out = importBinsCsv(text, disColumns)
    expect(out.errors).toEqual([])
    expect(out.rows).toEqual([goodRow])
    expect(out.lines).toEqual([3])
    expect(out.ignoredColumns).toEqual(['comment'])
  })

  it('detects a semicolon delimiter', () => {
    expect(importBinsCsv('xMin;xMax;q2Min;q2Max;target\n0.01;0.02;10;20;p\n', disColumns).rows).toEqual([goodRow])
  })

  it('refuses the whole file on a bad line, naming the line', () => {
    const out = importBinsCsv('xMin,xMax,q2Min,q2Max,target\n0.01,0.02,10,20,p\n0.1,0.2,10\n0.3,"0.4,10,20,p\n', disColumns)
    expect(out.rows).toEqual([])
    expect(out.errors.map(e => e.message)).toEqual([
      'line 4, character 5: quoted field is never closed',
      'line 3: 3 fields, but the header has 5'
    ])
  })

  it('refuses a file missing a required column or repeating one', () => {
    expect(importBinsCsv('xMin,xMax,q2Min,target\n', disColumns).errors.map(e => e.message))
      .toEqual(['line 1: the header has no column Q² max (q2Max), which is required'])
    expect(importBinsCsv('xMin,x min,xMax,q2Min,q2Max,target\n', disColumns).errors.map(e => e.message))
      .toEqual(['line 1: column x min appears twice in the header (fields 1 and 2)'])
    expect(importBinsCsv('', disColumns).errors[0]!.message).toMatch(/line 1: the file is empty/)
  })

  it('loads rows with bad cells and locates those cells by file line', () => {
    const out = importBinsCsv('xMin,xMax,q2Min,q2Max,target\n\n0.5,1,10,20,p\n0.1,0.2,ten,20,p\n', disColumns)
    expect(out.errors).toEqual([])
    expect(out.rows).toHaveLength(2)
    expect(out.cellErrors).toEqual([
      { line: 3, column: 'xMax', message: 'line 3, column x max: x must be below 1' },
      { line: 4, column: 'q2Min', message: "line 4, column Q² min: 'ten' is not a number" }
    ])
  })

  it('uses a swapped-in reader', () => {
    const reader = () => ({ records: [{ fields: ['xMin', 'xMax', 'q2Min', 'q2Max', 'target'], line: 1 }, { fields: ['0.01', '0.02', '10', '20', 'p'], line: 7 }], problems: [] })
    expect(importBinsCsv('ignored', disColumns, { reader }).lines).toEqual([7])
  })
})

describe('exportBinsCsv', () => {
  it('writes keys as header and round-trips rows exactly, text with commas and quotes included', () => {
    const rows = [goodRow, { ...goodRow, xMin: 1 / 3, xMax: 0.7, note: 'from "table 4", col 2' }, { ...goodRow, note: 'two\nlines' }]
    const text = exportBinsCsv(rows, disColumns)
    expect(text.split('\r\n')[0]).toBe('xMin,xMax,q2Min,q2Max,target,note')
    const back = importBinsCsv(text, disColumns)
    expect(back.errors).toEqual([])
    expect(back.rows).toEqual(rows)
  })

  it('round-trips 10,000 rows, each from its own line', () => {
    const rows = Array.from({ length: 10_000 }, (_, i) => ({ ...goodRow, xMin: (i + 1) * 1e-5, xMax: (i + 2) * 1e-5 }))
    const back = importBinsCsv(exportBinsCsv(rows, disColumns), disColumns)
    expect(back.lines.at(-1)).toBe(10_001)
    expect(back.rows).toEqual(rows)
  })
})
