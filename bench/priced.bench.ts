// The priced view's cost: priceTrial (every site's optimum, interval from the stored draws and
// profitable range, the across-site rows and regional rate) on 100 invented sites of 24 plots
// (shared/demo syntheticPlotTable) with the default 200 bootstrap resamples each, at a new
// nutrient price per call, as a price slider would ask. Medians of wall and process CPU time;
// timing is never asserted anywhere.
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial } from '../shared/analysis/analyzeTrial';
import { priceTrial } from '../shared/analysis/priceTrial';
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';
import { measure, timingSummary } from './timing';

export function run(): void {
  const sites = 100;
  const table = syntheticPlotTable({ sites, seed: 20261202 });
  const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 };
  const t0 = performance.now();
  const analysis = analyzeTrial(table, analysisSettings({ prices }));
  console.log(
    `analysis of ${sites} sites × 24 plots with ${analysis.settings.resamples} resamples each: ${(performance.now() - t0).toFixed(0)} ms wall`,
  );
  priceTrial(analysis, prices, {}); // warm-up
  const runs: { wall: number; cpu: number }[] = [];
  for (let i = 0; i < 30; i++) {
    const p = { grainPricePerKg: 0.18, nutrientPricePerKg: 0.8 + (i % 10) * 0.1 };
    runs.push(measure(() => priceTrial(analysis, p, {})));
  }
  console.log(`priceTrial at a new price: ${timingSummary(runs, 1)}`);
}
