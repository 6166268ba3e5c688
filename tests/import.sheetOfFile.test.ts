// Import messages name where to look: the sheet and file of a workbook, the file alone for a CSV
// (which has no sheets), never 'Sheet "" of …'. Invented file contents.
import { describe, expect, it } from 'vitest';
import { importFiles } from '../shared/import/importFiles';
import { sheetOfFile } from '../shared/import/sheetOfFile';

describe('sheetOfFile', () => {
  it('names the sheet of a workbook and only the file of a CSV', () => {
    expect(sheetOfFile('trial.xlsx', 'Plots')).toBe('Sheet "Plots" of "trial.xlsx"');
    expect(sheetOfFile('trial.csv', '')).toBe('"trial.csv"');
  });

  it('a CSV of plot weights without a plot area is refused naming the file, not an empty sheet', async () => {
    const text =
      'Site,Rep,Plot,N rate (kg N/ha),Plot weight (kg)\nMoss End,1,101,0,6.1\nMoss End,1,102,90,8.2\n';
    const run = importFiles([{ name: 'weights.csv', bytes: new TextEncoder().encode(text) }], {
      crop: 'wheat',
      overrides: [],
    });
    await expect(run).rejects.toThrow(/^"weights\.csv" gives plot weights/);
    await expect(run).rejects.not.toThrow(/Sheet ""/);
  });
});
