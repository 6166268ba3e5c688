/**
 * Did a site respond to the nutrient at all? The rate effect of the site's rate + block model
 * (shared/stats/rateBlockModel.ts: yield on rate taken as a factor, one mean per rate, no curve
 * assumed, with block terms when the plots carry blocks): the extra-sum-of-squares F-test of
 * y ~ block + rate against y ~ block. The same fit gives the site's CV:
 *
 *   CV% = 100 · √(residual mean square) / mean yield
 *
 * Edge cases, each a result with a reason rather than an exception (the model's reasons):
 * - fewer than two distinct rates: no rate effect can be tested;
 * - no residual degrees of freedom (one plot per rate and block cell missing): no test;
 * - blocks confounded with rates: no test.
 */
import {
  fitRateBlockModel,
  type RateBlockModel,
  type RateBlockProblem,
} from '../stats/rateBlockModel';
import type { FTestResult, NoTest } from './extraSumOfSquaresTest';
import type { SitePlots } from './sitePlots';

export interface SiteRateEffect {
  /** The rate-effect test, or why there is none. */
  test: FTestResult | NoTest;
  /** Coefficient of variation of the block × rate ANOVA, %; NaN without residual df. */
  cvPct: number;
  /** Mean yield of the site's analyzable plots, kg/ha. */
  meanYieldKgHa: number;
}

/**
 * Rate effect and CV of one site.
 * @param site - the site's plots (rates and yields in kg/ha)
 * @param fitted - the site's rate + block model when the caller has fitted it already
 * @returns the F-test of the rate effect, CV% and the mean yield (kg/ha)
 * @example
 * const e = siteRateEffect(site);
 * e.test.kind === 'f-test' && e.test.p < 0.05 // the site responded
 */
export function siteRateEffect(
  site: SitePlots,
  fitted?: RateBlockModel | RateBlockProblem,
): SiteRateEffect {
  const n = site.yieldKgHa.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += site.yieldKgHa[i];
  mean = n > 0 ? mean / n : NaN;
  const model =
    fitted ??
    fitRateBlockModel({ rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa, block: site.block });
  if ('problem' in model) {
    const reason = n === 0 ? (site.problem ?? model.problem) : model.problem;
    return { test: { kind: 'no-test', reason }, cvPct: NaN, meanYieldKgHa: mean };
  }
  return {
    // The model's rate line is the extra sum of squares of y ~ block + rate over y ~ block.
    test: {
      kind: 'f-test',
      df1: model.rates.df,
      df2: model.residual.df,
      f: model.F,
      p: model.p,
      extraSse: model.rates.ss,
    },
    cvPct: model.cvPct ?? NaN,
    meanYieldKgHa: model.meanKgHa,
  };
}
