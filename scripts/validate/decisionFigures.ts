// How good the analysis' decisions are on simulated sites of one truth, and on simulated regions:
// interval coverage, bias and RMSE of the recommended rate, the edge cases' shares, the
// gain-over-check test's rejection rate, the share that responded, and the regional rate's error
// against the true regional optimum. Plain arithmetic over SiteDecision records.
import {
  SIMULATED_RATES_KG_HA,
  simulatedTruth,
  type TruthName,
} from '../../shared/demo/simulatedSite';
import type { SiteDecision } from './siteDecisions';

/** A count out of a total and its share. */
export interface Share {
  count: number;
  of: number;
  /** count / of; NaN when `of` is 0. */
  share: number;
  /** Binomial standard error √(p(1 − p)/n) of the share. */
  standardError: number;
}

/** A count out of a total as a Share, with its binomial standard error. */
export function share(count: number, of: number): Share {
  const p = of > 0 ? count / of : NaN;
  return { count, of, share: p, standardError: of > 0 ? Math.sqrt((p * (1 - p)) / of) : NaN };
}

export interface TruthFigures {
  truth: TruthName;
  description: string;
  sites: number;
  trueOptimumKgHa: number;
  intervalLevel: number;
  /** Sites whose interval holds the true optimum, out of all sites (no interval: not covering). */
  coverage: Share;
  /** Sites without an interval (no leading model, no draws, or no resample gave a rate). */
  withoutInterval: number;
  /**
   * For a truth with a join (linear-plateau, quadratic-plateau): the same model's join profile
   * interval, the share of sites whose interval holds the true join (no interval: not
   * covering) and the sites without one (the fit reported no join); null for the other truths.
   */
  join: {
    model: JoinModelName;
    trueJoinKgHa: number;
    coverage: Share;
    /** The same among the sites whose fit reported a join. */
    coverageWhereJoined: Share;
    withoutInterval: number;
  } | null;
  /** Recommended rate minus the true optimum, over the sites with a rate. */
  rate: {
    rated: number;
    /** Sites with no optimum at all (left out of bias and RMSE). */
    unrated: number;
    /** Sites whose rate is the top of a "join-in-first-interval" range. */
    fromRangeTop: number;
    meanKgHa: number;
    meanBiasKgHa: number;
    rmseKgHa: number;
  };
  /** Sites recommended a rate above 0 (unrated sites count as not). */
  aboveZero: Share;
  /** Sites recommended more than the second-lowest tested rate (40 kg/ha). */
  aboveSecondLowest: Share;
  /** Sites where the gain-over-check test finds a gain at rate zero, out of those tested. */
  gainAtZeroFound: Share;
  /** Sites where the gain-over-check test finds the gains bend, out of those tested. */
  gainsBend: Share;
  /** Sites whose rate effect is significant. */
  responded: Share;
  /** The leading models and how many sites each led. */
  leadModels: Record<string, number>;
}

/** The plateau models whose join has a profile interval. */
type JoinModelName = keyof SiteDecision['joinProfileKgHa'];

/** The model fitted to judge a truth's join: the truth's own curve. */
const JOIN_MODEL_OF_TRUTH: Partial<Record<TruthName, JoinModelName>> = {
  'linear-plateau': 'linearPlateau',
  'quadratic-plateau': 'quadraticPlateau',
};

/** The join's coverage on one truth's sites, or null for a truth without a join. */
function joinFigures(truth: TruthName, mine: readonly SiteDecision[]): TruthFigures['join'] {
  const model = JOIN_MODEL_OF_TRUTH[truth];
  const trueJoinKgHa = simulatedTruth(truth).joinKgHa;
  if (!model || trueJoinKgHa === null) return null;
  const intervals = mine.map((d) => d.joinProfileKgHa[model]);
  const covered = intervals.filter(
    (i) => i !== null && i[0] <= trueJoinKgHa && trueJoinKgHa <= i[1],
  );
  const withoutInterval = intervals.filter((i) => i === null).length;
  return {
    model,
    trueJoinKgHa,
    coverage: share(covered.length, mine.length),
    coverageWhereJoined: share(covered.length, mine.length - withoutInterval),
    withoutInterval,
  };
}

