import { GF_GEV2, MW_GEV, PROTON_MASS_GEV } from '../constants'
import type { Pdg } from '../types'
import type { CkmChoice } from './couplings'
import { DOWN_TYPE, UP_TYPE, vSquared } from './couplings'
import type { Hadron } from './hadrons'
import { PROTON, onProton } from './hadrons'
import type { LinearTerm, XfFunction } from './terms'
import { addWeight, evaluateTerm } from './terms'
import type { CrossSectionUnit } from './units'
import { gev2ToUnit } from './units'

/**
 * Neutrino and antineutrino charged-current DIS at LO (W exchange), massless quarks, with CKM
 * mixing (PDG 2024 review "Structure functions"; see shared/physics/README.md, "DIS charged
 * current"). For a W⁺ (neutrino beam) the target's down-type quarks d_j turn into up-type quarks
 * u_i with weight |V_ij|², and its up-type antiquarks ū_i into d̄_j; for a W⁻ (antineutrino) the
 * charge conjugates:
 *   F₂^{W⁺} = 2 Σ_j c_j x d_j + 2 Σ_i r_i x ū_i,   xF₃^{W⁺} = 2 Σ_j c_j x d_j − 2 Σ_i r_i x ū_i,
 *   F₂^{W⁻} = 2 Σ_i r_i x u_i + 2 Σ_j c_j x d̄_j,   xF₃^{W⁻} = 2 Σ_i r_i x u_i − 2 Σ_j c_j x d̄_j,
 * with c_j = Σ_{i ∈ u, c} |V_ij|² (+ |V_tj|² when top production is open) and
 * r_i = Σ_{j ∈ d, s, b} |V_ij|² for i = u, c, t.
 * Heavy flavours are treated as in the neutral-current and Drell–Yan kernels: every quark the
 * set carries is a massless parton, so t and t̄ are struck like u and c wherever the set has a top
 * density (a six-flavour set above m_t²; below it, or in a set of five flavours or fewer, the top
 * density is absent or zero and drops out). Producing a top from d_j (mostly b → t) is open under
 * the same condition, `topOpen`: the study sets it where the set's scheme has six active flavours
 * at Q² (Q² ≥ m_t² of a six-flavour set); without it (the default) no top is produced.
 * With `ckm: 'diagonal'` this is the textbook F₂^{νp} = 2x(d + s + ū + c̄) (plus b, b̄, t̄ terms).
 * 2xF₁ = F₂ at LO. The cross-section (fixed target, lab beam energy E, nucleon mass M):
 *   d²σ/dx dy = (G_F² M E/π) (M_W²/(M_W² + Q²))² [x y² F₁ + (1 − y − xyM/(2E)) F₂ ± y(1 − y/2) xF₃],
 * + for ν, − for ν̄, Q² = 2 M E x y. The scale is μ_F² = Q².
 */

export type CcBeam = 'neutrino' | 'antineutrino'
export type CcStructure = 'F2' | 'xF3' | '2xF1'

/** Options of the charged-current kernel. */
export interface CcOptions {
  beam: CcBeam
  /** Target hadron (default proton); nuclei per nucleon. */
  target?: Hadron
  /** CKM magnitudes (default 'pdg', constants.ts) or the unit matrix. */
  ckm?: CkmChoice
  /**
   * Whether a top can be produced (d_j → t): true where the set has six active flavours at Q²
   * (set by the study from the set's scheme); default false.
   */
  topOpen?: boolean
}

/** Sum over the final up-type quarks u, c (and t when open) of |V_ij|². */
function columnWeight(down: Pdg, ckm: CkmChoice, topOpen: boolean): number {
  return vSquared(2, down, ckm) + vSquared(4, down, ckm) + (topOpen ? vSquared(6, down, ckm) : 0)
}

function rowWeight(up: Pdg, ckm: CkmChoice): number {
  let s = 0
  for (const d of DOWN_TYPE) s += vSquared(up, d, ckm)
  return s
}

/**
 * Weights of F₂ or xF₃ on the target's own densities (before isospin), for a W⁺ (ν) or W⁻ (ν̄).
 * u, c and t (ū, c̄, t̄) appear as struck up-type quarks (antiquarks); the top's weight counts
 * only where the set carries a top density. `topOpen` adds d_j → t production. Dimensionless.
 * @example ccWeights('neutrino', 'F2', 'diagonal').get(1) // 2 (d → u)
 * @example ccWeights('neutrino', 'F2', 'diagonal').get(-6) // 2 (t̄ → b̄)
 */
