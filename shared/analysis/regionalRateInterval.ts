/**
 * How sure the regional rate is, from resampling site-years: the nonparametric bootstrap over the
 * units of the regional analysis (Efron & Tibshirani, "An Introduction to the Bootstrap", 1993,
 * ch. 6 and 13: resample the independent units with replacement, percentile interval). Each
 * resample draws as many site-years as there are, with replacement, and averages their gain
 * curves (price-free, done once); at any prices its best rate is the argmax of the averaged
 * return. The interval is the central share of those best rates; beside it, for each candidate
 * rate, the share of resamples in which that rate returns within the tolerance of the resample's
 * best, i.e. how often it would have been close enough had other site-years been in the trial.
 *
 * It answers "would another set of site-years like these have given a different regional rate?"
 * It leaves out each site's own curve uncertainty (each site's interval carries that), so with
 * few site-years it is wide for the right reason and with many it narrows as the region is known.
 */
import { seededRandom } from '../optimize/seededRandom';
import type { Prices } from '../economics/priceRatio';
import { standardNormalCdf, studentTQuantile } from '../stats/distributions';
import { sortedQuantile } from '../stats/quantile';
import { argMaxLowest, costOnGrid, type PreparedRegionalReturn } from './regionalReturn';

/** The price-free part: each resample's mean gain on the grid. */
export interface ResampledRegionalGains {
  gridKgHa: Float64Array;
  /** meanGains[b][g]: resample b's mean gain over its drawn site-years at grid rate g, kg/ha. */
  meanGains: Float64Array[];
  /** Site-years drawn in each resample: all the regional rate used. */
  siteYears: number;
  /** Central level of the interval the resamples give, e.g. 0.9. */
  level: number;
}

export interface RegionalRateInterval {
  /** Central level of the interval, e.g. 0.9. */
  level: number;
  lowKgHa: number;
  highKgHa: number;
  resamples: number;
  /** Site-years drawn in each resample (all the regional rate used). */
  siteYears: number;
  /** For each candidate rate, the share of resamples in which it returns within the tolerance of their best. */
  withinTolerance: { rateKgHa: number; share: number }[];
  tolerancePerHa: number;
  /** The same resamples read along the whole grid, for the regional chart. */
  alongGrid: ReturnAlongGrid;
}

/**
 * The resampled regional return at every grid rate (ResampledRegionalGains.gridKgHa): the central
 * `level` share of the resamples' mean net return (type 7 quantiles, pointwise, so the band shows
 * how far the mean curve itself could move, not where a single site's return lies), and the share
 * of resamples in which the rate returns less than that resample's best by more than the
 * tolerance.
 */
export interface ReturnAlongGrid {
  /** Lower end of the pointwise band, currency/ha. */
  lowPerHa: Float64Array;
  /** Upper end of the pointwise band, currency/ha. */
  highPerHa: Float64Array;
  /** Share of resamples in which the rate falls short of their best by more than the tolerance, in [0, 1]. */
  shortShare: Float64Array;
}

/**
 * Draws the resamples of site-years and averages each one's gains (price-free).
 * @param prepared - the regional grid's gains per site-year
 * @param resamples - how many resamples (0: none)
 * @param seed - the run's seed
 * @param level - the interval's central level, e.g. 0.9
 * @returns the resampled mean gains, or null without resamples or with fewer than 2 site-years
 * @example resampleRegionalGains(r.prepared, 200, 1, 0.9)!.meanGains.length // 200
 */
export function resampleRegionalGains(
  prepared: PreparedRegionalReturn,
  resamples: number,
  seed: number,
  level: number,
): ResampledRegionalGains | null {
  const n = prepared.gains.length;
  if (!(resamples > 0) || n < 2) return null;
  const g = prepared.gridKgHa.length;
  const random = seededRandom(seed);
  const stretch = Math.sqrt(n / (n - 1));
  const meanGains: Float64Array[] = [];
  for (let b = 0; b < resamples; b++) {
    const mean = new Float64Array(g);
    for (let i = 0; i < n; i++) {
      const gain = prepared.gains[random.nextInt(n)];
      for (let j = 0; j < g; j++) mean[j] += gain[j];
    }
    // Stretched about the sample mean by √(n/(n−1)), so each resampled mean varies as much as the
    // mean of n new site-years would (the plain bootstrap's variance is (n−1)/n of it; Davison &
    // Hinkley, "Bootstrap Methods and their Application", 1997, §2.3 and §3.3).
    for (let j = 0; j < g; j++)
      mean[j] = prepared.meanGainKgHa[j] + stretch * (mean[j] / n - prepared.meanGainKgHa[j]);
    meanGains.push(mean);
  }
  return { gridKgHa: prepared.gridKgHa, meanGains, siteYears: n, level };
}

