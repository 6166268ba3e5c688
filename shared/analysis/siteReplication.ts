/**
 * Whether a site replicates any rate: the one reading of "no replication" that the site's
 * recommendation and its resampling both follow. With one plot per rate a site has no pure
 * error, so
 * - the rate effect cannot be tested (siteRateEffect has no residual degrees of freedom);
 * - resampling plots within each rate (bootstrapDraws) draws the data itself every time, so an
 *   interval from it would be a width of zero, not a measure of how sure the rate is;
 * - AICc on as many points as there are rates cannot tell the curves apart: with six plots its
 *   small-sample term is 2k(k + 1)/(n − k − 1) = 40 for a three-parameter curve (k = 4 with the
 *   variance) against 12 for a step (Hurvich & Tsai, Biometrika 76, 1989, 297–307), so a step
 *   leads whatever the yields say.
 * No rate is recommended from such a site; its curves are still fitted and shown, and an
 * analyst's pick still leads (with the same warning).
 */

/** The reason a site without replication gets no recommended rate. */
export const NO_REPLICATION_REASON =
  'each rate has one plot, so the site has no replication: its response cannot be tested, no interval can be drawn and the curves cannot be told apart on so few plots; no rate is recommended from it (replicate each rate, common practice: 3 or 4 blocks)';

/**
 * True when no rate has two plots or more.
 * @param rateKgHa - the site's analyzable plots' rates, kg/ha
 * @returns true for a site without replication (and for a site with no plots)
 * @example
 * withoutReplication([0, 40, 80, 120]) // true
 * withoutReplication([0, 0, 40, 80]) // false: the check is replicated
 */
export function withoutReplication(rateKgHa: ArrayLike<number>): boolean {
  const seen = new Set<number>();
  for (let i = 0; i < rateKgHa.length; i++) {
    if (seen.has(rateKgHa[i])) return false;
    seen.add(rateKgHa[i]);
  }
  return true;
}
