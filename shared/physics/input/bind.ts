/**
 * Binding a parameter vector to a model: numeric terms for every piece, and the normalisation
 * factors that impose the valence and momentum sum rules for that vector.
 */
import { quarkSlots } from './flavours'
import { massNumberValue } from './mass-number'
import type { CoefficientRef, InputModel, ModelPiece } from './model'
import { multiplyTerms, termMoment, type NumericTerm } from './moments'

/** A piece with numeric terms and its sum-rule normalisation (1 unless a rule names it). */
export interface BoundPiece {
  id: string
  weights: Float64Array
  terms: NumericTerm[]
  /** Factor multiplying the whole piece (from the sum rules). */
  norm: number
}

/** A model with one parameter vector bound: x·f_i(x, μ₀²) = Σ_p norm_p w_{p,i} Σ terms. */
export interface BoundInput {
  model: InputModel
  params: Float64Array
  pieces: BoundPiece[]
}

function valueOf(ref: CoefficientRef, params: ArrayLike<number>): number {
  if (typeof ref === 'number') return ref
  return 'param' in ref ? params[ref.param]! : massNumberValue(ref, params)
}

/**
 * The terms of a model piece with `params` bound, each the numeric product of its factors (no
 * sum rules applied, nothing checked).
 * @example numericTerms(model.pieces[0], model.central)[0].a // the first term's small-x power
 */
export function numericTerms(piece: ModelPiece, params: ArrayLike<number>): NumericTerm[] {
  return piece.terms.map(factors => multiplyTerms(factors.map(f => ({
    A: valueOf(f.A, params),
    a: valueOf(f.a, params),
    b: valueOf(f.b, params),
    c: Float64Array.from(f.c, c => valueOf(c, params))
  }))))
}

/** Solves the small dense system A k = r (Gaussian elimination, partial pivoting). */
function solveSmall(a: number[][], r: number[]): number[] | undefined {
  const n = r.length
  const m = a.map((row, i) => [...row, r[i]!])
  const scale = Math.max(...a.flat().map(Math.abs))
  for (let c = 0; c < n; c++) {
    let p = c
    for (let i = c + 1; i < n; i++) if (Math.abs(m[i]![c]!) > Math.abs(m[p]![c]!)) p = i
    if (!(Math.abs(m[p]![c]!) > 1e-12 * scale)) return undefined
    ;[m[c], m[p]] = [m[p]!, m[c]!]
    for (let i = c + 1; i < n; i++) {
      const f = m[i]![c]! / m[c]![c]!
      for (let j = c; j <= n; j++) m[i]![j]! -= f * m[c]![j]!
    }
  }
  const k = new Array<number>(n).fill(0)
  for (let i = n - 1; i >= 0; i--) {
    let s = m[i]![n]!
    for (let j = i + 1; j < n; j++) s -= m[i]![j]! * k[j]!
    k[i] = s / m[i]![i]!
  }
  return k
}

/**
 * Binds `params` (default: the model's central vector) and solves the sum rules.
 *
 * Sum rules (when the model names pieces for them): ∫(u − ū)dx = 2, ∫(d − d̄)dx = 1 and
 * ∫ x(Σ_q (q + q̄) + g) dx = 1, solved jointly (a linear system in the named pieces' factors)
 * from the exact moments (Beta functions). Accuracy: the rules hold to 1e-14.
 * @param label names the member in messages, e.g. 'member 17'.
 * @throws RangeError for a vector of the wrong length or with non-finite values, a divergent
 * integral (exponent at fault named), a singular system, or a normalisation ≤ 0 (the other pieces
 * already overshoot the rule).
 * @example bindParameters(model).pieces.find(p => p.id === 'g')!.norm
 */
export function bindParameters(model: InputModel, params: ArrayLike<number> = model.central, label = 'central member'): BoundInput {
  if (params.length !== model.parameterNames.length) {
    throw new RangeError(`${label}: ${params.length} parameter values given, the fit has ${model.parameterNames.length}`)
  }
  for (let i = 0; i < params.length; i++) {
    if (!Number.isFinite(params[i])) throw new RangeError(`${label}: parameter ${model.parameterNames[i]} = ${params[i]} is not finite`)
  }
  const pieces: BoundPiece[] = model.pieces.map(p => ({ id: p.id, weights: p.weights, norm: 1, terms: numericTerms(p, params) }))
  const u = quarkSlots(2)
  const d = quarkSlots(1)
  const rules: { piece: number, target: number, weight: (w: Float64Array) => number, n: number, what: string }[] = []
  const r = model.sumRules
  if (r.uValence !== undefined) rules.push({ piece: r.uValence, target: 2, weight: w => w[u.quark]! - w[u.anti]!, n: 1, what: 'u-valence rule ∫(u − ū)dx = 2' })
  if (r.dValence !== undefined) rules.push({ piece: r.dValence, target: 1, weight: w => w[d.quark]! - w[d.anti]!, n: 1, what: 'd-valence rule ∫(d − d̄)dx = 1' })
  if (r.momentum !== undefined) rules.push({ piece: r.momentum, target: 1, weight: w => w.reduce((s, v) => s + v, 0), n: 2, what: 'momentum sum rule ∫ x Σ f dx = 1' })
  if (rules.length === 0) return { model, params: Float64Array.from(params), pieces }

  const integral = (p: number, n: number) => {
    try {
      return pieces[p]!.terms.reduce((s, t) => s + termMoment(t, n), 0)
    } catch (e) {
      throw new RangeError(`${label}: piece "${pieces[p]!.id}": ${(e as Error).message}`)
    }
  }
  const named = rules.map(x => x.piece)
  const a: number[][] = rules.map(() => new Array<number>(rules.length).fill(0))
  const rhs = rules.map(x => x.target)
  rules.forEach((rule, i) => {
    pieces.forEach((piece, p) => {
      const w = rule.weight(piece.weights)
      if (w === 0) return
      const v = w * integral(p, rule.n)
      const j = named.indexOf(p)
      if (j >= 0) a[i]![j]! += v
      else rhs[i]! -= v
    })
  })
  const k = solveSmall(a, rhs)
  if (!k) {
    throw new RangeError(`${label}: the sum rules cannot fix the normalisations of ${named.map(p => `"${pieces[p]!.id}"`).join(', ')} (the named pieces do not enter their rules independently)`)
  }
  k.forEach((kv, j) => {
    if (!(kv > 0) || !Number.isFinite(kv)) {
      throw new RangeError(`${label}: the ${rules[j]!.what} needs a normalisation ${kv.toPrecision(4)} ≤ 0 for piece "${pieces[named[j]!]!.id}" (the other pieces already exceed it)`)
    }
    pieces[named[j]!]!.norm = kv
  })
  return { model, params: Float64Array.from(params), pieces }
}
