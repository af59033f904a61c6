import { ALPHA_EM } from '../constants'
import type { Pdg } from '../types'
import { QUARKS, quarkCharge } from './couplings'
import type { Hadron } from './hadrons'
import { PROTON, onProton } from './hadrons'
import { inelasticity } from './kinematics'
import type { LinearTerm, XfFunction } from './terms'
import { evaluateTerm } from './terms'
import type { CrossSectionUnit } from './units'
import { gev2ToUnit } from './units'

/**
 * Deep-inelastic charged-lepton scattering, neutral current, photon exchange only, at LO
 * (PDG 2024 review "Structure functions"; see shared/physics/README.md, "DIS neutral current"):
 *   F₂ = x Σ_q e_q² (q + q̄),  F_L = 0,  2xF₁ = F₂ (Callan–Gross),
 *   σ_r = F₂ − (y²/Y₊) F_L,   d²σ/dx dQ² = (2πα²/(x Q⁴)) [Y₊ F₂ − y² F_L],  Y₊ = 1 + (1 − y)².
 * Z exchange and the running of α are not included (α = α(0), constants.ts). Grids hold x·f, so
 * F₂ = Σ_q e_q² (xq + xq̄). The scale is μ_F² = Q². Per-nucleon targets follow hadrons.ts.
 */

/** Observables of the neutral-current kernel. */
export type NcObservable = 'F2' | 'FL' | '2xF1' | 'reduced' | 'd2sigma'

/** Options of the neutral-current kernel. */
export interface NcOptions {
  /** Target hadron (default proton); nuclei per nucleon. */
  target?: Hadron
  /** Lepton–nucleon centre-of-mass energy in GeV, needed for y (reduced and d2sigma). */
  sqrtSGeV?: number
  /** Unit of d2sigma (default pb, so the result is in pb/GeV²). */
  unit?: CrossSectionUnit
}

/**
 * Weights e_q² on q and q̄ of F₂ = Σ e_q² x(q + q̄), on the target's own densities.
 * @example f2PhotonWeights().get(2) // 4/9
 */
export function f2PhotonWeights(): Map<Pdg, number> {
  const w = new Map<Pdg, number>()
  for (const q of QUARKS) {
    const e2 = quarkCharge(q) ** 2
    w.set(q, e2)
    w.set(-q, e2)
  }
  return w
}

function yOf(x: number, q2GeV2: number, options: NcOptions): number {
  if (options.sqrtSGeV === undefined) {
    throw new RangeError('the reduced and differential cross-sections need the lepton–nucleon energy sqrtSGeV to compute y')
  }
  const y = inelasticity(x, q2GeV2, options.sqrtSGeV ** 2)
  if (!(y > 0 && y <= 1)) {
    throw new RangeError(`y = Q²/(x s) = ${y.toPrecision(4)} at x = ${x}, Q² = ${q2GeV2} GeV², √s = ${options.sqrtSGeV} GeV is outside (0, 1]: the point is beyond the kinematic limit`)
  }
  return y
}

function checkPoint(x: number, q2GeV2: number): void {
  if (!(x > 0 && x < 1)) throw new RangeError(`x = ${x} must lie in (0, 1)`)
  if (!(q2GeV2 > 0) || !Number.isFinite(q2GeV2)) throw new RangeError(`Q² = ${q2GeV2} GeV² must be positive`)
}

/**
 * The neutral-current observable at (x, Q²) as a linear form in the set's proton densities.
 * Units of the result: F2, FL, 2xF1, reduced dimensionless; d2sigma in `unit`/GeV² (pb/GeV² by
 * default). Domain: x in (0, 1), Q² > 0, and y ≤ 1 for reduced and d2sigma; else RangeError.
 * @example ncTerm('F2', 0.1, 10).weights.get(2) // 4/9 on a proton
 */
export function ncTerm(observable: NcObservable, x: number, q2GeV2: number, options: NcOptions = {}): LinearTerm {
  checkPoint(x, q2GeV2)
  const weights = onProton(f2PhotonWeights(), options.target ?? PROTON)
  let factor = 1
  switch (observable) {
    case 'F2':
    case '2xF1':
      break
    case 'FL':
      factor = 0
      break
    case 'reduced':
      // σ_r = F₂ − (y²/Y₊)·F_L with F_L = 0 at LO; y is still checked against the kinematic limit.
      yOf(x, q2GeV2, options)
      break
    case 'd2sigma': {
      const y = yOf(x, q2GeV2, options)
      const yPlus = 1 + (1 - y) ** 2
      factor = 2 * Math.PI * ALPHA_EM ** 2 / (x * q2GeV2 ** 2) * yPlus * gev2ToUnit(options.unit)
      break
    }
  }
  return { kind: 'linear', x, mu2GeV2: q2GeV2, factor, weights }
}

/**
 * F₂ of the target at (x, Q²) for densities `xf` (dimensionless). Formula and domain: {@link ncTerm}.
 * @example f2NeutralCurrent(xf, 0.1, 10) // Σ e_q² (xq + xq̄)
 */
export function f2NeutralCurrent(xf: XfFunction, x: number, q2GeV2: number, target: Hadron = PROTON): number {
  return evaluateTerm(ncTerm('F2', x, q2GeV2, { target }), xf)
}

/** F_L at LO: identically 0 (Callan–Gross), returned for symmetry with the other observables. */
export function flNeutralCurrent(xf: XfFunction, x: number, q2GeV2: number, target: Hadron = PROTON): number {
  return evaluateTerm(ncTerm('FL', x, q2GeV2, { target }), xf)
}

/** 2xF₁ at LO, equal to F₂ (Callan–Gross relation). Dimensionless. */
export function twoXF1NeutralCurrent(xf: XfFunction, x: number, q2GeV2: number, target: Hadron = PROTON): number {
  return evaluateTerm(ncTerm('2xF1', x, q2GeV2, { target }), xf)
}

/**
 * d²σ/dx dQ² of ℓN → ℓX by photon exchange, in `options.unit`/GeV² (pb/GeV² by default).
 * Needs options.sqrtSGeV. Formula and domain: {@link ncTerm}.
 */
export function d2SigmaDxDQ2NeutralCurrent(xf: XfFunction, x: number, q2GeV2: number, options: NcOptions): number {
  return evaluateTerm(ncTerm('d2sigma', x, q2GeV2, options), xf)
}
