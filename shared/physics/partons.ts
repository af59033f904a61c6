/**
 * The one table of parton names: PDG Monte-Carlo particle codes (PDG review "Monte Carlo particle
 * numbering scheme") of the partons a set may carry — quarks 1 d, 2 u, 3 s, 4 c, 5 b, 6 t, their
 * antiquarks with the negative code, 21 the gluon, 22 the photon — with the short symbol used in
 * tables, plots and messages and a label in words (see shared/physics/README.md, "Units and
 * codes"). The evolution carries the 13 slots of input/flavours.ts (no photon); a set file may
 * add a photon density.
 */
import { z } from 'zod'
import type { Pdg } from './types'

/** One parton: PDG code, short symbol (antiquarks with a combining macron) and label in words. */
export interface Parton {
  pdg: Pdg
  /** Short symbol, e.g. 'u', 'ū', 'g', 'γ'. */
  name: string
  /** Label in words, e.g. 'up antiquark'. */
  label: string
}

const QUARK_NAMES = ['d', 'u', 's', 'c', 'b', 't'] as const
const QUARK_WORDS = ['down', 'up', 'strange', 'charm', 'bottom', 'top'] as const
const MACRON = '\u0304'

/** Every parton Sheaf knows, in PDG order: t̄ … d̄, d … t, g, γ. */
export const PARTONS: readonly Parton[] = Object.freeze([
  ...QUARK_NAMES.map((n, i) => ({ pdg: -(i + 1), name: `${n}${MACRON}`, label: `${QUARK_WORDS[i]} antiquark` })).reverse(),
  ...QUARK_NAMES.map((n, i) => ({ pdg: i + 1, name: n, label: `${QUARK_WORDS[i]} quark` })),
  { pdg: 21, name: 'g', label: 'gluon' },
  { pdg: 22, name: 'γ', label: 'photon' }
].map(p => Object.freeze(p)))

const BY_CODE: ReadonlyMap<number, Parton> = new Map(PARTONS.map(p => [p.pdg, p]))

/** The valid codes in words, for messages: "±1 … ±6, 21 (gluon) or 22 (photon)". */
export const PARTON_CODES_TEXT = '±1 … ±6, 21 (gluon) or 22 (photon)'

/**
 * True when `pdg` is a parton code of {@link PARTONS}.
 * @example isPartonCode(-5) // true; isPartonCode(11) // false
 */
export function isPartonCode(pdg: number): boolean {
  return BY_CODE.has(pdg)
}

/** zod schema of a parton code, for set headers and study options. */
export const partonCodeSchema = z.number().int().refine(isPartonCode, { message: `must be a PDG parton code: ${PARTON_CODES_TEXT}` })

function parton(pdg: Pdg): Parton {
  const p = BY_CODE.get(pdg)
  if (p === undefined) throw new RangeError(`PDG code ${pdg} is not a parton Sheaf knows (${PARTON_CODES_TEXT})`)
  return p
}

/**
 * Short symbol of a parton.
 * @throws RangeError for a code that is not in {@link PARTONS}.
 * @example partonName(-2) // 'ū'; partonName(21) // 'g'; partonName(22) // 'γ'
 */
export function partonName(pdg: Pdg): string {
  return parton(pdg).name
}

/**
 * Label of a parton in words.
 * @throws RangeError for a code that is not in {@link PARTONS}.
 * @example partonLabel(-2) // 'up antiquark'
 */
export function partonLabel(pdg: Pdg): string {
  return parton(pdg).label
}
