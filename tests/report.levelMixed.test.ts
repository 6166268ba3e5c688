// The regional model by level through the whole run (import → analyzeTrial → priceTrial →
// assembleReport → results JSON), on the 12 invented rate × timing site-years of
// tests/fixtures/levelmixed (the 'differ' set: the split timing truly responds differently).
// The module itself is checked against R 4.2.2 nlme in analysis.regionalLevelMixedModel.test.ts;
// here the JSON is held to R's numbers where the pipeline must reproduce them: the design is
// balanced within every site-year, so the fixed effects are R's lme estimates (levelMixed.json,
// REML with block contrasts) whatever the variance components, and each level's optimum at
// price ratio 7 is (7 − b)/(2c) on R's b and c (closed form, Cerrato & Blackmer, Agron. J. 82,
// 1990, for the quadratic's optimum).
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { importFiles } from '../shared/import/importFiles';
import * as XLSX from 'xlsx';
import { resultsJson, type ResultsJson } from '../shared/report/resultsJson';
import { writeWorkbook } from '../shared/report/workbook';
import type { TrialReport } from '../shared/report/trialReport';
import { levelMixedCsv } from './levelMixed.fixture';
import { metricCornReportOf } from './report.pipeline';

interface RFit {
  model: string;
  method: string;
  structure: string;
  blocks: boolean;
  fixed: number[];
}
const reference = JSON.parse(
  readFileSync(new URL('./fixtures/levelmixed/levelMixed.json', import.meta.url), 'utf8'),
) as Record<'differ' | 'same', { fits: RFit[] }>;

async function reportOfSet(dataset: 'differ' | 'same', sites?: number): Promise<TrialReport> {
  const csv = levelMixedCsv(dataset, sites);
  const { table, mapping } = await importFiles(
    [{ name: 'timing series.csv', bytes: new TextEncoder().encode(csv) }],
    { crop: 'corn', overrides: [] },
  );
  return metricCornReportOf(table, { boot: 0, mapping });
}

let json: ResultsJson;
let report: TrialReport;
beforeAll(async () => {
  report = await reportOfSet('differ');
  json = resultsJson(report);
});

describe('the regional model by level in the results JSON', () => {
  it("reports R's fixed effects per timing, one intercept for the shared check (R 4.2.2 nlme lme)", () => {
    const m = json.acrossSites!.levelMixed[0];
    expect(m.factor).toBe('Timing');
    expect(m.model).toBe('quadratic-by-level');
    expect(m.siteYears).toBe(12);
    expect(m.blockOffsets).toBe(true);
    const r = reference.differ.fits.find((f) => f.model === 'full' && f.blocks)!.fixed;
    // Levels come in first-seen order; R's columns are At planting (x1, q1) then Split (x2, q2).
    expect(m.levels.map((l) => l.level).sort()).toEqual(['At planting', 'Split']);
    m.levels.forEach((l) => {
      const k = l.level === 'At planting' ? 0 : 1;
      // t/ha in the file: a and b and c are R's kg/ha figures / 1000.
      expect(Math.abs(l.fixed.a * 1000 - r[0]) / r[0]).toBeLessThan(1e-4);
      expect(Math.abs(l.fixed.b * 1000 - r[1 + 2 * k]) / Math.abs(r[1 + 2 * k])).toBeLessThan(1e-4);
      expect(Math.abs(l.fixed.c * 1000 - r[2 + 2 * k]) / Math.abs(r[2 + 2 * k])).toBeLessThan(1e-4);
      const optimum = (7 - r[1 + 2 * k]) / (2 * r[2 + 2 * k]);
      expect(Math.abs(l.optimumRate - optimum) / optimum).toBeLessThan(1e-3);
      expect(l.optimumCI![0]).toBeLessThan(l.optimumRate);
      expect(l.optimumCI![1]).toBeGreaterThan(l.optimumRate);
    });
  });

  it('says the timings differ, with the likelihood-ratio test on 2 df and the Wald test beside it', () => {
    const m = json.acrossSites!.levelMixed[0];
    expect(m.likelihoodRatio!.df).toBe(2);
    expect(m.wald!.df).toBe(2);
    expect(m.likelihoodRatio!.p).toBeLessThan(0.001);
    expect(m.differ).toBe(true);
    expect(m.sentence).toMatch(
      /^Across 12 site-years, the regional curves of the Timing levels differ/,
    );
    expect(m.sentence).toContain('At planting');
  });

  it('gives the reason instead of a model with fewer than 4 site-years', async () => {
    const few = resultsJson(await reportOfSet('differ', 3));
    const m = few.acrossSites!.levelMixed[0];
    expect(m.model).toBeNull();
    expect(m.reason).toMatch(/at least 4 site-years/);
    expect(m.levels).toEqual([]);
    expect(m.sentence).toMatch(/^No regional model by Timing/);
  });

  it("puts the tests and each level's regional rate on the Levels by Timing sheet (read back with SheetJS)", async () => {
    const wb = XLSX.read(await writeWorkbook(report), { type: 'array' });
    const rows = XLSX.utils.sheet_to_json<unknown[]>(wb.Sheets['Levels by Timing'], {
      header: 1,
      raw: true,
    });
    const m = json.acrossSites!.levelMixed[0];
    const lr = rows.find((r) => r[0] === 'Likelihood ratio')!;
    expect(lr[1]).toBeCloseTo(m.likelihoodRatio!.chiSquare, 8);
    expect(lr[2]).toBe(2);
    const wald = rows.find((r) => r[0] === 'Wald')!;
    expect(wald[1]).toBeCloseTo(m.wald!.chiSquare, 8);
    for (const l of m.levels) {
      const row = rows.filter((r) => r[0] === l.level).at(-1)!;
      expect(row[6]).toBeCloseTo(l.optimumRate, 6);
    }
    expect(rows.some((r) => String(r[0]).startsWith('Across 12 site-years'))).toBe(true);
  });
});
