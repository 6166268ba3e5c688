/**
 * The regional rate of a set of analyzed sites: each site's gain curve (regionalCurves) on one
 * rate grid that, by default, ends at the lowest of the sites' highest tested rates, so no
 * site curve is extended past its data; the mean return at the settings' prices; the sentence
 * and cautions shown with it; the regional rate at multiples of the price ratio
 * (priceRatioSensitivity) and the share of sites each candidate rate leaves clearly short of
 * their own best (regionalShortfallRisk). regionalAtPrices makes every priced part, here and
 * when repriceAcrossSites follows a new price.
 */
import { keptOnFirstRead } from './keptOnFirstRead';
import { priceRatioSensitivity, type RatioMultiple } from '../economics/priceRatioSensitivity';
import type { Prices } from '../economics/priceRatio';
import { candidateRates, toleranceInForce, type ShortfallRisk } from '../economics/shortfallRule';
import type { ModelName } from '../models/modelTypes';
import type { SiteAnalysis } from './analyzeSite';
import type { SiteLeftOut } from './commonResponseTests';
import type { AcrossSiteSettings } from './planAcrossSites';
import { rateGrid } from './rateGrid';
import { regionalCurves } from './regionalCurves';
import {
  prepareRegionalReturn,
  regionalReturnAtPrices,
  type PreparedRegionalReturn,
  type RegionalReturn,
  type SiteGainCurve,
} from './regionalReturn';
import { regionalRecommendation, type RegionalRecommendationText } from './regionalRecommendation';
import { regionalShortfallRisk } from './regionalShortfallRisk';
import {
  regionalRateInterval,
  resampleRegionalGains,
  type RegionalRateInterval,
  type ResampledRegionalGains,
} from './regionalRateInterval';

/** The regional rate of a set of sites and what stands behind it. */
export interface RegionalAnalysis {
  regional: RegionalReturn;
  text: RegionalRecommendationText;
  /** The site and the model it contributes. */
  sitesUsed: { site: string; model: ModelName; note: string }[];
  sitesLeftOut: SiteLeftOut[];
  /** Where the rate grid ends and why, e.g. "… 225 kg/ha, the highest rate tested at every site …". */
  gridNote: string;
  /** Price-free part, for repricing. */
  prepared: PreparedRegionalReturn;
  /** The site-years resampled (price-free), or null without resamples or with one site-year. */
  resampled: ResampledRegionalGains | null;
  /**
   * The regional rate's interval from resampling site-years and each candidate rate's share of
   * resamples within the tolerance of their best (regionalRateInterval); null without resamples.
   */
  rateInterval: RegionalRateInterval | null;
  /** The same sites' gains at the rates tested at them (within the grid), price-free. */
  atTestedRates: PreparedRegionalReturn;
  /**
   * The regional rate and profitable range at the price ratio scaled by 0.5, 0.75, 1, 1.5 and
   * 2 (the nitrogen price scaled, the grain price kept).
   */
  priceRatioSensitivity: RegionalSensitivityRow[];
  /**
   * For the tested rates and the regional rate: the share of sites at which the rate returns
   * less than the site's own best by more than the tolerance (a between-site risk); null with
   * no site.
   */
  shortfallRisk: ShortfallRisk | null;
}

/** The regional rate at one multiple of the price ratio. */
export interface RegionalSensitivityRow extends RatioMultiple {
  /** The regional rate at this ratio, kg/ha (NaN with no site). */
  rateKgHa: number;
  /** Rates within the band of the best mean return at this ratio, kg/ha. */
  profitableRangeKgHa: [number, number];
}

/** Every part of a regional analysis that depends on prices. */
export type RegionalAtPrices = Pick<
  RegionalAnalysis,
  'regional' | 'text' | 'priceRatioSensitivity' | 'shortfallRisk' | 'rateInterval'
>;

/**
 * The priced parts of a regional analysis: the regional return and its sentence, its
 * price-ratio table, its shortfall risk and its rate interval (the last three computed when
 * first read: copy the result with its property descriptors, not a spread, to keep them so).
 * @param r - the price-free parts (grid gains, gains at the tested rates, resampled site-years)
 * @param prices - canonical prices
 * @param tolerancePerHa - the tolerance, currency/ha: the profitable range's band below the best
 *   return and the shortfall risk's limit (one rule, shared/economics/shortfallRule)
 * @returns the priced parts
 * @throws {StatsInputError} "bad-argument" for a price that is not positive
 */
