// The report every report.* test reads: the committed demo workbook (invented
// data from the seeded generator) imported through the real import stage and
// analyzed by the real engine, in US or metric units.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { demoTrial } from '../shared/demo';
import { reportOf } from './report.pipeline';
import { importFiles } from '../shared/import/importFiles';
import type { TrialReport } from '../shared/report/trialReport';
import { studentTQuantile, studentTTwoSidedP } from '../shared/stats/distributions';
import { fitLeastSquares, type LeastSquaresFit } from '../shared/stats/leastSquares';
import type { Plot } from '../shared/table/plotTable';

export const demoPath = path.join(
  path.dirname(fileURLToPath(import.meta.url)),
  '..',
  'demo',
  'wrenhollow-n-trials-2025.xlsx',
);

/**
 * The US prices ($4.50/bu corn, urea 46 % N at $0.30/lb) restated per tonne of
 * grain and per kg of N, from the exact pound (NIST SP 811: 0.45359237 kg) and
 * the 56 lb corn bushel (USDA), so both unit systems price the same economics.
 */
export const METRIC_GRAIN_PER_T = 4.5 / ((56 * 0.45359237) / 1000);
export const METRIC_N_PER_KG = 0.3 / 0.46 / 0.45359237;

/**
 * Analyses the demo's corn sites.
 * @param units - 'us' (lb/ac, bu/ac, $4.50/bu, urea at $0.30/lb) or 'metric' (kg/ha, t/ha, the same prices per t and per kg N)
 * @param boot - bootstrap resamples
 */
export async function demoReport(units: 'us' | 'metric', boot = 60): Promise<TrialReport> {
  const bytes = new Uint8Array(readFileSync(demoPath));
  const corn = demoTrial()
    .sites.filter((s) => s.crop === 'corn')
    .map((s) => s.name);
  const imported = await importFiles([{ name: path.basename(demoPath), bytes }], {
    crop: 'corn',
    overrides: [],
    sheets: corn,
  });
  const us = units === 'us';
  return reportOf(
    imported.table,
    {
      units: us ? { rate: 'lb/ac', yield: 'bu/ac' } : { rate: 'kg/ha', yield: 't/ha' },
      unitSystem: units,
      currency: 'USD',
      crop: 'corn',
      prices: us
        ? {
            grainPrice: 4.5,
            nutrientPrice: null,
            product: { id: 'urea', price: 0.3 },
            defaulted: false,
          }
        : {
            grainPrice: METRIC_GRAIN_PER_T,
            nutrientPrice: METRIC_N_PER_KG,
            product: null,
            defaulted: false,
          },
      boot,
      seed: 11,
      blocks: 'none',
      intervalLevel: 0.9,
    },
    {
      tool: { name: 'Plotrate', version: '0.1.0' },
      createdAt: '2026-03-01T12:00:00Z',
      mapping: imported.mapping,
      findings: imported.findings,
    },
  );
}

/**
 * The gains over the check worked directly from a site's plots, for checking the report against:
 * the rate + block model fitted by fitLeastSquares with explicit dummies (intercept, one column
 * per fertilized rate: its difference from the check, one per block but the first), as R's
 * lm(y ~ factor(rate) + factor(block)) does, and the slope through the origin and the gain at
 * rate zero as contrasts of its coefficients (estimate k'b, SE √(k'Vk), t on its residual df),
 * independently of shared/stats/rateBlockModel and shared/analysis.
 * @param plots - every plot of one site (excluded ones are skipped)
 * @returns the slope over the check (kg/kg N) with its 95 % interval, and the gain at rate zero
 *   (kg/ha) with its SE, t, df and two-sided p
 */
export function gainsOverBlockCheck(plots: readonly Plot[]): {
  slope: { estimate: number; ciLow: number; ciHigh: number };
  gainAtZero: { estimate: number; stdError: number; t: number; df: number; p: number };
} {
  const used = plots.filter((p) => !p.excluded && p.rateKgHa !== null && p.yieldKgHa !== null);
  const x = [...new Set(used.map((p) => p.rateKgHa!))].filter((r) => r > 0).sort((a, b) => a - b);
  const blocks = [...new Set(used.map((p) => p.block!))];
  const fit: LeastSquaresFit = fitLeastSquares({
    columns: [
      ...x.map((r) => used.map((p) => (p.rateKgHa === r ? 1 : 0))),
      ...blocks.slice(1).map((b) => used.map((p) => (p.block === b ? 1 : 0))),
    ],
    y: used.map((p) => p.yieldKgHa!),
    intercept: true,
  });
  const contrast = (w: number[]) => {
    // Coefficient 0 is the intercept; 1 … J the fertilized rates.
    const k = w.map((v, j) => [j + 1, v] as const);
    const estimate = k.reduce((s, [c, v]) => s + v * fit.coefficients[c].estimate, 0);
    let variance = 0;
    for (const [c, v] of k) for (const [d, u] of k) variance += v * fit.covariance[c][d] * u;
    return { estimate, stdError: Math.sqrt(variance) };
  };
  const df = fit.dfResidual;
  const sxx0 = x.reduce((s, v) => s + v * v, 0);
  const slope = contrast(x.map((v) => v / sxx0));
  const half = studentTQuantile(0.975, df) * slope.stdError;
  const mean = x.reduce((s, v) => s + v, 0) / x.length;
  const sxx = x.reduce((s, v) => s + (v - mean) ** 2, 0);
  const zero = contrast(x.map((v) => 1 / x.length - (mean * (v - mean)) / sxx));
  const t = zero.estimate / zero.stdError;
  return {
    slope: {
      estimate: slope.estimate,
      ciLow: slope.estimate - half,
      ciHigh: slope.estimate + half,
    },
    gainAtZero: { ...zero, t, df, p: studentTTwoSidedP(t, df) },
  };
}
