// The crop read from the files when the user names none (importFiles, detectColumns' sheetCrop):
// from a sheet name, a title row, a crop column or the file name; corn when nothing names one;
// the crop most sheets name when they name two; a finding when the chosen crop differs from the
// file's. And a second yield column set aside is a finding, never dropped unseen.
// Invented trial files (fictional sites).
import { describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { importFiles } from '../shared/import/importFiles';

const enc = (text: string) => new TextEncoder().encode(text);
const rows = (site: string) =>
  [0, 60, 120, 180].map((n, i) => `${site},1,${101 + i},${n},${(6 + i * 0.5).toFixed(2)}`);
const csv = (title: string | null, extra = '') =>
  enc(
    [
      ...(title ? [title] : []),
      `Site,Rep,Plot,N rate (kg N/ha),Yield (t/ha)${extra ? ',Crop' : ''}`,
      ...rows('Hollin Cross').map((r) => (extra ? `${r},${extra}` : r)),
    ].join('\n'),
  );

async function cropOf(files: { name: string; bytes: Uint8Array }[]) {
  const { table, findings } = await importFiles(files, { crop: null, overrides: [] });
  return { crop: table.crop, note: findings.find((f) => f.code === 'crop-from-files')?.message };
}

describe('the crop read from the files', () => {
  it('from a title row', async () => {
    const r = await cropOf([{ name: 'trial.csv', bytes: csv('2025 winter wheat N trial') }]);
    expect(r.crop).toBe('wheat');
    expect(r.note).toMatch(/title row "2025 winter wheat N trial" in "trial.csv"/);
  });

  it('from the file name', async () => {
    const r = await cropOf([{ name: 'hollin_barley_2025.csv', bytes: csv(null) }]);
    expect(r.crop).toBe('barley');
    expect(r.note).toMatch(/file name "hollin_barley_2025.csv"/);
  });

  it('from a crop column whose values name one crop', async () => {
    const r = await cropOf([{ name: 'trial.csv', bytes: csv(null, 'Soybean') }]);
    expect(r.crop).toBe('soybean');
    expect(r.note).toMatch(/"Crop" column/);
  });

  it('from a sheet name', async () => {
    const book = XLSX.utils.book_new();
    XLSX.utils.book_append_sheet(
      book,
      XLSX.utils.aoa_to_sheet([
        ['Site', 'Rep', 'Plot', 'N rate (kg N/ha)', 'Yield (t/ha)'],
        ['Hollin Cross', 1, 101, 0, 9.1],
        ['Hollin Cross', 1, 102, 100, 11.2],
      ]),
      'Maize 2025',
    );
    const bytes = new Uint8Array(XLSX.write(book, { type: 'array', bookType: 'xlsx' }));
    const r = await cropOf([{ name: 'trial.xlsx', bytes }]);
    expect(r.crop).toBe('corn');
    expect(r.note).toMatch(/sheet name "Maize 2025"/);
  });

  it('corn when nothing names a crop, and said so', async () => {
    const r = await cropOf([{ name: 'trial.csv', bytes: csv(null) }]);
    expect(r.crop).toBe('corn');
    expect(r.note).toMatch(/No file names its crop/);
  });

  it('of files naming two crops, the one most sheets name; the others are left out and said so', async () => {
    const { table, findings } = await importFiles(
      [
        { name: 'a.csv', bytes: csv('Spring barley N rates') },
        { name: 'b.csv', bytes: csv('Winter wheat N rates') },
        { name: 'c.csv', bytes: csv('Winter wheat N rates, second farm') },
      ],
      { crop: null, overrides: [] },
    );
    expect(table.crop).toBe('wheat');
    // The two wheat files' plots only, four each.
    expect(table.plots).toHaveLength(8);
    const note = findings.find((f) => f.code === 'crop-from-files')?.message;
    expect(note).toMatch(
      /sheets naming barley are left out \(give --crop barley to analyse them\)/,
    );
    expect(findings.filter((f) => f.code === 'other-crop-sheet-skipped')).toHaveLength(1);
  });

  it('a chosen crop that differs from the file is a warning naming where the file says so', async () => {
    const { table, findings } = await importFiles(
      [{ name: 'trial.csv', bytes: csv('2025 winter wheat N trial') }],
      { crop: 'corn', overrides: [] },
    );
    expect(table.crop).toBe('corn');
    const f = findings.find((x) => x.code === 'crop-differs');
    expect(f?.severity).toBe('warning');
    expect(f?.message).toMatch(
      /"trial.csv" names wheat \(the title row "2025 winter wheat N trial"\)/,
    );
    expect(findings.some((x) => x.code === 'crop-from-files')).toBe(false);
  });
});

describe('a second yield column', () => {
  it('is a warning naming its header cell and the column used, never dropped unseen', async () => {
    const bytes = enc(
      [
        'Site,Rep,Plot,N rate (kg N/ha),Yield (t/ha),Yield 2nd harvest (t/ha)',
        ...rows('Hollin Cross').map((r) => `${r},1.1`),
      ].join('\n'),
    );
    const { findings } = await importFiles([{ name: 'two.csv', bytes }], {
      crop: 'corn',
      overrides: [],
    });
    const f = findings.find((x) => x.code === 'second-yield-column');
    expect(f?.severity).toBe('warning');
    expect(f?.message).toMatch(
      /column F "Yield 2nd harvest \(t\/ha\)" also looks like a yield and is not used; yields are read from column E "Yield \(t\/ha\)"/,
    );
    expect(f?.refs).toEqual([{ file: 'two.csv', sheet: '', cell: 'F1', row: 1 }]);
  });
});
