/**
 * The caution that goes with every set update by a measurement (reweighting, profiling) shown,
 * saved or exported, beside the leading-order caution of caution.ts.
 */
export const IMPACT_CAUTION
  = 'Reweighting and profiling on leading-order predictions are indicative only: they show roughly what the '
    + 'measurement could do to the densities. For a published update follow the prescriptions of the collaboration '
    + 'that provides the set (their theory, tolerance and data selection), not these numbers.'