export function regionalAtPrices(
  r: Pick<RegionalAnalysis, 'prepared' | 'atTestedRates'> & {
    resampled?: ResampledRegionalGains | null;
  },
  prices: Prices,
  tolerancePerHa: number,
): RegionalAtPrices {
  const bandPerHa = tolerancePerHa;
  const regional = regionalReturnAtPrices(r.prepared, prices, { bandPerHa });
  const priced: RegionalAtPrices = {
    regional,
    text: regionalRecommendation(regional),
    priceRatioSensitivity: [],
    shortfallRisk: null,
    rateInterval: null,
  };
  // Made when first read: the price-ratio table re-prices the regional return four more times,
  // the risk reads every site at every tested rate, and the interval prices every resample at
  // every candidate rate. Together most of a new price's regional cost (the interval alone 85
  // of the demo's 110 ms of first pricing in chromium), and only the all-sites step, the report
  // and the files show them.
  keptOnFirstRead(priced, 'priceRatioSensitivity', () =>
    priceRatioSensitivity(prices, (scaled, m) => {
      const at = m === 1 ? regional : regionalReturnAtPrices(r.prepared, scaled, { bandPerHa });
      const range = at.profitableRange;
      return {
        rateKgHa: at.bestRateKgHa,
        profitableRangeKgHa: [range.lowKgHa, range.highKgHa] as [number, number],
      };
    }),
  );
  keptOnFirstRead(priced, 'shortfallRisk', () =>
    regionalShortfallRisk(r.prepared, r.atTestedRates, regional, tolerancePerHa),
  );
  const { resampled } = r;
  keptOnFirstRead(priced, 'rateInterval', () =>
    resampled && Number.isFinite(regional.bestRateKgHa)
      ? regionalRateInterval(
          resampled,
          prices,
          tolerancePerHa,
          candidateRates(Array.from(r.atTestedRates.gridKgHa), regional.bestRateKgHa),
        )
      : null,
  );
  return priced;
}

/**
 * The regional rate of a set of analyzed sites at the settings' prices, models and grid.
 * @param sites - the sites' analyses
 * @param o - the analysis settings (prices, regional model, site models, grid, band)
 * @returns the regional return, its sentence and cautions, sites used and left out
 */
export function regionalAnalysis(
  sites: readonly SiteAnalysis[],
  o: AcrossSiteSettings,
): RegionalAnalysis {
  const { used, leftOut } = regionalCurves(sites, o.regionalModel, o.siteModels);
  const top =
    o.gridToKgHa ??
    (used.length > 0
      ? Math.min(...used.map((u) => u.fit.testedRates.highestKgHa))
      : o.gridFromKgHa);
  const grid = rateGrid(o.gridFromKgHa, Math.max(top, o.gridFromKgHa), o.gridStepKgHa);
  const curves: SiteGainCurve[] = used.map((u) => ({ site: u.site, gainKgHa: u.gainKgHa }));
  const sitesUsed = used.map((u) => {
    const beyond = u.fit.testedRates.highestKgHa < grid[grid.length - 1];
    const extra = beyond
      ? `the grid runs past the site's highest tested rate (${u.fit.testedRates.highestKgHa} kg/ha)`
      : '';
    return { site: u.site, model: u.model, note: [u.note, extra].filter((t) => t).join('; ') };
  });
  const end = grid[grid.length - 1];
  const lowest = used.filter((u) => u.fit.testedRates.highestKgHa === top).map((u) => u.site);
  const gridNote =
    o.gridToKgHa !== null
      ? `The rate grid runs from ${o.gridFromKgHa} to ${end} kg/ha in steps of ${o.gridStepKgHa} kg/ha, as chosen.`
      : `The rate grid runs from ${o.gridFromKgHa} to ${end} kg/ha in steps of ${o.gridStepKgHa} kg/ha: ${end} kg/ha is the highest rate tested at every site` +
        (lowest.length > 0 && lowest.length < used.length
          ? ` (${lowest.join(', ')} stopped there)`
          : '') +
        ', so no site curve is extended past its data.';
  const prepared = prepareRegionalReturn(curves, grid);
  const tested = candidateRates(
    used.flatMap((u) => u.fit.testedRates.distinctKgHa.filter((x) => x >= grid[0] && x <= end)),
    null,
  );
  const atTestedRates = prepareRegionalReturn(
    curves,
    tested.length > 0 ? Float64Array.from(tested) : Float64Array.of(grid[0]),
  );
  const tolerance = toleranceInForce(o.shortfallTolerancePerHa, o.prices);
  const resampled = resampleRegionalGains(prepared, o.resamples, o.seed, o.intervalLevel);
  return {
    ...regionalAtPrices({ prepared, atTestedRates, resampled }, o.prices, tolerance),
    resampled,
    sitesUsed,
    sitesLeftOut: leftOut,
    gridNote,
    prepared,
    atTestedRates,
  };
}
