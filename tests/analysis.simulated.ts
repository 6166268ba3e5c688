// Seeded simulated trials (shared/demo/simulatedSite, truths known in closed form) analyzed
// with the analysis defaults at the illustrative corn prices, for the price-ratio and risk
// tests. Shared by those tests; not a test itself.
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial, type TrialAnalysis } from '../shared/analysis/analyzeTrial';
import { simulatedTrial, type TruthName } from '../shared/demo/simulatedSite';
import { illustrativePrices } from '../shared/economics/illustrativePrices';

/** The illustrative corn prices (PR ≈ 7.03 kg grain per kg N), canonical. */
export const CORN_PRICES = illustrativePrices('corn').canonical;

/**
 * One site per truth, analyzed as the command line would (200 resamples, 90 % interval).
 * @param truths - each site's true response, in order
 * @param seed - the generator's seed
 * @param cv - plot error CV (default the demo's 6.5 %)
 * @returns the analysis
 */
export function simulatedAnalysis(truths: TruthName[], seed: number, cv = 0.065): TrialAnalysis {
  const { table } = simulatedTrial({ truths, seed, cv });
  return analyzeTrial(table, analysisSettings({ prices: CORN_PRICES }));
}
