/**
 * What an analysis is made with, and the one set of defaults the command line
 * and the workspace share, so the same file gives the same numbers in both:
 * canonical prices, block terms, bootstrap size, seed and level, the user's
 * model per site. How numbers are shown (units, locale, paper) is not here:
 * that is the report's display part.
 */
import type { Prices } from '../economics/priceRatio';
import type { ModelName } from '../models/modelTypes';

/** Block terms of the fits: "auto" puts block offsets in wherever the site's plots all carry a block label. */
export type BlockChoice = 'auto' | 'none';

export interface AnalysisSettings {
  /**
   * Canonical prices the analysis is first priced at: currency per kg grain (standard moisture),
   * per kg N, per ha application. priceTrial re-prices without refitting.
   */
  prices: Prices;
  blocks: BlockChoice;
  /** Bootstrap resamples for the optimum's interval (0: no interval). */
  resamples: number;
  /** Seed of the run; each site's generator is seeded from it by bootstrapSeed. */
  seed: number;
  /** Level of the optimum's interval, e.g. 0.9. */
  intervalLevel: number;
  /** Site → the model the user picked to lead it (leadingModel); others lead with the rule's model. */
  siteModels: Readonly<Record<string, ModelName>>;
}

/** Defaults of everything but prices (which the caller always gives: see illustrativePrices). */
export const ANALYSIS_DEFAULTS: Omit<AnalysisSettings, 'prices'> = {
  blocks: 'auto',
  resamples: 200,
  seed: 1,
  intervalLevel: 0.9,
  siteModels: {},
};

/** Points on each fitted curve kept for charts and files (smooth at report sizes). */
export const CURVE_POINTS = 81;

/**
 * Settings with the defaults filled in.
 * @param given - prices and any setting to change
 * @returns complete settings
 * @example
 * analysisSettings({ prices }).resamples // 200
 */
export function analysisSettings(
  given: Partial<AnalysisSettings> & Pick<AnalysisSettings, 'prices'>,
): AnalysisSettings {
  return { ...ANALYSIS_DEFAULTS, ...given, siteModels: { ...(given.siteModels ?? {}) } };
}

/**
 * The generator seed of one site: derived from the run's seed and the site's place in the
 * table, so a site's interval does not depend on the sites analyzed before it.
 * @param runSeed - the run's seed
 * @param siteIndex - the site's 0-based position in the table's site order
 * @returns an unsigned 32-bit seed
 * @example
 * bootstrapSeed(1, 2) // 15839
 */
export function bootstrapSeed(runSeed: number, siteIndex: number): number {
  // 7919 (a prime) spreads neighboring sites' seeds apart.
  return (runSeed + siteIndex * 7919) >>> 0;
}
