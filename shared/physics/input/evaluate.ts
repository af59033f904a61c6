/**
 * Evaluating a bound input at the starting scale: x·f for every flavour on any x nodes, and the
 * Mellin moments of every flavour (real or complex N).
 */
import type { BoundInput } from './bind'
import { complex, type Complex } from './complex'
import { N_SLOTS, quarkSlots } from './flavours'
import { termMoment, termMomentComplex, termXf } from './moments'

/**
 * x·f_i(x, μ₀²) of all 13 evolved flavours (EVOLVED_FLAVOURS order) at each x:
 * result[ix·13 + slot] (flavour fastest, as in MemberGrid at one Q²).
 * @param x nodes in (0, 1).
 * @throws RangeError for an x outside (0, 1).
 * @example evaluateXf(bindParameters(model), [1e-3, 0.1])[1 * 13 + 12] // x·g at x = 0.1
 */
export function evaluateXf(bound: BoundInput, x: ArrayLike<number>): Float64Array {
  const out = new Float64Array(x.length * N_SLOTS)
  for (let ix = 0; ix < x.length; ix++) {
    const xv = x[ix]!
    if (!(xv > 0 && xv < 1)) throw new RangeError(`x must lie in (0, 1); node ${ix} is x = ${xv}`)
    for (const piece of bound.pieces) {
      let v = 0
      for (const t of piece.terms) v += termXf(t, xv)
      v *= piece.norm
      for (let s = 0; s < N_SLOTS; s++) {
        const w = piece.weights[s]!
        if (w !== 0) out[ix * N_SLOTS + s]! += w * v
      }
    }
  }
  return out
}

/**
 * Mellin moments ∫₀¹ x^{N−1} f_i(x, μ₀²) dx of the 13 flavours (number densities), real N.
 * N = 1: number integrals; N = 2: momentum fractions.
 * @throws RangeError where a flavour's integral diverges.
 * @example flavourMoments(bound, 2).reduce((s, v) => s + v, 0) // 1 when the momentum rule is imposed
 */
export function flavourMoments(bound: BoundInput, n: number): Float64Array {
  const out = new Float64Array(N_SLOTS)
  for (const piece of bound.pieces) {
    if (piece.weights.every(w => w === 0)) continue
    const m = piece.norm * piece.terms.reduce((s, t) => s + termMoment(t, n), 0)
    for (let s = 0; s < N_SLOTS; s++) out[s]! += piece.weights[s]! * m
  }
  return out
}

/**
 * The sum-rule integrals of a bound input from exact moments: valence numbers
 * ∫(q − q̄)dx for u, d, s (only pieces that differ between quark and antiquark enter, so sea
 * pieces with x^a, a ≤ 0, are fine) and the momentum sum ∫ x Σ_i f_i dx.
 * @example sumRuleIntegrals(bindParameters(toy)) // { uValence: 2.0000, dValence: 1.0000, sValence: 0, momentum: 1.0000 }
 */
export function sumRuleIntegrals(bound: BoundInput): { uValence: number, dValence: number, sValence: number, momentum: number } {
  const valence = (q: number) => {
    const { quark, anti } = quarkSlots(q)
    let sum = 0
    for (const p of bound.pieces) {
      const w = p.weights[quark]! - p.weights[anti]!
      if (w !== 0) sum += w * p.norm * p.terms.reduce((s, t) => s + termMoment(t, 1), 0)
    }
    return sum
  }
  return {
    uValence: valence(2),
    dValence: valence(1),
    sValence: valence(3),
    momentum: flavourMoments(bound, 2).reduce((s, v) => s + v, 0)
  }
}

/**
 * Mellin moments of the 13 flavours at complex N (for Mellin-space evolution).
 * @returns re and im parts per slot.
 * @example flavourMomentsComplex(bound, complex(1.6, 3)).re[12] // Re of the gluon moment
 */
export function flavourMomentsComplex(bound: BoundInput, n: Complex): { re: Float64Array, im: Float64Array } {
  const re = new Float64Array(N_SLOTS)
  const im = new Float64Array(N_SLOTS)
  for (const piece of bound.pieces) {
    let m = complex(0, 0)
    for (const t of piece.terms) {
      const v = termMomentComplex(t, n)
      m = complex(m.re + v.re, m.im + v.im)
    }
    for (let s = 0; s < N_SLOTS; s++) {
      const w = piece.weights[s]! * piece.norm
      if (w === 0) continue
      re[s]! += w * m.re
      im[s]! += w * m.im
    }
  }
  return { re, im }
}

/**
 * Lowest x·f value of each listed flavour slot over the nodes (positivity checks of sea and gluon).
 * @example minimumXf(bound, xNodes, [12]) // smallest x·g on the nodes
 */
export function minimumXf(bound: BoundInput, x: ArrayLike<number>, slots: readonly number[]): number {
  const v = evaluateXf(bound, x)
  let min = Infinity
  for (let ix = 0; ix < x.length; ix++) for (const s of slots) min = Math.min(min, v[ix * N_SLOTS + s]!)
  return min
}
