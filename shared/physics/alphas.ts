/**
 * One-loop running of the strong coupling α_s(μ²) and the number of active flavours, for fixed-
 * and variable-flavour schemes (Ellis–Stirling–Webber, "QCD and Collider Physics", ch. 2; see
 * shared/physics/README.md, "Running coupling"): dα_s/d ln μ² = −β₀ α_s²/(4π),
 * β₀ = 11 − 2n_f/3, so within a range of fixed n_f
 * 1/α_s(μ²) = 1/α_s(μ₀²) + (β₀/4π) ln(μ²/μ₀²). At LO α_s is continuous across the heavy-quark
 * thresholds μ² = m_h² of a variable-flavour scheme; only its slope changes there.
 */
import type { FlavourScheme } from './types'

/**
 * M_Z is defined once, in constants.ts; engine code imports it from there. This re-export only
 * keeps an existing importer outside the engine working (server/utils/workflow/study-check.ts).
 */

/** A reference value of the coupling: α_s(μ²) = `value` at μ² = `scaleGeV2` (GeV²). */
export interface AlphasReference {
  /** α_s at the reference scale, dimensionless, in (0, 1.5]. */
  value: number
  /** Reference scale μ² in GeV², > 0. */
  scaleGeV2: number
}

/**
 * Relative tolerance within which a scale counts as lying on a heavy-quark threshold, so that
 * e.g. m_c = √2 GeV with μ₀² = 2 GeV² is one scale despite rounding ((√2)² = 2.0000000000000004).
 * The one engine-wide value: the set-file rules (sets/validate.ts) use it to match a repeated Q²
 * node to a declared threshold m_h².
 */
export const THRESHOLD_TOLERANCE = 1e-9

/**
 * True when the threshold t (GeV²) lies strictly inside (lo, hi), beyond THRESHOLD_TOLERANCE of
 * both ends.
 * @example strictlyBetween(20.25, 2, 1e4) // true; strictlyBetween(2.0000000000000004, 2, 1e4) // false
 */
export function strictlyBetween(t: number, lo: number, hi: number): boolean {
  return t > lo * (1 + THRESHOLD_TOLERANCE) && strictlyBelow(t, hi)
}

/**
 * True when the threshold t (GeV²) lies below μ² = `q2` (GeV²) by more than THRESHOLD_TOLERANCE:
 * evolving up to `q2` from t or from anywhere below it crosses t. A scale on the threshold
 * (within the tolerance) does not cross it.
 * @example strictlyBelow(20.25, 1e4) // true; strictlyBelow(20.25, 20.25) // false
 */
export function strictlyBelow(t: number, q2: number): boolean {
  return t < q2 * (1 - THRESHOLD_TOLERANCE)
}

const atOrAbove = (q2: number, t: number) => q2 >= t * (1 - THRESHOLD_TOLERANCE)

/**
 * The heavy quarks of a flavour scheme, lightest first: PDG code (= the n_f above its threshold),
 * name and key in FlavourScheme.massesGeV.
 */
export const HEAVY_QUARKS = [
  { pdg: 4, name: 'charm', key: 'charm' },
  { pdg: 5, name: 'bottom', key: 'bottom' },
  { pdg: 6, name: 'top', key: 'top' }
] as const

/**
 * One-loop coefficient β₀ = 11 − 2n_f/3 of the QCD β-function (normalisation
 * dα_s/d ln μ² = −β₀ α_s²/(4π)).
 * @param nf number of active flavours, integer 0..6.
 * @example betaZero(5) // 23/3 = 7.666…
 */
export function betaZero(nf: number): number {
  if (!Number.isInteger(nf) || nf < 0 || nf > 6) {
    throw new RangeError(`the number of active flavours must be an integer 0..6; got ${nf}`)
  }
  return 11 - (2 * nf) / 3
}

/**
 * Checks a flavour scheme: nf in 3..6, masses finite, positive and ordered charm < bottom < top.
 * @throws RangeError naming the offending field.
 * @example checkScheme({ type: 'variable', nf: 5, massesGeV: { charm: 1.4, bottom: 4.75, top: 172.5 } })
 */
