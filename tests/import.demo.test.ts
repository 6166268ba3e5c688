// The committed demo workbook imports to the right plot table. Expected values
// are computed here independently: cell values read by SheetJS (a second .xlsx
// reader), units from the exact definitions (NIST SP 811: 1 lb = 0.45359237 kg;
// NIST Handbook 44: 1 acre = 43 560 ft², international foot 0.3048 m), the USDA
// bushel weights (corn 56 lb/bu) and the dry-matter moisture formula.
import { originalRef } from '../shared/table/originalCell';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { buildPlotTable, detectColumns, readTrialFile, type RawWorkbook } from '../shared/import';
import { demoTrial, writeDemoWorkbook } from '../shared/demo';
import type { PlotTable } from '../shared/table/plotTable';

const demoPath = path.join(__dirname, '..', 'demo', 'wrenhollow-n-trials-2025.xlsx');
const KG_HA_PER_LB_AC = 0.45359237 / (43560 * 0.3048 * 0.3048 * 1e-4);
const cornSheets = [
  'Quillmere North',
  'Tarrowfield',
  'Brackenhollow',
  'Vesselby Ridge',
  'Pennock Flats',
  "Orrin's Bend",
];

let raw: RawWorkbook;
let corn: PlotTable;
let cornFindings: ReturnType<typeof buildPlotTable>['findings'];
let wheat: PlotTable;

beforeAll(async () => {
  const bytes = new Uint8Array(readFileSync(demoPath));
  raw = await readTrialFile({ name: 'wrenhollow-n-trials-2025.xlsx', bytes });
  const mapping = detectColumns(raw);
  const c = buildPlotTable(raw, mapping, {
    crop: 'corn',
    rateBasis: 'nutrient',
    sheets: cornSheets,
  });
  corn = c.table;
  cornFindings = c.findings;
  wheat = buildPlotTable(raw, mapping, {
    crop: 'wheat',
    rateBasis: 'nutrient',
    sheets: ['Wheat (metric)'],
  }).table;
});

