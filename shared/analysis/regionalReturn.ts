/**
 * One rate for a region: the maximum-return-to-nitrogen approach (Sawyer et al.,
 * 2006, Concepts and Rationale for Regional Nitrogen Rate Guidelines for Corn,
 * Iowa State University Extension PM 2015; title and number from memory). At every rate x of a fine grid and
 * every site s, the net return over the site's zero-rate check is
 *
 *   R_s(x) = p_grain · (ŷ_s(x) − ŷ_s(0)) − p_N · x − A·[x > 0]     (currency/ha)
 *
 * from the site's fitted curve ŷ_s, with A the cost of making an application
 * at all (shared/economics Prices, default 0). The regional curve is the plain mean over
 * sites, R̄(x) = (1/S) Σ_s R_s(x); the regional rate is the grid rate with the
 * highest R̄, and the profitable range is every grid rate whose R̄ is within a
 * band of that best. The band is the user's own tolerance, the same number that says when a rate
 * "falls short" in the risk tables (shared/economics/shortfallRule; default the cost of 10 kg N/ha
 * at the user's nitrogen price), so "profitable" and "short" never disagree.
 *
 * Price sensitivity: the yield gains ŷ_s(x) − ŷ_s(0) do not depend on prices, so
 * prepareRegionalReturn() evaluates them once and regionalReturnAtPrices()
 * re-prices in O(sites × grid) arithmetic with no curve evaluated again.
 *
 * Edge cases:
 * - ties: rates whose R̄ lies within 1e-9 (relative) of the best count as equal and
 *   the lowest is taken, so that the result does not hinge on the order of the
 *   summation (site order, duplicated sites);
 * - a band that leaves gaps (R̄ not unimodal) is reported as its lowest and
 *   highest rate with `contiguous: false`;
 * - a site optimum is the grid rate with the highest R_s (lowest on ties).
 */
import { assertPrices, rateCostPerHa, type Prices } from '../economics/priceRatio';
import { sortedQuantile } from '../stats/quantile';
import { toleranceInForce } from '../economics/shortfallRule';
import { SitesInputError } from './sitesInputError';

/** A site's fitted response, as yield gain over its own zero-rate check. */
export interface SiteGainCurve {
  site: string;
  /**
   * Predicted yield gain at a rate over the prediction at rate 0, ŷ(x) − ŷ(0).
   * @param rateKgHa - rate, kg/ha
   * @returns gain, kg/ha
   */
  gainKgHa: (rateKgHa: number) => number;
}

export interface PreparedRegionalReturn {
  /** Grid rates, kg/ha. */
  gridKgHa: Float64Array;
  sites: string[];
  /** gains[s][g]: site s's yield gain at grid rate g, kg/ha. */
  gains: Float64Array[];
  /** Mean gain over sites at each grid rate, kg/ha. */
  meanGainKgHa: Float64Array;
}

export interface RateDistribution {
  n: number;
  minKgHa: number;
  q1KgHa: number;
  medianKgHa: number;
  q3KgHa: number;
  maxKgHa: number;
}

export interface SiteGridOptimum {
  site: string;
  /** Grid rate with the highest return at this site, kg/ha. */
  rateKgHa: number;
  /** The return there, currency/ha. */
  returnPerHa: number;
}

export interface RegionalReturn {
  prices: Prices;
  /** Nutrient price / grain price, kg grain per kg nutrient. */
  priceRatio: number;
  gridKgHa: Float64Array;
  /** R̄ at each grid rate, currency/ha. */
  meanReturnPerHa: Float64Array;
  /** The rate with the highest mean return, kg/ha; NaN with no sites. */
  bestRateKgHa: number;
  bestMeanReturnPerHa: number;
  /** Mean yield gain over the checks at the best rate, kg/ha. */
  meanYieldGainAtBestKgHa: number;
  profitableRange: {
    /** Band below the best mean return, currency/ha. */
    bandPerHa: number;
    lowKgHa: number;
    highKgHa: number;
    /** False when some grid rate between low and high falls outside the band. */
    contiguous: boolean;
  };
  siteOptima: SiteGridOptimum[];
  /** Median and quartiles (Hyndman & Fan type 7) of the site optima. */
  siteOptimumDistribution: RateDistribution | null;
}

export interface RegionalReturnOptions {
  /**
   * Band below the best mean return, currency/ha; default the shortfall tolerance's default
   * (shared/economics/shortfallRule: the cost of 10 kg N/ha), so "profitable" and "falls short"
   * are one rule with one number.
   */
  bandPerHa?: number;
}

