// Two treatment factors at one site (rate × source × timing): each factor gets its own level test,
// and how the two meet is named (tests/fixtures/levels/crossed.plots.csv, invented by
// makeCrossed.ts: Wicken Lane crossed, Bramble Cross two names for the same treatments, Otter Ford
// partly crossed). The F tests, each factor's own and, where crossed, each adjusted for the other,
// are checked against R 4.2.2's lm() and anova() (crossed.R wrote crossed.anova.csv): F, both df
// and p within 1e-7 relative, as the one-factor tests are (analysis.levelResponseTest.test.ts).
import { beforeAll, describe, expect, it } from 'vitest';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial, type TrialAnalysis } from '../shared/analysis/analyzeTrial';
import type { LevelCurveTest } from '../shared/analysis/levelResponseTest';
import { factorCrossing } from '../shared/analysis/factorCrossing';
import { splitSiteLevels } from '../shared/analysis/siteLevels';
import type { SitePlots } from '../shared/analysis/sitePlots';
import { importFiles } from '../shared/import/importFiles';
import { resultsJson } from '../shared/report/resultsJson';
import type { PlotTable } from '../shared/table/plotTable';
import { metricCornReportOf } from './report.pipeline';
import { readRCsv } from './analysis.fixtures';

const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.26 };

/** An R-written fixture of tests/fixtures/levels/ as header → text rows. */
const rCsv = (file: string) => readRCsv(`../levels/${file}`);

function near(actual: number, expected: number, rel: number): void {
  const tol = rel * Math.max(Math.abs(expected), 1e-300);
  if (!(Math.abs(actual - expected) <= tol))
    throw new Error(`got ${actual}, R gave ${expected}; difference ${actual - expected} > ${tol}`);
}

let analysis: TrialAnalysis;
let table: PlotTable;
beforeAll(async () => {
  const lines = ['Site,Block,Plot,Source,Timing,N rate (kg N/ha),Yield (kg/ha)'];
  for (const r of rCsv('crossed.plots.csv'))
    lines.push([r.site, r.block, r.plot, r.source, r.timing, r.rate, r.yield].join(','));
  ({ table } = await importFiles(
    [{ name: 'source and timing.csv', bytes: new TextEncoder().encode(lines.join('\n') + '\n') }],
    {
      crop: 'corn',
      overrides: [
        { role: 'factor', header: 'Source' },
        { role: 'factor', header: 'Timing' },
      ],
    },
  ));
  expect(table.factorKeys).toEqual(['Source', 'Timing']);
  analysis = analyzeTrial(table, analysisSettings({ prices, resamples: 0 }));
});

const label = (f: string) => (f === 'source' ? 'Source' : 'Timing');

describe('two factors at one site', () => {
  it("gives each factor its own test, as R's anova() gives it", () => {
    for (const r of rCsv('crossed.anova.csv').filter((x) => x.test === 'own')) {
      const f = analysis.levels.find((l) => l.site === r.site && l.factor === label(r.factor))!;
      const t = f.test.quadratic.result;
      if (t.kind !== 'f-test') throw new Error(f.test.quadratic.sentence);
      expect([t.df1, t.df2]).toEqual([Number(r.df), Number(r.resDf1)]);
      near(t.f, Number(r.F), 1e-7);
      near(t.p, Number(r.p), 1e-7);
    }
  });

  it("tests each crossed factor adjusted for the other, as R's anova() does", () => {
    const rows = rCsv('crossed.anova.csv').filter((x) => x.test === 'adjusted');
    expect(rows.length).toBe(2);
    for (const r of rows) {
      const f = analysis.levels.find((l) => l.site === r.site && l.factor === label(r.factor))!;
      const c = f.test.crossings;
      expect(c.map((x) => x.relation)).toEqual(['crossed']);
      const adjusted = c[0].adjusted as LevelCurveTest;
      const t = adjusted.result;
      if (t.kind !== 'f-test') throw new Error(adjusted.sentence);
      expect([t.df1, t.df2]).toEqual([Number(r.df), Number(r.resDf1)]);
      near(adjusted.common!.sse, Number(r.rss0), 1e-7);
      near(t.f, Number(r.F), 1e-7);
      near(t.p, Number(r.p), 1e-7);
      expect(c[0].message).toMatch(/are crossed at Wicken Lane/);
    }
  });

  it('names two columns for the same treatments, and a partly crossed design it does not analyze', () => {
    const of = (site: string, factor: string) =>
      analysis.levels.find((l) => l.site === site && l.factor === factor)!.test.crossings[0];
    expect(of('Bramble Cross', 'Source').relation).toBe('same-treatments');
    expect(of('Bramble Cross', 'Timing').message).toBe(
      'Timing and Source name the same treatments at Bramble Cross (each Timing level goes with one Source level), so their tests are one test read twice.',
    );
    const partly = of('Otter Ford', 'Source');
    expect(partly.relation).toBe('partly-crossed');
    expect(partly.cells).toBe(3);
    expect(partly.adjusted).toBeNull();
    expect(partly.message).toMatch(/does not analyze this design/);
    expect(partly.message).toMatch(/Split the file/);
  });

  it("puts every factor's test in the JSON levelTests[] (levelTest stays the first)", () => {
    const json = resultsJson(metricCornReportOf(table, { boot: 0 }));
    const site = json.sites.find((s) => s.site === 'Wicken Lane')!;
    expect(site.levelTests.map((t) => t.factor)).toEqual(['Source', 'Timing']);
    expect(site.levelTest).toEqual(site.levelTests[0]);
    const c = site.levelTests[1].crossings[0];
    expect(c.other).toBe('Source');
    expect(c.relation).toBe('crossed');
    const r = rCsv('crossed.anova.csv').find(
      (x) => x.site === 'Wicken Lane' && x.factor === 'timing' && x.test === 'adjusted',
    )!;
    near(c.adjusted!.F, Number(r.F), 1e-7);
  });

  it('names a factor nested in another (products within sources), with no adjusted test', () => {
    // Three products, two of them urea-based: each product goes with one source, not back.
    const product = [
      '',
      'Urea 46',
      'Urea 46',
      'Stabilised urea',
      'Stabilised urea',
      'UAN 28',
      'UAN 28',
    ];
    const source = ['', 'Urea', 'Urea', 'Urea', 'Urea', 'UAN', 'UAN'];
    const site: SitePlots = {
      site: 'Heron Mead',
      year: 2025,
      siteName: 'Heron Mead',
      rateKgHa: Float64Array.from([0, 60, 120, 60, 120, 60, 120]),
      yieldKgHa: Float64Array.from([8000, 10000, 11500, 10200, 11800, 9900, 11200]),
      block: product.map(() => '1'),
      plotIds: product.map((_, i) => `p${i}`),
      groups: {},
      problem: null,
    };
    const of = (cells: string[]) => (id: string) => cells[Number(id.slice(1))] || null;
    const byProduct = splitSiteLevels(site, 'Product', of(product));
    const bySource = splitSiteLevels(site, 'Source', of(source));
    const p = factorCrossing(site, byProduct, bySource, 'auto', 0.05);
    expect(p.relation).toBe('nested');
    expect(p.cells).toBe(3);
    expect(p.adjusted).toBeNull();
    expect(p.message).toBe(
      'Product levels sit within Source levels at Heron Mead (each Product level with one Source level): the Source test compares groups of Product levels, the Product test the levels one by one.',
    );
    expect(factorCrossing(site, bySource, byProduct, 'auto', 0.05).relation).toBe('nested');
  });
});
