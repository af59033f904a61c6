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

/** The caution of a result: {@link RESULT_CAUTION}, with the K-factor sentence when K-factors were used. */
export const resultCaution = (kFactors: boolean) => (kFactors ? `${RESULT_CAUTION} ${K_FACTOR_CAUTION}` : RESULT_CAUTION)

/** The one-sentence caution, with the short K-factor sentence when K-factors were used. */
export const resultCautionShort = (kFactors: boolean) => (kFactors ? `${RESULT_CAUTION_SHORT} ${K_FACTOR_CAUTION_SHORT}` : RESULT_CAUTION_SHORT)
