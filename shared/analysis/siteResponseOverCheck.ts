/**
 * One site's response over the check, as plain data for the across-site result:
 * the line through the origin fitted to each fertilized plot's gain over the
 * zero-rate plot of its own block (shared/models/responseOverCheck), and the
 * intercept test on those gains, which says whether a gain at rate zero (a bias)
 * is present.
 *
 * The gains are only taken here when every plot has a block and every block has
 * its own zero-rate plot: fitResponseOverCheck would otherwise measure some gains
 * from the mean of all checks, which mixes block differences into the gains and
 * can show a bias that is only a block effect. Such a site gets the reason instead.
 */
import { fitResponseOverCheck } from '../models/responseOverCheck';
import { StatsInputError } from '../stats/errors';
import type { SitePlots } from './sitePlots';

/** The response over the check of one site. Slopes in kg grain per kg N, yields in kg/ha. */
export interface ResponseOverCheckOutcome {
  /** Fertilized plots whose gain over their block's check was fitted. */
  gains: number;
  /** Slope of the line through the origin fitted to the gains, kg grain per kg N. */
  slopeKgPerKg: number;
  /** Its standard error, kg grain per kg N. */
  slopeSeKgPerKg: number;
  /** Its interval (estimate ± t·SE), kg grain per kg N, at `confidenceLevel`. */
  slopeCiKgPerKg: [number, number];
  /** Level of `slopeCiKgPerKg`, e.g. 0.95. */
  confidenceLevel: number;
  /** The straight line's intercept on the gains: the gain at rate zero, kg/ha, and its SE. */
  gainAtZeroKgHa: number;
  gainAtZeroSeKgHa: number;
  /** Straight line against the line through the origin on the gains: t of the intercept, F = t². */
  t: number;
  F: number;
  df1: number;
  df2: number;
  p: number;
  /** True when the gain at rate zero differs from zero at the analysis' alpha. */
  biasPresent: boolean;
}

/** Level of the slope's interval: the fits' default (shared/models finishFit). */
const SLOPE_LEVEL = 0.95;

/**
 * The response over the check of one site, or why there is none.
 * @param site - the site's analyzable plots (kg/ha) with their block labels
 * @param alpha - significance level of the intercept test, in (0, 1)
 * @returns the slope over the check with its interval and the intercept test, or `{ problem }`
 *   (no blocks, a block without a zero-rate plot, too few gains)
 * @example
 * siteResponseOverCheck(plots, 0.05) // { slopeKgPerKg: 18.5, biasPresent: false, … }
 */
export function siteResponseOverCheck(
  site: SitePlots,
  alpha: number,
): ResponseOverCheckOutcome | { problem: string } {
  if (site.problem) return { problem: site.problem };
  if (site.block.length === 0 || site.block.some((b) => b === null || b === '')) {
    return {
      problem:
        'Not every plot has a block, so no plot has a check of its own block to be measured against.',
    };
  }
  const checked = new Set<string>();
  for (let i = 0; i < site.block.length; i++) {
    if (site.rateKgHa[i] === 0) checked.add(site.block[i] as string);
  }
  if (checked.size === 0) {
    return { problem: 'No plot has rate zero, so there is no check to measure gains from.' };
  }
  const without = [...new Set(site.block as string[])].filter((b) => !checked.has(b));
  if (without.length > 0) {
    return {
      problem: `No zero-rate plot in block${without.length === 1 ? '' : 's'} ${without.join(', ')}, so not every gain has a check of its own block.`,
    };
  }
  let r;
  try {
    r = fitResponseOverCheck(
      { rateKgHa: site.rateKgHa, yieldKgHa: site.yieldKgHa, block: site.block as string[] },
      { alpha, confidence: SLOPE_LEVEL },
    );
  } catch (e) {
    // A value the models refuse (e.g. a negative rate) is a data problem of this site.
    if (!(e instanceof StatsInputError)) throw e;
    return { problem: e.message };
  }
  const fit = r.proportional;
  const test = r.interceptTest;
  if (r.status !== 'ok' || !fit || !test) return { problem: r.message };
  const ci = fit.confidenceIntervals.b;
  return {
    gains: r.gains.length,
    slopeKgPerKg: fit.params.b,
    slopeSeKgPerKg: fit.stdErrors.b,
    slopeCiKgPerKg: [ci[0], ci[1]],
    confidenceLevel: SLOPE_LEVEL,
    gainAtZeroKgHa: test.intercept.estimate,
    gainAtZeroSeKgHa: test.intercept.stdError,
    t: test.t,
    F: test.F,
    df1: test.df1,
    df2: test.df2,
    p: test.p,
    biasPresent: test.interceptNeeded,
  };
}
