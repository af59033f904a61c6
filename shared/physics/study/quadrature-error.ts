import type { GridAxes } from '../interpolation/axes'
import type { PlanOptions } from './plan'
import { buildPlan, evaluatePlan } from './plan'
import type { StudySpec } from './spec'

/** Per-bin quadrature error estimate of a study, reported next to each bin's value. */
export interface QuadratureErrors {
  /** Gauss–Legendre orders of the study (ranged variables, full rapidity range). */
  order: number
  fullRangeOrder: number
  /** The orders of the check: twice the study's. */
  checkOrder: number
  checkFullRangeOrder: number
  /** Central member's value per bin at the study's orders and at the check orders. */
  values: Float64Array
  check: Float64Array
  /** |check − values| per bin, in the study's unit: 0 for bins integrated over nothing. */
  error: Float64Array
}

/**
 * The quadrature error estimate of every bin: the study's rule (n points per ranged variable,
 * in ln v for Q² and M) against the rule with 2n points, on one member (the central one), with
 * everything else fixed. |I_2n − I_n| estimates the error of I_n; for a smooth integrand
 * Gauss–Legendre converges so fast that it is a generous (conservative) estimate (common
 * practice; Abramowitz and Stegun §25.4.29 for the rule). Totals and luminosities double their
 * full-rapidity order as well. Result in the study's unit. Costs one more plan at twice the
 * points (four times for two ranged variables); reach errors as in buildPlan.
 * @example quadratureErrors(spec, set, set.members[0]).error // per-bin |I_2n − I_n|
 */
export function quadratureErrors(spec: StudySpec, axes: GridAxes, central: Float64Array, options: PlanOptions & { secondCentral?: Float64Array } = {}): QuadratureErrors {
  const second = options.secondCentral ? [options.secondCentral] : undefined
  const nBins = spec.bins.length
  const checkOrder = 2 * spec.quadratureOrder
  const checkFullRangeOrder = 2 * spec.fullRangeOrder
  const values = evaluatePlan(buildPlan(spec, axes, options), [central], second).slice(0, nBins)
  const check = evaluatePlan(buildPlan({ ...spec, quadratureOrder: checkOrder, fullRangeOrder: checkFullRangeOrder }, axes, options), [central], second).slice(0, nBins)
  const error = values.map((v, b) => Math.abs(check[b]! - v))
  return { order: spec.quadratureOrder, fullRangeOrder: spec.fullRangeOrder, checkOrder, checkFullRangeOrder, values, check, error }
}
