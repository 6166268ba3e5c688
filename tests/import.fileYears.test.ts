// Files of two seasons whose year is only in their names: each file's plots take its year, so
// each season is its own site-year; a single file named for its season is read as before.
// The plots are invented (the fixture of tests/fixtures/siteyears, without its year column).
import { describe, expect, it } from 'vitest';
import { yearFromFileName } from '../shared/import/fileYears';
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
