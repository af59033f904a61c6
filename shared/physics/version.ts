/**
 * The engine version recorded with every result, built set and export. Raise it whenever the
 * numbers the engine produces for the same input may change (a formula, a constant, the random
 * streams, a default grid), so that stored results can be told apart.
 *
 * 0.2.0: one random-number generator (Philox4x32-10, random.ts) with a stream per consumer;
 * pooled Hessian replicas and TOY replica sets draw different numbers than in 0.1.0.
 */
export const ENGINE_VERSION = 'sheaf-engine 0.2.0'
