import { z } from 'zod'
import { HBARC2_PB_GEV2 } from '../constants'

/** Cross-section units a study may report in. */
export const crossSectionUnitSchema = z.enum(['mb', 'ub', 'nb', 'pb', 'fb'])
export type CrossSectionUnit = z.infer<typeof crossSectionUnitSchema>

const PER_PB: Record<CrossSectionUnit, number> = { mb: 1e-9, ub: 1e-6, nb: 1e-3, pb: 1, fb: 1e3 }

/**
 * Factor converting a cross-section in pb to `unit` (e.g. 1000 for fb).
 * @example perPb('fb') // 1000
 */
export function perPb(unit: CrossSectionUnit = 'pb'): number {
  return PER_PB[unit]
}

/**
 * Factor converting a natural-unit cross-section in GeV⁻² to `unit`: (ħc)² in pb GeV² times
 * {@link perPb}. Source of (ħc)²: constants.ts (PDG 2024).
 * @example gev2ToUnit('pb') // 3.893793721e8
 */
export function gev2ToUnit(unit: CrossSectionUnit = 'pb'): number {
  return HBARC2_PB_GEV2 * PER_PB[unit]
}
