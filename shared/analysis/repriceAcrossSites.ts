/**
 * The across-site result at new prices without refitting: the side-by-side
 * rows' optima come from the stored parameters (shared/economics
 * economicOptimum, closed forms) and the regional curves from the stored yield
 * gains (regionalReturnAtPrices), so the cost is a few operations per site and
 * grid rate, fast enough to follow a price slider (bench/sites.bench.ts).
 */
import type { Prices } from '../economics/priceRatio';
import type { AcrossSiteAnalysis } from './acrossSites';
import { toleranceInForce } from '../economics/shortfallRule';
import { regionalAtPrices, type RegionalAnalysis } from './regionalAnalysis';
import { keptOnFirstRead } from './keptOnFirstRead';
import { siteModelRows } from './siteModelRows';

export interface RepriceOptions {
  /**
   * Re-price the side-by-side rows too (default true). A slider that shows only the regional
   * curve can pass false and re-price the rows when it stops: the rows cost one
   * economicOptimum per site and model, most of the time at hundreds of sites.
   */
  rows?: boolean;
  /**
   * The tolerance (shortfall risk and profitable range), currency/ha; default the analysis'
   * setting, else the cost of 10 kg N/ha at the new prices.
   */
  shortfallTolerancePerHa?: number | null;
}

/** The regional analysis at new prices; copied by descriptors, so a part made when first read stays so. */
function reprice(r: RegionalAnalysis, prices: Prices, tolerancePerHa: number): RegionalAnalysis {
  return Object.defineProperties(
    {},
    {
      ...Object.getOwnPropertyDescriptors(r),
      ...Object.getOwnPropertyDescriptors(regionalAtPrices(r, prices, tolerancePerHa)),
    },
  ) as RegionalAnalysis;
}

/**
 * The same analysis at other prices; the fits and tests are shared, not copied.
 * @param analysis - from analyzeAcrossSites
 * @param prices - grain and nutrient price (currency/kg), optional application cost (currency/ha)
 * @param options - a new tolerance (currency/ha); rows or not
 * @returns a new analysis with rows (unless rows: false, when the old rows are kept), regional
 *   rates and group regional rates at these prices
 * @throws {StatsInputError} "bad-argument" for a price that is not positive
 * @throws {StatsInputError} "bad-argument" for a negative tolerance
 * @example
 * const dearer = repriceAcrossSites(a, { grainPricePerKg: 0.18, nutrientPricePerKg: 1.4 });
 * dearer.regional.regional.bestRateKgHa // lower than at 1.1 per kg N
 */
export function repriceAcrossSites(
  analysis: AcrossSiteAnalysis,
  prices: Prices,
  options: RepriceOptions = {},
): AcrossSiteAnalysis {
  const given = options.shortfallTolerancePerHa ?? analysis.options.shortfallTolerancePerHa;
  const tolerance = toleranceInForce(given, prices);
  const regional = reprice(analysis.regional, prices, tolerance);
  const repriced: AcrossSiteAnalysis = {
    ...analysis,
    options: {
      ...analysis.options,
      prices: { ...prices },
      shortfallTolerancePerHa: given,
    },
    regional,
    rows: analysis.rows,
    groups: analysis.groups.map((g) => ({
      ...g,
      values: g.values.map((v) => ({
        ...v,
        regional: reprice(v.regional, prices, tolerance),
      })),
    })),
  };
  // Made when first read: a row per site and model is an economic optimum each (8 of the 24 ms
  // a new price cost at 500 sites in chromium), and only the reports and files list them.
  if (options.rows !== false) {
    keptOnFirstRead(repriced, 'rows', () =>
      analysis.sites.flatMap((s) => siteModelRows(s, prices)),
    );
  }
  return repriced;
}