const TIE = 1e-9;

/**
 * Evaluates every site's gain on the grid once, for any number of prices later.
 * @param curves - one gain curve per site (gains in kg/ha)
 * @param gridKgHa - ascending rates, kg/ha (see rateGrid)
 * @returns the gain matrix and its mean over sites
 * @throws {SitesInputError} "bad-grid" for an empty grid
 * @example
 * prepareRegionalReturn([{ site: 'A', gainKgHa: (x) => 20 * x - 0.05 * x * x }], rateGrid(0, 200, 1))
 */
export function prepareRegionalReturn(
  curves: readonly SiteGainCurve[],
  gridKgHa: Float64Array,
): PreparedRegionalReturn {
  if (gridKgHa.length === 0) {
    throw new SitesInputError('bad-grid', 'prepareRegionalReturn: the rate grid has no points.');
  }
  const g = gridKgHa.length;
  const meanGainKgHa = new Float64Array(g);
  const gains = curves.map((c) => {
    const row = new Float64Array(g);
    for (let j = 0; j < g; j++) {
      row[j] = c.gainKgHa(gridKgHa[j]);
      meanGainKgHa[j] += row[j];
    }
    return row;
  });
  if (curves.length > 0) for (let j = 0; j < g; j++) meanGainKgHa[j] /= curves.length;
  return { gridKgHa, sites: curves.map((c) => c.site), gains, meanGainKgHa };
}

/**
 * Nutrient and application cost at each grid rate, currency/ha: p_N·x, plus the application
 * cost wherever any N is applied.
 * @example costOnGrid(Float64Array.of(0, 100), { grainPricePerKg: 0.2, nutrientPricePerKg: 1, applicationCostPerHa: 10 }) // [0, 110]
 */
export function costOnGrid(gridKgHa: Float64Array, prices: Prices): Float64Array {
  const cost = new Float64Array(gridKgHa.length);
  for (let j = 0; j < cost.length; j++) cost[j] = rateCostPerHa(prices, gridKgHa[j]);
  return cost;
}

/** Index of the largest value, the lowest index among values within TIE of it. */
export function argMaxLowest(values: ArrayLike<number>): number {
  let best = -Infinity;
  for (let j = 0; j < values.length; j++) if (values[j] > best) best = values[j];
  const tol = TIE * Math.max(1, Math.abs(best));
  for (let j = 0; j < values.length; j++) if (values[j] >= best - tol) return j;
  return 0;
}

/** The prices checked and the band in force, currency/ha. */
function checkedBand(prices: Prices, options: RegionalReturnOptions): number {
  assertPrices(prices);
  const bandPerHa = options.bandPerHa ?? toleranceInForce(null, prices);
  if (!(Number.isFinite(bandPerHa) && bandPerHa >= 0)) {
    throw new SitesInputError('bad-argument', `bandPerHa is ${bandPerHa}; it must be 0 or more.`);
  }
  return bandPerHa;
}

/**
 * The grid rates whose mean return lies within the band of the best (index `best`), as the
 * lowest and highest of them and whether every rate between them is in the band too.
 */
function bandAroundBest(
  meanReturnPerHa: ArrayLike<number>,
  gridKgHa: Float64Array,
  best: number,
  bandPerHa: number,
): { lowKgHa: number; highKgHa: number; contiguous: boolean } {
  const g = gridKgHa.length;
  const floor =
    meanReturnPerHa[best] - bandPerHa - TIE * Math.max(1, Math.abs(meanReturnPerHa[best]));
  let lo = -1;
  let hi = -1;
  for (let j = 0; j < g; j++) {
    if (meanReturnPerHa[j] >= floor) {
      if (lo < 0) lo = j;
      hi = j;
    }
  }
  let contiguous = true;
  for (let j = lo; j <= hi; j++) if (meanReturnPerHa[j] < floor) contiguous = false;
  return { lowKgHa: gridKgHa[lo], highKgHa: gridKgHa[hi], contiguous };
}

/** Mean returns of profitableRangeAtPrices, reused from call to call (grown when a grid is longer). */
let returnScratch = new Float64Array(0);

/**
 * The profitable range alone: what regionalReturnAtPrices gives as `profitableRange`, by the same
 * arithmetic, without the site optima or a new return curve. Each site's own range is asked at
 * every pricing, so this allocates nothing but the result.
 * @param prepared - from prepareRegionalReturn
 * @param prices - grain price (currency/kg grain), nutrient price (currency/kg N), optional
 *   application cost (currency/ha)
 * @param options - the profitable band, currency/ha (default 1 per acre)
 * @returns the band, its lowest and highest rate (kg/ha; NaN with no sites) and whether it has gaps
 * @throws as regionalReturnAtPrices
 * @example
 * profitableRangeAtPrices(prepared, prices).lowKgHa // the same as regionalReturnAtPrices(prepared, prices).profitableRange.lowKgHa
 */
