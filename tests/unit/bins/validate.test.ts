import { describe, expect, it } from 'vitest'
import { checkCell, normalizeCell, rangePairs, validateRows } from '#shared/bins'
import type { BinColumn } from '#shared/bins'
import { disColumns, goodRow } from './columns'

const col = (key: string) => disColumns.find(c => c.key === key)!

describe('normalizeCell', () => {
  it.each([
    ['0.5', 0.5], [' .5 ', 0.5], ['1e-3', 0.001], ['-2.5E+2', -250], ['', null], ['   ', null], ['abc', 'abc'], ['1,5', '1,5'], ['0x10', '0x10'], [3, 3], [null, null], [undefined, null]
  ])('number column: %j → %j', (input, expected) => {
    expect(normalizeCell(input, col('xMin'))).toBe(expected)
  })
  it('keeps numeric text as text in a text column', () => {
    expect(normalizeCell(' 12 ', col('note'))).toBe('12')
  })
})

describe('checkCell', () => {
  it.each([
    ['xMax', 1, 'x must be below 1'],
    ['xMax', 0, 'x must be above 0'],
    ['xMax', 'abc', "'abc' is not a number"],
    ['xMax', Number.NaN, 'must be a finite number'],
    ['xMax', Number.POSITIVE_INFINITY, 'must be a finite number'],
    ['q2Min', 0.5, 'Q² must be at least 1 GeV²'],
    ['target', 'Pb', "'Pb' is not one of p, n, Fe"],
    ['target', null, 'a value is required']
  ])('%s = %j → %s', (key, value, reason) => {
    expect(checkCell(value as never, col(key))).toBe(reason)
  })
  it.each([['xMax', 0.999999], ['q2Min', 1], ['note', null], ['target', 'Fe']])('%s = %j is fine', (key, value) => {
    expect(checkCell(value as never, col(key))).toBeNull()
  })
  it('inclusive upper bound', () => {
    const c: BinColumn = { key: 'y', label: 'y', kind: 'number', max: 1 }
    expect(checkCell(1, c)).toBeNull()
    expect(checkCell(1.5, c)).toBe('y must be at most 1')
  })
})

describe('validateRows', () => {
  it('finds nothing in good rows', () => {
    expect(validateRows([goodRow, { ...goodRow, xMin: 0.5, xMax: 0.9 }], disColumns)).toEqual([])
  })

  it('locates each problem by 1-based row and column label, in row then column order', () => {
    const rows = [goodRow, { ...goodRow, xMax: 1, target: 'Pb' }, { ...goodRow, q2Min: 'ten' }]
    expect(validateRows(rows, disColumns).map(e => e.message)).toEqual([
      'row 2, column x max: x must be below 1',
      "row 2, column target: 'Pb' is not one of p, n, Fe",
      "row 3, column Q² min: 'ten' is not a number"
    ])
    expect(validateRows(rows, disColumns)[0]).toMatchObject({ row: 1, column: 'xMax', reason: 'x must be below 1' })
  })

  it('requires lo < hi on the hi cell, and skips the order check when an end is already wrong', () => {
    const errors = validateRows([{ ...goodRow, xMin: 0.3, xMax: 0.3 }, { ...goodRow, q2Min: 50, q2Max: 20 }, { ...goodRow, xMin: 0.5, xMax: 2 }], disColumns)
    expect(errors.map(e => e.message)).toEqual([
      'row 1, column x max: must be above x min (0.3)',
      'row 2, column Q² max: must be above Q² min (50 GeV²)',
      'row 3, column x max: x must be below 1'
    ])
  })

  it('runs extra checks only on rows that passed, with the same location format', () => {
    const seen: number[] = []
    const reach = (row: Record<string, unknown>, i: number) => {
      seen.push(i)
      return (row.q2Max as number) > 1e4 ? [{ column: 'q2Max', reason: "outside the set's Q² range (up to 10000 GeV²)" }] : []
    }
    const errors = validateRows([goodRow, { ...goodRow, xMax: 5 }, { ...goodRow, q2Max: 2e4 }], disColumns, reach)
    expect(seen).toEqual([0, 2])
    expect(errors.map(e => e.message)).toEqual([
      'row 2, column x max: x must be below 1',
      "row 3, column Q² max: outside the set's Q² range (up to 10000 GeV²)"
    ])
  })

  it('refuses an extra check naming an unknown column', () => {
    expect(() => validateRows([goodRow], disColumns, () => [{ column: 'sqrtS', reason: 'x' }])).toThrow(/unknown column 'sqrtS'/)
  })

  it('pairs ranges by pairWith, and refuses a lone range-lo', () => {
    const cols: BinColumn[] = [
      { key: 'a', label: 'a', kind: 'range-lo', pairWith: 'c' },
      { key: 'b', label: 'b', kind: 'range-hi' },
      { key: 'c', label: 'c', kind: 'range-hi' }
    ]
    expect(rangePairs(cols).map(([lo, hi]) => [lo.key, hi.key])).toEqual([['a', 'c']])
    expect(() => rangePairs([{ key: 'a', label: 'a', kind: 'range-lo' }])).toThrow(RangeError)
  })

  it('checks 10,000 rows and reports each bad one', () => {
    const rows = Array.from({ length: 10_000 }, (_, i) => ({ ...goodRow, xMin: (i + 1) * 1e-5, xMax: (i + 2) * 1e-5, ...(i % 1000 === 0 ? { xMax: 1 } : {}) }))
    const errors = validateRows(rows, disColumns)
    expect(errors).toHaveLength(10)
  })
})
