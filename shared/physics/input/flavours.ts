/**
 * The flavour slots the engine's inputs and evolution use: PDG codes −6…−1, 1…6 and 21 (13 slots,
 * no photon), in that order. Grids built by the evolution carry exactly these flavours. Names of
 * the partons: partons.ts.
 */
import type { Pdg } from '../types'

/** PDG codes of the 13 evolved partons: t̄ b̄ c̄ s̄ ū d̄ d u s c b t g. */
export const EVOLVED_FLAVOURS: readonly Pdg[] = [-6, -5, -4, -3, -2, -1, 1, 2, 3, 4, 5, 6, 21]

/** Number of evolved flavour slots (13). */
export const N_SLOTS = 13

/** Slot of the gluon (PDG 21). */
export const GLUON_SLOT = 12

/**
 * Slot index 0..12 of a PDG code in `EVOLVED_FLAVOURS`.
 * @throws RangeError for a code that is not a quark, antiquark or gluon.
 * @example slotOf(-1) // 5; slotOf(2) // 7; slotOf(21) // 12
 */
export function slotOf(pdg: Pdg): number {
  if (pdg === 21) return GLUON_SLOT
  if (Number.isInteger(pdg) && pdg >= -6 && pdg <= -1) return pdg + 6
  if (Number.isInteger(pdg) && pdg >= 1 && pdg <= 6) return pdg + 5
  throw new RangeError(`PDG code ${pdg} is not an evolved parton (quarks ±1…±6 and the gluon 21)`)
}

/** Slot of quark flavour q (1..6) and of its antiquark. @example quarkSlots(2) // { quark: 7, anti: 4 } */
export function quarkSlots(q: number): { quark: number, anti: number } {
  return { quark: q + 5, anti: 6 - q }
}
