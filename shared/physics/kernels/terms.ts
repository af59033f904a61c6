import type { Pdg } from '../types'

/**
 * Every LO kernel in Sheaf is, at one kinematic point, either a linear form in the momentum
 * densities x·f at one (x, μ²) (DIS-like) or a bilinear form in x₁f(x₁, μ²) and x₂f(x₂, μ²)
 * (hadron–hadron). Kernels return these forms as data; the direct evaluator, the precomputed
 * plan and the tests all evaluate the same forms.
 */

/** Weight of each flavour (PDG code) in a linear form; absent flavours weigh 0. */
export type FlavourWeights = ReadonlyMap<Pdg, number>

/** One entry w · x₁f_a(x₁) · x₂f_b(x₂) of a bilinear form. */
export interface PairWeight {
  a: Pdg
  b: Pdg
  w: number
}

/** factor · Σ_f weights[f] · x·f(x, μ²). */
export interface LinearTerm {
  kind: 'linear'
  x: number
  /** Factorisation scale μ_F² in GeV². */
  mu2GeV2: number
  factor: number
  weights: FlavourWeights
}

/** factor · Σ_(a,b) w · x₁f_a(x₁, μ²) · x₂f_b(x₂, μ²); beam 1 carries x₁, beam 2 carries x₂. */
export interface BilinearTerm {
  kind: 'bilinear'
  x1: number
  x2: number
  /** Factorisation scale μ_F² in GeV², shared by both beams. */
  mu2GeV2: number
  factor: number
  pairs: readonly PairWeight[]
}

export type Term = LinearTerm | BilinearTerm

/** Momentum density x·f_pdg(x, Q²) of some set or analytic model (dimensionless). */
export type XfFunction = (pdg: Pdg, x: number, q2GeV2: number) => number

/**
 * Value of a term for densities `xf` (beam 1) and `xf2` (beam 2, default `xf`). Unit: that of
 * `term.factor`. Exact arithmetic of the form, no approximation.
 * @example evaluateTerm({ kind: 'linear', x: 0.1, mu2GeV2: 10, factor: 1, weights: new Map([[2, 4 / 9]]) }, xf)
 */
export function evaluateTerm(term: Term, xf: XfFunction, xf2: XfFunction = xf): number {
  if (term.kind === 'linear') {
    let sum = 0
    for (const [pdg, w] of term.weights) {
      if (w !== 0) sum += w * xf(pdg, term.x, term.mu2GeV2)
    }
    return term.factor * sum
  }
  let sum = 0
  for (const { a, b, w } of term.pairs) {
    if (w !== 0) sum += w * xf(a, term.x1, term.mu2GeV2) * xf2(b, term.x2, term.mu2GeV2)
  }
  return term.factor * sum
}

/** Adds w to the weight of pdg in a mutable map (helper for building forms). */
export function addWeight(map: Map<Pdg, number>, pdg: Pdg, w: number): void {
  if (w === 0) return
  map.set(pdg, (map.get(pdg) ?? 0) + w)
}

/** Merges equal (a, b) entries of a list of pair weights and drops zeros. */
export function mergePairs(pairs: Iterable<PairWeight>): PairWeight[] {
  const merged = new Map<string, PairWeight>()
  for (const p of pairs) {
    const key = `${p.a},${p.b}`
    const seen = merged.get(key)
    if (seen) seen.w += p.w
    else merged.set(key, { a: p.a, b: p.b, w: p.w })
  }
  return [...merged.values()].filter(p => p.w !== 0)
}
