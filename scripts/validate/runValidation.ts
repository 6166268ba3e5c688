// The whole validation: sites of each truth, then regions mixing all truths, each table
// simulated from its own seed and run through the public analysis API; the figures and goals.
import { mulberry32 } from '../../shared/demo/mulberry32';
import { STRAIGHT_GAIN_TRUTHS, TRUTH_NAMES, type TruthName } from '../../shared/demo/simulatedSite';
import type { Prices } from '../../shared/economics/priceRatio';
import {
  gainNullFigures,
  regionFigures,
  trueRegionalOptimumKgHa,
  truthFigures,
  type GainNullFigures,
  type RegionFigures,
  type RegionOutcome,
  type TruthFigures,
} from './decisionFigures';
import { simulateAndAnalyze } from './siteDecisions';
import { validationGoals, type GoalCheck } from './validationGoals';

export interface ValidationOptions {
  /** Simulated sites per truth (one table per truth). */
  sitesPerTruth: number;
  /** Simulated regions, each its own table. */
  regions: number;
  sitesPerRegion: number;
  /** Base seed: truth i uses seed + i, region r uses seed + 1000 + r. */
  seed: number;
  /** Canonical prices without application cost. */
  prices: Prices;
  /** Called after each table with what was done. */
  onProgress?: (message: string) => void;
}

export interface Validation {
  priceRatio: number;
  truths: TruthFigures[];
  /** The gain-over-check tests on the truths whose nulls hold (flat, straight line). */
  gainNulls: GainNullFigures[];
  regions: RegionFigures;
  regionOutcomes: RegionOutcome[];
  goals: GoalCheck[];
}

/**
 * Runs the validation.
 * @param options - sample sizes, seed and prices
 * @returns the figures per truth, the regional figures and the goal checks
 * @example
 * runValidation({ sitesPerTruth: 400, regions: 50, sitesPerRegion: 12, seed: 1, prices }).goals
 */
export function runValidation(options: ValidationOptions): Validation {
  const { prices, seed } = options;
  const priceRatio = prices.nutrientPricePerKg / prices.grainPricePerKg;
  const gainNulls: GainNullFigures[] = [];
  const truths = TRUTH_NAMES.map((truth, i) => {
    const run = simulateAndAnalyze(
      Array.from({ length: options.sitesPerTruth }, () => truth),
      seed + i,
      prices,
    );
    const figures = truthFigures(truth, run.decisions);
    if (STRAIGHT_GAIN_TRUTHS.includes(truth)) gainNulls.push(gainNullFigures(truth, run.decisions));
    options.onProgress?.(`${truth}: ${figures.sites} sites`);
    return figures;
  });
  // The straight line has no finite optimum, so only the gain-over-check tests are read from it.
  STRAIGHT_GAIN_TRUTHS.filter((t) => !TRUTH_NAMES.includes(t)).forEach((truth, i) => {
    const run = simulateAndAnalyze(
      Array.from({ length: options.sitesPerTruth }, () => truth),
      seed + 100 + i,
      prices,
    );
    gainNulls.push(gainNullFigures(truth, run.decisions));
    options.onProgress?.(`${truth}: ${options.sitesPerTruth} sites (gain-over-check tests only)`);
  });
  // Each region's sites draw their truths at random (uniform over the five), from the base seed.
  const pick = mulberry32(seed ^ 0x5eed);
  const regionOutcomes: RegionOutcome[] = [];
  for (let r = 0; r < options.regions; r++) {
    const mix: TruthName[] = Array.from(
      { length: options.sitesPerRegion },
      () => TRUTH_NAMES[pick.int(0, TRUTH_NAMES.length - 1)],
    );
    const run = simulateAndAnalyze(mix, seed + 1000 + r, prices);
    regionOutcomes.push({
      truths: mix,
      regionalRateKgHa: run.regionalRateKgHa,
      trueRegionalOptimumKgHa: trueRegionalOptimumKgHa(mix, priceRatio),
      intervalKgHa: run.regionalIntervalKgHa,
      populationOptimumKgHa: trueRegionalOptimumKgHa(TRUTH_NAMES, priceRatio),
    });
  }
  options.onProgress?.(`${options.regions} regions of ${options.sitesPerRegion} sites`);
  const regions = regionFigures(regionOutcomes);
  return {
    priceRatio,
    truths,
    gainNulls,
    regions,
    regionOutcomes,
    goals: validationGoals(truths, gainNulls, regions),
  };
}
