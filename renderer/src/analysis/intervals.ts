/**
 * The optimum's interval for each site: a seeded percentile bootstrap of the
 * leading model (shared/report/bootstrapSiteOptimum), with the same count,
 * seed per site and level as the report writer, so the band on screen is the
 * interval the workbook prints. Runs in the worker; it refits hundreds of times.
 */
import type { Prices } from '../../../shared/economics/priceRatio';
import type { BlockTerms, ModelName } from '../../../shared/models/modelTypes';
import { bootstrapSiteOptimum } from '../../../shared/report/bootstrapSiteOptimum';

/** Resamples, seed and level used on screen and in the report. */
export const BOOTSTRAP = { count: 200, seed: 20250917, level: 0.9 } as const;

export interface IntervalSite {
  site: string;
  /** Position of the site in the table's site order (the report seeds by it). */
  index: number;
  model: ModelName;
  /** The block terms the site was fitted with (the pipeline's choice for this site). */
  blocks: BlockTerms;
  rateKgHa: Float64Array;
  yieldKgHa: Float64Array;
  block: (string | null)[];
}

export interface IntervalInput {
  sites: IntervalSite[];
  prices: Prices;
}

/**
 * Bootstraps every site's optimum.
 * @param input - the sites' plots, leading models and block terms, canonical prices
 * @param progress - awaited after each site (lets a cancel arrive)
 * @returns site → interval, kg/ha (sites without a usable interval are absent)
 */
export async function siteIntervals(
  input: IntervalInput,
  progress: (done: number, total: number, note: string) => Promise<void>,
): Promise<Record<string, [number, number]>> {
  const out: Record<string, [number, number]> = {};
  for (const [i, s] of input.sites.entries()) {
    await progress(i, input.sites.length, s.site);
    try {
      const b = bootstrapSiteOptimum(
        {
          rateKgHa: s.rateKgHa,
          yieldKgHa: s.yieldKgHa,
          block: s.block,
          model: s.model,
          blocks: s.blocks,
          prices: input.prices,
        },
        BOOTSTRAP.count,
        (BOOTSTRAP.seed + s.index * 7919) >>> 0,
        BOOTSTRAP.level,
      );
      if (b.ciKgHa) out[s.site] = b.ciKgHa;
    } catch {
      // No interval for this site; the screen shows the optimum without a band.
    }
  }
  return out;
}
