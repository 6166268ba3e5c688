// Nested F-tests of a common response across sites, checked against R 4.2.2's
// anova() on lm fits of the same invented plots: tests/fixtures/sites/pooled.R
// wrote pooled.plots.csv and pooled.anova.csv (the R version is in its first line).
import { describe, expect, it } from 'vitest';
import { testCommonResponse, type PooledLinearModel } from '../shared/analysis/commonResponseTests';
import { sitePlots } from '../shared/analysis/sitePlots';
import { siteRateEffect } from '../shared/analysis/siteRateEffect';
import { groupResponseTest } from '../shared/analysis/groupResponseTest';
import type { FTestResult } from '../shared/analysis/extraSumOfSquaresTest';
import { fixtureHeader, pooledPlotTable, readRCsv } from './analysis.fixtures';

const anova = readRCsv('pooled.anova.csv');
const sites = sitePlots(pooledPlotTable());

function rRow(test: string, model: string, levels: string): Record<string, number> {
  const row = anova.find((r) => r.test === test && r.model === model && r.levels === levels);
  if (!row) throw new Error(`no R row for ${test} ${model} ${levels}`);
  return Object.fromEntries(
    Object.entries(row)
      .filter(([k]) => !['test', 'model', 'levels'].includes(k))
      .map(([k, v]) => [k, Number(v)]),
  );
}

/** F to 1e-9 relative; p to 1e-9 absolute plus 1e-7 relative (1 − CDF loses digits below ~1e-15). */
function expectSameTest(actual: FTestResult, r: Record<string, number>): void {
  expect(actual.df1).toBe(r.df);
  expect(actual.df2).toBeGreaterThan(0);
  expect(Math.abs(actual.f - r.F)).toBeLessThanOrEqual(1e-9 * r.F);
  expect(Math.abs(actual.p - r.p)).toBeLessThanOrEqual(1e-9 + 1e-7 * r.p);
  expect(Math.abs(actual.extraSse - r.ss)).toBeLessThanOrEqual(1e-9 * r.ss);
}

function fTest(t: { result: FTestResult | { kind: 'no-test' } }): FTestResult {
  if (t.result.kind !== 'f-test') throw new Error('expected an F-test');
  return t.result;
}

