// The priced view's cost: priceTrial (every site's optimum, interval from the stored draws and
// profitable range, the across-site rows and regional rate) on 100 invented sites of 24 plots
// (shared/demo syntheticPlotTable) with the default 200 bootstrap resamples each, at a new
// nutrient price per call, as a price slider would ask. Medians of wall and process CPU time;
// timing is never asserted anywhere.
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial } from '../shared/analysis/analyzeTrial';
import { priceTrial } from '../shared/analysis/priceTrial';
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Wall and CPU (user + system) time of one call, ms. */
function measure(f: () => unknown): { wall: number; cpu: number } {
  const c = process.cpuUsage();
  const t = performance.now();
  f();
  const wall = performance.now() - t;
  const d = process.cpuUsage(c);
  return { wall, cpu: (d.user + d.system) / 1000 };
}

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
  const w = median(runs.map((r) => r.wall)).toFixed(1);
  const c = median(runs.map((r) => r.cpu)).toFixed(1);
  console.log(`priceTrial at a new price: ${w} ms wall, ${c} ms CPU (median of ${runs.length})`);
}
