import { z } from 'zod'
import type { Pdg } from '../types'
import type { FlavourWeights, PairWeight } from './terms'
import { addWeight, mergePairs } from './terms'

/**
 * Which hadron a density describes, in terms of the proton (or bound-proton) densities that a set
 * carries. Nuclear conventions (see shared/physics/README.md, "Nuclear targets and isospin"): a
 * bound neutron follows from the bound proton by isospin (u ↔ d, ū ↔ d̄), and the per-nucleon
 * density of a nucleus (Z, A) is (Z/A) f^{p/A} + ((A − Z)/A) f^{n/A}. The antiproton is the charge
 * conjugate (q ↔ q̄).
 */
export type Hadron =
  | { type: 'proton' }
  | { type: 'antiproton' }
  | { type: 'neutron' }
  | { type: 'isoscalar' }
  | { type: 'nucleus', z: number, a: number }

/** zod schema of a {@link Hadron}; a nucleus needs integer 1 ≤ Z ≤ A ≤ 300. */
export const hadronSchema = z.discriminatedUnion('type', [
  z.strictObject({ type: z.literal('proton') }),
  z.strictObject({ type: z.literal('antiproton') }),
  z.strictObject({ type: z.literal('neutron') }),
  z.strictObject({ type: z.literal('isoscalar') }),
  z.strictObject({
    type: z.literal('nucleus'),
    z: z.number().int().min(1, 'Z must be at least 1'),
    a: z.number().int().min(1, 'A must be at least 1').max(300, 'A must be at most 300')
  }).refine(n => n.z <= n.a, { message: 'a nucleus needs Z ≤ A', path: ['z'] })
])

/** The free proton. */
export const PROTON: Hadron = Object.freeze({ type: 'proton' })

function isospinPartner(pdg: Pdg): Pdg {
  switch (pdg) {
    case 1: return 2
    case 2: return 1
    case -1: return -2
    case -2: return -1
    default: return pdg
  }
}

function chargeConjugate(pdg: Pdg): Pdg {
  return pdg === 21 || pdg === 22 ? pdg : -pdg
}

/**
 * The hadron's density of parton `pdg` as a combination Σ c · f^p_{pdg′} of proton densities,
 * returned as [pdg′, c] pairs. Dimensionless coefficients. RangeError for an invalid nucleus.
 * @example composition({ type: 'neutron' }, 2) // [[1, 1]]: u in the neutron is d in the proton
 */
export function composition(hadron: Hadron, pdg: Pdg): Array<[Pdg, number]> {
  switch (hadron.type) {
    case 'proton': return [[pdg, 1]]
    case 'antiproton': return [[chargeConjugate(pdg), 1]]
    case 'neutron': return [[isospinPartner(pdg), 1]]
    case 'isoscalar': return combine(pdg, 0.5)
    case 'nucleus': {
      const { z: zz, a } = hadron
      if (!(Number.isInteger(zz) && Number.isInteger(a) && zz >= 1 && zz <= a)) {
        throw new RangeError(`a nucleus needs integers 1 ≤ Z ≤ A; got Z = ${zz}, A = ${a}`)
      }
      return combine(pdg, zz / a)
    }
  }
}

function combine(pdg: Pdg, protonFraction: number): Array<[Pdg, number]> {
  const partner = isospinPartner(pdg)
  if (partner === pdg) return [[pdg, 1]]
  return [[pdg, protonFraction], [partner, 1 - protonFraction]].filter(([, c]) => c !== 0) as Array<[Pdg, number]>
}

/**
 * Re-expresses weights on the hadron's densities as weights on the set's proton densities.
 * @example onProton(new Map([[2, 4 / 9]]), { type: 'neutron' }) // Map { 1 → 4/9 }
 */
export function onProton(weights: FlavourWeights, hadron: Hadron): Map<Pdg, number> {
  const out = new Map<Pdg, number>()
  for (const [pdg, w] of weights) {
    for (const [p, c] of composition(hadron, pdg)) addWeight(out, p, w * c)
  }
  return out
}

/**
 * Re-expresses pair weights on two hadrons' densities as pair weights on proton densities
 * (beam 1 → index a, beam 2 → index b), merging equal pairs.
 */
export function pairsOnProton(pairs: readonly PairWeight[], beam1: Hadron, beam2: Hadron): PairWeight[] {
  const out: PairWeight[] = []
  for (const { a, b, w } of pairs) {
    for (const [pa, ca] of composition(beam1, a)) {
      for (const [pb, cb] of composition(beam2, b)) out.push({ a: pa, b: pb, w: w * ca * cb })
    }
  }
  return mergePairs(out)
}
