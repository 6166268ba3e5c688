/**
 * The regional model by level at prices: each level's population curve priced at the level's own
 * price ratio (its own N price where it has one, as priceLevels prices a site's levels), by the
 * regional quadratic's closed-form optimum and delta-method interval (mixedModelOptimum) on that
 * level's fixed effects a, b_k, c_k and their covariance. No refit.
 */
import { mixedModelOptimum, type MixedModelOptimum } from '../economics/mixedModelOptimum';
import { priceRatio, type Prices } from '../economics/priceRatio';
import type { NoRegionalLevelMixedModel, RegionalLevelMixedModel } from './regionalLevelMixedModel';

/** One level's regional optimum. */
export interface PricedLevelMixedCurve {
  level: string;
  /** The price ratio it was priced at, kg grain per kg N, and whether the N price is the level's own. */
  priceRatio: number;
  ownNutrientPrice: boolean;
  optimum: MixedModelOptimum;
}

/** A factor's regional model by level at prices. */
export interface PricedLevelMixedModel {
  factor: string;
  levels: PricedLevelMixedCurve[];
}

/**
 * Every factor's regional model by level at these prices; a factor without a model is left out.
 * @param models - TrialAnalysis.levelMixed
 * @param prices - the run's canonical prices
 * @param levelNutrientPricePerKg - level name → its own N price, currency per kg N
 * @param level - the intervals' level, e.g. 0.9
 * @returns one entry per fitted factor, each level's optimum (kg N/ha) and interval
 * @example
 * priceLevelMixedModels(analysis.levelMixed, prices, { Split: 1.3 }, 0.9)[0].levels[1].optimum.rateKgHa
 */
export function priceLevelMixedModels(
  models: readonly (RegionalLevelMixedModel | NoRegionalLevelMixedModel)[],
  prices: Prices,
  levelNutrientPricePerKg: Readonly<Record<string, number>>,
  level: number,
): PricedLevelMixedModel[] {
  const out: PricedLevelMixedModel[] = [];
  for (const m of models) {
    if (m.model === null) continue;
    out.push({
      factor: m.factor,
      levels: m.levels.map((curve) => {
        const own = Object.hasOwn(levelNutrientPricePerKg, curve.level);
        const ratio = priceRatio(
          own ? { ...prices, nutrientPricePerKg: levelNutrientPricePerKg[curve.level] } : prices,
        );
        return {
          level: curve.level,
          priceRatio: ratio,
          ownNutrientPrice: own,
          optimum: mixedModelOptimum(curve, ratio, level),
        };
      }),
    });
  }
  return out;
}