export function checkScheme(scheme: FlavourScheme): void {
  if (scheme.type !== 'fixed' && scheme.type !== 'variable') {
    throw new RangeError(`flavour scheme type must be 'fixed' or 'variable'; got '${String(scheme.type)}'`)
  }
  if (![3, 4, 5, 6].includes(scheme.nf)) {
    throw new RangeError(`flavour scheme nf must be 3, 4, 5 or 6; got ${scheme.nf}`)
  }
  const m = scheme.massesGeV
  for (const h of HEAVY_QUARKS) {
    const v = m[h.key]
    if (!Number.isFinite(v) || v <= 0) {
      throw new RangeError(`the ${h.name} mass must be a finite number of GeV > 0; got ${v}`)
    }
  }
  if (!(m.charm < m.bottom && m.bottom < m.top)) {
    throw new RangeError(`heavy-quark masses must be ordered charm < bottom < top; got ${m.charm}, ${m.bottom}, ${m.top} GeV`)
  }
}

/**
 * The heavy-quark thresholds μ² = m_h² (GeV², ascending) at which n_f changes in `scheme`:
 * empty for a fixed scheme; for a variable scheme, m_c², m_b², m_t² of the flavours up to
 * `scheme.nf`.
 * @example flavourThresholdsGeV2({ type: 'variable', nf: 5, massesGeV: { charm: 1.5, bottom: 4.5, top: 175 } }) // [2.25, 20.25]
 */
export function flavourThresholdsGeV2(scheme: FlavourScheme): number[] {
  checkScheme(scheme)
  if (scheme.type === 'fixed') return []
  return HEAVY_QUARKS.filter(h => h.pdg <= scheme.nf).map(h => scheme.massesGeV[h.key] ** 2)
}

/**
 * Number of active quark flavours at μ² (GeV²) in `scheme`. Fixed scheme: `scheme.nf`.
 * Variable scheme: 3 plus the heavy quarks h ≤ `scheme.nf` with m_h² ≤ μ² (so exactly at the
 * threshold, within THRESHOLD_TOLERANCE, the heavy quark counts as active: the upper side of the
 * pair of grid nodes).
 * @example activeFlavours(10, { type: 'variable', nf: 5, massesGeV: { charm: 1.4, bottom: 4.75, top: 172.5 } }) // 4
 */
export function activeFlavours(q2GeV2: number, scheme: FlavourScheme): number {
  if (!Number.isFinite(q2GeV2) || q2GeV2 <= 0) {
    throw new RangeError(`μ² must be a finite number of GeV² > 0; got ${q2GeV2}`)
  }
  const thresholds = flavourThresholdsGeV2(scheme)
  if (scheme.type === 'fixed') return scheme.nf
  return 3 + thresholds.filter(t => atOrAbove(q2GeV2, t)).length
}

function checkReference(ref: AlphasReference): void {
  if (!Number.isFinite(ref.value) || ref.value <= 0 || ref.value > 1.5) {
    throw new RangeError(`the reference α_s must be in (0, 1.5]; got ${ref.value}`)
  }
  if (!Number.isFinite(ref.scaleGeV2) || ref.scaleGeV2 <= 0) {
    throw new RangeError(`the α_s reference scale must be a finite μ² > 0 in GeV²; got ${ref.scaleGeV2}`)
  }
}

/**
 * A fast evaluator of the one-loop α_s(μ²) for a fixed reference and scheme (the inverse coupling
 * at each threshold is computed once). Continuous across thresholds in the variable scheme.
 *
 * Domain: μ² > 0 above the one-loop Landau pole of the range it falls in.
 * Method: exact one-loop solution per range of fixed n_f. Accuracy: rounding only (1e-15).
 * @throws RangeError for a bad reference or scheme at construction, and from the returned
 * function for μ² ≤ 0 or at/below the Landau pole.
 * @example const as = makeAlphas({ value: 0.35, scaleGeV2: 2 }, fixed4); as(1e4) // 0.117574…
 */
