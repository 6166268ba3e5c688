// A site with no rate replicated within its design (one plot per rate; or the check in every
// block and each fertilized rate in one block) gets no recommended rate and no interval: its
// rate + block model has no residual degrees of freedom to test its response with, resampling
// plots within rates would draw the single plots as they are every time, and AICc on so few
// plots cannot tell a three-parameter curve from a step (the small-sample term
// 2k(k + 1)/(n − k − 1) of Hurvich & Tsai, Biometrika 76, 1989, is 40 for k = 4 against 12 for
// k = 3 at n = 6). The yields are invented: they rise to about 120 kg/ha, yet the step, a full
// response by 40 kg/ha, has the lowest AICc among the curves.
import { describe, expect, it } from 'vitest';
import { analysisSettings, analyzeTrial, priceTrial } from '../shared/analysis';
import { isReplicated, NO_REPLICATION_REASON } from '../shared/analysis/siteReplication';
import { fitRateBlockModel } from '../shared/stats/rateBlockModel';
import { recommendationModel } from '../shared/analysis/recommendationModel';
import { illustrativePrices } from '../shared/economics/illustrativePrices';
import { growerPage } from '../shared/report/growerPage';
import type { Plot, PlotTable } from '../shared/table/plotTable';
import { reportOf } from './report.pipeline';

const prices = illustrativePrices('corn').canonical;

function plot(site: string, block: number | null, i: number, rate: number, y: number): Plot {
  return {
    id: `${site}|${block}|${i}`,
    site,
    year: 2025,
    block: block === null ? null : String(block),
    plotLabel: `${block ?? 0}0${i}`,
    treatment: null,
    rateKgHa: rate,
    yieldKgHa: y,
    moisturePct: null,
    testWeight: null,
    notes: null,
    groups: {},
    excluded: null,
    original: {},
  };
}

const RATES = [0, 40, 80, 120, 160, 200];
const SINGLE = [9450, 10890, 11070, 12800, 12580, 12580];
// The same rise with the check in four blocks and the other rates in block 1 only: still no
// rate replicated within the blocks. Without block labels and a second check plot the check is
// replicated, so that site is analysed.
const table: PlotTable = {
  crop: 'corn',
  standardMoisturePct: 15.5,
  plots: [
    ...RATES.map((r, i) => plot('One Rep', 1, i + 1, r, SINGLE[i])),
    ...RATES.map((r, i) => plot('Check Strips', 1, i + 1, r, SINGLE[i])),
    ...[9610, 9320, 9700].map((y, b) => plot('Check Strips', b + 2, 1, 0, y)),
    ...RATES.map((r, i) => plot('Check Twice', null, i + 1, r, SINGLE[i])),
    plot('Check Twice', null, 7, 0, 9610),
  ],
  sources: [],
};

describe('a site without replication', () => {
  const analysis = analyzeTrial(table, analysisSettings({ prices }));
  const one = analysis.across.sites.find((s) => s.site === 'One Rep')!;
  const twice = analysis.across.sites.find((s) => s.site === 'Check Twice')!;

  it('is told apart from a site with one rate replicated, by the rate + block model', () => {
    const model = (rates: number[], blocks: (string | null)[], y: number[]) =>
      fitRateBlockModel({ rateKgHa: rates, yieldKgHa: y, block: blocks });
    const nulls = (n: number) => Array.from({ length: n }, () => null);
    expect(isReplicated(model(RATES, nulls(6), SINGLE))).toBe(false);
    expect(isReplicated(model([...RATES, 0], nulls(7), [...SINGLE, 9610]))).toBe(true);
    // With blocks, a second check plot in another block only estimates that block.
    expect(
      isReplicated(model([...RATES, 0], [...RATES.map(() => '1'), '2'], [...SINGLE, 9610])),
    ).toBe(false);
    for (const name of ['One Rep', 'Check Strips']) {
      const s = analysis.across.sites.find((x) => x.site === name)!;
      expect(s.replicated, name).toBe(false);
      expect(s.recommended.model, name).toBeNull();
    }
  });

  it('would have been led by a step under AICc, a full response the yields do not show', () => {
    expect(recommendationModel(one.fits!).model).toBe('step');
    expect(one.fits!.fits.step.status).toBe('full-response-at-lowest-rate');
  });

  it('gets no recommended rate and no resamples, and says why', () => {
    expect(one.fits).not.toBeNull();
    expect(one.recommended).toEqual({ model: null, reason: NO_REPLICATION_REASON });
    expect(one.draws).toBeNull();
    expect(twice.recommended.model).not.toBeNull();
    expect(twice.draws).not.toBeNull();
    const priced = priceTrial(analysis, prices, {});
    const p = priced.sites.find((s) => s.site === 'One Rep')!;
    expect(p.optimum).toBeNull();
    expect(p.interval).toBeNull();
  });

  it('says so on its grower page, with no rate and no claim that the yield did not respond', () => {
    const report = reportOf(
      table,
      {
        units: { rate: 'kg/ha', yield: 'kg/ha' },
        unitSystem: 'metric',
        currency: 'USD',
        crop: 'corn',
        prices: { grainPrice: 0.18, nutrientPrice: 1.1, product: null, defaulted: false },
        boot: 50,
        seed: 1,
        blocks: 'fixed',
        intervalLevel: 0.9,
      },
      {
        tool: { name: 'Plotrate', version: 'test' },
        createdAt: '2026-12-05T00:00:00Z',
        mapping: [],
      },
    );
    const site = report.sites.find((s) => s.site === 'One Rep')!;
    expect(site.recommendation.rateKgHa).toBeNull();
    expect(site.warnings).toContain(`No rate is recommended: ${NO_REPLICATION_REASON}.`);
    const page = growerPage(report, 'One Rep');
    expect(page.rate).toBeNull();
    expect(page.recommendation).toBe('No rate can be recommended from this trial');
    expect(page.warnings.join(' ')).toMatch(/the site has no replicated rate/);
    expect(page.warnings.join(' ')).not.toMatch(/did not respond/);
  });
});
