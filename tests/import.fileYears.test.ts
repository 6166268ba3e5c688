// Files of two seasons whose year is only in their names: each file's plots take its year, so
// each season is its own site-year; a single file named for its season is read as before. Sheets
// named for a site and a season ("Ostmere 2025", "Ostmere 2026") are site-years of one site.
// The plots are invented (the fixture of tests/fixtures/siteyears, without its year column, and
// rows made here).
import { describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { sheetNameSiteYears, yearFromFileName } from '../shared/import/fileYears';
import { importFiles } from '../shared/import/importFiles';
import { sitePlots } from '../shared/analysis/sitePlots';
import { harvestCsv } from './siteYears.fixture';

function file(name: string, year: '2024' | '2025'): { name: string; bytes: Uint8Array } {
  return { name, bytes: new TextEncoder().encode(harvestCsv(year, false)) };
}

describe('yearFromFileName', () => {
  it('finds the one year standing apart from other digits', () => {
    expect(yearFromFileName('Tamsin Hollow 2024.csv')).toBe(2024);
    expect(yearFromFileName('north_2025_final.xlsx')).toBe(2025);
    expect(yearFromFileName('plots 2024-2025.csv')).toBeNull();
    expect(yearFromFileName('plot 120245.csv')).toBeNull();
    expect(yearFromFileName('trial.csv')).toBeNull();
  });
});

describe('importFiles with the year only in the file names', () => {
  it('gives each file its year when the files name different years, with a finding per file', async () => {
    const { table, findings } = await importFiles(
      [file('Wrenfield trials 2024.csv', '2024'), file('Wrenfield trials 2025.csv', '2025')],
      { crop: 'corn', overrides: [] },
    );
    expect(sitePlots(table).map((s) => [s.site, s.year, s.yieldKgHa.length])).toEqual([
      ['Wrenfield 2024', 2024, 24],
      ["Hobb's Reach 2024", 2024, 24],
      ['Wrenfield 2025', 2025, 24],
      ["Hobb's Reach 2025", 2025, 24],
    ]);
    expect(findings.filter((f) => f.code === 'year-from-file-name').map((f) => f.message)).toEqual([
      '"Wrenfield trials 2024.csv" has no year column; its plots were given the year 2024 from the file\'s name, because the files imported together are from different years.',
      '"Wrenfield trials 2025.csv" has no year column; its plots were given the year 2025 from the file\'s name, because the files imported together are from different years.',
    ]);
  });

  it('leaves a single file named for its season without a year', async () => {
    const { table, findings } = await importFiles([file('Wrenfield trials 2024.csv', '2024')], {
      crop: 'corn',
      overrides: [],
    });
    expect(table.plots.every((p) => p.year === null)).toBe(true);
    expect(findings.some((f) => f.code === 'year-from-file-name')).toBe(false);
  });
});

describe('sheets named for a site and a season', () => {
  it('read a site named with two seasons or more as site-years of one site, and leave the rest', () => {
    const f = (sheet: string) => ({ file: 'co-op.xlsx', sheet });
    const named = sheetNameSiteYears(
      [
        'Ostmere 2025',
        'Ostmere_2026',
        'Lindby Fen 2026',
        '2025',
        'Plots 2024-2025',
        'Strip 120251 2025',
        'Strip 120251 2026',
      ].map(f),
    );
    expect([...named.entries()]).toEqual([
      ['co-op.xlsx\u0000Ostmere 2025', { site: 'Ostmere', year: 2025 }],
      ['co-op.xlsx\u0000Ostmere_2026', { site: 'Ostmere', year: 2026 }],
      // The year's digits inside another number are not the year: the site keeps that number.
      ['co-op.xlsx\u0000Strip 120251 2025', { site: 'Strip 120251', year: 2025 }],
      ['co-op.xlsx\u0000Strip 120251 2026', { site: 'Strip 120251', year: 2026 }],
    ]);
  });

  it('gives the plots of such sheets their site and year on import, with a finding per sheet', async () => {
    const wb = new ExcelJS.Workbook();
    for (const [name, level] of [
      ['Ostmere 2025', 8000],
      ['Ostmere 2026', 8400],
      ['Lindby Fen 2026', 7200],
    ] as const) {
      const ws = wb.addWorksheet(name);
      ws.addRow(['Rep', 'Plot', 'N rate (kg N/ha)', 'Yield (kg/ha)']);
      let plot = 100;
      for (let rep = 1; rep <= 4; rep++)
        for (const x of [0, 60, 120, 180])
          ws.addRow([rep, ++plot, x, level + 20 * Math.min(x, 120) + 37 * ((plot * 7) % 5)]);
    }
    const bytes = new Uint8Array(await wb.xlsx.writeBuffer());
    const { table, findings } = await importFiles([{ name: 'co-op.xlsx', bytes }], {
      crop: 'corn',
      overrides: [],
    });
    expect(sitePlots(table).map((s) => [s.site, s.siteName, s.year, s.yieldKgHa.length])).toEqual([
      ['Ostmere 2025', 'Ostmere', 2025, 16],
      ['Ostmere 2026', 'Ostmere', 2026, 16],
      ['Lindby Fen 2026', 'Lindby Fen 2026', null, 16],
    ]);
    expect(
      findings.filter((x) => x.code === 'site-year-from-sheet-name').map((x) => x.message),
    ).toEqual([
      'Sheet "Ostmere 2025" of "co-op.xlsx" has no year column; its plots were read as site "Ostmere" in 2025 from the sheet\'s name, because other sheets hold the same site in other years.',
      'Sheet "Ostmere 2026" of "co-op.xlsx" has no year column; its plots were read as site "Ostmere" in 2026 from the sheet\'s name, because other sheets hold the same site in other years.',
    ]);
  });
});
