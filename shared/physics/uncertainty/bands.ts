/**
 * One entry point for the uncertainty band of a study: picks the prescription, sets the α_s
 * members aside, rescales to the requested CL and adds the α_s error in quadrature.
 */
import type { SetKind } from '../types'
import { scaleBands, type Band } from './band'
import { alphasVariationError } from './alphas-members'
import { clScaleFactor } from './confidence'
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
 * - 'replica-68-interval': median with the 16th–84th percentile interval (replicaMedianInterval).
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
}

/**
 * Per-bin uncertainty band of one set: the `prescription` applied to the members other than the α_s
 * members, rescaled from `clFrom` to `clTo` by the Gaussian factor z(clTo)/z(clFrom)
 * (clScaleFactor), then ⊕ the α_s error ½|X(α_s⁺) − X(α_s⁻)| rescaled from `alphasCl` to `clTo`
 * (see shared/physics/README.md, "Confidence levels" and "α_s members"). For 'replica-68-interval'
 * the rescaling stretches the 16–84% interval by the Gaussian factor; for the exact percentile
 * interval at another coverage call replicaMedianInterval(matrix, coverage) directly.
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
  const native = PRESCRIPTION_FUNCTIONS[prescription](pdfMembers)
  const pdf = scaleBands(native, clScaleFactor(clFrom, clTo))
  if (alphasMembers === undefined) return { ...pdf, kind, prescription, clPercent: clTo, pdf, alphas: null }
  const alphasFactor = clScaleFactor(options.alphasCl ?? clFrom, clTo)
  const alphas = alphasVariationError(matrix, alphasMembers).map(v => v * alphasFactor)
  return { ...addInQuadrature(pdf, alphas), kind, prescription, clPercent: clTo, pdf, alphas }
}

const PRESCRIPTION_FUNCTIONS: Record<Prescription, (matrix: MemberValues) => Band> = {
  'hessian-symmetric': hessianSymmetric,
  'hessian-asymmetric': hessianAsymmetric,
  'one-sided': hessianOneSided,
  'replica-sd': replicaMeanSd,
  'replica-68-interval': matrix => replicaMedianInterval(matrix, 68)
}
