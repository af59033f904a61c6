import { densityOf, SPECIES, type SetDensity } from '../fragmentation/species'
import { partonName } from '../partons'
import type { Pdg, SetTarget } from '../types'

/**
 * How pages, exports and the command line say what a set's grid holds. One place, so that the
 * library, the set page, the figures and the CLI use the same words.
 */

/** What a set holds, in words: "parton densities in the proton", "fragmentation into π⁺". */
export function densityText(header: { density?: SetDensity, target?: SetTarget | { type: string, z?: number, a?: number } }): string {
  const density = densityOf(header)
  if (density.type === 'fragmentation') return `fragmentation into ${SPECIES[density.hadron].symbol}`
  const t = header.target
  return t?.type === 'nucleus' ? `parton densities in the nucleus Z = ${t.z}, A = ${t.a}` : 'parton densities in the proton'
}

/**
 * A key to filter sets by what they hold: 'proton', 'nucleus' or 'fragmentation:<hadron>'.
 * @example densityKey({ density: { type: 'fragmentation', hadron: 'K+' } }) // 'fragmentation:K+'
 */
export function densityKey(header: { density?: SetDensity, target?: { type: string } }): string {
  const density = densityOf(header)
  if (density.type === 'fragmentation') return `fragmentation:${density.hadron}`
  return header.target?.type === 'nucleus' ? 'nucleus' : 'proton'
}

/** Words of a densityKey, for a filter's options. */
export function densityKeyText(key: string): string {
  if (key === 'proton') return 'parton densities in the proton'
  if (key === 'nucleus') return 'parton densities in nuclei'
  const hadron = key.slice('fragmentation:'.length) as keyof typeof SPECIES
  return SPECIES[hadron] ? `fragmentation into ${SPECIES[hadron].symbol}` : key
}

/**
 * The axis and quantity of a density plot: x and x·f(x, Q²) for parton densities, z and
 * z·D(z, Q²) for fragmentation functions (the hadron's momentum fraction z).
 */
export function densityAxes(density: SetDensity | undefined): { variable: 'x' | 'z', variableText: string, quantity: string } {
  return density?.type === 'fragmentation'
    ? { variable: 'z', variableText: 'momentum fraction z', quantity: `z·D(z, Q²) into ${SPECIES[density.hadron].symbol}` }
    : { variable: 'x', variableText: 'momentum fraction x', quantity: 'x·f(x, Q²)' }
}

/**
 * The label of one flavour's curve: the parton ("ū") for parton densities, "parton → hadron"
 * ("u → π⁺") for fragmentation functions.
 */
export function flavourText(density: SetDensity | undefined, pdg: Pdg): string {
  return density?.type === 'fragmentation' ? `${partonName(pdg)} → ${SPECIES[density.hadron].symbol}` : partonName(pdg)
}