export function profitableRangeAtPrices(
  prepared: PreparedRegionalReturn,
  prices: Prices,
  options: RegionalReturnOptions = {},
): RegionalReturn['profitableRange'] {
  const bandPerHa = checkedBand(prices, options);
  const { gridKgHa, meanGainKgHa } = prepared;
  const g = gridKgHa.length;
  if (prepared.gains.length === 0)
    return { bandPerHa, lowKgHa: NaN, highKgHa: NaN, contiguous: true };
  if (returnScratch.length < g) returnScratch = new Float64Array(g);
  const meanReturnPerHa = returnScratch.subarray(0, g);
  const pg = prices.grainPricePerKg;
  // The cost as costOnGrid has it, so the returns are the same doubles.
  for (let j = 0; j < g; j++)
    meanReturnPerHa[j] = pg * meanGainKgHa[j] - rateCostPerHa(prices, gridKgHa[j]);
  const best = argMaxLowest(meanReturnPerHa);
  return { bandPerHa, ...bandAroundBest(meanReturnPerHa, gridKgHa, best, bandPerHa) };
}

/**
 * Regional net return, best rate, profitable range and site optima at one set of prices.
 * @param prepared - from prepareRegionalReturn
 * @param prices - grain price (currency/kg grain), nutrient price (currency/kg N), optional
 *   application cost (currency/ha)
 * @param options - the profitable band, currency/ha (default the shortfall tolerance's default)
 * @returns the regional return curve and what it recommends
 * @throws {StatsInputError} "bad-argument" for a price that is not positive (shared/economics)
 * @throws {SitesInputError} "bad-argument" for a negative or non-finite band
 * @example
 * regionalReturnAtPrices(prepared, { grainPricePerKg: 0.2, nutrientPricePerKg: 1 }).bestRateKgHa // e.g. 150
 */
export function regionalReturnAtPrices(
  prepared: PreparedRegionalReturn,
  prices: Prices,
  options: RegionalReturnOptions = {},
): RegionalReturn {
  const bandPerHa = checkedBand(prices, options);
  const { gridKgHa, gains, meanGainKgHa, sites } = prepared;
  const { grainPricePerKg: pg, nutrientPricePerKg: pn } = prices;
  const g = gridKgHa.length;
  // Nutrient and application cost per grid rate, shared by every site.
  const cost = costOnGrid(gridKgHa, prices);
  const meanReturnPerHa = new Float64Array(g);
  for (let j = 0; j < g; j++) meanReturnPerHa[j] = pg * meanGainKgHa[j] - cost[j];

  const siteOptima: SiteGridOptimum[] = [];
  const row = new Float64Array(g);
  for (let s = 0; s < gains.length; s++) {
    const gain = gains[s];
    for (let j = 0; j < g; j++) row[j] = pg * gain[j] - cost[j];
    const k = argMaxLowest(row);
    siteOptima.push({ site: sites[s], rateKgHa: gridKgHa[k], returnPerHa: row[k] });
  }

  const empty = gains.length === 0;
  const best = empty ? -1 : argMaxLowest(meanReturnPerHa);
  const band = empty
    ? { lowKgHa: NaN, highKgHa: NaN, contiguous: true }
    : bandAroundBest(meanReturnPerHa, gridKgHa, best, bandPerHa);

  const sorted = Float64Array.from(siteOptima, (o) => o.rateKgHa).sort();
  return {
    prices: { ...prices },
    priceRatio: pn / pg,
    gridKgHa,
    meanReturnPerHa,
    bestRateKgHa: empty ? NaN : gridKgHa[best],
    bestMeanReturnPerHa: empty ? NaN : meanReturnPerHa[best],
    meanYieldGainAtBestKgHa: empty ? NaN : meanGainKgHa[best],
    profitableRange: { bandPerHa, ...band },
    siteOptima,
    siteOptimumDistribution: empty
      ? null
      : {
          n: sorted.length,
          minKgHa: sorted[0],
          q1KgHa: sortedQuantile(sorted, 0.25),
          medianKgHa: sortedQuantile(sorted, 0.5),
          q3KgHa: sortedQuantile(sorted, 0.75),
          maxKgHa: sorted[sorted.length - 1],
        },
  };
}
