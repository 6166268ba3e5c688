// Across-site analysis speed: 500 invented sites of 24 plots (shared/demo
// syntheticPlotTable: 6 N rates × 4 blocks, quadratic-plateau responses).
// Targets: the full analysis under 1 s; a new price applied to the fitted set
// under 30 ms. Prints medians of wall time and of process CPU time (the CPU
// figure is less inflated when other jobs share the machine); timing is never
// asserted anywhere.
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';
import { analyzeAcrossSites, type AcrossSiteAnalysis } from '../shared/analysis/analyzeAcrossSites';
import { repriceAcrossSites } from '../shared/analysis/repriceAcrossSites';
import { measure, timingSummary as summary } from './timing';

export function run(): void {
  const sites = 500;
  const table = syntheticPlotTable({ sites, seed: 20261202 });
  const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 };
  let analysis: AcrossSiteAnalysis = analyzeAcrossSites(table, { prices }); // warm-up
  const full = Array.from({ length: 5 }, () =>
    measure(() => (analysis = analyzeAcrossSites(table, { prices }))),
  );
  const regionalOnly: { wall: number; cpu: number }[] = [];
  const withRows: { wall: number; cpu: number }[] = [];
  for (let i = 0; i < 30; i++) {
    // A slider step: N price from 0.80 to 1.70 per kg.
    const p = { grainPricePerKg: 0.18, nutrientPricePerKg: 0.8 + (i % 10) * 0.1 };
    regionalOnly.push(measure(() => repriceAcrossSites(analysis, p, { rows: false })));
    withRows.push(measure(() => repriceAcrossSites(analysis, p)));
  }
  const r = analysis.regional.regional;
  console.log(`sites: ${sites} × 24 plots, ${analysis.sites.filter((s) => s.fits).length} fitted`);
  console.log(`full analysis: ${summary(full, 0)}; target < 1000 ms`);
  console.log(
    `new price, regional curves, site optima, groups: ${summary(regionalOnly, 2)}; target < 30 ms`,
  );
  console.log(
    `new price including the ${analysis.rows.length} site × model row optima: ${summary(withRows, 1)}`,
  );
  console.log(
    `regional rate ${r.bestRateKgHa} kg/ha (profitable ${r.profitableRange.lowKgHa}–${r.profitableRange.highKgHa}) on ${r.gridKgHa.length} grid rates`,
  );
}
