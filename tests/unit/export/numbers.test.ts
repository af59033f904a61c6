import { describe, expect, it } from 'vitest'
import { roundDecimal, roundMeasurement, roundSignificant } from '#shared/export'

// Rounding rule (common practice): errors to 2 significant digits, the central value to the
// same decimal place, ties half away from zero on the decimal form.
describe('roundDecimal', () => {
  it.each([
    [1.005, 2, '1.01'], [2.675, 2, '2.68'], [1234, -2, '1200'], [1250, -2, '1300'], [0.0996, 3, '0.100'],
    [-0.0004, 3, '0.000'], [-0.0006, 3, '-0.001'], [9.99, 1, '10.0'], [0, 2, '0.00'], [123.456, 0, '123'],
    [-2.5, 0, '-3'], [99999, -3, '100000'], [0.000123, 5, '0.00012'], [1e21, 0, '1000000000000000000000']
  ])('%d to %d places → %s', (x, d, text) => {
    expect(roundDecimal(x, d)).toBe(text)
  })
  it('refuses non-finite input', () => {
    expect(() => roundDecimal(Number.NaN, 2)).toThrow(RangeError)
  })
})

describe('roundSignificant', () => {
  it.each([
    [0.01234, '0.012', 3], [0.0996, '0.10', 2], [0.095, '0.095', 3], [99.5, '100', -1], [1234, '1200', -2], [0.15, '0.15', 2]
  ])('%d → %s (decimals %d)', (x, text, decimals) => {
    expect(roundSignificant(x, 2)).toEqual({ text, decimals })
  })
})

describe('roundMeasurement', () => {
  it.each([
    // central, +, −, expected central, +, −, exponent
    [1.23456, 0.01234, 0.0156, '1.235', '0.012', '0.016', 0],
    [1.23456, 0.012, 0.15, '1.235', '0.012', '0.15', 0], // central follows the finer error
    [2.5, 0.0996, 0.098, '2.500', '0.10', '0.098', 0], // carry: 0.0996 → 0.10
    [45678, 1234, 987, '45680', '1200', '990', 0],
    [1.234e-5, 2.1e-7, 1.9e-7, '1.234', '0.021', '0.019', -5],
    [123456, 1234, 1234, '1.235', '0.012', '0.012', 5],
    [-0.5, 0.0123, 0.0123, '-0.500', '0.012', '0.012', 0],
    [1.5, 0, 0.0123, '1.500', '0.000', '0.012', 0]
  ])('%d +%d −%d', (c, p, m, central, plus, minus, exponent) => {
    expect(roundMeasurement(c, p, m)).toMatchObject({ central, plus, minus, exponent })
  })
  it('prints a value without errors to 4 significant digits', () => {
    expect(roundMeasurement(3.14159, 0, 0)).toEqual({ central: '3.142', plus: '0', minus: '0', exponent: 0, symmetric: true })
  })
  it('refuses negative or non-finite errors', () => {
    expect(() => roundMeasurement(1, -0.1, 0.1)).toThrow(/magnitudes/)
    expect(() => roundMeasurement(Number.NaN, 0.1, 0.1)).toThrow(/central value is NaN/)
  })
})
