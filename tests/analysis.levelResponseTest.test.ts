// Rate × timing trials: the treatment-factor role found by import (a timing column of a plots
// sheet) or given by the user (--map factor=…), each level's plots with the shared zero-rate
// check, and whether the levels differ. The nested F tests and each level's linear fits are
// checked against R 4.2.2's lm() and anova() on the same invented plots
// (tests/fixtures/levels/levels.R wrote levels.anova.csv and levels.fits.csv from
// levels.plots.csv, which makeLevels.ts wrote with the project's seeded generator).
import { describe, expect, it } from 'vitest';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial } from '../shared/analysis/analyzeTrial';
import type { FTestResult } from '../shared/analysis/extraSumOfSquaresTest';
import { planAcrossSites } from '../shared/analysis/planAcrossSites';
import { importFiles } from '../shared/import/importFiles';
import { fitAllModels } from '../shared/models/fitAllModels';
import { readRCsv } from './analysis.fixtures';

const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.26 };

/** An R-written fixture of tests/fixtures/levels/ as header → text rows. */
const rCsv = (file: string) => readRCsv(`../levels/${file}`);

/** The fixture's plots as a user's CSV file, with the factor column under `header`. */
function plotsFile(header = 'Timing'): { name: string; bytes: Uint8Array } {
  const lines = [`Site,Block,Plot,${header},N rate (kg N/ha),Yield (kg/ha)`];
  for (const r of rCsv('levels.plots.csv'))
    lines.push([r.site, r.block, r.plot, r.timing, r.rate, r.yield].join(','));
  return { name: 'timing trial.csv', bytes: new TextEncoder().encode(lines.join('\n') + '\n') };
}

function fTest(result: FTestResult | { kind: 'no-test' }): FTestResult {
  if (result.kind !== 'f-test') throw new Error('expected an F-test');
  return result;
}

/** |a − b| within rel·|b| (or abs near 0): relative agreement with R's printed 15 digits. */
function near(actual: number, expected: number, rel: number): void {
  const tol = rel * Math.max(Math.abs(expected), 1e-300);
  if (!(Math.abs(actual - expected) <= tol))
    throw new Error(`got ${actual}, R gave ${expected}; difference ${actual - expected} > ${tol}`);
}

describe('import: the treatment-factor role', () => {
  it('detectColumns makes a timing column of a plots sheet the factor and lists its header', async () => {
    const { table, mapping } = await importFiles([plotsFile()], { crop: 'corn', overrides: [] });
    expect(mapping.find((m) => m.header === 'Timing')?.role).toBe('factor');
    expect(table.factorKeys).toEqual(['Timing']);
  });

  it('a column the user names with --map factor=… splits the site (a header no rule knows)', async () => {
    const auto = await importFiles([plotsFile('Programme')], { crop: 'corn', overrides: [] });
    expect(auto.table.factorKeys).toBeUndefined();
    const { table } = await importFiles([plotsFile('Programme')], {
      crop: 'corn',
      overrides: [{ role: 'factor', header: 'Programme' }],
    });
    expect(table.factorKeys).toEqual(['Programme']);
    // The planner no longer lists it as a column that varies within a site.
    const plan = planAcrossSites(table, { prices, factorKeys: table.factorKeys });
    expect(plan.groupKeysSkipped.map((k) => k.key)).not.toContain('Programme');
    expect(plan.options.groupKeys).not.toContain('Programme');
  });

  it('every level holds its own fertilized plots and all four shared check plots', async () => {
    const { table } = await importFiles([plotsFile()], { crop: 'corn', overrides: [] });
    const a = analyzeTrial(table, analysisSettings({ prices, resamples: 0 }));
    expect(a.levels.map((s) => [s.site, s.factor, s.levels.map((l) => l.level)])).toEqual([
      ['Quill Hollow', 'Timing', ['At planting', 'Split']],
      ['Sorrel Bank', 'Timing', ['At planting', 'Split']],
      ['Teasel Rise', 'Timing', ['Fall', 'Split', 'At planting']], // first-seen order
    ]);
    for (const s of a.levels) {
      const checks = a.plots.find((p) => p.site === s.site)!;
      const checkIds = checks.plotIds.filter((_, i) => checks.rateKgHa[i] === 0);
      expect(checkIds).toHaveLength(4);
      for (const l of s.levels) {
        expect(l.checkPlots).toBe(4);
        expect(l.plots.plotIds.filter((id) => checkIds.includes(id))).toEqual(checkIds);
        // 4 checks + 5 rates × 4 blocks of its own, and nothing of another level.
        expect(l.plots.rateKgHa.length).toBe(24);
        expect(l.analysis.site).toBe(`${s.site} (Timing: ${l.level})`);
        expect(l.analysis.blocks).toBe('fixed');
      }
    }
  });
});

