// @ts-check
// thresholds.js: judgement calls the page applies to results, kept apart so that a later change
// can take them from the module with the limits (copoly.limits()).

/**
 * The linear methods treat each sample as made from its starting feed; above 10 % conversion
 * that is usually no longer true (common practice, no source). Runs above it are flagged.
 */
export const LINEAR_LIMIT = 0.10;

/** A triad family sums to 1 within this (common practice, no source). */
export const SUM_TOLERANCE = 0.01;
