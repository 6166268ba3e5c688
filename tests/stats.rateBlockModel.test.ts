// The rate + block model has one owner (shared/stats/rateBlockModel.ts): the quality checks, the
// analysis' rate effect and the report's ANOVA must read the same numbers from it. References:
// R 4.2.2's anova(lm(y ~ block), lm(y ~ block + factor(rate))) in tests/fixtures/sites/
// pooled.anova.csv (made by the R script beside it) and anova(lm(y ~ factor(block) +
// factor(rate))) in tests/fixtures/stats-r/rate-block-reference.json (make-rate-block-reference.R).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { siteRateEffect } from '../shared/analysis/siteRateEffect';
import { sitePlots } from '../shared/analysis/sitePlots';
import { syntheticPlotTable } from '../shared/demo/syntheticTrial';
import { fitTreatmentBlock } from '../shared/quality/treatmentBlockModel';
import { siteAnova } from '../shared/analysis/siteAnova';
import { defaultBlockTerms, hasBlocks, isBlockLabel } from '../shared/stats/hasBlocks';
import { fitRateBlockModel, type RateBlockModel } from '../shared/stats/rateBlockModel';
import { analyzablePlots, type PlotTable } from '../shared/table/plotTable';
import { pooledPlotTable, readRCsv } from './analysis.fixtures';

/** The three callers and the model itself on one site of a table. */
function callers(table: PlotTable, site: string) {
  const plots = analyzablePlots(table).filter((p) => p.site === site);
  const rates = plots.map((p) => p.rateKgHa!);
  const yields = plots.map((p) => p.yieldKgHa!);
  const blocks = plots.map((p) => p.block);
  const model = fitRateBlockModel({ rateKgHa: rates, yieldKgHa: yields, block: blocks });
  if ('problem' in model) throw new Error(model.problem);
  const quality = fitTreatmentBlock(plots);
  if ('reason' in quality) throw new Error(quality.reason);
  const analysis = siteRateEffect(sitePlots(table).find((s) => s.site === site)!);
  if (analysis.test.kind !== 'f-test') throw new Error(analysis.test.reason);
  const report = siteAnova(rates, yields, blocks);
  if (!report.anova) throw new Error('no ANOVA in the report');
  return { model, quality, analysis: { ...analysis, test: analysis.test }, report, plots };
}

function expectSameNumbers(c: ReturnType<typeof callers>, model: RateBlockModel): void {
  // Quality: CV, mean, design size.
  expect(c.quality.cvPct).toBe(model.cvPct);
  expect(c.quality.meanKgHa).toBe(model.meanKgHa);
  expect([c.quality.rates, c.quality.blocks]).toEqual([model.rateCount, model.blockCount]);
  // The least-squares fit behind the outlier check has the model's residual df and SS.
  expect(c.quality.fit.dfResidual).toBe(model.residual.df);
  expect(Math.abs(c.quality.fit.sse - model.residual.ss)).toBeLessThanOrEqual(
    1e-9 * model.residual.ss,
  );
  // Analysis: the rate effect's F-test and CV.
  expect(c.analysis.test.f).toBe(model.F);
  expect(c.analysis.test.p).toBe(model.p);
  expect([c.analysis.test.df1, c.analysis.test.df2]).toEqual([model.rates.df, model.residual.df]);
  expect(c.analysis.test.extraSse).toBe(model.rates.ss);
  expect(c.analysis.cvPct).toBe(model.cvPct);
  // Report: the ANOVA table's rate and error lines, CV and rate means.
  const row = (source: string) => c.report.anova!.rows.find((r) => r.source === source)!;
  expect([row('N rate').F, row('N rate').p, row('N rate').ss]).toEqual([
    model.F,
    model.p,
    model.rates.ss,
  ]);
  expect([row('Error').df, row('Error').ss]).toEqual([model.residual.df, model.residual.ss]);
  expect(c.report.anova!.cvPercent).toBe(model.cvPct);
  expect(c.report.means.map((m) => m.meanKgHa)).toEqual(model.rateMeans.map((m) => m.meanKgHa));
}

