/**
 * The economic optimum of every fitted model of one site, and a warning when
 * the models that describe the data about equally well disagree on the rate.
 * Model choice moves the optimum more than most other decisions (a
 * linear-plateau often puts it well below a quadratic on the same plots), so
 * the screen shows the spread rather than one number alone.
 */
import { MODEL_CURVES } from '../models/curves';
import type { CurveSummary, ModelName } from '../models/modelTypes';
import type { ModelRank } from '../models/fitAllModels';
import { KG_HA_FORMAT, rateText, type RateFormat } from '../models/rateFormat';
import { economicOptimum, type EconomicOptimum } from './economicOptimum';
import type { Prices } from './priceRatio';

export interface OptimumComparison {
  /** Optimum per model, in the order of the ranking given (ranked models first). */
  optima: EconomicOptimum[];
  /** Smallest and largest optimum rate among the candidate models, kg/ha (NaN if none). */
  lowestRateKgHa: number;
  highestRateKgHa: number;
  /** Models whose optimum took part: ranked, with a numeric optimum, ΔAICc ≤ the cut-off. */
  candidates: ModelName[];
  /** A sentence when the candidates' optima differ by more than the tolerance, else null. */
  warning: string | null;
}

export interface OptimumComparisonOptions {
  /** Largest acceptable spread of the candidates' optima, kg/ha; default 20. */
  toleranceKgHa?: number;
  /** Models within this ΔAICc of the best are candidates; default Infinity (all ranked models). */
  maxDeltaAicc?: number;
  /** How the warning and the explanations write rates; default kg/ha rounded. */
  rateFormat?: RateFormat;
}

/**
 * Prices every model and compares the optima.
 * @param fits - fits by model name (from fitAllModels)
 * @param ranking - the AICc ranking (from fitAllModels)
 * @param prices - canonical prices (currency/kg grain, currency/kg nutrient, currency/ha)
 * @param options - tolerance (kg/ha), ΔAICc cut-off and how rates are written
 * @returns every optimum, the spread and a warning when it exceeds the tolerance
 * @throws {StatsInputError} "bad-argument" for a price that is not positive
 * @example
 * const all = fitAllModels(site);
 * optimumAcrossModels(all.fits, all.ranking, { grainPricePerKg: 0.18, nutrientPricePerKg: 1.2 }).warning
 */
export function optimumAcrossModels(
  fits: Partial<Record<ModelName, CurveSummary>>,
  ranking: readonly ModelRank[],
  prices: Prices,
  options: OptimumComparisonOptions = {},
): OptimumComparison {
  const tolerance = options.toleranceKgHa ?? 20;
  const maxDelta = options.maxDeltaAicc ?? Infinity;
  const format = options.rateFormat ?? KG_HA_FORMAT;
  const optima: EconomicOptimum[] = [];
  const candidates: ModelName[] = [];
  let lo = Infinity;
  let hi = -Infinity;
  for (const line of ranking) {
    const fit = fits[line.model];
    if (!fit) continue;
    const opt = economicOptimum(fit, prices, { rateFormat: format });
    optima.push(opt);
    // The straight lines' corners are not estimates of a response optimum.
    const { isCurve } = MODEL_CURVES[line.model];
    if (line.rank !== null && isCurve && line.deltaAicc <= maxDelta && opt.rateKgHa !== null) {
      candidates.push(line.model);
      lo = Math.min(lo, opt.rateKgHa);
      hi = Math.max(hi, opt.rateKgHa);
    }
  }
  const spread = hi - lo;
  const warning =
    candidates.length > 1 && spread > tolerance
      ? `The candidate models' optimum rates range from ${format.number(lo)} to ${rateText(format, hi)} (${rateText(format, spread)} apart, more than ${rateText(format, tolerance)}): the choice of model matters here.`
      : null;
  return {
    optima,
    lowestRateKgHa: candidates.length > 0 ? lo : NaN,
    highestRateKgHa: candidates.length > 0 ? hi : NaN,
    candidates,
    warning,
  };
}
