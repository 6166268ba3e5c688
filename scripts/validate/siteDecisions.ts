// The analysis' decisions on simulated sites, beside each site's truth. Only the public
// analysis API is called (analyzeTrial, analysisSettings, priceTrial), with its defaults, so the
// figures measure the pipeline as the command line and the workspace run it.
import { analysisSettings, analyzeTrial, priceTrial } from '../../shared/analysis';
import { simulatedTrial, simulatedTruth, type TruthName } from '../../shared/demo/simulatedSite';
import type { OptimumStatus } from '../../shared/economics/economicOptimum';
import type { Prices } from '../../shared/economics/priceRatio';

/** What the analysis decided at one simulated site, and the truth to judge it by. */
export interface SiteDecision {
  site: string;
  truth: TruthName;
  /** The truth's economic optimum at the prices, kg/ha. */
  trueOptimumKgHa: number;
  /** The leading model's name, or null when the site has none. */
  leadModel: string | null;
  /** The leading model's optimum status, or null without a leading model. */
  status: OptimumStatus | null;
  /**
   * The recommended rate, kg/ha: the optimum's rate, or for "join-in-first-interval" (no single
   * rate) the top of its range; null when the site has no optimum at all.
   */
  recommendedKgHa: number | null;
  /** True when `recommendedKgHa` is the top of a "join-in-first-interval" range. */
  fromRangeTop: boolean;
  /** The leading model's bootstrap interval of the optimum, kg/ha; null when there is none. */
  ciKgHa: [number, number] | null;
  /** The interval's level, e.g. 0.9 (the analysis default). */
  intervalLevel: number;
  /**
   * The profile interval of each plateau model's join (the analysis' joinProfiles, at the same
   * level), kg/ha; null where that model reports no join.
   */
  joinProfileKgHa: Record<'linearPlateau' | 'quadraticPlateau', [number, number] | null>;
  /** Whether the gain-over-check test could be made at this site. */
  gainTested: boolean;
  /** The gain-over-check test of a gain at rate zero rejects (at the analysis' alpha). */
  gainAtZeroFound: boolean;
  /** The gain-over-check test of a bend rejects: the gains bend away from a straight line. */
  gainsBend: boolean;
  /** The rate effect (rate as a factor, with blocks) is significant at the analysis' alpha. */
  responded: boolean;
}

export interface SimulatedRun {
  decisions: SiteDecision[];
  /** The regional rate of all the table's sites at the prices, kg/ha. */
  regionalRateKgHa: number;
  /** The regional rate's interval from resampling site-years, kg/ha; null without one. */
  regionalIntervalKgHa: [number, number] | null;
}

/** An interval's two ends, or null. */
function ends(interval: { lowKgHa: number; highKgHa: number } | null): [number, number] | null {
  return interval ? [interval.lowKgHa, interval.highKgHa] : null;
}

/**
 * Simulates one table of sites, runs the analysis with its default settings (200 resamples,
 * 90 % interval) and prices it.
 * @param truths - each site's truth, in table order
 * @param seed - seed of the simulated plots and of the analysis' resamples
 * @param prices - canonical prices (no application cost: the truths' optima assume none)
 * @returns each site's decisions beside its truth, and the table's regional rate
 * @example
 * simulateAndAnalyze(['flat', 'exponential'], 1, illustrativePrices('corn').canonical).decisions[0].recommendedKgHa // e.g. 0
 */
export function simulateAndAnalyze(
  truths: readonly TruthName[],
  seed: number,
  prices: Prices,
): SimulatedRun {
  if ((prices.applicationCostPerHa ?? 0) !== 0) {
    throw new Error('The truths’ closed-form optima assume no application cost.');
  }
  const priceRatio = prices.nutrientPricePerKg / prices.grainPricePerKg;
  const sim = simulatedTrial({ truths, seed });
  const analysis = analyzeTrial(sim.table, analysisSettings({ prices, seed }));
  const priced = priceTrial(analysis, prices, {});
  const level = analysis.settings.intervalLevel;
  const bySite = new Map(analysis.across.sites.map((s) => [s.site, s]));
  const pricedBySite = new Map(priced.sites.map((s) => [s.site, s]));
  const decisions = sim.sites.map(({ site, truth }): SiteDecision => {
    const analyzed = bySite.get(site);
    const p = pricedBySite.get(site);
    if (!analyzed || !p) throw new Error(`The analysis lost the simulated site ${site}.`);
    const optimum = p.optimum;
    const fromRangeTop = optimum?.status === 'join-in-first-interval' && optimum.rangeKgHa !== null;
    const recommendedKgHa = fromRangeTop ? optimum!.rangeKgHa![1] : (optimum?.rateKgHa ?? null);
    const gain = analyzed.responseOverCheck;
    const gainTested = !('problem' in gain);
    return {
      site,
      truth,
      trueOptimumKgHa: simulatedTruth(truth).optimumKgHa(priceRatio),
      leadModel: p.lead.model,
      status: optimum?.status ?? null,
      recommendedKgHa,
      fromRangeTop,
      ciKgHa: p.interval?.ciKgHa ?? null,
      intervalLevel: level,
      joinProfileKgHa: {
        linearPlateau: ends(analyzed.joinProfiles.linearPlateau ?? null),
        quadraticPlateau: ends(analyzed.joinProfiles.quadraticPlateau ?? null),
      },
      gainTested,
      gainAtZeroFound: gainTested && gain.gainAtZeroPresent,
      gainsBend: gainTested && gain.bends,
      responded: analyzed.responded,
    };
  });
  const interval = priced.across.regional.rateInterval;
  return {
    decisions,
    regionalRateKgHa: priced.across.regional.regional.bestRateKgHa,
    regionalIntervalKgHa: interval ? [interval.lowKgHa, interval.highKgHa] : null,
  };
}
