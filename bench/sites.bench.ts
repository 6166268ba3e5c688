// Across-site analysis speed: 500 invented sites of 24 plots (shared/demo
// syntheticPlotTable: 6 N rates × 4 blocks, quadratic-plateau responses).
// Targets: the full analysis under 1 s; a new price applied to the fitted set
// under 30 ms. Prints medians; timing is never asserted anywhere.
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';
import { analyseAcrossSites } from '../shared/sites/analyseAcrossSites';
import { repriceAcrossSites } from '../shared/sites/repriceAcrossSites';

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function timeIt(f: () => unknown): number {
  const t = performance.now();
  f();
  return performance.now() - t;
}

export function run(): void {
  const sites = 500;
  const table = syntheticPlotTable({ sites, seed: 20261202 });
  const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 };
  let analysis = analyseAcrossSites(table, { prices });
  const first = timeIt(() => (analysis = analyseAcrossSites(table, { prices })));
  const full: number[] = [];
  for (let i = 0; i < 5; i++)
    full.push(timeIt(() => (analysis = analyseAcrossSites(table, { prices }))));

  const regionalOnly: number[] = [];
  const withRows: number[] = [];
  for (let i = 0; i < 30; i++) {
    // A slider step: N price from 0.80 to 1.70 per kg.
    const p = { grainPricePerKg: 0.18, nutrientPricePerKg: 0.8 + (i % 10) * 0.1 };
    regionalOnly.push(timeIt(() => repriceAcrossSites(analysis, p, { rows: false })));
    withRows.push(timeIt(() => repriceAcrossSites(analysis, p)));
  }
  const r = analysis.regional.regional;
  console.log(`sites: ${sites} × 24 plots, ${analysis.sites.filter((s) => s.fits).length} fitted`);
  console.log(
    `full analysis: ${median(full).toFixed(0)} ms median of 5 (second run ${first.toFixed(0)} ms; target < 1000 ms)`,
  );
  console.log(
    `new price, regional curves and site optima: ${median(regionalOnly).toFixed(2)} ms median of 30 (target < 30 ms)`,
  );
  console.log(
    `new price including the ${analysis.rows.length} site × model row optima: ${median(withRows).toFixed(1)} ms median of 30`,
  );
  console.log(
    `regional rate ${r.bestRateKgHa} kg/ha (profitable ${r.profitableRange.lowKgHa}–${r.profitableRange.highKgHa}) on ${r.gridKgHa.length} grid rates`,
  );
}
