import type { BandJson } from '#shared/physics/uncertainty/band'

/** One nucleus of a family with its ratio band at one x (a single-entry band from the densities route), or null when it has none. */
export interface NucleusRatio {
  a: number
  z: number
  name: string
  band: BandJson | null
}

/**
 * R_i^A at one x against the mass number A for a family's nuclei: the positions (A, ascending)
 * and one band through them (each nucleus's own band at that x), for the family page's plot.
 * Nuclei without a band are left out; null when none has one.
 * @example ratioAgainstA([{ a: 12, z: 6, name: 'C', band: { central: [0.98], plus: [0.01], minus: [0.01], relPlus: [0.0102], relMinus: [0.0102] } }]) // { a: [12], band: { central: [0.98], … } }
 */
export function ratioAgainstA(nuclei: readonly NucleusRatio[]): { a: number[], labels: string[], band: BandJson } | null {
  const rows = nuclei.filter(n => n.band && n.band.central.length > 0).sort((p, q) => p.a - q.a)
  if (!rows.length) return null
  const pick = <K extends keyof BandJson>(k: K) => rows.map(n => n.band![k][0]!) as BandJson[K]
  return {
    a: rows.map(n => n.a),
    labels: rows.map(n => `${n.name} (Z = ${n.z}, A = ${n.a})`),
    band: { central: pick('central'), plus: pick('plus'), minus: pick('minus'), relPlus: pick('relPlus'), relMinus: pick('relMinus') }
  }
}