/** The second-lowest tested rate of every simulated site, kg/ha. */
export const SECOND_LOWEST_RATE_KG_HA = [...SIMULATED_RATES_KG_HA].sort((a, b) => a - b)[1];

/**
 * The figures of one truth's sites.
 * @param truth - the truth every decision was simulated from
 * @param decisions - the sites' decisions (simulateAndAnalyze)
 * @returns coverage, rate error, edge-case shares, test rejection and response shares
 * @example
 * truthFigures('flat', run.decisions).aboveZero.share // e.g. 0.01
 */
export function truthFigures(truth: TruthName, decisions: readonly SiteDecision[]): TruthFigures {
  const mine = decisions.filter((d) => d.truth === truth);
  if (mine.length === 0) throw new Error(`No simulated site of the ${truth} truth.`);
  const trueOptimumKgHa = mine[0].trueOptimumKgHa;
  const covered = mine.filter(
    (d) =>
      d.ciKgHa !== null && d.ciKgHa[0] <= d.trueOptimumKgHa && d.trueOptimumKgHa <= d.ciKgHa[1],
  ).length;
  const rated = mine.filter((d) => d.recommendedKgHa !== null);
  const errors = rated.map((d) => d.recommendedKgHa! - d.trueOptimumKgHa);
  const mean = (xs: number[]) => (xs.length ? xs.reduce((s, x) => s + x, 0) / xs.length : NaN);
  const tested = mine.filter((d) => d.gainTested);
  const leadModels: Record<string, number> = {};
  for (const d of mine) {
    const key = d.leadModel ?? 'none';
    leadModels[key] = (leadModels[key] ?? 0) + 1;
  }
  return {
    truth,
    description: simulatedTruth(truth).description,
    sites: mine.length,
    trueOptimumKgHa,
    intervalLevel: mine[0].intervalLevel,
    coverage: share(covered, mine.length),
    withoutInterval: mine.filter((d) => d.ciKgHa === null).length,
    join: joinFigures(truth, mine),
    rate: {
      rated: rated.length,
      unrated: mine.length - rated.length,
      fromRangeTop: mine.filter((d) => d.fromRangeTop).length,
      meanKgHa: mean(rated.map((d) => d.recommendedKgHa!)),
      meanBiasKgHa: mean(errors),
      rmseKgHa: Math.sqrt(mean(errors.map((e) => e * e))),
    },
    aboveZero: share(mine.filter((d) => (d.recommendedKgHa ?? 0) > 0).length, mine.length),
    aboveSecondLowest: share(
      mine.filter((d) => (d.recommendedKgHa ?? 0) > SECOND_LOWEST_RATE_KG_HA).length,
      mine.length,
    ),
    gainAtZeroFound: share(tested.filter((d) => d.gainAtZeroFound).length, tested.length),
    gainsBend: share(tested.filter((d) => d.gainsBend).length, tested.length),
    responded: share(mine.filter((d) => d.responded).length, mine.length),
    leadModels,
  };
}

/** The gain-over-check tests on sites whose gains lie on a straight line through the origin. */
export interface GainNullFigures {
  truth: TruthName;
  description: string;
  sites: number;
  /** The gain-at-rate-zero test's rejections: its Type I error. */
  gainAtZeroFound: Share;
  /** The bend test's rejections: its Type I error. */
  gainsBend: Share;
}

/**
 * The gain-over-check tests' rejection rates on one truth whose nulls hold (STRAIGHT_GAIN_TRUTHS).
 * @param truth - the truth every decision was simulated from
 * @param decisions - the sites' decisions (simulateAndAnalyze)
 * @returns the two tests' rejection shares among the sites tested
 * @example
 * gainNullFigures('straight-line', run.decisions).gainAtZeroFound.share // e.g. 0.03
 */
export function gainNullFigures(
  truth: TruthName,
  decisions: readonly SiteDecision[],
): GainNullFigures {
  const tested = decisions.filter((d) => d.truth === truth && d.gainTested);
  if (tested.length === 0) throw new Error(`No tested site of the ${truth} truth.`);
  return {
    truth,
    description: simulatedTruth(truth).description,
    sites: tested.length,
    gainAtZeroFound: share(tested.filter((d) => d.gainAtZeroFound).length, tested.length),
    gainsBend: share(tested.filter((d) => d.gainsBend).length, tested.length),
  };
}

