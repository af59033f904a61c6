import type { Pdg } from '../types'
import { QUARKS, quarkCharge } from './couplings'
import type { Hadron } from './hadrons'
import { PROTON, composition, onProton } from './hadrons'
import type { BilinearTerm, LinearTerm, PairWeight } from './terms'
import { mergePairs } from './terms'
import { f2PhotonWeights } from './dis-neutral'

/**
 * Semi-inclusive deep-inelastic scattering ℓN → ℓ h X by photon exchange at LO (PDG review
 * "Fragmentation functions in e⁺e⁻, ep and pp collisions", the LO multiplicity; see
 * shared/physics/README.md, "Hadron production: semi-inclusive DIS"):
 *   M^h(x, z, Q²) = Σ_q e_q² q(x, Q²) D_q^h(z, Q²) / Σ_q e_q² q(x, Q²),
 * sums over quarks and antiquarks; μ_F² = Q² for both densities. The numerator is a bilinear form
 * (beam 1: the parton densities of the target at x; beam 2: the fragmentation set at z), the
 * denominator a linear form in the parton densities; the study divides one by the other bin by
 * bin, member by member (registry: 'sidis-multiplicity'), so over a bin with ranges the
 * multiplicity is the ratio of the two integrals. Grids hold x·f and z·D, hence the factors
 * 1/(x z) and 1/x. Neutron, isoscalar, deuteron and nuclear targets: hadrons.ts (the parton side
 * only; the fragmentation side is the same for every target).
 *
 * Charge conjugation gives the antihadron's functions from the hadron's, D_q^{h̄} = D_q̄^h
 * (common practice; C invariance of QCD): 'conjugate' is M^{h̄} from a set of h, and
 * 'difference' the numerator of M^h − M^{h̄}, Σ e_q² q (D_q^h − D_q̄^h).
 */

/** Which fragmentation combination the numerator takes from a set of hadron h. */
export type FragmentationCombination = 'same' | 'conjugate' | 'difference'

function checkPoint(x: number, z: number, q2GeV2: number): void {
  if (!(x > 0 && x < 1)) throw new RangeError(`x = ${x} must lie in (0, 1)`)
  if (!(z > 0 && z < 1)) throw new RangeError(`z = ${z} must lie in (0, 1)`)
  if (!(q2GeV2 > 0) || !Number.isFinite(q2GeV2)) throw new RangeError(`Q² = ${q2GeV2} GeV² must be positive`)
}

/**
 * The pair weights (parton q of the target, parton of the fragmentation set) of Σ e_q² q D: q with
 * q ('same'), q with q̄ ('conjugate'), or both with opposite signs ('difference').
 */
export function fragmentationPairs(combination: FragmentationCombination = 'same'): PairWeight[] {
  const out: PairWeight[] = []
  for (const q of QUARKS) {
    const e2 = quarkCharge(q) ** 2
    for (const p of [q, -q] as Pdg[]) {
      if (combination !== 'conjugate') out.push({ a: p, b: p, w: e2 })
      if (combination !== 'same') out.push({ a: p, b: -p, w: combination === 'conjugate' ? e2 : -e2 })
    }
  }
  return out
}

/**
 * Numerator Σ_q e_q² q(x, Q²) D_q^h(z, Q²) of the multiplicity on `target`: beam 1 the parton
 * densities (re-expressed on the set's proton densities), beam 2 the fragmentation set. Unit: that
 * of q(x), i.e. dimensionless per unit x. Domain: x, z in (0, 1), Q² > 0; else RangeError.
 * @example semiInclusiveYieldTerm(0.1, 0.4, 10).factor // 1/(0.1 · 0.4) = 25
 */
export function semiInclusiveYieldTerm(x: number, z: number, q2GeV2: number, options: { target?: Hadron, combination?: FragmentationCombination } = {}): BilinearTerm {
  checkPoint(x, z, q2GeV2)
  const target = options.target ?? PROTON
  const pairs: PairWeight[] = []
  for (const { a, b, w } of fragmentationPairs(options.combination)) {
    for (const [pa, ca] of composition(target, a)) pairs.push({ a: pa, b, w: w * ca })
  }
  return { kind: 'bilinear', x1: x, x2: z, mu2GeV2: q2GeV2, factor: 1 / (x * z), pairs: mergePairs(pairs) }
}

/**
 * Denominator Σ_q e_q² q(x, Q²) of the multiplicity on `target` (F₂/x at LO); z is only checked,
 * so that a bin over a z range integrates the denominator over the same range. Dimensionless per
 * unit x. Domain as {@link semiInclusiveYieldTerm}.
 * @example semiInclusiveQuarkSumTerm(0.1, 0.4, 10).weights.get(2) // 4/9 on a proton
 */
export function semiInclusiveQuarkSumTerm(x: number, z: number, q2GeV2: number, options: { target?: Hadron } = {}): LinearTerm {
  checkPoint(x, z, q2GeV2)
  return { kind: 'linear', x, mu2GeV2: q2GeV2, factor: 1 / x, weights: onProton(f2PhotonWeights(), options.target ?? PROTON) }
}
