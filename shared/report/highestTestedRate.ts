/**
 * Whether a recommended rate sits at the highest rate the trial tested. Such a rate is where the
 * trial stopped, not where the return peaked: a capped curve, a straight line or a curve still
 * rising there, and resamples counted there look certain when the optimum is not located. The
 * site's warning, the command line's summary and the grower page all ask this one question.
 */

/**
 * @param rate - the recommended rate (any unit), or null for none
 * @param highest - the highest tested rate in the same unit, or undefined without rates
 * @returns true when the rate is above 0 and at (or past) the highest tested rate
 * @example
 * atHighestTestedRate(200, 200) // true
 * atHighestTestedRate(0, 0) // false: no N is not a rate the trial stopped at
 */
export function atHighestTestedRate(rate: number | null, highest: number | undefined): boolean {
  return rate !== null && rate > 0 && highest !== undefined && rate >= highest;
}
