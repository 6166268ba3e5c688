// One site over two years: site-years as the unit (own blocks, plots, checks and fits), the
// findings for a repeated site name and a repeated plot number, and the year comparison
// checked against R 4.2.2's anova() on lm fits of the same invented plots
// (tests/fixtures/siteyears/yearsCompared.R wrote yearsCompared.anova.csv from
// siteYears.plots.csv, which makeSiteYears.ts wrote with the project's seeded generator), and
// by simulation against known truths (shared/demo/simulatedSite).
import { describe, expect, it } from 'vitest';
import { analyzeAcrossSites } from '../shared/analysis/analyzeAcrossSites';
import type { FTestResult } from '../shared/analysis/extraSumOfSquaresTest';
import { sitePlots } from '../shared/analysis/sitePlots';
import type { YearComparison } from '../shared/analysis/yearsCompared';
import { simulatedTrial, type TruthName } from '../shared/demo/simulatedSite';
import { importFiles } from '../shared/import/importFiles';
import { checkQuality } from '../shared/quality/checkQuality';
import { growerPage } from '../shared/report/growerPage';
import { fixtureHeader, readRCsv } from './analysis.fixtures';
import { reportOf } from './report.pipeline';

const PLOTS = '../siteyears/siteYears.plots.csv';
const ANOVA = '../siteyears/yearsCompared.anova.csv';
const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 };

/** The fixture's plots as one CSV file per year, as a user would have them. */
function yearFile(year: string, extraRow = ''): { name: string; bytes: Uint8Array } {
  const rows = readRCsv(PLOTS).filter((r) => r.year === year);
  const lines = ['Site,Year,Block,Plot,N rate (kg N/ha),Yield (kg/ha)'];
  for (const r of rows) lines.push([r.site, r.year, r.block, r.plot, r.rate, r.yield].join(','));
  if (extraRow) lines.push(extraRow);
  return { name: `trial ${year}.csv`, bytes: new TextEncoder().encode(lines.join('\n') + '\n') };
}

async function twoYears(extraRow2024 = '') {
  return importFiles([yearFile('2024', extraRow2024), yearFile('2025')], {
    crop: 'corn',
    overrides: [],
  });
}

function fTest(result: FTestResult | { kind: 'no-test' }): FTestResult {
  if (result.kind !== 'f-test') throw new Error('expected an F-test');
  return result;
}

describe('site-years: two files of the same sites for 2024 and 2025', () => {
  it('sitePlots makes one unit per site and year, each with its own four blocks', async () => {
    const { table } = await twoYears();
    expect(new Set(table.plots.map((p) => p.year))).toEqual(new Set([2024, 2025]));
    const units = sitePlots(table);
    expect(units.map((u) => [u.site, u.siteName, u.year])).toEqual([
      ['Wrenfield 2024', 'Wrenfield', 2024],
      ["Hobb's Reach 2024", "Hobb's Reach", 2024],
      ['Wrenfield 2025', 'Wrenfield', 2025],
      ["Hobb's Reach 2025", "Hobb's Reach", 2025],
    ]);
    for (const u of units) {
      expect(u.yieldKgHa.length).toBe(24);
      // Block "1" of 2024 and block "1" of 2025 are two blocks: each unit holds 6 plots of it.
      expect(u.block.filter((b) => b === '1')).toHaveLength(6);
      expect(new Set(u.plotIds.map((id) => id.split('|')[0]))).toEqual(
        new Set([`trial ${u.year}.csv`]),
      );
    }
  });

  it('analyzes each site-year as a randomized block trial of its own (rate F on 5 and 15 df)', async () => {
    const { table } = await twoYears();
    const a = analyzeAcrossSites(table, { prices });
    expect(a.sites.map((s) => [s.site, s.year, s.plots, s.blocks])).toEqual([
      ['Wrenfield 2024', 2024, 24, 'fixed'],
      ["Hobb's Reach 2024", 2024, 24, 'fixed'],
      ['Wrenfield 2025', 2025, 24, 'fixed'],
      ["Hobb's Reach 2025", 2025, 24, 'fixed'],
    ]);
    // 24 plots, 6 rates, 4 blocks: residual df (6 − 1)(4 − 1) = 15. Pooling the years into one
    // site of 48 plots with 4 blocks would leave 48 − 6 − 3 = 39.
    for (const s of a.sites) expect(fTest(s.rateEffect.test).df2).toBe(15);
  });

  it('checkQuality reports each repeated site name once with its years, and no repeated plot', async () => {
    const { table } = await twoYears();
    const findings = checkQuality(table);
    const several = findings.filter((f) => f.code === 'site-in-several-years');
    expect(several.map((f) => f.message)).toEqual([
      'Wrenfield has plots from 2 years (2024, 2025); each year is analyzed as its own site-year (Wrenfield 2024, Wrenfield 2025) with its own blocks and plots, and the years are compared across sites.',
      "Hobb's Reach has plots from 2 years (2024, 2025); each year is analyzed as its own site-year (Hobb's Reach 2024, Hobb's Reach 2025) with its own blocks and plots, and the years are compared across sites.",
    ]);
    // Plot 101 exists in both years: not a repeat.
    expect(findings.filter((f) => f.code === 'duplicate-plot')).toEqual([]);
  });

  it('checkQuality names the file, sheet and cells of a plot number repeated within a site-year', async () => {
    const { table } = await twoYears('Wrenfield,2024,4,101,0,9000');
    const dup = checkQuality(table).filter((f) => f.code === 'duplicate-plot');
    expect(dup).toHaveLength(1);
    expect(dup[0].site).toBe('Wrenfield 2024');
    expect(dup[0].refs.map((r) => [r.file, r.cell])).toEqual([
      ['trial 2024.csv', 'D2'],
      ['trial 2024.csv', 'D50'],
    ]);
    expect(dup[0].message).toBe(
      'Wrenfield 2024: plot 101 appears 2 times (trial 2024.csv › D2, trial 2024.csv › D50); correct the plot numbers or exclude the wrong row.',
    );
  });
});

