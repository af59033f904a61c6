import { ALPHA_EM, GF_GEV2, MZ_GEV } from '../constants'
import type { Pdg } from '../types'
import { QUARKS, quarkCharge, zCouplings } from './couplings'
import type { Hadron } from './hadrons'
import { PROTON, onProton } from './hadrons'
import { inelasticity } from './kinematics'
import type { LinearTerm, XfFunction } from './terms'
import { evaluateTerm } from './terms'
import type { CrossSectionUnit } from './units'
import { gev2ToUnit } from './units'

/**
 * Deep-inelastic charged-lepton scattering, neutral current, at LO (PDG 2024 review "Structure
 * functions"; see shared/physics/README.md, "DIS neutral current"). Photon exchange only
 * (`exchange: 'photon'`, the default):
 *   F₂ = x Σ_q e_q² (q + q̄),  F_L = 0,  2xF₁ = F₂ (Callan–Gross),
 *   σ_r = F₂ − (y²/Y₊) F_L,   d²σ/dx dQ² = (2πα²/(x Q⁴)) [Y₊ F₂ − y² F_L],  Y₊ = 1 + (1 − y)².
 * With `exchange: 'gamma-z'`, γ, γ/Z interference and Z exchange for an unpolarised e⁻ or e⁺
 * (same review, the neutral-current structure functions with the propagator ratios):
 *   F̃₂ = F₂^γ − g_V^e η_γZ F₂^{γZ} + (g_V^e² + g_A^e²) η_Z F₂^Z,
 *   xF̃₃ = −g_A^e η_γZ xF₃^{γZ} + 2 g_V^e g_A^e η_Z xF₃^Z,
 *   F₂^{γZ} = x Σ 2e_q g_V^q (q + q̄), F₂^Z = x Σ (g_V^q² + g_A^q²)(q + q̄),
 *   xF₃^{γZ} = x Σ 2e_q g_A^q (q − q̄), xF₃^Z = x Σ 2g_V^q g_A^q (q − q̄),
 *   η_γZ = (G_F M_Z²/(2√2πα)) Q²/(Q² + M_Z²), η_Z = η_γZ²,
 *   σ_r^± = F̃₂ ∓ (Y₋/Y₊) xF̃₃, d²σ/dx dQ² = (2πα²/(x Q⁴)) [Y₊ F̃₂ ∓ Y₋ xF̃₃], Y₋ = 1 − (1 − y)²,
 * upper sign for e⁺; g_V = T₃ − 2e sin²θ_W, g_A = T₃ (couplings.ts, effective angle).
 * The running of α is not included (α = α(0), constants.ts). Grids hold x·f. The scale is
 * μ_F² = Q². Per-nucleon targets follow hadrons.ts.
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
  /** 'photon' (default): γ exchange only; 'gamma-z': γ, γ/Z interference and Z exchange. */
  exchange?: NcExchange
  /** The charged lepton, for the sign of xF̃₃ with γ/Z exchange (reduced and d2sigma need it). */
  lepton?: NcLepton
}

/** Boson exchange of the neutral-current kernel. */
export type NcExchange = 'photon' | 'gamma-z'
/** Charge of the scattered lepton: e⁻ (or μ⁻) or e⁺ (μ⁺). */
export type NcLepton = 'electron' | 'positron'

/**
 * The propagator ratio η_γZ = (G_F M_Z²/(2√2πα)) · Q²/(Q² + M_Z²) (PDG 2024 review "Structure
 * functions"), with α = α(0); η_Z = η_γZ². Dimensionless.
 * @example etaGammaZ(91.188 ** 2) // ≈ 0.748 (half the Q² → ∞ value 1.4957)
 */
export function etaGammaZ(q2GeV2: number): number {
  return GF_GEV2 * MZ_GEV ** 2 / (2 * Math.SQRT2 * Math.PI * ALPHA_EM) * q2GeV2 / (q2GeV2 + MZ_GEV ** 2)
}

/**
 * Per-quark weights of F̃₂ (on q + q̄) and xF̃₃ (on q − q̄) with γ/Z exchange at Q², for an
 * unpolarised charged lepton (formulas in the module comment). Dimensionless.
 * @example gammaZWeights(10).f2.get(2) // ≈ 4/9 (photon dominates at Q² ≪ M_Z²)
 */
export function gammaZWeights(q2GeV2: number): { f2: Map<Pdg, number>, xf3: Map<Pdg, number> } {
  const eta = etaGammaZ(q2GeV2)
  const e = zCouplings(-0.5, -1)
  const f2 = new Map<Pdg, number>()
  const xf3 = new Map<Pdg, number>()
  for (const q of QUARKS) {
    const eq = quarkCharge(q)
    const { gV, gA } = zCouplings(q % 2 === 0 ? 0.5 : -0.5, eq)
    f2.set(q, eq * eq - e.gV * eta * 2 * eq * gV + (e.gV ** 2 + e.gA ** 2) * eta * eta * (gV * gV + gA * gA))
    xf3.set(q, -e.gA * eta * 2 * eq * gA + 2 * e.gV * e.gA * eta * eta * 2 * gV * gA)
  }
  return { f2, xf3 }
}

/**
 * Weights on the target's own densities of F̃₂ + c · xF̃₃ (q + q̄ weights from F̃₂, ± c times the
 * xF̃₃ weight on q and q̄): the combination of a reduced or differential cross-section.
 */
function gammaZCombination(q2GeV2: number, c: number): Map<Pdg, number> {
  const { f2, xf3 } = gammaZWeights(q2GeV2)
  const w = new Map<Pdg, number>()
  for (const q of QUARKS) {
    w.set(q, f2.get(q)! + c * xf3.get(q)!)
    w.set(-q, f2.get(q)! - c * xf3.get(q)!)
  }
  return w
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
  if ((options.exchange ?? 'photon') === 'gamma-z') return gammaZTerm(observable, x, q2GeV2, options)
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

/** ncTerm with γ/Z exchange: F₂ and 2xF₁ are F̃₂; reduced and d2sigma add ∓ the xF̃₃ term. */
function gammaZTerm(observable: NcObservable, x: number, q2GeV2: number, options: NcOptions): LinearTerm {
  const target = options.target ?? PROTON
  if (observable === 'F2' || observable === '2xF1' || observable === 'FL') {
    return { kind: 'linear', x, mu2GeV2: q2GeV2, factor: observable === 'FL' ? 0 : 1, weights: onProton(gammaZCombination(q2GeV2, 0), target) }
  }
  if (options.lepton === undefined) {
    throw new RangeError('γ/Z exchange needs the lepton\'s charge (lepton: electron or positron) for the sign of xF̃₃')
  }
  const y = yOf(x, q2GeV2, options)
  const yPlus = 1 + (1 - y) ** 2
  const yMinus = 1 - (1 - y) ** 2
  // σ_r^± = F̃₂ ∓ (Y₋/Y₊) xF̃₃: + for e⁻, − for e⁺
  const sign = options.lepton === 'electron' ? 1 : -1
  const weights = onProton(gammaZCombination(q2GeV2, sign * yMinus / yPlus), target)
  const factor = observable === 'reduced' ? 1 : 2 * Math.PI * ALPHA_EM ** 2 / (x * q2GeV2 ** 2) * yPlus * gev2ToUnit(options.unit)
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
