import type { ErrorSet, FlavourScheme, Pdg, SetHeader } from '../../../../shared/physics/types'
import type { HadronSpecies } from '../../../../shared/physics/fragmentation/species'

/**
 * Sets whose every node holds one constant per flavour (x·f, or z·D for a fragmentation set), so
 * that interpolation is exact and a study's value can be worked by hand. TOY numbers, not fits.
 */

export const SCHEME5: FlavourScheme = { type: 'variable', nf: 5, massesGeV: { charm: 1.51, bottom: 4.92, top: 172.5 } }

/** Toy parton densities x·f (proton): valence-like u, d above the sea. */
export const TOY_XF: Readonly<Record<number, number>> = { 2: 0.6, 1: 0.3, [-2]: 0.1, [-1]: 0.12, 3: 0.05, [-3]: 0.05 }
/** Toy z·D^{π⁺}: favoured u and d̄ 0.5, unfavoured ū, d, s, s̄ 0.2, charm and bottom 0.02 and 0.01. */
export const TOY_ZD_PI_PLUS: Readonly<Record<number, number>> = { 2: 0.5, [-1]: 0.5, [-2]: 0.2, 1: 0.2, 3: 0.2, [-3]: 0.2, 4: 0.02, [-4]: 0.02, 5: 0.01, [-5]: 0.01 }
/** Toy z·D^{K⁺}: favoured u and s̄ 0.3, every other quark 0.05. */
export const TOY_ZD_K_PLUS: Readonly<Record<number, number>> = { 2: 0.3, [-3]: 0.3, [-2]: 0.05, 1: 0.05, [-1]: 0.05, 3: 0.05, 4: 0.05, [-4]: 0.05, 5: 0.05, [-5]: 0.05 }

const FLAVOURS: Pdg[] = [-5, -4, -3, -2, -1, 1, 2, 3, 4, 5, 21]

/**
 * A set holding `table` at every node (flavours absent from the table are 0), with `members`
 * members: member k > 0 is the central one scaled by 1 + 0.01 k (so members differ).
 */
export function constantSet(table: Readonly<Record<number, number>>, options: { hadron?: HadronSpecies, members?: number, name?: string } = {}): ErrorSet {
  const x = Float64Array.from([1e-4, 1e-3, 0.01, 0.05, 0.1, 0.2, 0.3, 0.5, 0.7, 0.9])
  const q2 = Float64Array.from([1, 10, 100, 1000, 1e4, 1e5])
  const nf = FLAVOURS.length
  const n = options.members ?? 1
  const members = Array.from({ length: n }, (_, k) => {
    const v = new Float64Array(x.length * q2.length * nf)
    for (let i = 0; i < x.length * q2.length; i++) FLAVOURS.forEach((f, j) => { v[i * nf + j] = (table[f] ?? 0) * (1 + 0.01 * k) })
    return v
  })
  const header: SetHeader = {
    name: options.name ?? (options.hadron ? `TOY-FF-${options.hadron}` : 'TOY-PDF'), family: 'TOY', version: '1', kind: 'hessian-pairs',
    confidenceLevelPercent: 68, alphasMzCentral: 0.118, order: 'LO', scheme: SCHEME5, target: { type: 'proton' },
    provenance: 'constant toy for hand-worked tests', memberCount: n,
    ...(options.hadron ? { density: { type: 'fragmentation' as const, hadron: options.hadron } } : {})
  }
  return { header, x, q2, flavours: [...FLAVOURS], members }
}
