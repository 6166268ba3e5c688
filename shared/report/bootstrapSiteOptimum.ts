/**
 * The bootstrap interval of one site's optimum exactly as the reports compute
 * it, for any caller that must agree with them (the screen shows the same band
 * as the workbook). A thin adapter over the economics stage's stratified
 * bootstrap (shared/economics/bootstrapOptimum: plots resampled within each
 * rate, the model refitted, the optimum re-priced, percentile interval).
 */
import { bootstrapOptimum } from '../economics/bootstrapOptimum';
import type { Prices } from '../economics/priceRatio';
import type { BlockTerms, ModelName } from '../models/modelTypes';

export interface BootstrapInput {
  /** Rate of each plot used, kg/ha. */
  rateKgHa: ArrayLike<number>;
  /** Yield of each plot used, kg/ha. */
  yieldKgHa: ArrayLike<number>;
  block: ArrayLike<string | null> | null;
  model: ModelName;
  blocks: BlockTerms;
  /** Canonical prices (currency per kg grain, per kg N). */
  prices: Prices;
}

export interface BootstrapSiteOptimum {
  count: number;
  /** Resamples that gave one optimum rate. */
  usable: number;
  seed: number;
  level: number;
  /** Percentile interval of the optimum, kg/ha; null when no resample gave a rate. */
  ciKgHa: [number, number] | null;
}

/**
 * Bootstraps the optimum of one model at one site.
 * @param input - plots (kg/ha), blocks, the model and canonical prices
 * @param count - number of resamples (≥ 1)
 * @param seed - generator seed (the reports use run seed + 7919 × site index)
 * @param level - interval level in (0, 1), e.g. 0.9
 * @returns the interval and how many resamples gave an optimum
 * @throws {StatsInputError} for a count below 1, a level outside (0, 1) or prices that are not positive
 * @example
 * bootstrapSiteOptimum(input, 200, 1, 0.9).ciKgHa // e.g. [138, 171]
 */
export function bootstrapSiteOptimum(
  input: BootstrapInput,
  count: number,
  seed: number,
  level: number,
): BootstrapSiteOptimum {
  const b = bootstrapOptimum(
    { rateKgHa: input.rateKgHa, yieldKgHa: input.yieldKgHa, block: input.block },
    input.model,
    input.prices,
    { resamples: count, seed, confidence: level, blocks: input.blocks },
  );
  let usable = 0;
  for (const v of b.rateSamplesKgHa) if (Number.isFinite(v)) usable++;
  return { count: b.resamples, usable, seed: b.seed, level: b.confidence, ciKgHa: b.ciKgHa };
}