describe('levelResponseTests against R 4.2.2 anova() (tests/fixtures/levels/levels.R)', () => {
  it('F, both df and p agree with R within 1e-7 (relative) for the quadratic and the straight line', async () => {
    const { table } = await importFiles([plotsFile()], { crop: 'corn', overrides: [] });
    const a = analyzeTrial(table, analysisSettings({ prices, resamples: 0 }));
    const rows = rCsv('levels.anova.csv');
    expect(rows).toHaveLength(6);
    for (const r of rows) {
      const t = a.levels.find((s) => s.site === r.site)!.test;
      const test = r.model === 'quadratic' ? t.quadratic : t.linear;
      const f = fTest(test.result);
      expect(f.df1).toBe(Number(r.df));
      expect(f.df2).toBe(Number(r.resDf1));
      expect(test.common!.df).toBe(Number(r.resDf0));
      near(test.common!.sse, Number(r.rss0), 1e-9);
      near(test.perLevel!.sse, Number(r.rss1), 1e-9);
      near(f.f, Number(r.F), 1e-7);
      near(f.p, Number(r.p), 1e-7);
    }
    // The readings: equal truths not told apart, the 20 kg/ha difference and the weak level found.
    const p = (site: string) =>
      fTest(a.levels.find((s) => s.site === site)!.test.quadratic.result).p;
    expect(p('Quill Hollow')).toBeGreaterThan(0.05);
    expect(p('Sorrel Bank')).toBeLessThan(0.05);
    expect(p('Teasel Rise')).toBeLessThan(0.001);
  });

  it("each level's quadratic and straight-line fits (block offsets) agree with R's lm() on the level's plots", async () => {
    const { table } = await importFiles([plotsFile()], { crop: 'corn', overrides: [] });
    const a = analyzeTrial(table, analysisSettings({ prices, resamples: 0 }));
    const rows = rCsv('levels.fits.csv');
    expect(rows).toHaveLength(7);
    for (const r of rows) {
      const level = a.levels
        .find((s) => s.site === r.site)!
        .levels.find((l) => l.level === r.level)!;
      expect(level.plots.rateKgHa.length).toBe(Number(r.n));
      const fits = level.analysis.fits!.fits;
      near(fits.quadratic.sse, Number(r.quadraticSse), 1e-9);
      near(fits.quadratic.params.b, Number(r.quadraticB), 1e-8);
      near(fits.quadratic.params.c, Number(r.quadraticC), 1e-8);
      near(fits.linear.sse, Number(r.linearSse), 1e-9);
      near(fits.linear.params.b, Number(r.linearB), 1e-8);
    }
  });

  it('a level analyzed as its own site is the same analysis as fitting its plots alone', async () => {
    const { table } = await importFiles([plotsFile()], { crop: 'corn', overrides: [] });
    const a = analyzeTrial(table, analysisSettings({ prices, resamples: 0 }));
    const level = a.levels[1].levels[1];
    const alone = fitAllModels(
      {
        rateKgHa: level.plots.rateKgHa,
        yieldKgHa: level.plots.yieldKgHa,
        block: level.plots.block,
      },
      { blocks: 'fixed' },
    );
    expect(level.analysis.fits!.fits.quadraticPlateau.sse).toBe(alone.fits.quadraticPlateau.sse);
  });
});