describe('yearsCompared against R anova() (tests/fixtures/siteyears/yearsCompared.anova.csv)', () => {
  const anova = readRCsv(ANOVA);
  function rRow(site: string, test: string): Record<string, number> {
    const row = anova.find((r) => r.site === site && r.test === test);
    if (!row) throw new Error(`no R row for ${site} ${test}`);
    return Object.fromEntries(
      Object.entries(row)
        .filter(([k]) => k !== 'site' && k !== 'test')
        .map(([k, v]) => [k, Number(v)]),
    );
  }
  /**
   * F and the extra SS to 1e-9 relative; p to 1e-9 absolute plus 1e-7 relative. The
   * denominator's df is that of the year-specific curves (m2) in every row.
   */
  function expectSameTest(actual: FTestResult, r: Record<string, number>, df2: number): void {
    expect(actual.df1).toBe(r.df);
    expect(actual.df2).toBe(df2);
    expect(Math.abs(actual.f - r.F)).toBeLessThanOrEqual(1e-9 * r.F);
    expect(Math.abs(actual.p - r.p)).toBeLessThanOrEqual(1e-9 + 1e-7 * r.p);
    expect(Math.abs(actual.extraSse - r.ss)).toBeLessThanOrEqual(1e-9 * r.ss);
  }

  it('reads a fixture written by R 4.2.2', () => {
    expect(fixtureHeader(ANOVA)).toMatch(/^# R version 4\.2\.2/);
  });

  it('the level and response tests are anova(m0, m1, m2) of y ~ x + x², + year, year × (x + x²)', async () => {
    const { table } = await twoYears();
    const compared = analyzeAcrossSites(table, { prices }).yearsCompared;
    expect(compared.map((c) => c.site)).toEqual(['Wrenfield', "Hobb's Reach"]);
    for (const c of compared) {
      expect(c.siteYears.map((s) => s.year)).toEqual([2024, 2025]);
      const df2 = rRow(c.site, 'common-vs-site-curves').resDf;
      expectSameTest(fTest(c.level.result), rRow(c.site, 'common-vs-levels'), df2);
      expectSameTest(fTest(c.response.result), rRow(c.site, 'levels-vs-site-curves'), df2);
      const whole = c.tests.quadratic.tests.find((t) => t.question === 'common-vs-site-curves')!;
      expectSameTest(fTest(whole.result), rRow(c.site, 'common-vs-site-curves'), df2);
    }
    // Wrenfield's 2025 did not respond (generated flat), Hobb's Reach had one truth both years.
    expect(compared[0].sentence).toMatch(
      /^Wrenfield, 2024 and 2025: .*p < 0\.001; at the 5% level the response to N differs between the years\./,
    );
    expect(compared[1].sentence).toMatch(
      /p = 0\.64; at the 5% level the years do not differ detectably in their response to N\./,
    );
  });
});

describe('the grower page of one season of a site tried over several', () => {
  it('says whether the season responded as the others did, with the p of the comparison', async () => {
    const { table, mapping } = await twoYears();
    const report = reportOf(
      table,
      {
        units: { rate: 'kg/ha', yield: 't/ha' },
        unitSystem: 'metric',
        currency: 'USD',
        crop: 'corn',
        prices: { grainPrice: 180, nutrientPrice: 1.1, product: null, defaulted: false },
        boot: 0,
        seed: 1,
        blocks: 'fixed',
        intervalLevel: 0.9,
      },
      { tool: { name: 'Plotrate', version: '0.1.0' }, createdAt: '2026-03-01T12:00:00Z', mapping },
    );
    expect(report.sites.map((s) => s.year)).toEqual([2024, 2024, 2025, 2025]);
    expect(growerPage(report, 'Wrenfield 2024').basis).toContain(
      'This is the 2024 season of Wrenfield, tried in 2024, 2025: the response to N differed between the seasons (p < 0.001), so this page speaks for 2024 alone.',
    );
    // R: p = 0.6357 for Hobb's Reach (yearsCompared.anova.csv).
    expect(growerPage(report, "Hobb's Reach 2025").basis).toContain(
      "This is the 2025 season of Hobb's Reach, tried in 2024, 2025: the response to N did not differ detectably between the seasons (p = 0.64); this page still rests on this season's plots alone.",
    );
  });
});

/** One site per pair of truths, each over 2024 and 2025, analyzed; the year comparisons. */
function simulatedYears(
  pair: [TruthName, TruthName],
  sites: number,
  seed: number,
  blockSdKgHa?: number,
): YearComparison[] {
  const truths: TruthName[] = [];
  const siteYears: { site: string; year: number }[] = [];
  for (let i = 0; i < sites; i++) {
    truths.push(...pair);
    siteYears.push({ site: `Farm ${i + 1}`, year: 2024 }, { site: `Farm ${i + 1}`, year: 2025 });
  }
  const { table } = simulatedTrial({ truths, siteYears, seed, blockSdKgHa });
  return analyzeAcrossSites(table, { prices, groupKeys: [] }).yearsCompared;
}

function rejections(compared: readonly YearComparison[], alpha: number): number {
  return compared.filter((c) => fTest(c.response.result).p < alpha).length;
}

/** Smallest and largest count k with P(X < k) ≤ tail and P(X > k) ≤ tail, X ~ Binomial(n, p). */
function binomialBounds(n: number, p: number, tail: number): [number, number] {
  const pmf: number[] = [];
  let term = (1 - p) ** n;
  for (let k = 0; k <= n; k++) {
    pmf.push(term);
    term *= ((n - k) / (k + 1)) * (p / (1 - p));
  }
  let low = 0;
  for (let below = 0; below + pmf[low] <= tail; low++) below += pmf[low];
  let high = n;
  for (let above = 0; above + pmf[high] <= tail; high--) above += pmf[high];
  return [low, high];
}

describe('yearsCompared by simulation against known truths (shared/demo/simulatedSite)', () => {
  it('detects a site that responds one year and not the next in at least 95 % of 40 seeded sites', () => {
    const compared = simulatedYears(['quadratic-plateau', 'flat'], 40, 7);
    expect(compared).toHaveLength(40);
    expect(rejections(compared, 0.05)).toBeGreaterThanOrEqual(38);
  });

  it('keeps its 5 % level when both years share the truth (flat, no block offsets: the F test is exact)', () => {
    const n = 200;
    const compared = simulatedYears(['flat', 'flat'], n, 8, 0);
    // Binomial(200, 0.05) bounds at 0.1 % per tail, [2, 21] rejections: a test that never
    // rejects, or one whose real level is 15 % (30 expected), falls outside.
    const [low, high] = binomialBounds(n, 0.05, 0.001);
    const k = rejections(compared, 0.05);
    expect(k).toBeGreaterThanOrEqual(low);
    expect(k).toBeLessThanOrEqual(high);
  });

  it('does not exceed its level on a curved truth with block offsets (drawn afresh each year)', () => {
    const n = 200;
    const compared = simulatedYears(['quadratic-plateau', 'quadratic-plateau'], n, 9);
    const [, high] = binomialBounds(n, 0.05, 0.001);
    expect(rejections(compared, 0.05)).toBeLessThanOrEqual(high);
  });
});
