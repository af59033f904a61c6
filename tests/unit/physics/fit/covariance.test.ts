import { describe, expect, it } from 'vitest'
import { checkedCovariance } from '~/shared/physics/fit/covariance'

describe('covariance checks before building members', () => {
  it('accepts a symmetric positive-definite matrix', () => {
    expect(checkedCovariance([[4, 1], [1, 9]]).get(0, 1)).toBe(1)
  })

  it.each([
    ['an empty matrix', [], /empty/],
    ['a ragged matrix', [[1, 0], [0]], /row 1 has 1 entries/],
    ['a NaN', [[1, Number.NaN], [Number.NaN, 1]], /C\[0\]\[1\] = NaN is not a finite number/],
    ['a zero variance', [[0, 0], [0, 1]], /diagonal C\[0\]\[0\] = 0 must be > 0/],
    ['an asymmetric matrix', [[1, 0.2], [0.3, 1]], /not symmetric: C\[0\]\[1\] = 0.2 but C\[1\]\[0\] = 0.3/],
    ['a correlation above 1', [[1, 1.2], [1.2, 1]], /not positive definite/],
    ['a fully correlated pair', [[1, 1, 0], [1, 1, 0], [0, 0, 1]], /not positive definite|numerically singular/]
  ])('refuses %s', (_label, m, message) => {
    expect(() => checkedCovariance(m as number[][])).toThrow(RangeError)
    expect(() => checkedCovariance(m as number[][])).toThrow(message)
  })

  it('refuses a size that does not match the parameters', () => {
    expect(() => checkedCovariance([[1]], 2)).toThrow(/1 rows but there are 2 parameters/)
  })
})
