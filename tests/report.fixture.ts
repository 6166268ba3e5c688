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
 * each used fertilized plot's yield minus the mean of the used zero-rate plots of its own block
 * (kg/ha), with the line through the origin and the straight line fitted to them by
 * fitLeastSquares, independently of shared/sites and shared/models.
 * @param plots - every plot of one site (excluded ones are skipped)
 * @returns the rates and gains, and the two fits
 */
export function gainsOverBlockCheck(plots: readonly Plot[]): {
  rateKgHa: number[];
  gainKgHa: number[];
  origin: LeastSquaresFit;
  line: LeastSquaresFit;
} {
  const used = plots.filter((p) => !p.excluded && p.rateKgHa !== null && p.yieldKgHa !== null);
  const checks = new Map<string, number[]>();
  for (const p of used) {
    if (p.rateKgHa === 0) checks.set(p.block!, [...(checks.get(p.block!) ?? []), p.yieldKgHa!]);
  }
  const fertilized = used.filter((p) => p.rateKgHa! > 0);
  const rateKgHa = fertilized.map((p) => p.rateKgHa!);
  const gainKgHa = fertilized.map((p) => {
    const c = checks.get(p.block!)!;
    return p.yieldKgHa! - c.reduce((a, b) => a + b, 0) / c.length;
  });
  return {
    rateKgHa,
    gainKgHa,
    origin: fitLeastSquares({ columns: [rateKgHa], y: gainKgHa, intercept: false }),
    line: fitLeastSquares({ columns: [rateKgHa], y: gainKgHa, intercept: true }),
  };
}
