// The regional mixed model's speed and memory: fitRegionalMixedModel (REML, then ML from the
// REML estimate; Psi unstructured) on 100 and 1,000 invented site-years of 24 plots
// (shared/demo/simulatedRegion: 6 rates × 4 blocks, block offsets absorbed). Two layouts:
// every site-year complete (they share one set of cross-products, so one deviance evaluation
// costs the same for any number of site-years) and every site-year missing one plot, at a
// different place each (up to 24 distinct layouts, the per-class work grows again).
// CPU time of the fit (process.cpuUsage), wall time, deviance evaluations, and the heap grown
// while fitting (heapUsed after minus before; a lower bound on the peak). The plateau forms
// (fitRegionalPlateauMixedModel, ML, Psi diagonal) on the complete layout: the same quadratic
// truth, so their joins sit near its top, and every site-year has its own linearization (no
// shared cross-products), so their cost grows with the site-years.
import { performance } from 'node:perf_hooks';
import { fitRegionalMixedModel, type MixedModelSite } from '../shared/analysis/regionalMixedModel';
import { simulatedRegion } from '../shared/demo/simulatedRegion';
import {
  fitRegionalPlateauMixedModel,
  PLATEAU_MIXED_FORMS,
} from '../shared/analysis/regionalPlateauMixedModel';

function measure(label: string, sites: MixedModelSite[]): void {
  const heap0 = process.memoryUsage().heapUsed;
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  const fit = fitRegionalMixedModel(sites);
  const wall = performance.now() - t0;
  const cpu = process.cpuUsage(cpu0);
  const heapMb = (process.memoryUsage().heapUsed - heap0) / 2 ** 20;
  if (fit.model === null) throw new Error(fit.reason);
  console.log(
    `${label}: ${((cpu.user + cpu.system) / 1000).toFixed(0)} ms CPU, ${wall.toFixed(0)} ms wall, ` +
      `heap +${heapMb.toFixed(1)} MB, converged ${fit.converged}, b = ${fit.fixed.b.toFixed(2)} kg/kg`,
  );
}

/** A plateau form by ML (Lindstrom–Bates alternation, Psi diagonal), timed the same way. */
function measurePlateau(label: string, sites: MixedModelSite[]): void {
  for (const form of PLATEAU_MIXED_FORMS) {
    const heap0 = process.memoryUsage().heapUsed;
    const cpu0 = process.cpuUsage();
    const t0 = performance.now();
    const fit = fitRegionalPlateauMixedModel(sites, form);
    const wall = performance.now() - t0;
    const cpu = process.cpuUsage(cpu0);
    const heapMb = (process.memoryUsage().heapUsed - heap0) / 2 ** 20;
    if (fit.model === null) throw new Error(fit.reason);
    console.log(
      `${label}, ${form}: ${((cpu.user + cpu.system) / 1000).toFixed(0)} ms CPU, ${wall.toFixed(0)} ms wall, ` +
        `heap +${heapMb.toFixed(1)} MB, ${fit.iterations} alternations, converged ${fit.converged}, settled ${fit.settled}, ` +
        `join ${fit.fixed.x0.toFixed(1)} kg/ha`,
    );
  }
}

export function run(): void {
  measure('warm-up, 12 site-years', simulatedRegion(12, 1));
  for (const n of [100, 1000]) {
    const complete = simulatedRegion(n, 20261202 + n);
    measure(`${n.toLocaleString('en-US')} site-years × 24 plots, complete`, complete);
    const missing = complete.map((s, i) => {
      const drop = i % 24;
      const keep = (_: unknown, j: number) => j !== drop;
      return {
        site: s.site,
        rateKgHa: s.rateKgHa.filter(keep),
        yieldKgHa: s.yieldKgHa.filter(keep),
        block: s.block.filter(keep),
      };
    });
    measure(`${n.toLocaleString('en-US')} site-years × 23 plots, one missing each`, missing);
    measurePlateau(`${n.toLocaleString('en-US')} site-years × 24 plots`, complete);
  }
}
