// The demo generator: deterministic, the scenario it promises (sites, rates,
// blocks, response shapes, noise), and synthetic trials that import to the
// same numbers the direct PlotTable generator gives.
import { describe, expect, it } from 'vitest';
import {
  demoTrial,
  mulberry32,
  syntheticCsv,
  syntheticPlotTable,
  syntheticRows,
  syntheticWorkbook,
  writeDemoWorkbook,
} from '../shared/demo';
import { buildPlotTable, detectColumns, readTrialFile } from '../shared/import';
import { fitTreatmentBlock } from '../shared/quality';

describe('mulberry32', () => {
  it('gives the reference sequence for seed 1 and a uniform-looking spread', () => {
    // First output for seed 1 worked by hand from the published algorithm (Ettinger 2017):
    // a = 0x6d2b79f5; t = imul(a ^ a>>>15, a | 1); … ⇒ 2693262203 / 2^32.
    expect(mulberry32(1).next()).toBeCloseTo(0.6270739405881613, 15);
    const r = mulberry32(42);
    const xs = Array.from({ length: 20000 }, () => r.next());
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length;
    expect(mean).toBeGreaterThan(0.49); // uniform mean 1/2, sd of the mean ≈ 0.002
    expect(mean).toBeLessThan(0.51);
    const n = mulberry32(7);
    const zs = Array.from({ length: 20000 }, () => n.normal());
    const zm = zs.reduce((s, x) => s + x, 0) / zs.length;
    const zv = zs.reduce((s, x) => s + (x - zm) ** 2, 0) / (zs.length - 1);
    expect(Math.abs(zm)).toBeLessThan(0.03);
    expect(zv).toBeGreaterThan(0.96);
    expect(zv).toBeLessThan(1.04);
  });
});

describe('demoTrial', () => {
  const t = demoTrial();

  it('is the same on every call and differs with another seed', () => {
    expect(JSON.stringify(demoTrial())).toBe(JSON.stringify(t));
    expect(demoTrial(1).cornPlots.map((p) => p.yieldWet)).not.toEqual(
      t.cornPlots.map((p) => p.yieldWet),
    );
  });

  it('has six corn sites × six rates (0–240 lb N/ac) × four blocks, one plot missing, and two metric wheat sites', () => {
    const corn = t.sites.filter((s) => s.crop === 'corn');
    expect(corn.length).toBeGreaterThanOrEqual(5);
    expect(t.cornTreatments.map((x) => x.rateLbAc)).toEqual([0, 40, 80, 120, 180, 240]);
    expect(t.cornPlots).toHaveLength(corn.length * 24 - 1);
    expect(new Set(t.cornPlots.map((p) => p.block))).toEqual(new Set([1, 2, 3, 4]));
    expect(t.wheatPlots).toHaveLength(40);
    expect(new Set(t.sites.map((s) => s.shape))).toEqual(
      new Set(['quadratic-plateau', 'linear-plateau', 'mitscherlich', 'flat']),
    );
    expect(new Set(t.cornPlots.map((p) => p.previousCrop))).toEqual(new Set(['corn', 'soybean']));
  });

  it('harvest moistures differ from the standard, so the adjustment matters', () => {
    const ms = t.cornPlots.map((p) => p.moisturePct);
    expect(Math.min(...ms)).toBeGreaterThan(14);
    expect(Math.max(...ms)).toBeLessThan(26);
    expect(ms.reduce((s, m) => s + m, 0) / ms.length).toBeGreaterThan(17.5);
  });

  it('gives each site plot noise with a CV near 5–10 % and real responses except at the flat site', async () => {
    const raw = await readTrialFile({ name: 'demo.xlsx', bytes: await writeDemoWorkbook(t) });
    const m = detectColumns(raw);
    const cornSites = t.sites.filter((s) => s.crop === 'corn').map((s) => s.name);
    const { table } = buildPlotTable(raw, m, {
      crop: 'corn',
      rateBasis: 'nutrient',
      sheets: cornSites,
    });
    for (const site of cornSites) {
      const plots = table.plots.filter((p) => p.site === site && p.excluded === null);
      const fit = fitTreatmentBlock(plots);
      if ('reason' in fit) throw new Error(fit.reason);
      expect(fit.cvPct, site).toBeGreaterThan(3);
      expect(fit.cvPct, site).toBeLessThan(11);
      const mean = (r: number) => {
        const ys = plots.filter((p) => Math.abs(p.rateKgHa! - r) < 1e-6).map((p) => p.yieldKgHa!);
        return ys.reduce((s, y) => s + y, 0) / ys.length;
      };
      const rates = [...new Set(plots.map((p) => p.rateKgHa!))].sort((a, b) => a - b);
      const gain = mean(rates[rates.length - 1]) / mean(0) - 1;
      if (site === t.quirks.flatSite) expect(Math.abs(gain), site).toBeLessThan(0.08);
      else expect(gain, site).toBeGreaterThan(0.25);
    }
  });
});

describe('synthetic trials', () => {
  it('has 24 plots per site and the CSV and workbook import to the PlotTable the direct generator gives', async () => {
    expect(syntheticRows({ sites: 3 })).toHaveLength(72);
    const direct = syntheticPlotTable({ sites: 3 });
    for (const [name, bytes] of [
      ['s.csv', new TextEncoder().encode(syntheticCsv({ sites: 3 }))],
      ['s.xlsx', await syntheticWorkbook({ sites: 3 })],
    ] as const) {
      const raw = await readTrialFile({ name, bytes });
      const { table } = buildPlotTable(raw, detectColumns(raw), {
        crop: 'corn',
        rateBasis: 'nutrient',
      });
      expect(table.plots).toHaveLength(72);
      table.plots.forEach((p, i) => {
        expect(p.site).toBe(direct.plots[i].site);
        expect(p.rateKgHa!).toBeCloseTo(direct.plots[i].rateKgHa!, 9);
        expect(p.yieldKgHa!).toBeCloseTo(direct.plots[i].yieldKgHa!, 6);
      });
    }
  });
});
