// The regional mixed model's optimum and interval on simulated regions whose population curve is
// a known quadratic (shared/demo/simulatedRegion: correlated random site-year effects, blocks and
// plot error), through the public API (analyzeTrial with its defaults but no resamples, which
// the mixed model does not use, then priceTrial's mixedOptimum). The truth is the population
// curve's optimum at the prices.
import { analysisSettings, analyzeTrial, priceTrial } from '../../shared/analysis';
import { regionTrueOptimumKgHa, simulatedRegionTable } from '../../shared/demo/simulatedRegion';
import type { Prices } from '../../shared/economics/priceRatio';

export interface MixedModelFigures {
  regions: number;
  siteYearsPerRegion: number;
  trueOptimumKgHa: number;
  /** Share of regions whose interval holds the true optimum, and its binomial SE. */
  coverage: { share: number; se: number };
  intervalLevel: number;
  meanBiasKgHa: number;
  rmseKgHa: number;
  meanIntervalWidthKgHa: number;
}

/**
 * Fits and prices the regional mixed model on simulated quadratic regions.
 * @param regions - how many regions
 * @param siteYears - site-years per region
 * @param seed - region r uses seed + r
 * @param prices - canonical prices, no application cost
 * @returns coverage, bias, RMSE and mean width of the regional optimum's interval
 */
export function mixedModelRegions(
  regions: number,
  siteYears: number,
  seed: number,
  prices: Prices,
): MixedModelFigures {
  const truth = regionTrueOptimumKgHa(prices.nutrientPricePerKg / prices.grainPricePerKg);
  let covered = 0;
  let level = NaN;
  const errors: number[] = [];
  const widths: number[] = [];
  for (let r = 0; r < regions; r++) {
    const table = simulatedRegionTable(siteYears, seed + r);
    const analysis = analyzeTrial(table, analysisSettings({ prices, seed, resamples: 0 }));
    const optimum = priceTrial(analysis, prices, {}).mixedOptimum;
    if (!optimum) throw new Error(`Region ${r}: no regional mixed model.`);
    level = optimum.level;
    errors.push(optimum.rateKgHa - truth);
    const i = optimum.interval;
    if (i) {
      widths.push(i.highKgHa - i.lowKgHa);
      if (i.lowKgHa <= truth && truth <= i.highKgHa) covered++;
    }
  }
  const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
  const share = covered / regions;
  return {
    regions,
    siteYearsPerRegion: siteYears,
    trueOptimumKgHa: truth,
    coverage: { share, se: Math.sqrt((share * (1 - share)) / regions) },
    intervalLevel: level,
    meanBiasKgHa: mean(errors),
    rmseKgHa: Math.sqrt(mean(errors.map((e) => e * e))),
    meanIntervalWidthKgHa: mean(widths),
  };
}
