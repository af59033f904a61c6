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
