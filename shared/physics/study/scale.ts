import type { GridAxes } from '../interpolation/axes'
import type { PlanOptions } from './plan'
import { buildPlan, evaluatePlan } from './plan'
import type { StudySpec } from './spec'

/** Factorisation-scale variation of a study, reported apart from the PDF band. */
export interface ScaleVariation {
  /** κ of each row of `values`: nominal × ½, nominal, nominal × 2. */
  kappas: [number, number, number]
  /** 3 × bins, row-major: the central member's value at each κ. */
  values: Float64Array
  /** Value at the nominal κ, per bin. */
  nominal: Float64Array
  /** Largest minus nominal and nominal minus smallest over the three, per bin (≥ 0). */
  up: Float64Array
  down: Float64Array
}

/**
 * Varies the factorisation scale μ_F = κ μ by factors ½ and 2 around the spec's κ (κ clamped to
 * the allowed [0.25, 4]) on one member (the central one, as is common practice), with
 * everything else fixed. For gg → H only μ_F moves; α_s stays at μ_R = M_H. Result in the
 * study's unit. Reach errors as in buildPlan: κ = ½ lowers μ_F², which can leave the grid.
 * @example scaleVariation(spec, set, set.members[0]).up // per-bin upward scale uncertainty
 */
export function scaleVariation(spec: StudySpec, axes: GridAxes, central: Float64Array, options: PlanOptions & { secondCentral?: Float64Array } = {}): ScaleVariation {
  const clamp = (k: number) => Math.min(4, Math.max(0.25, k))
  const kappas: [number, number, number] = [clamp(spec.scaleFactor / 2), spec.scaleFactor, clamp(spec.scaleFactor * 2)]
  const nBins = spec.bins.length
  const values = new Float64Array(3 * nBins)
  kappas.forEach((kappa, row) => {
    const plan = buildPlan({ ...spec, scaleFactor: kappa }, axes, options)
    const v = evaluatePlan(plan, [central], options.secondCentral ? [options.secondCentral] : undefined)
    values.set(v.subarray(0, nBins), row * nBins)
  })
  const nominal = values.slice(nBins, 2 * nBins)
  const up = new Float64Array(nBins)
  const down = new Float64Array(nBins)
  for (let b = 0; b < nBins; b++) {
    const v = [values[b]!, values[nBins + b]!, values[2 * nBins + b]!]
    up[b] = Math.max(...v) - nominal[b]!
    down[b] = nominal[b]! - Math.min(...v)
  }
  return { kappas, values, nominal, up, down }
}
