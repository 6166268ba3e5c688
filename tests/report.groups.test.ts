// The regional rate per group of sites in the report and the JSON (acrossSites.groups), checked
// against a second path: the same group's sites analyzed as a trial of their own must give the
// same regional rate and profitable range. Data: the invented demo trial, whose sites follow corn
// or soybean ("Previous crop").
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { demoTrial } from '../shared/demo';
import { importFiles } from '../shared/import/importFiles';
import { resultsJson } from '../shared/report/resultsJson';
import { growerPage, groupPageId } from '../shared/report/growerPage';
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
      expect(page.cautions).toEqual(recommendationCautions);
      expect(page.basis.join(' ')).toMatch(/Previous crop/);
    }
    expect(() => growerPage(report, groupPageId('Previous crop', 'oats'))).toThrow(/no group/);
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
