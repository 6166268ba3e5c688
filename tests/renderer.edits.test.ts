import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildPlotTable } from '../shared/import/buildPlotTable';
import { detectColumns } from '../shared/import/detectColumns';
import { readTrialFile } from '../shared/import/readTrialFile';
import { syntheticCsv } from '../shared/demo/syntheticTrial';
import {
  applyDecisions,
  correct,
  decide,
  setColumnRole,
  setColumnUnit,
  setHeaderRow,
  setSheetUse,
} from '../renderer/src/analysis/edits';

async function synthetic() {
  const bytes = new TextEncoder().encode(syntheticCsv({ sites: 2, seed: 5 }));
  const raw = await readTrialFile({ name: 'two sites.csv', bytes });
  return { raw, mapping: detectColumns(raw) };
}

describe('renderer edits', () => {
  it('setColumnRole moves a unique role: the column that had it is set aside', async () => {
    const { mapping } = await synthetic();
    const sheet = mapping.sheets[0];
    const yieldCol = sheet.columns.find((c) => c.role === 'yield')!;
    const moistureCol = sheet.columns.find((c) => c.role === 'moisture')!;
    const next = setColumnRole(mapping, sheet.sheet, moistureCol.col, 'yield');
    const cols = next.sheets[0].columns;
    expect(cols.find((c) => c.col === moistureCol.col)!.role).toBe('yield');
    expect(cols.find((c) => c.col === yieldCol.col)!.role).toBe('ignore');
    expect(cols.filter((c) => c.role === 'yield')).toHaveLength(1);
    // The original is untouched (undo snapshots rely on it).
    expect(mapping.sheets[0].columns.find((c) => c.col === yieldCol.col)!.role).toBe('yield');
  });

  it('a header row given by hand lists headers in words Plotrate does not know, to be given roles', async () => {
    // Invented: a title row, then German headers; semicolons and decimal commas; yields in dt/ha.
    const text = [
      'Feldversuch Holmbach 2025',
      'Standort;Wdh;N-Menge (kg N/ha);Ertrag (dt/ha)',
      'Holmbach;1;0;62,5',
      'Holmbach;1;60;78,1',
    ].join('\n');
    const raw = await readTrialFile({
      name: 'holmbach.csv',
      bytes: new TextEncoder().encode(text),
    });
    const found = detectColumns(raw);
    expect(found.sheets[0].headerRow).toBe(0);
    const sheet = found.sheets[0].sheet;
    let m = setHeaderRow(found, raw, sheet, 2);
    expect(m.sheets[0].headerRow).toBe(2);
    expect(m.sheets[0].use).toBe('plots');
    expect(m.sheets[0].columns.map((c) => c.header)).toEqual([
      'Standort',
      'Wdh',
      'N-Menge (kg N/ha)',
      'Ertrag (dt/ha)',
    ]);
    // The rate is known by its unit; the rest take the roles the user gives.
    expect(m.sheets[0].columns[2].role).toBe('rate');
    m = setColumnRole(m, sheet, 4, 'yield');
    m = setColumnRole(m, sheet, 1, 'site');
    m = setColumnRole(m, sheet, 2, 'block');
    expect(m.sheets[0].site).toEqual({ from: 'column' });
    const { table } = buildPlotTable(raw, m, { crop: 'wheat', rateBasis: 'nutrient' });
    expect(table.plots.map((p) => [p.site, p.block, p.rateKgHa])).toEqual([
      ['Holmbach', '1', 0],
      ['Holmbach', '1', 60],
    ]);
    // 1 dt = 100 kg: 62.5 dt/ha is 6,250 kg/ha (no moisture column: taken as at standard moisture).
    expect(table.plots[0].yieldKgHa).toBeCloseTo(6250, 9);
    expect(() => setHeaderRow(found, raw, sheet, 9)).toThrow(/outside the sheet's 4 rows/);
  });

  it('a repeatable role (group) does not push other columns aside', async () => {
    const { mapping } = await synthetic();
    const sheet = mapping.sheets[0];
    const year = sheet.columns.find((c) => c.role === 'year')!;
    const plot = sheet.columns.find((c) => c.role === 'plot')!;
    let next = setColumnRole(mapping, sheet.sheet, year.col, 'group');
    next = setColumnRole(next, sheet.sheet, plot.col, 'group');
    expect(next.sheets[0].columns.filter((c) => c.role === 'group')).toHaveLength(2);
  });

  it('a unit change reaches the plot table: the same numbers read as kg/ha instead of lb/ac', async () => {
    const { raw, mapping } = await synthetic();
    const sheet = mapping.sheets[0];
    const rate = sheet.columns.find((c) => c.role === 'rate')!;
    expect(rate.unit).toBe('lb/ac');
    const settings = { crop: 'corn', rateBasis: 'nutrient' } as const;
    const before = buildPlotTable(raw, mapping, settings).table;
    const after = buildPlotTable(
      raw,
      setColumnUnit(mapping, sheet.sheet, rate.col, 'kg/ha'),
      settings,
    ).table;
    const i = before.plots.findIndex((p) => (p.rateKgHa ?? 0) > 0);
    expect(after.plots[i].rateKgHa! / before.plots[i].rateKgHa!).toBeCloseTo(1 / 1.120851, 5);
  });

  it('setSheetUse to ignore leaves no plots, and unknown sheets are refused by name', async () => {
    const { mapping } = await synthetic();
    const sheetName = mapping.sheets[0].sheet;
    expect(setSheetUse(mapping, sheetName, 'ignore').sheets[0].use).toBe('ignore');
    expect(() => setSheetUse(mapping, 'Nowhere', 'plots')).toThrow(
      'The mapping has no sheet called "Nowhere".',
    );
  });

  it('a corrected value replaces the read one, keeps the cell text and the value read, and undoes cleanly', async () => {
    const { raw, mapping } = await synthetic();
    const { table } = buildPlotTable([raw], [mapping], { crop: 'corn', rateBasis: 'nutrient' });
    const plot = table.plots[3];
    const read = plot.yieldKgHa;
    const text = plot.original.yield!.text;
    const corrections = correct({}, plot.id, 'yield', { toKgHa: 9876, reason: 'decimal slipped' });
    const out = applyDecisions(table, {}, corrections);
    const fixed = out.plots[3];
    expect(fixed.yieldKgHa).toBe(9876);
    expect(fixed.original.yield!.text).toBe(text);
    expect(fixed.corrections).toEqual([
      { role: 'yield', fromKgHa: read, toKgHa: 9876, reason: 'decimal slipped' },
    ]);
    // Other plots are shared, not copied; the built table itself is untouched.
    expect(out.plots[0]).toBe(table.plots[0]);
    expect(table.plots[3].yieldKgHa).toBe(read);
    // A table that already carries the correction (a saved project) gives the same result again,
    // and clearing the correction brings back the value the sheet gave.
    expect(applyDecisions(out, {}, corrections).plots[3]).toEqual(fixed);
    const cleared = correct(corrections, plot.id, 'yield', null);
    expect(cleared).toEqual({});
    const back = applyDecisions(out, {}, cleared).plots[3];
    expect(back.yieldKgHa).toBe(read);
    expect(back.corrections).toBeUndefined();
    // A corrected plot can still be excluded: both decisions hold.
    const both = applyDecisions(
      table,
      { [plot.id]: { action: 'exclude', reason: 'hail' } },
      corrections,
    );
    expect(both.plots[3]).toMatchObject({
      yieldKgHa: 9876,
      excluded: { reason: 'hail', by: 'user' },
    });
  });

  it('applyDecisions excludes with the reason, keep clears a sheet exclusion, nothing is removed', () => {
    const demo = new Uint8Array(
      readFileSync(new URL('../demo/wrenhollow-n-trials-2025.xlsx', import.meta.url)),
    );
    return readTrialFile({ name: 'demo.xlsx', bytes: demo }).then((raw) => {
      const { table } = buildPlotTable(raw, detectColumns(raw), {
        crop: 'corn',
        rateBasis: 'nutrient',
      });
      const sheetExcluded = table.plots.find((p) => p.excluded?.by === 'sheet')!;
      const ordinary = table.plots.find((p) => p.excluded === null)!;
      let decisions = decide({}, [ordinary.id], { action: 'exclude', reason: 'hail strip' });
      decisions = decide(decisions, [sheetExcluded.id], {
        action: 'keep',
        reason: 'note was wrong',
      });
      const out = applyDecisions(table, decisions);
      expect(out.plots).toHaveLength(table.plots.length);
      expect(out.plots.find((p) => p.id === ordinary.id)!.excluded).toEqual({
        reason: 'hail strip',
        by: 'user',
      });
      expect(out.plots.find((p) => p.id === sheetExcluded.id)!.excluded).toBeNull();
      // Withdrawing a decision returns the plot to the sheet's own state.
      const back = applyDecisions(table, decide(decisions, [sheetExcluded.id], null));
      expect(back.plots.find((p) => p.id === sheetExcluded.id)!.excluded?.by).toBe('sheet');
    });
  });
});