export function makeAlphas(ref: AlphasReference, scheme: FlavourScheme): (q2GeV2: number) => number {
  checkReference(ref)
  const thresholds = flavourThresholdsGeV2(scheme)
  // Inverse coupling at each threshold, walking out from the reference in both directions.
  const invAt = new Map<number, number>()
  const invRef = 1 / ref.value
  const nfAt = (q2: number) => scheme.type === 'fixed' ? scheme.nf : 3 + thresholds.filter(t => atOrAbove(q2, t)).length
  let q2 = ref.scaleGeV2
  let inv = invRef
  for (const t of thresholds.filter(t => t > ref.scaleGeV2)) {
    inv += (betaZero(nfAt(q2)) / (4 * Math.PI)) * Math.log(t / q2)
    invAt.set(t, inv)
    q2 = t
  }
  q2 = ref.scaleGeV2
  inv = invRef
  for (const t of thresholds.filter(t => t <= ref.scaleGeV2).reverse()) {
    // Below q2 and above t the active n_f is the one just below q2.
    inv += (betaZero(nfAt(t)) / (4 * Math.PI)) * Math.log(t / q2)
    invAt.set(t, inv)
    q2 = t
  }
  return (q2GeV2: number) => {
    if (!Number.isFinite(q2GeV2) || q2GeV2 <= 0) {
      throw new RangeError(`α_s(μ²) needs a finite μ² > 0 in GeV²; got ${q2GeV2}`)
    }
    // Anchor: the threshold or reference nearest μ² on the reference side, with the same
    // tolerance rule as the flavour count so that n_f is constant between anchor and μ².
    let anchorQ2 = ref.scaleGeV2
    let anchorInv = invRef
    if (q2GeV2 >= ref.scaleGeV2) {
      for (const t of thresholds) {
        if (t > ref.scaleGeV2 && atOrAbove(q2GeV2, t)) { anchorQ2 = t; anchorInv = invAt.get(t)! }
      }
    } else {
      for (const t of [...thresholds].reverse()) {
        if (t <= ref.scaleGeV2 && !atOrAbove(q2GeV2, t)) { anchorQ2 = t; anchorInv = invAt.get(t)! }
      }
    }
    const result = anchorInv + (betaZero(nfAt(q2GeV2)) / (4 * Math.PI)) * Math.log(q2GeV2 / anchorQ2)
    if (!(result > 0)) {
      throw new RangeError(`μ² = ${q2GeV2} GeV² is at or below the one-loop Landau pole for α_s(${ref.scaleGeV2} GeV²) = ${ref.value}`)
    }
    return 1 / result
  }
}

/**
 * One-loop α_s(μ²) from a reference value at any scale, in a fixed- or variable-flavour scheme
 * (continuous across thresholds). See `makeAlphas` for the method; use that for many calls.
 * @param q2GeV2 μ² in GeV², > 0.
 * @returns α_s(μ²), dimensionless.
 * @example alphasOneLoop(1e4, { value: 0.35, scaleGeV2: 2 }, { type: 'fixed', nf: 4, massesGeV: { charm: 1.414, bottom: 4.5, top: 175 } }) // 0.117574…
 */
export function alphasOneLoop(q2GeV2: number, ref: AlphasReference, scheme: FlavourScheme): number {
  return makeAlphas(ref, scheme)(q2GeV2)
}

/**
 * LO evolution time s = ∫ α_s(μ²)/(2π) d ln μ² from μ₁² to μ₂² (GeV²), the variable in which
 * LO DGLAP is ∂f/∂s = P ⊗ f with a constant kernel inside a range of fixed n_f. Requires both
 * scales in the same range of fixed n_f (no threshold strictly between them).
 *
 * Exact one-loop result: s = (2/β₀) ln(α_s(μ₁²)/α_s(μ₂²)).
 * @throws RangeError if a threshold lies strictly between the scales.
 * @example evolutionTime(2, 1e4, ref, fixed4) // (2/β₀(4)) ln(0.35/0.117574) = 0.2618…
 */
export function evolutionTime(q2FromGeV2: number, q2ToGeV2: number, ref: AlphasReference, scheme: FlavourScheme): number {
  const lo = Math.min(q2FromGeV2, q2ToGeV2)
  const hi = Math.max(q2FromGeV2, q2ToGeV2)
  const crossing = flavourThresholdsGeV2(scheme).filter(t => strictlyBetween(t, lo, hi))
  if (crossing.length > 0) {
    throw new RangeError(`evolution time is defined per range of fixed n_f; μ² = ${crossing.join(', ')} GeV² lies between ${q2FromGeV2} and ${q2ToGeV2} GeV²`)
  }
  const as = makeAlphas(ref, scheme)
  const nf = activeFlavours(Math.sqrt(lo * hi), scheme)
  return (2 / betaZero(nf)) * Math.log(as(q2FromGeV2) / as(q2ToGeV2))
}
