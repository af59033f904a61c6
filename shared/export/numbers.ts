/**
 * Decimal rounding for printed results. Binary floating point cannot hold 1.005 exactly, so
 * `toFixed` would print 1.00; these functions round the 15-significant-digit decimal form
 * instead, half away from zero, which is what a reader checking by hand expects.
 */

/** Sign, 15 significant digits and decimal exponent of a finite number (`1.25` → ['', '125000000000000', 0]). */
function decimalParts(x: number): { negative: boolean, digits: string, exponent: number } {
  const [mantissa, exp] = Math.abs(x).toExponential(14).split('e') as [string, string]
  return { negative: x < 0, digits: mantissa.replace('.', ''), exponent: Number(exp) }
}

/**
 * `x` rounded to `decimals` places (negative: to tens, hundreds …) as text, half away from zero.
 *
 * @example roundDecimal(1.005, 2) // → '1.01'
 * @example roundDecimal(1234, -2) // → '1200'
 */
export function roundDecimal(x: number, decimals: number): string {
  if (!Number.isFinite(x)) throw new RangeError(`Cannot round ${x}: not a finite number`)
  if (!Number.isInteger(decimals)) throw new RangeError(`Decimal places must be an integer, got ${decimals}`)
  const { negative, digits, exponent } = decimalParts(x)
  // keep the digits down to 10^-decimals: the first digit stands for 10^exponent
  const keep = exponent + 1 + decimals
  let kept: string
  let exp = exponent
  if (x === 0 || keep < 0) kept = ''
  else if (keep >= digits.length) kept = digits + '0'.repeat(keep - digits.length)
  else {
    kept = digits.slice(0, keep)
    if (digits[keep]! >= '5') {
      const up = (BigInt(kept || '0') + 1n).toString()
      if (up.length > kept.length) exp += 1
      kept = up.padStart(keep, '0')
    }
  }
  // kept holds digits for 10^exp … 10^-decimals; place the decimal point
  const intDigits = exp + 1
  let intPart: string
  let fracPart: string
  if (kept === '' || /^0*$/.test(kept)) {
    intPart = '0'
    fracPart = '0'.repeat(Math.max(decimals, 0))
  }
  else if (intDigits <= 0) {
    intPart = '0'
    fracPart = ('0'.repeat(-intDigits) + kept).slice(0, Math.max(decimals, 0))
  }
  else {
    const all = kept + '0'.repeat(Math.max(0, intDigits - kept.length))
    intPart = all.slice(0, intDigits)
    fracPart = all.slice(intDigits, intDigits + Math.max(decimals, 0))
  }
  const zero = /^[0.]*$/.test(intPart + fracPart)
  return `${negative && !zero ? '-' : ''}${intPart}${fracPart ? `.${fracPart}` : ''}`
}

/** Decimal exponent of |x| (x ≠ 0, finite), from its decimal form: 0.0996 → -2, 100 → 2. */
export const decimalExponent = (x: number) => decimalParts(x).exponent

/**
 * `x` rounded to `digits` significant digits, with the decimal place it ended on
 * (`decimals`, negative for tens, hundreds …). A carry is handled: 0.0996 at 2 digits is
 * '0.10' (decimals 2), not '0.100'.
 */
export function roundSignificant(x: number, digits: number): { text: string, decimals: number } {
  if (!Number.isFinite(x) || x === 0) throw new RangeError(`Significant digits are defined for a finite non-zero number, got ${x}`)
  let decimals = digits - 1 - decimalExponent(x)
  let text = roundDecimal(x, decimals)
  if (decimalExponent(Number(text)) > decimalExponent(x)) {
    decimals -= 1
    text = roundDecimal(x, decimals)
  }
  return { text, decimals }
}

/** Central value and its two errors as printed, sharing one decimal place and power of ten. */
export interface RoundedMeasurement {
  central: string
  plus: string
  minus: string
  /** Power of ten factored out of all three (0 when none). */
  exponent: number
  /** Whether the rounded errors print the same (then `X ± a` reads better). */
  symmetric: boolean
}

