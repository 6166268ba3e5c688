/**
 * The regional rate's risk between sites: for each candidate rate (the rates tested at the
 * sites and the regional rate), the share of the sites at which that rate returns less than the
 * site's own best rate by more than the tolerance, both read from the site's fitted gain curve
 * (the one the regional rate averages, regionalCurves):
 *
 *   R_s(x) = p_grain · gain_s(x) − p_N · x − A·[x > 0],
 *   short at s when max_grid R_s − R_s(x) > tolerance      (currency/ha)
 *
 * with the site's best on the regional rate grid (RegionalReturn.siteOptima). This is a
 * between-site risk: it says how often one rate for all sites leaves a site clearly below what
 * its own curve would have paid, not how sure any one site's curve is (that is the site's own
 * shortfall risk from its resamples, shared/economics/shortfallRisk). The comparison itself is
 * shareFallingShort, the same as the sites'.
 */
import { rateCostPerHa } from '../economics/priceRatio';
import { candidateRates, shareFallingShort, type ShortfallRisk } from '../economics/shortfallRule';
import type { PreparedRegionalReturn, RegionalReturn } from './regionalReturn';

/**
 * The share of sites at which each candidate rate falls short of the site's best.
 * @param prepared - the regional grid's gains (RegionalAnalysis.prepared)
 * @param atTested - the same sites' gains at the tested rates (RegionalAnalysis.atTestedRates)
 * @param regional - the regional return at these prices (its best rate and site optima)
 * @param tolerancePerHa - currency/ha
 * @returns one row per candidate rate; null with no site
 * @example
 * regionalShortfallRisk(r.prepared, r.atTestedRates, r.regional, 12)!.rows
 * // e.g. [{ rateKgHa: 0, share: 1 }, …, { rateKgHa: 152, share: 0.17 }, …]
 */
export function regionalShortfallRisk(
  prepared: PreparedRegionalReturn,
  atTested: PreparedRegionalReturn,
  regional: RegionalReturn,
  tolerancePerHa: number,
): ShortfallRisk | null {
  const sites = regional.siteOptima.length;
  if (sites === 0 || atTested.sites.length !== sites) return null;
  const tested = atTested.gridKgHa;
  const bestIndex = regional.gridKgHa.indexOf(regional.bestRateKgHa);
  const rates = candidateRates(Array.from(tested), bestIndex >= 0 ? regional.bestRateKgHa : null);
  // Each candidate's gains: at a tested rate from atTested, at the regional rate from the grid.
  const columns = rates.map((x) => {
    const k = tested.indexOf(x);
    return k >= 0 ? atTested.gains.map((g) => g[k]) : prepared.gains.map((g) => g[bestIndex]);
  });
  const pg = regional.prices.grainPricePerKg;
  const r = rates.length;
  const best = Float64Array.from(regional.siteOptima, (o) => o.returnPerHa);
  const returns = new Float64Array(sites * r);
  for (let s = 0; s < sites; s++) {
    for (let j = 0; j < r; j++)
      returns[s * r + j] = pg * columns[j][s] - rateCostPerHa(regional.prices, rates[j]);
  }
  const shares = shareFallingShort(best, returns, r, tolerancePerHa);
  return {
    tolerancePerHa,
    count: sites,
    rows: rates.map((rateKgHa, j) => ({ rateKgHa, share: shares[j] })),
  };
}
