import { z } from 'zod'
import { partonCodeSchema } from '../partons'
import type { Pdg } from '../types'
import type { CompiledExpression } from './expression'
import { compileExpression } from './expression'
import type { Hadron } from './hadrons'
import { PROTON, hadronSchema, onProton, pairsOnProton } from './hadrons'
import { inelasticity, partonFractions } from './kinematics'
import type { Term } from './terms'
import { addWeight, mergePairs } from './terms'

/**
 * A user-defined LO kernel: a table of flavour weights (DIS-like, one parton) or flavour-pair
 * weights (hadron–hadron, two partons) times an expression in the kinematic variables:
 *   DIS-like:  O(x, Q²) = E(x, q2, y, s) · Σ_a w_a x·f_a(x, μ²),            μ² = Q²
 *   hadronic:  O(M, y)  = E(m, y, x1, x2, tau, s) · Σ_(a,b) w_ab x₁f_a(x₁, μ²) x₂f_b(x₂, μ²),  μ² = M²,
 * with x₁,₂ = (M/√s) e^{±y}, τ = M²/s; y and s exist in the DIS mode only when √s is given.
 * Densities are momentum densities (x·f); divide by x (or x1·x2) in E for number densities.
 * The unit is whatever E carries (the constant hbarc2 converts GeV⁻² to pb); `unitLabel` names it.
 */

/** One row of the weights table: flavour a (and b for the hadronic mode) with weight w. */
export const userWeightRowSchema = z.strictObject({ a: partonCodeSchema, b: partonCodeSchema.optional(), w: z.number().refine(Number.isFinite, 'must be finite') })

/** Options of the user-defined kernel (plain JSON). */
export const userKernelOptionsSchema = z.strictObject({
  mode: z.enum(['dis', 'hadron']),
  expression: z.string().min(1, 'the expression is empty').max(2000),
  weights: z.array(userWeightRowSchema).min(1, 'give at least one weight row').max(400),
  sqrtSGeV: z.number().positive().optional(),
  target: hadronSchema.optional(),
  beam1: hadronSchema.optional(),
  beam2: hadronSchema.optional(),
  unitLabel: z.string().max(40).optional()
})
export type UserKernelOptions = z.infer<typeof userKernelOptionsSchema>

/** Variable names the expression may use in each mode. */
export function userKernelVariables(options: Pick<UserKernelOptions, 'mode' | 'sqrtSGeV'>): string[] {
  if (options.mode === 'hadron') return ['m', 'y', 'x1', 'x2', 'tau', 's']
  return options.sqrtSGeV === undefined ? ['x', 'q2'] : ['x', 'q2', 'y', 's']
}

/** A user kernel ready to produce terms. */
export interface UserKernel {
  options: UserKernelOptions
  expression: CompiledExpression
  /** The term at a point: { x, q2 } in the DIS mode, { m, y } in the hadronic mode. */
  term(point: Readonly<Record<string, number>>): Term
}

/**
 * Checks the options (weights table rows, expression) and compiles the kernel. Errors name the
 * table row and column ("weights row 2, column b: …") or the expression column (ExpressionError).
 * @example buildUserKernel({ mode: 'dis', expression: '1', weights: [{ a: 2, w: 4/9 }, { a: -2, w: 4/9 }] })
 */
export function buildUserKernel(options: UserKernelOptions): UserKernel {
  options.weights.forEach((row, i) => {
    if (options.mode === 'hadron' && row.b === undefined) throw new RangeError(`weights row ${i + 1}, column b: the hadronic mode needs a second flavour b`)
    if (options.mode === 'dis' && row.b !== undefined) throw new RangeError(`weights row ${i + 1}, column b: the DIS-like mode takes a single flavour a`)
  })
  if (options.mode === 'hadron' && options.sqrtSGeV === undefined) throw new RangeError('the hadronic user kernel needs sqrtSGeV')
  const expression = compileExpression(options.expression, userKernelVariables(options))
  const own = new Map<Pdg, number>()
  const pairs = mergePairs(options.weights.map(r => ({ a: r.a, b: r.b ?? 0, w: r.w })))
  for (const r of options.weights) addWeight(own, r.a, r.w)
  const disWeights = onProton(own, options.target ?? PROTON)
  const hadronPairs = pairsOnProton(pairs, (options.beam1 ?? PROTON) as Hadron, (options.beam2 ?? PROTON) as Hadron)
  return {
    options,
    expression,
    term(point) {
      if (options.mode === 'dis') {
        const x = point.x!
        const q2 = point.q2!
        if (!(x > 0 && x < 1) || !(q2 > 0)) throw new RangeError(`the user kernel needs x in (0, 1) and Q² > 0; got x = ${x}, Q² = ${q2} GeV²`)
        const vars: Record<string, number> = { x, q2 }
        if (options.sqrtSGeV !== undefined) {
          vars.s = options.sqrtSGeV ** 2
          vars.y = inelasticity(x, q2, vars.s)
        }
        return { kind: 'linear', x, mu2GeV2: q2, factor: expression.evaluate(vars), weights: disWeights }
      }
      const m = point.m!
      const y = point.y!
      const sqrtS = options.sqrtSGeV!
      const { x1, x2 } = partonFractions(m, y, sqrtS)
      if (!(m > 0) || !(x1 < 1) || !(x2 < 1)) throw new RangeError(`M = ${m} GeV at y = ${y} needs x₁ = ${x1.toPrecision(4)}, x₂ = ${x2.toPrecision(4)}; both must be below 1`)
      const factor = expression.evaluate({ m, y, x1, x2, tau: x1 * x2, s: sqrtS * sqrtS })
      return { kind: 'bilinear', x1, x2, mu2GeV2: m * m, factor, pairs: hadronPairs }
    }
  }
}
