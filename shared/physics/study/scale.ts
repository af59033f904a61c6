import type { GridAxes } from '../interpolation/axes'
import type { KernelDefinition } from '../kernels/registry'
import { kernelDefinition } from '../kernels/registry'
import type { PlanOptions } from './plan'
import { buildPlan, evaluatePlan } from './plan'
import type { StudySpec } from './spec'

/** One scale choice of a variation: factors on the study's μ_F and μ_R (relative to the nominal κ). */
export interface ScalePoint {
  /** μ_F / μ_F,nominal (½, 1 or 2). */
  muF: number
  /** μ_R / μ_R,nominal (½, 1 or 2); always 1 for kernels without α_s. */
  muR: number
}

/** Scale variation of a study, reported apart from the PDF band. */
export interface ScaleVariation {
  /**
   * Which variation the band is: '3-point μ_F' (κ_F × ½, 1, 2; kernels without α_s) or
   * '7-point μ_F, μ_R' (independent μ_F and μ_R by ½ and 2, without the opposite corners (½, 2)
   * and (2, ½); kernels with α_s).
   */
  variation: '3-point μ_F' | '7-point μ_F, μ_R'
  /** Words for the variation, for labels and exports. */
  label: string
  /** κ_F of each row of `values`: nominal × ½, nominal, nominal × 2 (μ_R at its nominal value). */
  kappas: [number, number, number]
  /** 3 × bins, row-major: the central member's value at each κ_F of `kappas`, μ_R nominal. */
  values: Float64Array
  /** Every scale point evaluated (3 or 7), in the order of `pointValues`' rows. */
  points: ScalePoint[]
  /** points.length × bins, row-major: the central member's value at each point. */
  pointValues: Float64Array
  /** Value at the nominal scales, per bin. */
  nominal: Float64Array
  /** Largest minus nominal and nominal minus smallest over all points, per bin (≥ 0). */
  up: Float64Array
  down: Float64Array
}

/** The 7 points (κ_F, κ_R) of an independent variation by ½ and 2 without the opposite corners (common practice). */
const SEVEN_POINTS: readonly ScalePoint[] = [
  { muF: 1, muR: 1 }, { muF: 0.5, muR: 0.5 }, { muF: 0.5, muR: 1 }, { muF: 1, muR: 0.5 },
  { muF: 1, muR: 2 }, { muF: 2, muR: 1 }, { muF: 2, muR: 2 }
]
const THREE_POINTS: readonly ScalePoint[] = [{ muF: 1, muR: 1 }, { muF: 0.5, muR: 1 }, { muF: 2, muR: 1 }]

/** Whether the study's kernel (or a part of a composite) depends on α_s(μ_R). */
export function studyHasAlphas(spec: Pick<StudySpec, 'kernel' | 'options'>): boolean {
  const def = kernelDefinition(spec.kernel)
  if (!def.composite) return def.alphasScaling !== undefined
  return def.parts(spec.options).some(p => (kernelDefinition(p.kernel) as KernelDefinition).alphasScaling !== undefined)
}

/**
 * Varies the scales around the spec's κ_F (scaleFactor) and κ_R (renormalisationScaleFactor) on
 * one member (the central one, as is common practice), with everything else fixed, each factor
 * clamped to the allowed [0.25, 4]:
 * - kernels without α_s: μ_F × ½, 1, 2 (3-point);
 * - kernels with α_s (gg → H): μ_F and μ_R varied independently by ½ and 2, the 7-point
 *   variation (both at 1, both ½, both 2, one at 1 and the other ½ or 2; the opposite corners
 *   (½, 2) and (2, ½) left out), common practice.
 * up/down are the envelope of all points about the nominal value. Result in the study's unit.
 * Reach errors as in buildPlan: κ_F = ½ lowers μ_F², which can leave the grid.
 * @example scaleVariation(spec, set, set.members[0]).up // per-bin upward scale uncertainty
 */
export function scaleVariation(spec: StudySpec, axes: GridAxes, central: Float64Array, options: PlanOptions & { secondCentral?: Float64Array } = {}): ScaleVariation {
  const clamp = (k: number) => Math.min(4, Math.max(0.25, k))
  const kF = spec.scaleFactor
  const kR = spec.renormalisationScaleFactor ?? 1
  const withAlphas = studyHasAlphas(spec)
  const points = withAlphas ? SEVEN_POINTS : THREE_POINTS
  const nBins = spec.bins.length
  const pointValues = new Float64Array(points.length * nBins)
  points.forEach((p, row) => {
    const varied: StudySpec = { ...spec, scaleFactor: clamp(kF * p.muF), ...(withAlphas ? { renormalisationScaleFactor: clamp(kR * p.muR) } : {}) }
    const plan = buildPlan(varied, axes, options)
    const v = evaluatePlan(plan, [central], options.secondCentral ? [options.secondCentral] : undefined)
    pointValues.set(v.subarray(0, nBins), row * nBins)
  })
  const rowOf = (muF: number, muR: number) => points.findIndex(p => p.muF === muF && p.muR === muR)
  const kappas: [number, number, number] = [clamp(kF / 2), kF, clamp(kF * 2)]
  const values = new Float64Array(3 * nBins)
  ;[0.5, 1, 2].forEach((muF, i) => values.set(pointValues.subarray(rowOf(muF, 1) * nBins, (rowOf(muF, 1) + 1) * nBins), i * nBins))
  const nominal = pointValues.slice(0, nBins)
  const up = new Float64Array(nBins)
  const down = new Float64Array(nBins)
  for (let b = 0; b < nBins; b++) {
    let hi = -Infinity
    let lo = Infinity
    for (let r = 0; r < points.length; r++) {
      hi = Math.max(hi, pointValues[r * nBins + b]!)
      lo = Math.min(lo, pointValues[r * nBins + b]!)
    }
    up[b] = hi - nominal[b]!
    down[b] = nominal[b]! - lo
  }
  const variation = withAlphas ? '7-point μ_F, μ_R' as const : '3-point μ_F' as const
  const label = withAlphas
    ? 'scale variation, 7-point: μ_F and μ_R independently × ½, 2 (not (½, 2) or (2, ½)), envelope'
    : 'scale variation, 3-point: μ_F × ½, 2, envelope'
  return { variation, label, kappas, values, points: points.map(p => ({ ...p })), pointValues, nominal, up, down }
}
