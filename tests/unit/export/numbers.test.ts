import { describe, expect, it } from 'vitest'
import { pdgErrorDecimals, roundDecimal, roundMeasurement, roundSignificant } from '#shared/export'

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
  ])('%d +%d −%d, two significant digits on request', (c, p, m, central, plus, minus, exponent) => {
    expect(roundMeasurement(c, p, m, { errorDigits: 2 })).toMatchObject({ central, plus, minus, exponent })
  })

  // The Particle Data Group's rounding rule, Review of Particle Physics, Introduction, section on
  // rounding: the three highest-order digits of the error decide (100–354: two significant
  // digits, 355–949: one, 950–999: round up to 1000 and keep two), the value is rounded to match.
  // The first two examples are the ones printed there (from memory); the others apply the rule.
  it.each([
    [0.827, 0.119, '0.83', '0.12'], // published example (from memory)
    [0.827, 0.367, '0.8', '0.4'], // published example (from memory)
    [0.827, 0.980, '0.8', '1.0'], // 980 → 1000, two digits
    [0.827, 0.354, '0.83', '0.35'], // edge of the two-digit range
    [0.827, 0.355, '0.8', '0.4'], // edge of the one-digit range
    [0.827, 0.949, '0.8', '0.9'],
    [0.827, 0.950, '0.8', '1.0'],
    [1234.5, 23.4, '1235', '23'],
    [1234.5, 56, '1230', '60']
  ])('by the PDG rule: %d ± %d → %s ± %s', (c, e, central, error) => {
    expect(roundMeasurement(c, e, e)).toMatchObject({ central, plus: error, minus: error, symmetric: true })
  })
  it('rounds asymmetric errors to one decimal place, set by the smaller error', () => {
    // The uneven 16.95^{+1.0}_{-0.97} of the old rounding: 0.97 → 970 → 1.0 (one decimal), so all at one decimal.
    expect(roundMeasurement(16.95, 1.04, 0.97)).toMatchObject({ central: '17.0', plus: '1.0', minus: '1.0' })
    expect(roundMeasurement(16.95, 1.24, 0.31)).toMatchObject({ central: '16.95', plus: '1.24', minus: '0.31', symmetric: false })
    expect(roundMeasurement(2.5, 0.0996, 0.098)).toMatchObject({ central: '2.50', plus: '0.10', minus: '0.10' })
  })
  it('prints a value without errors to 4 significant digits', () => {
    expect(roundMeasurement(3.14159, 0, 0)).toEqual({ central: '3.142', plus: '0', minus: '0', exponent: 0, symmetric: true })
  })
  it('gives the decimal place of the PDG rule', () => {
    expect([pdgErrorDecimals(0.119), pdgErrorDecimals(0.367), pdgErrorDecimals(0.98), pdgErrorDecimals(23.4), pdgErrorDecimals(560)]).toEqual([2, 1, 1, 0, -2])
    expect(() => pdgErrorDecimals(0)).toThrow(RangeError)
  })
  it('refuses negative or non-finite errors', () => {
    expect(() => roundMeasurement(1, -0.1, 0.1)).toThrow(/magnitudes/)
    expect(() => roundMeasurement(Number.NaN, 0.1, 0.1)).toThrow(/central value is NaN/)
  })
})
