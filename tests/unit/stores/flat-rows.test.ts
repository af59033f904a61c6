// Long lists of flat records travel in the page payload as JSON text: only what JSON carries
// exactly is taken, and it comes back equal.
import { describe, expect, it } from 'vitest'
import { isFlatRows, reduceFlatRows, reviveFlatRows } from '../../../stores/plugins/flat-rows'

const bins = (n: number) => Array.from({ length: n }, (_, i) => ({ x: 0.001 * (i + 1), q2Min: 10, q2Max: 20, label: `bin ${i + 1}`, flag: i % 2 === 0, note: null }))

describe('flat rows in the page payload', () => {
  it('writes 10,000 bins as JSON text that reads back equal', () => {
    const rows = bins(10_000)
    const text = reduceFlatRows(rows)
    expect(typeof text).toBe('string')
    expect(reviveFlatRows(text as string)).toEqual(rows)
  })

  it('leaves short lists and everything JSON would change to the default format', () => {
    expect(reduceFlatRows(bins(255))).toBe(false)
    expect(isFlatRows(bins(256))).toBe(true)
    const withValue = (v: unknown) => bins(300).map((r, i) => (i === 299 ? { ...r, x: v } : r))
    for (const v of [undefined, Number.NaN, Number.POSITIVE_INFINITY, -0, new Date(0), { nested: 1 }, [1], 1n]) {
      expect(isFlatRows(withValue(v)), String(v)).toBe(false)
    }
    expect(isFlatRows(bins(300).map((r, i) => (i === 0 ? Object.assign(Object.create(null), r) : r)))).toBe(false)
    expect(isFlatRows([...bins(299), null])).toBe(false)
    expect(isFlatRows({ length: 300 })).toBe(false)
  })
})
