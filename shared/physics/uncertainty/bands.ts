/**
 * One entry point for the uncertainty band of a study: picks the prescription, sets the α_s
 * members aside, rescales to the requested CL and adds the α_s error in quadrature.
 */
import type { SetKind } from '../types'
import { scaleBands, type Band } from './band'
import { alphasVariationError } from './alphas-members'
import { centralPercentiles, clScaleFactor } from './confidence'
import { hessianAsymmetric, hessianOneSided, hessianSymmetric } from './hessian'
import { withoutMembers, type MemberValues, type SpreadOptions } from './matrix'
import { addInQuadrature } from './in-quadrature'
import { replicaMeanSd, replicaMedianInterval } from './replicas'

/**
 * Every prescription name, in display order (usable as a zod enum).
 * @example z.enum(PRESCRIPTIONS).parse('hessian-asymmetric')
 */
export const PRESCRIPTIONS = [
  'hessian-symmetric',
  'hessian-asymmetric',
  'one-sided',
  'replica-sd',
  'replica-68-interval'
] as const

/**
 * How to turn a set's members into a band:
 * - 'hessian-symmetric': ½√Σ(X_k⁺ − X_k⁻)² about X₀ (hessianSymmetric);
 * - 'hessian-asymmetric': ΔX± of Nadolsky–Sullivan about X₀ (hessianAsymmetric);
 * - 'one-sided': √Σ(X_k − X₀)² about X₀ (hessianOneSided);
 * - 'replica-sd': mean ± sample standard deviation of the replicas (replicaMeanSd);
 * - 'replica-68-interval': median with the central percentile interval at the requested CL
 *   (replicaMedianInterval): 15.87th–84.13th at 68 %, 5th–95th at 90 %. The name is kept for
 *   stored studies and links; the interval follows the CL.
 */
export type Prescription = typeof PRESCRIPTIONS[number]

/**
 * Which prescriptions apply to which kind of set; the first is the default.
 * @example PRESCRIPTIONS_BY_KIND['hessian-pairs'][0] // 'hessian-symmetric'
 */
export const PRESCRIPTIONS_BY_KIND: Readonly<Record<SetKind, readonly Prescription[]>> = {
  'hessian-pairs': ['hessian-symmetric', 'hessian-asymmetric'],
  'hessian-one-sided': ['one-sided'],
  'replicas': ['replica-sd', 'replica-68-interval']
}

/**
 * True if `name` is one of PRESCRIPTIONS (for validating user input).
 * @example isPrescription('replica-sd') // true
 */
export function isPrescription(name: string): name is Prescription {
  return (PRESCRIPTIONS as readonly string[]).includes(name)
}

/**
 * The prescriptions valid for a set kind, the default first.
 * @example prescriptionsFor('replicas') // ['replica-sd', 'replica-68-interval']
 */
export function prescriptionsFor(kind: SetKind): readonly Prescription[] {
  const list = PRESCRIPTIONS_BY_KIND[kind]
  if (list === undefined) throw new RangeError(`Unknown set kind '${kind}': expected one of ${Object.keys(PRESCRIPTIONS_BY_KIND).join(', ')}.`)
  return list
}

/** Options of computeBands: the set's kind and CLs (SpreadOptions) and the prescription. */
export interface BandOptions extends SpreadOptions {
  /** Prescription; must be valid for `kind` (PRESCRIPTIONS_BY_KIND). */
  prescription: Prescription
}

/**
 * Which rule made a band's interval, for labels in the pages and exports:
 * - 'percentile': read from the replicas' own percentiles at the CL (no Gaussian assumption);
 * - 'gaussian': the prescription's native width (Hessian, or a replica standard deviation),
 *   multiplied by the Gaussian quantile ratio z(clTo)/z(clFrom) (factor 1 when the CLs agree).
 */
export interface IntervalRule {
  rule: 'percentile' | 'gaussian'
  /** Words for the rule, e.g. "percentile 5–95 %" or "Hessian, rescaled from 68 % to 90 % CL (Gaussian)". */
  label: string
  /** 'percentile': the lower and upper percentiles, in percent. */
  percentiles?: [number, number]
  /** 'gaussian': the CL of the set's spread, percent, and the factor applied. */
  fromClPercent?: number
  factor?: number
}

/** A percent figure for a label: up to two decimals, trailing zeros dropped (15.87, 5, 84.13). */
function percentText(v: number): string {
  return String(Number(v.toFixed(2)))
}

