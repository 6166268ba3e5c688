// The regional rate per group of sites in the report and the JSON (acrossSites.groups), checked
// against a second path: the same group's sites analyzed as a trial of their own must give the
// same regional rate and profitable range. Data: the invented demo trial, whose sites follow corn
// or soybean ("Previous crop").
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { demoTrial } from '../shared/demo';
import { importFiles } from '../shared/import/importFiles';
import ExcelJS from 'exceljs';
import { resultsJson } from '../shared/report/resultsJson';
import { reportGrowerPages, writeWorkbook } from '../shared/report/workbook';
import { growerPage, groupPageId } from '../shared/report/growerPage';
import { growerPageChart } from '../shared/report/growerPageChart';
import { recommendationCautions } from '../shared/economics/recommendationCautions';
import type { ReportSettings } from '../shared/report/reportSettings';
import type { TrialReport } from '../shared/report/trialReport';
import type { PlotTable } from '../shared/table/plotTable';
import { demoPath } from './report.fixture';
import { reportOf } from './report.pipeline';

const settings: ReportSettings = {
  units: { rate: 'kg/ha', yield: 't/ha' },
  unitSystem: 'metric',
  currency: 'EUR',
  crop: 'corn',
  prices: { grainPrice: 180, nutrientPrice: 1.1, product: null, defaulted: false },
  boot: 40,
  seed: 3,
  blocks: 'fixed',
  intervalLevel: 0.9,
};
const meta = {
  tool: { name: 'Plotrate', version: 'test' },
  createdAt: '2026-03-01T00:00:00Z',
  mapping: [],
};
let table: PlotTable;
let report: TrialReport;

beforeAll(async () => {
  const corn = demoTrial()
    .sites.filter((s) => s.crop === 'corn')
    .map((s) => s.name);
  const bytes = new Uint8Array(readFileSync(demoPath));
  const imported = await importFiles([{ name: path.basename(demoPath), bytes }], {
    crop: 'corn',
    overrides: [],
    sheets: corn,
  });
  table = imported.table;
  report = reportOf(table, settings, meta);
});

describe('the regional rate per group', () => {
  it('lists each previous crop with its sites, and each group agrees with its sites analyzed alone', () => {
    const g = report.acrossSites!.groups.find((x) => x.key === 'Previous crop')!;
    expect(g.values.map((v) => [v.value, v.sites.length])).toEqual([
      ['corn', 4],
      ['soybean', 2],
    ]);
    for (const v of g.values) {
      const alone = reportOf(
        { ...table, plots: table.plots.filter((p) => v.sites.includes(p.site)) },
        settings,
        meta,
      );
      expect(v.bestRateKgHa).toBe(alone.acrossSites!.bestRateKgHa);
      expect(v.profitableRangeKgHa).toEqual(alone.acrossSites!.profitableRangeKgHa);
    }
    expect(g.differ!.df1).toBeGreaterThan(0);
    expect(g.differ!.p).toBeGreaterThanOrEqual(0);
    expect(g.differ!.sentence).toMatch(/Previous crop/);
  });

  it("gives each group a grower page whose rate is its sites' own regional rate, with the cautions", () => {
    const g = report.acrossSites!.groups.find((x) => x.key === 'Previous crop')!;
    for (const v of g.values) {
      const page = growerPage(report, groupPageId(g.key, v.value));
      const alone = reportOf(
        { ...table, plots: table.plots.filter((p) => v.sites.includes(p.site)) },
        settings,
        meta,
      );
      expect(page.subject).toBe(`Previous crop: ${v.value} (${v.sites.length} sites)`);
      expect(page.recommendation).toBe(growerPage(alone, 'region').recommendation);
      // Its chart is the group's own regional chart: the same curve as its sites analyzed alone.
      const chart = growerPageChart(report, groupPageId(g.key, v.value))!;
      expect(chart).toEqual(growerPageChart(alone, 'region'));
      expect(page.cautions).toEqual(recommendationCautions);
      expect(page.basis.join(' ')).toMatch(/Previous crop/);
    }
    expect(() => growerPage(report, groupPageId('Previous crop', 'oats'))).toThrow(/no group/);
  });

  it('prints every group page after the region, as the workspace lists them', () => {
    const subjects = reportGrowerPages(report).map((p) => p.subject);
    const groupSubjects = report.acrossSites!.groups.flatMap((g) =>
      g.values
        .filter((v) => v.sites.length >= 2)
        .map((v) => growerPage(report, groupPageId(g.key, v.value)).subject),
    );
    expect(groupSubjects.length).toBeGreaterThanOrEqual(2);
    const region = subjects.findIndex((s) => s.startsWith('Region'));
    expect(region).toBe(report.sites.length);
    expect(subjects.slice(region + 1)).toEqual(groupSubjects);
  });

  it("lists each group's regional rate on the workbook's across-site sheet", async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(Buffer.from(await writeWorkbook(report)) as never);
    const ws = wb.getWorksheet('Across sites')!;
    const rows: unknown[][] = [];
    ws.eachRow((row) => rows.push((row.values as unknown[]).slice(1)));
    const g = report.acrossSites!.groups.find((x) => x.key === 'Previous crop')!;
    for (const v of g.values) {
      const row = rows.find((r) => r[0] === 'Previous crop' && r[1] === v.value)!;
      expect(row, v.value).toBeDefined();
      // kg/ha output, so the cell holds the report's own number.
      expect(row[3]).toBe(v.bestRateKgHa);
      expect(row[2]).toBe(v.sites.join(', '));
    }
    expect(rows.some((r) => r[0] === g.differ!.sentence)).toBe(true);
  });

  it('writes the groups into the JSON in the output units', () => {
    const json = resultsJson(report);
    const g = json.acrossSites!.groups.find((x) => x.key === 'Previous crop')!;
    const r = report.acrossSites!.groups.find((x) => x.key === 'Previous crop')!;
    expect(g.values.map((v) => v.bestRate)).toEqual(r.values.map((v) => v.bestRateKgHa));
    // The JSON keeps 10 significant digits (clean), so 1e-9 relative.
    expect(g.differ!.F).toBeCloseTo(r.differ!.F, 8);
  });
});