export interface RoundingOptions {
  /**
   * How many significant digits an error keeps: 'pdg' (default) by the Particle Data Group's
   * rule ({@link pdgErrorDecimals}), or a fixed number.
   */
  errorDigits?: 'pdg' | number
  /** Significant digits of the central value when both errors are zero; default 4. */
  bareDigits?: number
  /** A power of ten is factored out when |central| < 10^low or ≥ 10^high; default [-3, 5]. */
  plainRange?: [number, number]
}

/**
 * The decimal place an error is rounded to by the Particle Data Group's rule (Review of Particle
 * Physics, Introduction, the section on rounding; the rule as recalled here is from memory): the
 * three highest-order digits of the error decide — 100 to 354: two significant digits; 355 to
 * 949: one; 950 to 999: round the error up to 1000 and keep two significant digits.
 * Returns the number of decimals (negative for tens, hundreds …).
 *
 * @example pdgErrorDecimals(0.119) // 2 (→ 0.12)
 * @example pdgErrorDecimals(0.367) // 1 (→ 0.4)
 * @example pdgErrorDecimals(0.980) // 1 (→ 1.0)
 */
export function pdgErrorDecimals(error: number): number {
  if (!Number.isFinite(error) || error <= 0) throw new RangeError(`The rounding rule needs a positive error, got ${error}`)
  const { digits, exponent } = decimalParts(error)
  const lead = Number(digits.slice(0, 3))
  if (lead <= 354) return 1 - exponent
  if (lead <= 949) return -exponent
  return -exponent // 950–999 → 1000 (one order up) with two significant digits: the same decimal place
}

/**
 * Rounds a result for a table. By default the Particle Data Group's rule ({@link pdgErrorDecimals})
 * decides the decimal place from the smaller non-zero error, and the value and both errors are
 * rounded to that one place, so an asymmetric result reads evenly (`17.0^{+1.2}_{-1.0}`, never
 * `16.95^{+1.2}_{-0.97}`; one place for both errors is common practice). A common power of ten is
 * factored out when the central value is very small or large. Errors are magnitudes (≥ 0).
 *
 * @example roundMeasurement(0.827, 0.119, 0.119) // → { central: '0.83', plus: '0.12', minus: '0.12', … }
 */
export function roundMeasurement(central: number, plus: number, minus: number, options: RoundingOptions = {}): RoundedMeasurement {
  const errorDigits = options.errorDigits ?? 'pdg'
  const [low, high] = options.plainRange ?? [-3, 5]
  for (const [name, v] of [['central value', central], ['upper error', plus], ['lower error', minus]] as const) {
    if (!Number.isFinite(v)) throw new RangeError(`Cannot print a result whose ${name} is ${v}`)
  }
  if (plus < 0 || minus < 0) throw new RangeError(`Errors are magnitudes and must be ≥ 0, got +${plus} / -${minus}`)
  const lead = central !== 0 ? central : Math.max(plus, minus)
  const e = lead === 0 ? 0 : decimalExponent(lead)
  const exponent = e < low || e >= high ? e : 0
  // shift the decimal exponent rather than divide, so 1.234e-5 scales to exactly 1.234
  const scale = (v: number) => (exponent === 0 || v === 0 ? v : Number(v.toExponential(14).replace(/e([+-]\d+)$/, (_, k: string) => `e${Number(k) - exponent}`)))
  const [c, p, m] = [scale(central), scale(plus), scale(minus)]
  const nonZero = [p, m].filter(v => v > 0)
  if (!nonZero.length) {
    const text = c === 0 ? '0' : roundSignificant(c, options.bareDigits ?? 4).text
    return { central: text, plus: '0', minus: '0', exponent, symmetric: true }
  }
  const decimals = errorDigits === 'pdg'
    ? pdgErrorDecimals(Math.min(...nonZero))
    : Math.max(...nonZero.map(v => roundSignificant(v, errorDigits).decimals))
  const text = (v: number) => (errorDigits === 'pdg' || v === 0 ? roundDecimal(v, decimals) : roundSignificant(v, errorDigits).text)
  const plusText = text(p)
  const minusText = text(m)
  return { central: roundDecimal(c, decimals), plus: plusText, minus: minusText, exponent, symmetric: plusText === minusText }
}
