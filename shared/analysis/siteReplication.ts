/**
 * Whether a site replicates its rates: the one reading of "no replication" that the site's
 * recommendation and its resampling both follow. A site's rate + block model (shared/stats/
 * rateBlockModel) with no residual degrees of freedom after its blocks and rates has no rate
 * replicated within its design: one plot per rate, or the fertilized rates in one block only
 * with the check in every block. Then
 * - the rate effect cannot be tested (siteRateEffect);
 * - resampling plots within each rate (bootstrapDraws) draws the single plots as they are every
 *   time, so an interval from it would show no doubt where there is most;
 * - AICc on so few plots cannot tell the curves apart: its small-sample term 2k(k + 1)/(n − k − 1)
 *   (Hurvich & Tsai, Biometrika 76, 1989, 297–307) is 40 for a three-parameter curve (k = 4 with
 *   the variance) against 12 for a step at n = 6, so a step leads whatever the yields say.
 * No rate is recommended from such a site; its curves are still fitted and shown, and an
 * analyst's pick still leads (with the same warning).
 */
import type { RateBlockModel, RateBlockProblem } from '../stats/rateBlockModel';

/** The reason a site without replication gets no recommended rate. */
export const NO_REPLICATION_REASON =
  'the site has no replicated rate (one plot per rate, or per rate and block), so its response cannot be tested, no interval can be drawn and the curves cannot be told apart on so few plots; replicate each rate (common practice: 3 or 4 blocks)';

/**
 * True when the site's rate + block model has residual degrees of freedom, i.e. some rate is
 * replicated within the design.
 * @param rateBlock - the site's rate + block model, or why it has none
 * @returns false only for a site without replication (a site with one rate or no plots has
 *   other reasons, said elsewhere)
 * @example
 * isReplicated(fitRateBlockModel({ rateKgHa: [0, 40, 80], yieldKgHa: [9, 11, 12], block: [null, null, null] })) // false
 */
export function isReplicated(rateBlock: RateBlockModel | RateBlockProblem): boolean {
  return !('problem' in rateBlock && rateBlock.code === 'too-few-points');
}