/**
 * The share of the resamples left out below (and above) a central `level` interval from n
 * site-years: Φ(−t(1 − (1 − level)/2, n − 1)) rather than (1 − level)/2. The resampled means are
 * already stretched to the variance of a new sample's mean (resampleRegionalGains), so they spread
 * like the sample mean's normal approximation; a mean of n units with its variance estimated from
 * them calls for Student's t on n − 1 df, whose wider tails the percentiles then match. This is
 * the expanded percentile interval (Hesterberg, "What Teachers Should Know About the Bootstrap",
 * The American Statistician 69, 2015, pp. 371–386, the section on small samples, from memory:
 * percentiles at Φ(−√(n/(n−1)) t) of the plain bootstrap; the √(n/(n−1)) is the stretch here).
 * For 12 site-years at 90 %: 3.6 % a side.
 */
function expandedTail(level: number, siteYears: number): number {
  const plain = (1 - level) / 2;
  return standardNormalCdf(-studentTQuantile(1 - plain, siteYears - 1));
}

/**
 * The regional rate's interval and each candidate's share within the tolerance, at some prices.
 * @param resampled - from resampleRegionalGains
 * @param prices - canonical prices
 * @param tolerancePerHa - how far below the best a rate may return, currency/ha
 * @param candidatesKgHa - rates to report the share for (the tested rates and the regional rate)
 * @returns the interval (Hyndman & Fan type 7 quantiles of the resamples' best rates)
 * @example regionalRateInterval(res, prices, 12, [0, 60, 120])  // { lowKgHa: 118, highKgHa: 160, … }
 */
export function regionalRateInterval(
  resampled: ResampledRegionalGains,
  prices: Prices,
  tolerancePerHa: number,
  candidatesKgHa: readonly number[],
): RegionalRateInterval {
  const { gridKgHa, meanGains, level } = resampled;
  const g = gridKgHa.length;
  const cost = costOnGrid(gridKgHa, prices);
  // Each candidate's nearest grid point (candidates are tested rates inside the grid).
  const at = candidatesKgHa.map((x) => {
    let k = 0;
    for (let j = 1; j < g; j++) if (Math.abs(gridKgHa[j] - x) < Math.abs(gridKgHa[k] - x)) k = j;
    return k;
  });
  const count = meanGains.length;
  const best = new Float64Array(count);
  // Returns grid-major (rate j's resamples side by side), so each rate's band is one sort.
  const returns = new Float64Array(g * count);
  const short = new Float64Array(g);
  const r = new Float64Array(g);
  meanGains.forEach((mean, b) => {
    for (let j = 0; j < g; j++) r[j] = prices.grainPricePerKg * mean[j] - cost[j];
    // The regional rate's own rule for the best (ties to the lowest rate).
    const top = argMaxLowest(r);
    best[b] = gridKgHa[top];
    for (let j = 0; j < g; j++) {
      returns[j * count + b] = r[j];
      if (r[j] < r[top] - tolerancePerHa) short[j]++;
    }
  });
  best.sort();
  const tail = expandedTail(level, resampled.siteYears);
  const lowPerHa = new Float64Array(g);
  const highPerHa = new Float64Array(g);
  for (let j = 0; j < g; j++) {
    const column = returns.subarray(j * count, (j + 1) * count).sort();
    lowPerHa[j] = sortedQuantile(column, tail);
    highPerHa[j] = sortedQuantile(column, 1 - tail);
    short[j] /= count;
  }
  return {
    level,
    lowKgHa: sortedQuantile(best, tail),
    highKgHa: sortedQuantile(best, 1 - tail),
    resamples: meanGains.length,
    siteYears: resampled.siteYears,
    withinTolerance: candidatesKgHa.map((x, c) => ({ rateKgHa: x, share: 1 - short[at[c]] })),
    tolerancePerHa,
    alongGrid: { lowPerHa, highPerHa, shortShare: short },
  };
}
