/**
 * An analysis at a set of prices and the user's model picks, without refitting
 * or resampling: each site's leading model (leadingModel), its optimum by the
 * closed forms of shared/economics, its interval from the stored bootstrap
 * draws, its profitable range on the fitted curve, how its recommendation moves
 * with the price ratio (priceRatioSensitivity) and the risk of each candidate rate
 * (shortfallRisk), and the across-site rows and regional rate (chooseSiteModels,
 * repriceAcrossSites); one site's part is priceSite (shared/analysis/priceSite.ts), each
 * treatment level's priceLevels. Every view (screen, workbook, grower page, JSON,
 * command-line summary) reads this one value.
 */
import { assertPrices, priceRatio, type Prices } from '../economics/priceRatio';
import { toleranceInForce } from '../economics/shortfallRule';
import { mixedModelOptimum, type MixedModelOptimum } from '../economics/mixedModelOptimum';
import { plateauMixedModelOptimum } from '../economics/plateauMixedModelOptimum';
import type { ModelName } from '../models/modelTypes';
import type { AcrossSiteAnalysis } from './acrossSites';
import type { TrialAnalysis } from './analyzeTrial';
import { chooseSiteModels } from './chooseSiteModels';
import { priceLevelMixedModels, type PricedLevelMixedModel } from './priceLevelMixedModel';
import { priceTrialLevels, type PricedSiteLevels } from './priceLevels';
import { priceSite, type PricedSite } from './priceSite';
import { repriceAcrossSites } from './repriceAcrossSites';

export type { SiteLead } from './siteDecision';
export { priceSite, siteLead, type PricedSite, type SiteSensitivityRow } from './priceSite';

/** Settings of the priced view that are not prices. */
export interface PriceTrialOptions {
  /**
   * Shortfall beyond which a rate counts as falling short of the best, currency/ha; null or
   * absent: the cost of 10 kg N/ha at these prices (defaultShortfallTolerancePerHa).
   */
  shortfallTolerancePerHa?: number | null;
  /**
   * A treatment level's own N price, currency per kg N, by level name (a product that costs
   * more or less per kg N than the run's); absent levels take the run's price (priceLevels).
   */
  levelNutrientPricePerKg?: Readonly<Record<string, number>>;
}

export interface PricedTrial {
  prices: Prices;
  /** The shortfall tolerance in force, currency/ha, and whether it is the default. */
  shortfallTolerance: { perHa: number; isDefault: boolean };
  /** Site → the analyst's model, as given. */
  choices: Readonly<Record<string, ModelName>>;
  /** The across-site analysis with these choices at these prices (rows, regional rate, groups). */
  across: AcrossSiteAnalysis;
  /** One entry per site, in the analysis' order. */
  sites: PricedSite[];
  /**
   * The regional mixed model's optimum at these prices with its delta-method interval at the
   * analysis' level (mixedModelOptimum, closed form, no refit); null without a mixed model.
   */
  mixedOptimum: MixedModelOptimum | null;
  /**
   * Each plateau mixed model's optimum at these prices (plateauMixedModelOptimum, closed form),
   * in the order of across.plateauMixed; null where that form has no fit.
   */
  plateauMixedOptima: (MixedModelOptimum | null)[];
  /** Each treatment level's own N price by level name, as given (priceTrialLevels reads it). */
  levelNutrientPricePerKg: Readonly<Record<string, number>>;
  /**
   * Each rate × factor site's levels at these prices (each level at its own N price where it has
   * one), the level tests and which level returns most (priceLevels); [] without a factor.
   */
  levels: PricedSiteLevels[];
  /**
   * Each factor's regional model by level at these prices: every level's population optimum at
   * its own price ratio with its delta-method interval (priceLevelMixedModel); [] without one.
   */
  levelMixed: PricedLevelMixedModel[];
}

/**
 * The analysis at these prices and model picks.
 * @param analysis - from analyzeTrial
 * @param prices - canonical prices (currency per kg grain and per kg N, per ha application)
 * @param choices - site → the model the analyst picked (a model the site has no fit of is ignored)
 * @param options - the shortfall tolerance (currency/ha; default the cost of 10 kg N/ha)
 * @returns the priced trial every view reads
 * @throws {StatsInputError} "bad-argument" for a price that is not positive or a negative tolerance
 * @example
 * const priced = priceTrial(analysis, { ...prices, nutrientPricePerKg: 1.4 }, {});
 * priced.across.regional.regional.bestRateKgHa // lower than at the first prices
 */
export function priceTrial(
  analysis: TrialAnalysis,
  prices: Prices,
  choices: Readonly<Record<string, ModelName>>,
  options: PriceTrialOptions = {},
): PricedTrial {
  assertPrices(prices);
  const given = options.shortfallTolerancePerHa ?? null;
  const tolerance = toleranceInForce(given, prices);
  const across = repriceAcrossSites(chooseSiteModels(analysis.across, choices), prices, {
    shortfallTolerancePerHa: given,
  });
  const { intervalLevel } = analysis.settings;
  return {
    prices: { ...prices },
    shortfallTolerance: { perHa: tolerance, isDefault: given === null },
    choices: { ...choices },
    across,
    sites: across.sites.map((s) => priceSite(s, prices, choices, intervalLevel, tolerance)),
    mixedOptimum:
      across.mixed.model === null
        ? null
        : mixedModelOptimum(across.mixed, priceRatio(prices), intervalLevel),
    plateauMixedOptima: across.plateauMixed.map((m) =>
      m.model === null ? null : plateauMixedModelOptimum(m, priceRatio(prices), intervalLevel),
    ),
    levelNutrientPricePerKg: { ...options.levelNutrientPricePerKg },
    levels: priceTrialLevels(analysis.levels ?? [], {
      prices,
      levelNutrientPricePerKg: { ...options.levelNutrientPricePerKg },
      choices,
      level: intervalLevel,
      tolerancePerHa: given,
    }),
    levelMixed: priceLevelMixedModels(
      analysis.levelMixed ?? [],
      prices,
      { ...options.levelNutrientPricePerKg },
      intervalLevel,
    ),
  };
}