describe('demo workbook', () => {
  it('the generator reproduces the committed file byte for byte', async () => {
    const committed = new Uint8Array(readFileSync(demoPath));
    const fresh = await writeDemoWorkbook();
    expect(fresh.length).toBe(committed.length);
    expect(Buffer.from(fresh).equals(Buffer.from(committed))).toBe(true);
  });

  it('detectColumns finds the key, the six site sheets, the wheat sheet and ignores the notes sheet', () => {
    const m = detectColumns(raw);
    const uses = Object.fromEntries(m.sheets.map((s) => [s.sheet, s.use]));
    expect(uses).toEqual({
      About: 'ignore',
      Treatments: 'treatment-key',
      ...Object.fromEntries(cornSheets.map((s) => [s, 'plots'])),
      'Wheat (metric)': 'plots',
    });
    const q = m.sheets.find((s) => s.sheet === 'Quillmere North')!;
    expect(q.headerRow).toBe(4);
    expect(q.site).toEqual({ from: 'sheet-name' });
    const y = q.columns.find((c) => c.role === 'yield')!;
    expect([y.letter, y.unit, y.moistureBasis]).toEqual(['D', 'bu/ac', 'harvest']);
    const key = m.sheets.find((s) => s.sheet === 'Treatments')!;
    const rate = key.columns.find((c) => c.role === 'rate')!;
    expect([rate.unit, rate.basis]).toEqual(['lb/ac', 'nutrient']);
    const w = m.sheets.find((s) => s.sheet === 'Wheat (metric)')!;
    expect(w.site).toEqual({ from: 'column' });
    expect(w.columns.find((c) => c.role === 'yield')!.unit).toBe('t/ha');
    expect(w.columns.find((c) => c.role === 'rate')!.unit).toBe('kg/ha');
  });

  it('leaves the wheat sheet out of a corn table by the crop its title names, and says so', () => {
    const m = detectColumns(raw);
    expect(m.sheets.find((s) => s.sheet === 'Wheat (metric)')!.cropHint).toBe('wheat');
    expect(m.sheets.find((s) => s.sheet === 'Tarrowfield')!.cropHint).toBe('corn');
    const { table, findings } = buildPlotTable(raw, m, { crop: 'corn', rateBasis: 'nutrient' });
    expect(table.plots.map((p) => p.id)).toEqual(corn.plots.map((p) => p.id));
    expect(findings.find((f) => f.code === 'other-crop-sheet-skipped')!.message).toBe(
      'Sheet "Wheat (metric)" of "wrenhollow-n-trials-2025.xlsx" is about wheat, not corn, and was left out of this table; import it with the crop set to wheat, or choose the sheet by name.',
    );
    const w = buildPlotTable(raw, m, { crop: 'wheat', rateBasis: 'nutrient' }).table;
    expect(w.plots.map((p) => p.id)).toEqual(wheat.plots.map((p) => p.id));
  });

  it('imports 6 corn sites with 143 plots (one missing) and 2 wheat sites with 40', () => {
    expect([...new Set(corn.plots.map((p) => p.site))]).toEqual(cornSheets);
    expect(corn.plots.length).toBe(6 * 24 - 1);
    expect(corn.plots.filter((p) => p.site === 'Tarrowfield').length).toBe(23);
    expect(wheat.plots.length).toBe(40);
    expect(new Set(wheat.plots.map((p) => p.site))).toEqual(
      new Set(['Skellwater Upper', 'Skellwater Lower']),
    );
    expect(corn.standardMoisturePct).toBe(15.5); // common practice for corn
    expect(wheat.standardMoisturePct).toBe(13.5); // common practice for wheat
    expect(corn.sources[0].sha256).toMatch(/^[0-9a-f]{64}$/);
  });

  it('every corn plot matches SheetJS cell values converted by hand', () => {
    const wb = XLSX.read(readFileSync(demoPath));
    const keySheet = XLSX.utils.sheet_to_json<unknown[]>(wb.Sheets.Treatments, {
      header: 1,
      blankrows: true,
    });
    const rateLbAcByTrt = new Map<number, number>();
    for (const r of keySheet.slice(3))
      if (typeof r[0] === 'number') rateLbAcByTrt.set(r[0], r[1] as number);
    let checked = 0;
    for (const sheet of cornSheets) {
      const rows = XLSX.utils.sheet_to_json<unknown[]>(wb.Sheets[sheet], {
        header: 1,
        blankrows: true,
      });
      rows.slice(4).forEach((r, i) => {
        if (!r || r.length === 0) return;
        const rowNo = i + 5;
        const p = corn.plots.find(
          (q) => q.id === `wrenhollow-n-trials-2025.xlsx|${sheet}|${rowNo}`,
        )!;
        expect(p, `${sheet} row ${rowNo}`).toBeDefined();
        const wetBu = Number(r[3]);
        const moisture = r[4] as number;
        // bu → lb (56 lb/bu, USDA) → kg/ha, then dry matter kept: × (100 − M)/(100 − 15.5).
        const expected = wetBu * 56 * KG_HA_PER_LB_AC * ((100 - moisture) / (100 - 15.5));
        expect(p.yieldKgHa!).toBeCloseTo(expected, 6);
        expect(p.rateKgHa!).toBeCloseTo(rateLbAcByTrt.get(r[2] as number)! * KG_HA_PER_LB_AC, 9);
        expect(p.block).toBe(String(r[1]));
        expect(p.plotLabel).toBe(String(r[0]));
        expect(p.moisturePct).toBe(moisture);
        expect(p.groups['Previous crop']).toBe(r[6]);
        expect(p.original.yield?.text).toBe(
          typeof r[3] === 'string' ? r[3] : (r[3] as number).toFixed(1),
        );
        checked++;
      });
    }
    expect(checked).toBe(143);
  });

  it('keeps the yield stored as text, with a finding pointing at its cell', () => {
    const q = demoTrial().quirks.yieldAsText;
    const p = corn.plots.find((x) => x.site === q.site && x.plotLabel === q.plot)!;
    expect(p.yieldKgHa).not.toBeNull();
    const f = cornFindings.filter((x) => x.code === 'number-as-text');
    expect(f).toHaveLength(1);
    expect(f[0].refs[0]).toEqual({
      ...originalRef(p.original.yield!),
      file: 'wrenhollow-n-trials-2025.xlsx',
      sheet: q.site,
    });
    expect(f[0].message).toMatch(/number stored as text/);
  });

  it('turns the exclude column into an exclusion with the reason, keeping the plot', () => {
    const q = demoTrial().quirks.excluded;
    const p = corn.plots.find((x) => x.site === q.site && x.plotLabel === q.plot)!;
    expect(p.excluded).toEqual({
      reason: `Exclude column says "yes"; notes: ${q.reason}`,
      by: 'sheet',
    });
    expect(p.yieldKgHa).not.toBeNull();
    expect(corn.plots.filter((x) => x.excluded !== null)).toHaveLength(1);
  });

  it('wheat yields are t/ha adjusted from harvest moisture to 13.5 %', () => {
    const wb = XLSX.read(readFileSync(demoPath));
    const rows = XLSX.utils.sheet_to_json<unknown[]>(wb.Sheets['Wheat (metric)'], {
      header: 1,
      blankrows: true,
    });
    for (const [i, r] of rows.slice(3).entries()) {
      const p = wheat.plots.find(
        (q) => q.id === `wrenhollow-n-trials-2025.xlsx|Wheat (metric)|${i + 4}`,
      )!;
      expect(p.site).toBe(r[0]);
      expect(p.rateKgHa).toBe(r[4]);
      // 1 t = 1000 kg by definition of the tonne (NIST SP 811 B.8: 1 t = 1000 kg).
      expect(p.yieldKgHa!).toBeCloseTo(
        (r[5] as number) * 1000 * ((100 - (r[6] as number)) / 86.5),
        6,
      );
    }
  });
});