export function ccWeights(beam: CcBeam, structure: 'F2' | 'xF3', ckm: CkmChoice = 'pdg', topOpen = false): Map<Pdg, number> {
  const sign = structure === 'F2' ? 1 : -1
  const w = new Map<Pdg, number>()
  if (beam === 'neutrino') {
    for (const d of DOWN_TYPE) addWeight(w, d, 2 * columnWeight(d, ckm, topOpen))
    for (const u of UP_TYPE) addWeight(w, -u, sign * 2 * rowWeight(u, ckm))
  } else {
    for (const u of UP_TYPE) addWeight(w, u, 2 * rowWeight(u, ckm))
    for (const d of DOWN_TYPE) addWeight(w, -d, sign * 2 * columnWeight(d, ckm, topOpen))
  }
  return w
}

function checkPoint(x: number, q2GeV2: number): void {
  if (!(x > 0 && x < 1)) throw new RangeError(`x = ${x} must lie in (0, 1)`)
  if (!(q2GeV2 > 0) || !Number.isFinite(q2GeV2)) throw new RangeError(`Q² = ${q2GeV2} GeV² must be positive`)
}

/**
 * F₂, xF₃ or 2xF₁ of ν/ν̄ charged-current DIS at (x, Q²) as a linear form on the set's proton
 * densities (dimensionless). Domain: x in (0, 1), Q² > 0; else RangeError.
 * @example ccStructureTerm('xF3', 0.1, 10, { beam: 'neutrino', target: { type: 'isoscalar' } })
 */
export function ccStructureTerm(structure: CcStructure, x: number, q2GeV2: number, options: CcOptions): LinearTerm {
  checkPoint(x, q2GeV2)
  const own = ccWeights(options.beam, structure === 'xF3' ? 'xF3' : 'F2', options.ckm, options.topOpen)
  return { kind: 'linear', x, mu2GeV2: q2GeV2, factor: 1, weights: onProton(own, options.target ?? PROTON) }
}

/** F₂/xF₃/2xF₁ for densities `xf`; formula and domain in {@link ccStructureTerm}. */
export function ccStructureFunction(xf: XfFunction, structure: CcStructure, x: number, q2GeV2: number, options: CcOptions): number {
  return evaluateTerm(ccStructureTerm(structure, x, q2GeV2, options), xf)
}

/** Options of the charged-current cross-section. */
export interface CcCrossSectionOptions extends CcOptions {
  /** Neutrino beam energy in the target rest frame, GeV. */
  beamEnergyGeV: number
  /** Result unit (default pb). */
  unit?: CrossSectionUnit
}

/**
 * d²σ/dx dy of ν N or ν̄ N charged-current scattering per nucleon, in `unit` (pb by default), as
 * a linear form; Q² = 2 M E x y with M the proton mass (constants.ts). Domain: x in (0, 1),
 * y in (0, 1], E > 0; else RangeError.
 * @example ccCrossSectionTerm(0.2, 0.5, { beam: 'neutrino', beamEnergyGeV: 100 }).mu2GeV2 // 18.77 GeV²
 */
export function ccCrossSectionTerm(x: number, y: number, options: CcCrossSectionOptions): LinearTerm {
  const e = options.beamEnergyGeV
  if (!(e > 0) || !Number.isFinite(e)) throw new RangeError(`the beam energy must be positive; got ${e} GeV`)
  if (!(y > 0 && y <= 1)) throw new RangeError(`y = ${y} must lie in (0, 1]`)
  const m = PROTON_MASS_GEV
  const q2 = 2 * m * e * x * y
  checkPoint(x, q2)
  const propagator = (MW_GEV ** 2 / (MW_GEV ** 2 + q2)) ** 2
  const prefactor = GF_GEV2 ** 2 * m * e / Math.PI * propagator * gev2ToUnit(options.unit)
  // x y² F₁ = y² F₂/2 (Callan–Gross), so the bracket is a·F₂ + b·xF₃:
  const a = y * y / 2 + 1 - y - x * y * m / (2 * e)
  const b = (options.beam === 'neutrino' ? 1 : -1) * y * (1 - y / 2)
  const f2 = ccWeights(options.beam, 'F2', options.ckm, options.topOpen)
  const xf3 = ccWeights(options.beam, 'xF3', options.ckm, options.topOpen)
  const own = new Map<Pdg, number>()
  for (const [p, w] of f2) addWeight(own, p, a * w)
  for (const [p, w] of xf3) addWeight(own, p, b * w)
  return { kind: 'linear', x, mu2GeV2: q2, factor: prefactor, weights: onProton(own, options.target ?? PROTON) }
}

/** d²σ/dx dy for densities `xf`, in `unit` (pb by default); see {@link ccCrossSectionTerm}. */
export function d2SigmaDxDyChargedCurrent(xf: XfFunction, x: number, y: number, options: CcCrossSectionOptions): number {
  return evaluateTerm(ccCrossSectionTerm(x, y, options), xf)
}
