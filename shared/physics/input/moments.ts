/**
 * Exact Mellin moments of parametrised terms. A term gives the momentum density
 * x·f(x) = A x^a (1−x)^b (1 + Σ_k c_k x^{k/2}); its Mellin moment of the number density is
 *   M(N) = ∫₀¹ x^{N−1} f(x) dx = A Σ_{k≥0} c_k B(a + k/2 + N − 1, b + 1),  c₀ = 1,
 * with Euler's Beta function B (evaluated through log-gamma). N = 1 is the number integral
 * ∫ f dx (valence sum rules), N = 2 the momentum integral ∫ x f dx.
 */
import { complex, type Complex } from './complex'
import { beta, betaComplex } from './special-functions'

/** A term with numeric coefficients: x·f = A x^a (1−x)^b (1 + Σ c[k−1] x^{k/2}). */
export interface NumericTerm {
  A: number
  a: number
  b: number
  /** c₁, c₂, …: c[k−1] multiplies x^{k/2}. */
  c: Float64Array
}

/**
 * M(N) = ∫₀¹ x^{N−1} f(x) dx of one term (see the module comment), for real N.
 *
 * Domain: a + N − 1 > 0 for every power present (a + k/2 + N − 1 with c_k ≠ 0) and b > −1.
 * Accuracy: relative 1e-14 (log-gamma accuracy).
 * @throws RangeError where the integral diverges, saying which exponent is at fault.
 * @example termMoment({ A: 5.1072, a: 0.8, b: 3, c: new Float64Array() }, 1) // 2.0000 (u_v of hep-ph/0204316's toy input)
 */
export function termMoment(term: NumericTerm, n: number): number {
  if (!(term.b > -1)) {
    throw new RangeError(`∫ x^${n - 1} f dx diverges at x → 1: the large-x exponent b = ${term.b} must exceed −1`)
  }
  let sum = 0
  for (let k = 0; k <= term.c.length; k++) {
    const ck = k === 0 ? 1 : term.c[k - 1]!
    if (ck === 0) continue
    const p = term.a + k / 2 + n - 1
    if (!(p > 0)) {
      throw new RangeError(`∫ x^${n - 1} f dx diverges at x → 0: the power x^${term.a + k / 2} of x·f needs a + ${k / 2} > ${1 - n} (a = ${term.a})`)
    }
    sum += ck * beta(p, term.b + 1)
  }
  return term.A * sum
}

/**
 * M(N) of one term for complex N (Mellin-space evolution): the Beta-function formula of
 * `termMoment`, analytically continued to the whole complex plane except the poles at
 * a + k/2 + N − 1 = 0, −1, −2, … (so a contour may pass to Re N < 0 away from the real axis).
 * Domain: b > −1, N off those poles.
 * Accuracy: relative 1e-13 for |N| ≤ 1e4.
 * @example termMomentComplex(term, complex(2, 0)) // { re: termMoment(term, 2), im: 0 }
 */
export function termMomentComplex(term: NumericTerm, n: Complex): Complex {
  if (!(term.b > -1)) {
    throw new RangeError(`the Mellin moment diverges at x → 1: b = ${term.b} must exceed −1`)
  }
  let re = 0
  let im = 0
  const q = complex(term.b + 1, 0)
  for (let k = 0; k <= term.c.length; k++) {
    const ck = k === 0 ? 1 : term.c[k - 1]!
    if (ck === 0) continue
    const p = complex(term.a + k / 2 + n.re - 1, n.im)
    const bv = betaComplex(p, q)
    re += ck * bv.re
    im += ck * bv.im
  }
  return complex(term.A * re, term.A * im)
}

/**
 * The numeric product of several factors, itself a term:
 * Π A_i · x^{Σa_i} (1−x)^{Σb_i} · Π(1 + Σ c_ik x^{k/2}) (the polynomials in √x multiplied out).
 * @example multiplyTerms([t1, t2]).a // t1.a + t2.a
 */
export function multiplyTerms(factors: readonly NumericTerm[]): NumericTerm {
  let A = 1
  let a = 0
  let b = 0
  let poly = [1]
  for (const f of factors) {
    A *= f.A
    a += f.a
    b += f.b
    const other = [1, ...f.c]
    const next = new Array<number>(poly.length + other.length - 1).fill(0)
    poly.forEach((p, i) => other.forEach((o, j) => { next[i + j]! += p * o }))
    poly = next
  }
  let last = poly.length - 1
  while (last > 0 && poly[last] === 0) last--
  return { A, a, b, c: Float64Array.from(poly.slice(1, last + 1)) }
}

/**
 * x·f(x) of one term at x in (0, 1).
 * @example termXf({ A: 1.7, a: -0.1, b: 5, c: new Float64Array() }, 0.1) // 1.7·0.1^−0.1·0.9^5
 */
export function termXf(term: NumericTerm, x: number): number {
  let poly = 1
  if (term.c.length > 0) {
    const r = Math.sqrt(x)
    let pw = 1
    for (let k = 0; k < term.c.length; k++) {
      pw *= r
      poly += term.c[k]! * pw
    }
  }
  return term.A * Math.pow(x, term.a) * Math.pow(1 - x, term.b) * poly
}