/** One simulated region: its sites' truths, its regional rate and the true regional optimum. */
export interface RegionOutcome {
  truths: TruthName[];
  regionalRateKgHa: number;
  trueRegionalOptimumKgHa: number;
  /** The regional rate's interval from resampling site-years, kg/ha; null without one. */
  intervalKgHa: [number, number] | null;
  /**
   * The population's regional optimum: the five truths in equal shares, from which every region
   * draws its sites. Resampling site-years estimates the spread around this one, not around the
   * optimum of the region's own twelve sites.
   */
  populationOptimumKgHa: number;
}

/**
 * The true regional optimum of a set of sites: the rate of a 1 kg/ha grid from 0 to the highest
 * tested rate that maximizes the mean true net return over the sites' checks,
 * mean_s (y_s(x) − y_s(0)) − PR·x (in kg grain/ha; multiplying by the grain price changes no
 * maximizer). Ties within 1e-9 (relative) take the lowest rate, as the analysis' grid does.
 * @param truths - the sites' truths
 * @param priceRatio - nutrient price / grain price, kg grain per kg N
 * @returns the rate, kg/ha
 * @example
 * trueRegionalOptimumKgHa(['flat', 'flat'], 7) // 0
 */
export function trueRegionalOptimumKgHa(truths: readonly TruthName[], priceRatio: number): number {
  const curves = truths.map((t) => simulatedTruth(t));
  const top = Math.max(...SIMULATED_RATES_KG_HA);
  // At rate 0 every gain is 0, so the return there is 0: the first best.
  let best = 0;
  let bestRate = 0;
  for (let x = 1; x <= top; x++) {
    let sum = 0;
    for (const c of curves) sum += c.yieldKgHa(x) - c.yieldKgHa(0);
    const r = sum / curves.length - priceRatio * x;
    if (r > best + 1e-9 * Math.max(1, Math.abs(best))) {
      best = r;
      bestRate = x;
    }
  }
  return bestRate;
}

export interface RegionFigures {
  regions: number;
  sitesPerRegion: number;
  /** Mean of (regional rate − true regional optimum), kg/ha. */
  meanBiasKgHa: number;
  rmseKgHa: number;
  meanTrueOptimumKgHa: number;
  meanRegionalRateKgHa: number;
  /** Share of regions whose site-year interval holds the population's regional optimum. */
  intervalCoverage: number;
  /** Regions with an interval. */
  intervalRegions: number;
  meanIntervalWidthKgHa: number;
  populationOptimumKgHa: number;
}

/**
 * The regional rate's error over simulated regions.
 * @param regions - each region's regional rate and true optimum
 * @returns mean bias and RMSE, kg/ha
 * @example
 * regionFigures(outcomes).meanBiasKgHa // e.g. −2
 */
export function regionFigures(regions: readonly RegionOutcome[]): RegionFigures {
  const n = regions.length;
  const errors = regions.map((r) => r.regionalRateKgHa - r.trueRegionalOptimumKgHa);
  const sum = (xs: number[]) => xs.reduce((s, x) => s + x, 0);
  const withInterval = regions.filter((r) => r.intervalKgHa !== null);
  return {
    regions: n,
    sitesPerRegion: n > 0 ? regions[0].truths.length : 0,
    meanBiasKgHa: sum(errors) / n,
    rmseKgHa: Math.sqrt(sum(errors.map((e) => e * e)) / n),
    meanTrueOptimumKgHa: sum(regions.map((r) => r.trueRegionalOptimumKgHa)) / n,
    meanRegionalRateKgHa: sum(regions.map((r) => r.regionalRateKgHa)) / n,
    intervalCoverage:
      withInterval.filter(
        (r) =>
          r.intervalKgHa![0] <= r.populationOptimumKgHa &&
          r.populationOptimumKgHa <= r.intervalKgHa![1],
      ).length / withInterval.length,
    intervalRegions: withInterval.length,
    meanIntervalWidthKgHa:
      sum(withInterval.map((r) => r.intervalKgHa![1] - r.intervalKgHa![0])) / withInterval.length,
    populationOptimumKgHa: n > 0 ? regions[0].populationOptimumKgHa : NaN,
  };
}