describe('testCommonResponse against R anova() (tests/fixtures/sites/pooled.anova.csv)', () => {
  it('reads a fixture written by R 4.2.2 with six sites of 24 plots', () => {
    expect(fixtureHeader('pooled.anova.csv')).toMatch(/^# R version 4\.2\.2/);
    expect(sites.map((s) => s.yieldKgHa.length)).toEqual([24, 24, 24, 24, 24, 24]);
  });

  const cases: [PooledLinearModel, 'site' | 'blockWithinSite'][] = [
    ['linear', 'site'],
    ['linear', 'blockWithinSite'],
    ['quadratic', 'site'],
    ['quadratic', 'blockWithinSite'],
  ];
  for (const [model, levels] of cases) {
    it(`testCommonResponse matches anova(m0, m1, m2) and anova(m0, m2) for the ${model} with ${levels} levels`, () => {
      const t = testCommonResponse(sites, model, { levels });
      expect(t.sitesLeftOut).toEqual([]);
      const byQ = Object.fromEntries(t.tests.map((x) => [x.question, x]));
      for (const q of ['common-vs-levels', 'levels-vs-site-curves', 'common-vs-site-curves']) {
        const r = rRow(q, model, levels);
        expectSameTest(fTest(byQ[q]), r);
      }
      const full = rRow('common-vs-site-curves', model, levels);
      expect(t.siteCurves?.df).toBe(full.resDf);
      expect(Math.abs((t.siteCurves?.sse ?? NaN) - full.rss)).toBeLessThanOrEqual(1e-9 * full.rss);
      const lv = rRow('common-vs-levels', model, levels);
      expect(t.siteLevels?.df).toBe(lv.resDf);
      expect(Math.abs((t.siteLevels?.sse ?? NaN) - lv.rss)).toBeLessThanOrEqual(1e-9 * lv.rss);
    });
  }

  it('testCommonResponse matches anova(lm(y ~ 0 + x), lm(y ~ 0 + site:x)) for the proportional model', () => {
    const t = testCommonResponse(sites, 'proportional');
    expect(t.tests.map((x) => x.question)).toEqual(['common-vs-site-curves']);
    expectSameTest(fTest(t.tests[0]), rRow('common-vs-site-curves', 'proportional', 'site'));
    expect(t.tests[0].sentence).toMatch(/one common curve describes the sites as well/);
  });

  it('testCommonResponse reports homogeneity of slopes as anova(lm(y ~ site + x), lm(y ~ site * x))', () => {
    const t = testCommonResponse(sites, 'linear');
    expect(t.slopeHomogeneity).not.toBeNull();
    expectSameTest(fTest(t.slopeHomogeneity!), rRow('slope-homogeneity', 'linear', 'site'));
    expect(t.slopeHomogeneity!.sentence).toMatch(
      /^Homogeneity of slopes .*: F = 3\.47 on 5 and 132 df, p = 0\.006; at the 5% level the response to rate differs between sites\.$/,
    );
  });

  it('testCommonResponse leaves out, with the reason, a site with too few rates for a quadratic', () => {
    const twoRates = { ...sites[0], site: 'Gorse Lane' };
    const keep = Array.from(twoRates.rateKgHa, (r, i) => (r === 0 || r === 225 ? i : -1)).filter(
      (i) => i >= 0,
    );
    const cut = {
      ...twoRates,
      rateKgHa: Float64Array.from(keep, (i) => twoRates.rateKgHa[i]),
      yieldKgHa: Float64Array.from(keep, (i) => twoRates.yieldKgHa[i]),
      block: keep.map((i) => twoRates.block[i]),
      plotIds: keep.map((i) => twoRates.plotIds[i]),
    };
    const t = testCommonResponse([...sites, cut], 'quadratic');
    expect(t.sitesLeftOut).toEqual([
      { site: 'Gorse Lane', reason: '2 distinct rates; a quadratic needs at least 3' },
    ]);
    expectSameTest(fTest(t.tests[2]), rRow('common-vs-site-curves', 'quadratic', 'site'));
  });

  it('testCommonResponse gives no test, with a reason, for a single site', () => {
    const t = testCommonResponse(sites.slice(0, 1), 'linear');
    expect(t.tests.every((x) => x.result.kind === 'no-test')).toBe(true);
    expect(t.tests[0].sentence).toMatch(/no test \(fewer than two sites can be fitted/);
  });
});

describe('siteRateEffect against R anova(lm(y ~ block), lm(y ~ block + factor(rate)))', () => {
  for (const site of sites) {
    it(`siteRateEffect matches R's rate-effect F and CV% at ${site.site}`, () => {
      const r = rRow('rate-effect', site.site, 'blocks');
      const e = siteRateEffect(site);
      if (e.test.kind !== 'f-test') throw new Error('expected a test');
      expect(e.test.df1).toBe(5);
      expect(e.test.df2).toBe(15);
      expect(Math.abs(e.test.f - r.F)).toBeLessThanOrEqual(1e-9 * r.F);
      expect(Math.abs(e.test.p - r.p)).toBeLessThanOrEqual(1e-9 + 1e-7 * r.p);
      // The R script stores CV% = 100·√(deviance/df)/mean(yield) in the ss column.
      expect(Math.abs(e.cvPct - r.ss)).toBeLessThanOrEqual(1e-9 * r.ss);
    });
  }
});

describe('groupResponseTest against R anova(lm(y ~ site + g(x)), lm(y ~ site + previousCrop:g(x)))', () => {
  const groupOf = new Map(sites.map((s) => [s.site, s.groups.previousCrop as string]));
  for (const model of ['linear', 'quadratic'] as const) {
    it(`groupResponseTest matches R for the ${model} by previous crop`, () => {
      const t = groupResponseTest(sites, groupOf, model, 'previous crop', 0.05);
      expect(t.groupsUsed).toEqual(['soybean', 'corn']);
      expectSameTest(fTest(t), rRow('groups', model, 'site'));
      expect(t.sentence).toMatch(
        /at the 5% level the groups of previous crop respond differently\.$/,
      );
    });
  }
});

describe('unbalanced sites against R (pooled.R leaves out CSV data rows 1, 30 and 77)', () => {
  // Here the three plots are excluded in the plot table, as the sheet or the user would.
  const t = pooledPlotTable();
  const cut = new Set([0, 29, 76]);
  const unbalanced = sitePlots({
    ...t,
    plots: t.plots.map((p, i) =>
      cut.has(i) ? { ...p, excluded: { reason: 'lodged', by: 'user' } } : p,
    ),
  });

  it('testCommonResponse matches anova(m0, m1, m2) for the quadratic with block-within-site levels', () => {
    const res = testCommonResponse(unbalanced, 'quadratic', { levels: 'blockWithinSite' });
    const byQ = Object.fromEntries(res.tests.map((x) => [x.question, x]));
    for (const q of ['common-vs-levels', 'levels-vs-site-curves', 'common-vs-site-curves']) {
      expectSameTest(fTest(byQ[q]), rRow(q, 'quadratic', 'blockWithinSite-unbalanced'));
    }
    expect(res.siteCurves?.df).toBe(
      rRow('common-vs-site-curves', 'quadratic', 'blockWithinSite-unbalanced').resDf,
    );
  });

  for (const site of ['Alder Flats', 'Birch Hollow', 'Dunmore East']) {
    it(`siteRateEffect matches R with a plot missing at ${site}`, () => {
      const r = rRow('rate-effect-unbalanced', site, 'blocks');
      const e = siteRateEffect(unbalanced.find((s) => s.site === site)!);
      if (e.test.kind !== 'f-test') throw new Error('expected a test');
      expect([e.test.df1, e.test.df2]).toEqual([5, r.resDf]);
      expect(Math.abs(e.test.f - r.F)).toBeLessThanOrEqual(1e-9 * r.F);
      expect(Math.abs(e.test.p - r.p)).toBeLessThanOrEqual(1e-9 + 1e-7 * r.p);
      expect(Math.abs(e.cvPct - r.ss)).toBeLessThanOrEqual(1e-9 * r.ss);
    });
  }
});
