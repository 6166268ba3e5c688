// The years chart of a site tried in several years: each site-year's leading curve and kept plots,
// in display units, drawn from the report's own site-years. Data: the invented two-year fixture
// the year comparison is checked against R with (tests/fixtures/siteyears/siteYears.plots.csv).
// A view of the report, so it is checked against the report's numbers.
import { beforeAll, describe, expect, it } from 'vitest';
import { importFiles } from '../shared/import/importFiles';
import type { CurveLayer, PointLayer } from '../shared/report/chartSpec';
import type { ReportSettings } from '../shared/report/reportSettings';
import type { TrialReport } from '../shared/report/trialReport';
import { yearCurvesChart } from '../shared/report/yearCurvesChart';
import { LB_AC_TO_KG_HA } from '../shared/units/unitConstants';
import { HARVEST_YEARS, harvestCsv } from './siteYears.fixture';
import { reportOf } from './report.pipeline';

const settings: ReportSettings = {
  units: { rate: 'lb/ac', yield: 'kg/ha' },
  unitSystem: 'us',
  currency: 'USD',
  crop: 'corn',
  prices: { grainPrice: 0.2, nutrientPrice: 1.1, product: null, defaulted: false },
  boot: 0,
  seed: 1,
  blocks: 'fixed',
  intervalLevel: 0.9,
};
let report: TrialReport;

beforeAll(async () => {
  const files = HARVEST_YEARS.map((year) => ({
    name: `harvest ${year}.csv`,
    bytes: new TextEncoder().encode(harvestCsv(year)),
  }));
  const { table } = await importFiles(files, { crop: 'corn', overrides: [] });
  report = reportOf(table, settings, {
    tool: { name: 'Plotrate', version: 'test' },
    createdAt: '2026-03-01T00:00:00Z',
    mapping: [],
  });
});

describe('yearCurvesChart', () => {
  it("overlays each year's leading curve and plots in the display units", () => {
    expect(report.yearsCompared.length).toBe(2);
    for (const c of report.yearsCompared) {
      const spec = yearCurvesChart(report, c);
      const layers = spec.panels[0].layers;
      const curves = layers.filter((l): l is CurveLayer => l.kind === 'curve');
      const points = layers.filter((l): l is PointLayer => l.kind === 'points');
      expect(points.map((p) => p.name)).toEqual(c.years.map((y) => `${y} plots`));
      c.siteYears.forEach((name, k) => {
        const s = report.sites.find((x) => x.site === name)!;
        const kept = s.plots.filter((p) => p.excluded === null && p.yieldKgHa !== null);
        expect(points[k].x.length).toBe(kept.length);
        expect(points[k].groupIndex).toBe(k);
        // lb/ac on the axis: kg/ha ÷ 1.12085 (exact pound and acre, NIST SP 811).
        expect(Math.max(...points[k].x)).toBeCloseTo(
          Math.max(...kept.map((p) => p.rateKgHa!)) / LB_AC_TO_KG_HA,
          9,
        );
        const lead = s.models.find((m) => m.model === s.bestModel);
        const curve = curves.find((l) => l.groupIndex === k);
        if (!lead) expect(curve).toBeUndefined();
        else {
          expect(curve!.name).toMatch(new RegExp(`^${c.years[k]} \\(`));
          expect(curve!.y).toEqual(lead.curve.yieldKgHa);
        }
      });
      expect(spec.panels[0].x.unit).toBe('lb N/ac');
    }
  });
});
