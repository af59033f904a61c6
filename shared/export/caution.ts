import { slotsOf } from '../utils/set-match'

/**
 * The standard caution that goes with every result shown or exported (common practice in
 * analysis notes). The results pages show RESULT_CAUTION; captions and file headers use it too.
 */
export const RESULT_CAUTION
  = 'Leading-order prediction. The band is the PDF uncertainty only, not the full theory uncertainty '
    + '(higher orders, scale choices and other parameters are not included). '
    + 'Quote it with the prescription your collaboration recommends.'

/** One sentence for table captions and plot footers. */
export const RESULT_CAUTION_SHORT = 'Leading-order prediction; PDF uncertainty only, not the full theory uncertainty.'

/** Added to the caution of a result whose study carries K-factors. */
export const K_FACTOR_CAUTION
  = 'The predictions are multiplied by per-bin K-factors supplied by the user: their values, their uncertainty and '
    + 'their validity for this set and these bins are the user\'s responsibility.'

/** The short form of {@link K_FACTOR_CAUTION} for captions and footers. */
export const K_FACTOR_CAUTION_SHORT = 'Scaled by user-supplied K-factors (the user\'s responsibility).'

/**
 * Whose uncertainty a result's band is: the parton densities, the fragmentation functions, or both
 * (a semi-inclusive multiplicity whose fragmentation set varied too).
 */
export type VaryingDensities = 'parton' | 'fragmentation' | 'both'

/**
 * What varied in a result of kernel `kernel`: the main sets' density always; the second set's
 * too when it was paired or varied apart (shared/physics/uncertainty/two-sets.ts).
 * @example varyingDensities('sidis-multiplicity', 'apart') // 'both'
 */
export function varyingDensities(kernel: string, variation?: 'central' | 'paired' | 'apart'): VaryingDensities {
  const slots = slotsOf(kernel)
  const second = variation === 'paired' || variation === 'apart' ? slots.second : null
  return second && second !== slots.main ? 'both' : slots.main
}

/** What the first sentence of the caution says the band is. */
const BAND_IS: Readonly<Record<VaryingDensities, { long: string, short: string }>> = Object.freeze({
  parton: { long: 'The band is the PDF uncertainty only', short: 'PDF uncertainty only' },
  fragmentation: { long: 'The band is the fragmentation-function uncertainty only', short: 'fragmentation-function uncertainty only' },
  both: { long: 'The band combines the PDF and the fragmentation-function uncertainties in quadrature', short: 'PDF and fragmentation-function uncertainties only' }
})

/** Added when fragmentation functions enter the prediction (common practice: LO fragmentation is rough at small z). */
export const FRAGMENTATION_CAUTION = 'Leading-order fragmentation functions mean little below z ≈ 0.05; read hadron spectra and multiplicities as indicative.'

/**
 * The caution of a result: {@link RESULT_CAUTION} (with the band named by what varied), the
 * fragmentation sentence when fragmentation functions enter, and the K-factor sentence when
 * K-factors were used.
 */
export function resultCaution(kFactors: boolean, varies: VaryingDensities = 'parton', fragmentation = varies !== 'parton'): string {
  const base = varies === 'parton' ? RESULT_CAUTION : RESULT_CAUTION.replace(BAND_IS.parton.long, BAND_IS[varies].long)
  return [base, ...(fragmentation ? [FRAGMENTATION_CAUTION] : []), ...(kFactors ? [K_FACTOR_CAUTION] : [])].join(' ')
}

/** The one-sentence caution, named by what varied, with the short K-factor sentence when K-factors were used. */
export function resultCautionShort(kFactors: boolean, varies: VaryingDensities = 'parton'): string {
  const base = varies === 'parton' ? RESULT_CAUTION_SHORT : RESULT_CAUTION_SHORT.replace(BAND_IS.parton.short, BAND_IS[varies].short)
  return kFactors ? `${base} ${K_FACTOR_CAUTION_SHORT}` : base
}

/** The caution of a result of kernel `kernel` whose second set entered with `variation`. */
export function cautionOfKernel(kFactors: boolean, kernel: string, variation?: 'central' | 'paired' | 'apart'): string {
  const slots = slotsOf(kernel)
  const fragmentation = slots.main === 'fragmentation' || slots.second === 'fragmentation'
  return resultCaution(kFactors, varyingDensities(kernel, variation), fragmentation)
}
