/**
 * Percentile bootstrap of one site's economic optimum (Efron & Tibshirani,
 * An Introduction to the Bootstrap, 1993, ch. 13): resample the plots with
 * replacement within each rate (stratified, so every resample keeps the
 * trial's design of rates), refit the chosen model, price it again, and take
 * the (1 − level)/2 and (1 + level)/2 quantiles of the optima. Resamples whose
 * fit gives no numeric optimum are counted as unusable, not dropped silently.
 * Seeded (mulberry32), so the same seed gives the same interval.
 */
import { mulberry32 } from '../demo/mulberry32';
import { economicOptimum } from '../economics/economicOptimum';
import type { Prices } from '../economics/priceRatio';
import { fitAllModels } from '../models/fitAllModels';
import type { BlockTerms, ModelName } from '../models/modelTypes';
import { sampleQuantile } from '../stats/quantile';

export interface BootstrapInput {
  rateKgHa: ArrayLike<number>;
  yieldKgHa: ArrayLike<number>;
  block: ArrayLike<string | null> | null;
  model: ModelName;
  blocks: BlockTerms;
  prices: Prices;
}

export interface BootstrapOptimum {
  count: number;
  usable: number;
  seed: number;
  level: number;
  /** Percentile interval of the optimum, kg/ha; null when under half the resamples were usable. */
  ciKgHa: [number, number] | null;
}

/**
 * Bootstraps the optimum of one model at one site.
 * @param input - plots (kg/ha), blocks, the model and canonical prices
 * @param count - number of resamples (≥ 1)
 * @param seed - generator seed
 * @param level - interval level in (0, 1), e.g. 0.9
 * @returns the interval and how many resamples gave an optimum
 * @throws {RangeError} for a count below 1 or a level outside (0, 1)
 * @example
 * bootstrapSiteOptimum(input, 200, 1, 0.9).ciKgHa // e.g. [138, 171]
 */
export function bootstrapSiteOptimum(
  input: BootstrapInput,
  count: number,
  seed: number,
  level: number,
): BootstrapOptimum {
  if (!(Number.isInteger(count) && count >= 1)) {
    throw new RangeError(`The bootstrap count must be a whole number of at least 1; got ${count}.`);
  }
  if (!(level > 0 && level < 1)) {
    throw new RangeError(`The interval level must lie between 0 and 1; got ${level}.`);
  }
  const rng = mulberry32(seed);
  const n = input.rateKgHa.length;
  // Plot indices grouped by rate: resampling within a rate keeps the design.
  const byRate = new Map<number, number[]>();
  for (let i = 0; i < n; i++) {
    const key = input.rateKgHa[i];
    const g = byRate.get(key);
    if (g) g.push(i);
    else byRate.set(key, [i]);
  }
  const groups = [...byRate.values()];
  const rate = new Float64Array(n);
  const yld = new Float64Array(n);
  const blk: (string | null)[] = new Array(n);
  const optima: number[] = [];
  for (let b = 0; b < count; b++) {
    let k = 0;
    for (const g of groups) {
      for (let j = 0; j < g.length; j++) {
        const i = g[rng.int(0, g.length - 1)];
        rate[k] = input.rateKgHa[i];
        yld[k] = input.yieldKgHa[i];
        // The block of the slot, not of the drawn plot: the design stays balanced.
        blk[k] = input.block ? input.block[g[j]] : null;
        k++;
      }
    }
    try {
      const fit = fitAllModels(
        { rateKgHa: rate, yieldKgHa: yld, block: input.block ? blk : null },
        { blocks: input.blocks, models: [input.model], curvePoints: 2 },
      ).fits[input.model];
      const opt = economicOptimum(fit, input.prices);
      if (opt.rateKgHa !== null && Number.isFinite(opt.rateKgHa)) optima.push(opt.rateKgHa);
    } catch {
      // A degenerate resample (every plot of a rate identical) is unusable, nothing more.
    }
  }
  const usable = optima.length;
  const ciKgHa: [number, number] | null =
    usable >= Math.max(2, count / 2)
      ? [sampleQuantile(optima, (1 - level) / 2), sampleQuantile(optima, (1 + level) / 2)]
      : null;
  return { count, usable, seed, level, ciKgHa };
}
