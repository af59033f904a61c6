import { describe, expect, it } from 'vitest'
import { assertMemberValues, binColumn, memberValuesFromRows, withoutMembers } from '../../../../shared/physics/uncertainty/matrix'

describe('member-value matrices', () => {
  it('is row-major, member 0 first', () => {
    const m = memberValuesFromRows([[1, 2, 3], [4, 5, 6]])
    expect(m.members).toBe(2)
    expect(m.bins).toBe(3)
    expect(Array.from(m.values)).toEqual([1, 2, 3, 4, 5, 6])
    expect(Array.from(binColumn(m, 1))).toEqual([2, 5])
  })

  it('sets members aside, keeping the order of the rest', () => {
    const m = memberValuesFromRows([[0], [1], [2], [3], [4]])
    const out = withoutMembers(m, [3, 1])
    expect(Array.from(out.values)).toEqual([0, 2, 4])
    expect(m.members).toBe(5)
  })

  it.each([
    { rows: [], message: /No members/ },
    { rows: [[]], message: /no bins/ },
    { rows: [[1, 2], [3]], message: /Member 1 has 1 bins but member 0 has 2/ },
    { rows: [[1, 2], [3, Number.POSITIVE_INFINITY]], message: /member 1, bin 1/ }
  ])('rejects $rows', ({ rows, message }) => {
    expect(() => memberValuesFromRows(rows)).toThrow(RangeError)
    expect(() => memberValuesFromRows(rows)).toThrow(message)
  })

  it.each([
    { matrix: { members: 2, bins: 2, values: new Float64Array(3) }, message: /holds 3 values but 2 members × 2 bins need 4/ },
    { matrix: { members: 0, bins: 2, values: new Float64Array(0) }, message: /0 members/ },
    { matrix: { members: 1, bins: 0, values: new Float64Array(0) }, message: /0 bins/ },
    { matrix: { members: 1, bins: 1, values: new Float64Array([Number.NaN]) }, message: /member 0, bin 0/ }
  ])('checks shape and values: $message', ({ matrix, message }) => {
    expect(() => assertMemberValues(matrix)).toThrow(message)
  })

  it.each([
    { indices: [0], message: /central/ },
    { indices: [5], message: /run from 1 to 2/ },
    { indices: [1, 1], message: /twice/ }
  ])('refuses to set aside $indices', ({ indices, message }) => {
    expect(() => withoutMembers(memberValuesFromRows([[0], [1], [2]]), indices)).toThrow(message)
  })

  it('refuses a bin out of range', () => {
    expect(() => binColumn(memberValuesFromRows([[0, 1]]), 2)).toThrow(/bins run from 0 to 1/)
  })
})