describe('fitRateBlockModel: one model for quality, analysis and report', () => {
  it('gives the three callers identical numbers on a demo site with four blocks', () => {
    const table = syntheticPlotTable({ sites: 2, seed: 11 });
    const c = callers(table, table.plots[0].site);
    expect(c.model.design).toBe('rcbd');
    expect([c.model.rateCount, c.model.blockCount, c.model.n]).toEqual([6, 4, 24]);
    expect(c.model.missingPlots).toEqual([]);
    expectSameNumbers(c, c.model);
  });

  it('gives the three callers identical numbers on a demo site with a missing plot', () => {
    const full = syntheticPlotTable({ sites: 2, seed: 11 });
    const site = full.plots[0].site;
    const dropped = full.plots.findIndex((p) => p.site === site && p.block === '3');
    const table: PlotTable = {
      ...full,
      plots: full.plots.map((p, i) =>
        i === dropped ? { ...p, excluded: { reason: 'lodged', by: 'user' } } : p,
      ),
    };
    const c = callers(table, site);
    expect(c.model.missingPlots).toEqual([{ rateKgHa: full.plots[dropped].rateKgHa, block: '3' }]);
    expect(c.model.residual.df).toBe(14); // (6 − 1)(4 − 1) − 1 missing plot
    expectSameNumbers(c, c.model);
  });

  it('matches R with and without a missing plot (tests/fixtures/sites/pooled.anova.csv)', () => {
    const anova = readRCsv('pooled.anova.csv');
    const rRow = (test: string, site: string) =>
      anova.find((r) => r.test === test && r.model === site && r.levels === 'blocks')!;
    const t = pooledPlotTable();
    const cut = new Set([0, 29, 76]); // the plots pooled.R leaves out
    const unbalanced: PlotTable = {
      ...t,
      plots: t.plots.map((p, i) =>
        cut.has(i) ? { ...p, excluded: { reason: 'lodged', by: 'user' } } : p,
      ),
    };
    for (const [table, test, site] of [
      [t, 'rate-effect', 'Alder Flats'],
      [unbalanced, 'rate-effect-unbalanced', 'Alder Flats'],
    ] as const) {
      const r = rRow(test, site);
      const c = callers(table, site);
      expectSameNumbers(c, c.model);
      expect(c.model.residual.df).toBe(Number(r.resDf));
      expect(Math.abs(c.model.F - Number(r.F))).toBeLessThanOrEqual(1e-9 * Number(r.F));
      expect(Math.abs(c.model.p - Number(r.p))).toBeLessThanOrEqual(1e-9 + 1e-7 * Number(r.p));
      // The R script stores CV% = 100·√(deviance/df)/mean(yield) in the ss column.
      expect(Math.abs(c.model.cvPct! - Number(r.ss))).toBeLessThanOrEqual(1e-9 * Number(r.ss));
    }
  });

  it('fits a block holding a rate twice by least squares with blocks first, as R does', () => {
    const ref = JSON.parse(
      readFileSync(
        new URL('./fixtures/stats-r/rate-block-reference.json', import.meta.url),
        'utf8',
      ),
    ) as Record<string, number[] | string[]>;
    const m = fitRateBlockModel({
      rateKgHa: ref.rate as number[],
      yieldKgHa: ref.y as number[],
      block: ref.block as string[],
    });
    if ('problem' in m) throw new Error(m.problem);
    const [dfB, dfR, dfE] = ref.df as number[];
    const [ssB, ssR, ssE] = ref.ss as number[];
    const [fB, fR] = ref.F as number[];
    const [pB, pR] = ref.p as number[];
    const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
    expect([m.blocks!.df, m.rates.df, m.residual.df]).toEqual([dfB, dfR, dfE]);
    expect(rel(m.blocks!.ss, ssB)).toBeLessThan(1e-9);
    expect(rel(m.rates.ss, ssR)).toBeLessThan(1e-9);
    expect(rel(m.residual.ss, ssE)).toBeLessThan(1e-9);
    expect(rel(m.blockF!, fB)).toBeLessThan(1e-9);
    expect(rel(m.F, fR)).toBeLessThan(1e-9);
    expect(rel(m.blockP!, pB)).toBeLessThan(1e-7);
    expect(rel(m.p, pR)).toBeLessThan(1e-7);
    expect(rel(m.cvPct!, (ref.cvPercent as number[])[0])).toBeLessThan(1e-9);
    expect(m.rateMeans.map((r) => r.meanKgHa)).toEqual(
      (ref.rMeans as number[]).map((v) => expect.closeTo(v, 6)),
    );
    expect(m.lsdKgHa).toBeNull();
  });

  it('says why there is no model: no plots, one rate, no residual df, equal yields', () => {
    const fit = (rate: number[], y: number[], block: (string | null)[]) =>
      fitRateBlockModel({ rateKgHa: rate, yieldKgHa: y, block });
    expect(fit([], [], [])).toEqual({ problem: 'no plots', code: 'no-plots' });
    expect(fit([50, 50], [1, 2], [null, null])).toEqual({
      problem: 'only one rate was tested',
      code: 'one-rate',
    });
    expect(fit([0, 50, 0, 50], [1, 2, 1.5, 2.5], ['1', '1', '2', '2'])).not.toHaveProperty(
      'problem',
    );
    expect(fit([0, 50, 100, 0], [1, 2, 3, 1.2], ['1', '1', '1', '2'])).toEqual({
      problem: 'no residual degrees of freedom are left after blocks and rates',
      code: 'too-few-points',
    });
    expect(fit([0, 0, 50, 50], [4, 4, 4, 4], [null, null, null, null])).toEqual({
      problem: 'every plot has the same yield',
      code: 'constant-values',
    });
  });
});