/**
 * The interval rule of a prescription at `clTo` for a set whose spread is at `clFrom`.
 * @example intervalRule('replica-68-interval', 68, 90).label // 'percentile 5–95 %'
 * @example intervalRule('hessian-symmetric', 68, 90).label // 'Hessian, rescaled from 68 % to 90 % CL (Gaussian)'
 */
export function intervalRule(prescription: Prescription, clFrom: number, clTo: number): IntervalRule {
  if (prescription === 'replica-68-interval') {
    const percentiles = centralPercentiles(clTo)
    return { rule: 'percentile', label: `percentile ${percentiles.map(percentText).join('–')} %`, percentiles }
  }
  const what = prescription === 'replica-sd' ? 'replica standard deviation' : 'Hessian'
  const factor = clScaleFactor(clFrom, clTo)
  const label = clFrom === clTo ? `${what} at the set's ${percentText(clTo)} % CL` : `${what}, rescaled from ${percentText(clFrom)} % to ${percentText(clTo)} % CL (Gaussian)`
  return { rule: 'gaussian', label, fromClPercent: clFrom, factor }
}

/** computeBands' result: the total band plus its parts. */
export interface BandResult extends Band {
  kind: SetKind
  prescription: Prescription
  /** CL of the band, percent (= options.clTo). */
  clPercent: number
  /** PDF part only, at clPercent (equal to the total when there are no α_s members). */
  pdf: Band
  /** α_s part ½|X(α_s⁺) − X(α_s⁻)| at clPercent, or null without α_s members. */
  alphas: Float64Array | null
  /** Which rule made the interval (percentile or Gaussian rescaling), with a label. */
  interval: IntervalRule
}

/**
 * Per-bin uncertainty band of one set: the `prescription` applied to the members other than the α_s
 * members, rescaled from `clFrom` to `clTo` by the Gaussian factor z(clTo)/z(clFrom)
 * (clScaleFactor), then ⊕ the α_s error ½|X(α_s⁺) − X(α_s⁻)| rescaled from `alphasCl` to `clTo`
 * (see shared/physics/README.md, "Confidence levels" and "α_s members"). 'replica-68-interval'
 * is not rescaled: its interval is read from the replicas' percentiles at `clTo` directly
 * (5–95 % at 90 % CL), whatever `clFrom` says. `interval` says which rule was used.
 *
 * Unit: that of the observable. Domain: a member-value matrix whose member count fits `kind`
 * (central + 2N for pairs, central + N for one-sided, central + N ≥ 2 replicas; α_s members come
 * on top), a prescription valid for `kind`, CLs in (0, 100).
 * Accuracy: that of the prescription (exact arithmetic up to compensated rounding).
 * @throws RangeError naming the problem for any of the above.
 * @example computeBands(m, { kind: 'hessian-pairs', prescription: 'hessian-symmetric', clFrom: 90, clTo: 68 })
 */
export function computeBands(matrix: MemberValues, options: BandOptions): BandResult {
  const { kind, prescription, clFrom = 68, clTo = 68, alphasMembers } = options
  const valid = prescriptionsFor(kind)
  if (!valid.includes(prescription)) {
    const known = isPrescription(prescription) ? '' : ' (unknown name)'
    throw new RangeError(`Prescription '${prescription}'${known} does not apply to a set of kind '${kind}'; use one of: ${valid.join(', ')}.`)
  }
  const pdfMembers = alphasMembers === undefined ? matrix : withoutMembers(matrix, alphasMembers)
  const interval = intervalRule(prescription, clFrom, clTo)
  const pdf = prescription === 'replica-68-interval'
    ? replicaMedianInterval(pdfMembers, clTo)
    : scaleBands(PRESCRIPTION_FUNCTIONS[prescription](pdfMembers), interval.factor!)
  if (alphasMembers === undefined) return { ...pdf, kind, prescription, clPercent: clTo, pdf, alphas: null, interval }
  const alphasFactor = clScaleFactor(options.alphasCl ?? clFrom, clTo)
  const alphas = alphasVariationError(matrix, alphasMembers).map(v => v * alphasFactor)
  return { ...addInQuadrature(pdf, alphas), kind, prescription, clPercent: clTo, pdf, alphas, interval }
}

const PRESCRIPTION_FUNCTIONS: Record<Prescription, (matrix: MemberValues) => Band> = {
  'hessian-symmetric': hessianSymmetric,
  'hessian-asymmetric': hessianAsymmetric,
  'one-sided': hessianOneSided,
  'replica-sd': replicaMeanSd,
  'replica-68-interval': matrix => replicaMedianInterval(matrix, 68)
}
