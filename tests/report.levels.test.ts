// The rate × timing fixture (tests/fixtures/levels/levels.plots.csv, from the seeded generator)
// through the report: the workbook's sheet per factor, read back with SheetJS (an independent
// .xlsx reader), and the grower page's words per level. The numbers on both are checked against
// the report's own level analyses (each level a site: tests/cli.levels.test.ts checks that
// against the plots analyzed alone, and tests/analysis.levelResponseTest.test.ts the level tests
// against R 4.2.2).
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { growerPageChart } from '../shared/report/growerPageChart';
import * as XLSX from 'xlsx';
import { recommendationCautions } from '../shared/economics/recommendationCautions';
import { importFiles } from '../shared/import/importFiles';
import { growerPage } from '../shared/report/growerPage';
import type { TrialReport } from '../shared/report/trialReport';
import { writeWorkbook } from '../shared/report/workbook';
import { reportOf } from './report.pipeline';

let report: TrialReport;

beforeAll(async () => {
  const text = readFileSync(new URL('./fixtures/levels/levels.plots.csv', import.meta.url), 'utf8');
  const lines = text
    .trim()
    .split('\n')
    .slice(1)
    .map((l) => l.replace(/"/g, ''));
  const csv = ['Site,Block,Plot,Timing,N rate (kg N/ha),Yield (kg/ha)', ...lines].join('\n');
  const { table, mapping } = await importFiles(
    [{ name: 'timing trial.csv', bytes: new TextEncoder().encode(csv + '\n') }],
    { crop: 'corn', overrides: [] },
  );
  report = reportOf(
    table,
    {
      units: { rate: 'kg/ha', yield: 't/ha' },
      unitSystem: 'metric',
      currency: 'USD',
      crop: 'corn',
      prices: { grainPrice: 180, nutrientPrice: 1.26, product: null, defaulted: false },
      boot: 100,
      seed: 1,
      blocks: 'fixed',
      intervalLevel: 0.9,
    },
    { tool: { name: 'Plotrate', version: '0.1.0' }, createdAt: '2026-03-01T12:00:00Z', mapping },
  );
});

describe('the report of a rate × timing trial', () => {
  it('has one "Levels by Timing" sheet with every site, level, recommended rate and test', async () => {
    const wb = XLSX.read(await writeWorkbook(report), { type: 'array' });
    expect(wb.SheetNames).toContain('Levels by Timing');
    const rows = XLSX.utils.sheet_to_json<unknown[]>(wb.Sheets['Levels by Timing'], {
      header: 1,
      raw: true,
    });
    const firstCells = rows.map((r) => String(r[0] ?? ''));
    for (const f of report.levels) {
      expect(firstCells).toContain(f.site);
      for (const l of f.levels) {
        const row = rows.find(
          (r) =>
            String(r[0]).replace(' (returns most)', '') === l.level &&
            r.length >= 8 &&
            rows.indexOf(r) > firstCells.indexOf(f.site),
        )!;
        expect(row).toBeDefined();
        expect(row[1]).toBe(`24 (4)`);
        expect(row[4]).toBeCloseTo(l.report.recommendation.rateKgHa!, 9);
        expect(row[5]).toBeCloseTo(l.report.recommendation.ciKgHa![0], 9);
      }
      const q = f.test.quadratic.result;
      const testRow = rows.find((r, i) => r[0] === 'quadratic' && i > firstCells.indexOf(f.site))!;
      if (q.kind !== 'f-test') throw new Error('expected an F test');
      expect(testRow[1]).toBeCloseTo(q.f, 9);
      expect(testRow[4]).toBeCloseTo(q.p, 12);
    }
    const best = rows.filter((r) => String(r[0]).endsWith('(returns most)'));
    expect(best).toHaveLength(3);
    expect(firstCells).toContain(recommendationCautions[0]);
  });

  it("the grower page gives each timing's rate and which returns most, in words, with the cautions", () => {
    const page = growerPage(report, 'Teasel Rise');
    const f = report.levels.find((l) => l.site === 'Teasel Rise')!;
    expect(page.levels?.[0].rates.map((r) => r.label)).toEqual([
      'Timing: Fall',
      'Timing: Split',
      'Timing: At planting',
    ]);
    for (const [i, l] of f.levels.entries()) {
      // Rounded to a spreader setting (5 kg N/ha), as the headline is.
      const rounded = Math.round(l.report.recommendation.rateKgHa! / 5) * 5;
      expect(page.levels![0].rates[i].value).toMatch(
        new RegExp(`^about ${rounded} kg N/ha \\(90 % range`),
      );
    }
    const words = page.basis.join(' ');
    expect(words).toMatch(
      /The response to N differs between the Timing levels \(quadratic curves compared, p < 0\.001\)/,
    );
    expect(words).toMatch(
      new RegExp(`${f.comparison.best} returns the most at its own recommended rate`),
    );
    expect(words).toMatch(/more than Fall \(90 % interval/);
    expect(words).toMatch(
      /it returned the most in (almost every|most|only some) resamples \(\d+ %\)/,
    );
    // The facts table carries the level rates too, so every layout of the page prints them.
    expect(page.facts.map((x) => x.label)).toContain('Timing: Split');
    expect(page.cautions).toEqual(recommendationCautions);
  });

  it("the grower page's chart is the levels' curves with the shared check (growerPageChart)", () => {
    const site = report.levels[0].site;
    const chart = growerPageChart(report, site)!;
    const names = chart.panels[0].layers.map((l) => l.name);
    expect(names.some((n) => /shared check/i.test(n))).toBe(true);
    for (const l of report.levels[0].levels)
      expect(names.some((n) => n.startsWith(l.level))).toBe(true);
  });

  it('a page of equal timings says they do not differ detectably', () => {
    const words = growerPage(report, 'Quill Hollow').basis.join(' ');
    expect(words).toMatch(
      /The Timing levels do not differ detectably in their response to N \(quadratic curves compared, p = 0\.50\)/,
    );
  });
});