describe('hasBlocks', () => {
  it('gives block terms only when every plot has a label and there are two blocks or more', () => {
    expect(hasBlocks(['1', '2', '1', '2'])).toBe(true);
    expect(hasBlocks(['1', '2', null, '2'])).toBe(false);
    expect(hasBlocks(['1', '2', '', '2'])).toBe(false);
    expect(hasBlocks(['1', '1', '1'])).toBe(false);
    expect(hasBlocks([])).toBe(false);
    expect(isBlockLabel(' ')).toBe(false);
    expect(defaultBlockTerms(['A', 'B'])).toBe('fixed');
    expect(defaultBlockTerms(['A', null])).toBe('none');
  });

  it('decides the design the model fits: one-way when a plot has no block', () => {
    const m = fitRateBlockModel({
      rateKgHa: [0, 60, 0, 60, 0, 60],
      yieldKgHa: [5, 7, 5.4, 7.1, 4.9, 6.8],
      block: ['1', '1', '2', '2', null, '3'],
    });
    if ('problem' in m) throw new Error(m.problem);
    expect([m.design, m.blockCount, m.residual.df]).toEqual(['oneWay', 1, 4]);
  });
});

describe('fitRateBlockModel: the differences of rate means when the fit is exact', () => {
  it('keeps Var(mean_j − mean_0)/σ² = 2/r (and 1/r between two differences) when every yield is equal', () => {
    // Textbook: two means of r independent plots each differ with variance 2σ²/r and share the
    // control mean's σ²/r (any design text; a balanced layout with blocks orthogonal to rates).
    // Equal yields make σ² = 0 exactly, where covariance ÷ σ² would be 0/0.
    const n = 20_000;
    const m = fitRateBlockModel({
      rateKgHa: Float64Array.from({ length: n }, (_, i) => (i % 5) * 50),
      yieldKgHa: new Float64Array(n).fill(6000),
      block: Array.from({ length: n }, (_, i) => String(1 + (i % 4))),
    });
    if ('problem' in m) throw new Error(m.problem);
    const r = n / 5;
    const u = m.differences.unscaledCovariance;
    expect(u[0][0]).toBeCloseTo(2 / r, 12);
    expect(u[2][1]).toBeCloseTo(1 / r, 12);
    expect(u.flat().every(Number.isFinite)).toBe(true);
  });
});
