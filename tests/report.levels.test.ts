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
import { levelChartKey, levelCurvesChart } from '../shared/report/levelCurvesChart';
import { chartPng } from '../cli/chartPng';
import ExcelJS from 'exceljs';
import { metricCornReportOf } from './report.pipeline';

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
  report = metricCornReportOf(table, { boot: 100, mapping });
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

  it("puts each site's levels chart on the factor's sheet beside the site's tables (exceljs reads it back)", async () => {
    // The real picture, drawn as the command line draws it (cli/chartPng: resvg); its size is
    // read from the PNG header (IHDR width and height, PNG spec §11.2.2).
    const levelCharts = Object.fromEntries(
      report.levels.map((f) => {
        const spec = levelCurvesChart(report, f, null);
        return [
          levelChartKey(f.site, f.factor),
          { png: chartPng(spec), widthPx: spec.widthPx, heightPx: spec.heightPx },
        ];
      }),
    );
    const bytes = await writeWorkbook(report, { levelCharts });
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(bytes as never);
    const ws = wb.getWorksheet('Levels by Timing')!;
    const images = ws.getImages();
    expect(images).toHaveLength(report.levels.length);
    const titleRows = report.levels.map((f) => {
      let row = 0;
      ws.eachRow((r, i) => {
        if (row === 0 && r.getCell(1).value === f.site) row = i;
      });
      return row;
    });
    // Each picture starts on its site's title row (exceljs anchors count rows from 0), right of
    // the tables (column J on).
    expect(images.map((im) => Math.round(im.range.tl.nativeRow + 1))).toEqual(titleRows);
    for (const im of images) expect(im.range.tl.nativeCol).toBeGreaterThanOrEqual(9);
    for (const [k, im] of images.entries()) {
      const media = wb.getImage(Number(im.imageId));
      const png = Buffer.from(media.buffer as ArrayBuffer);
      const chart = levelCharts[levelChartKey(report.levels[k].site, 'Timing')];
      expect(png.subarray(1, 4).toString('latin1')).toBe('PNG');
      expect(png.readUInt32BE(16)).toBe(Math.round(chart.widthPx * 2));
      expect(Buffer.compare(png, Buffer.from(chart.png))).toBe(0);
    }
    // The pictures do not overlap: each site's block is at least as tall as its picture
    // (exceljs's default row, 15 pt = 20 px).
    for (let k = 1; k < images.length; k++) {
      const prev = images[k - 1].range as unknown as {
        tl: { nativeRow: number };
        ext: { height: number };
      };
      expect(images[k].range.tl.nativeRow).toBeGreaterThanOrEqual(
        prev.tl.nativeRow + prev.ext.height / 20,
      );
    }
  });
});
