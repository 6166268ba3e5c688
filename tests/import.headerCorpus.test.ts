// The header corpus (tests/fixtures/import/headers/, written by its make_cases.py): 32 invented
// trial files whose yield or plot-weight column is headed the ways trial sheets head them. Each
// must be read right or asked about, never silently wrong: the expected role, unit and first
// plot's yield in kg/ha were computed by the Python script from exact unit definitions (NIST
// SP 811 Appendix B, NIST Handbook 44 Appendix C) and the USDA bushel weights, not by Plotrate.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ImportError } from '../shared/import';
import { importFiles } from '../shared/import/importFiles';
import { buildPlotTable } from '../shared/import/buildPlotTable';
import { detectColumns } from '../shared/import/detectColumns';
import { readTrialFile } from '../shared/import/readTrialFile';
import type { CropId } from '../shared/table/plotTable';

const DIR = path.join(__dirname, 'fixtures', 'import', 'headers');
type Expect = { role: 'yield' | 'plotWeight'; unit: string; kgHa: number } | 'asks';
const expected: Record<string, { crop: CropId; header: string; expect: Expect }> = JSON.parse(
  readFileSync(path.join(DIR, 'expected.json'), 'utf8'),
);
const cases = Object.entries(expected);

function bytesOf(name: string): Uint8Array {
  return new Uint8Array(readFileSync(path.join(DIR, `${name}.csv`)));
}

describe('the header corpus', () => {
  it('holds at least 30 cases, a file for each, some of them asked', () => {
    expect(cases.length).toBeGreaterThanOrEqual(30);
    const files = readdirSync(DIR).filter((f) => f.endsWith('.csv'));
    expect(files.sort()).toEqual(cases.map(([name]) => `${name}.csv`).sort());
    expect(cases.filter(([, c]) => c.expect === 'asks').length).toBeGreaterThanOrEqual(5);
  });

  it.each(cases)('%s: read right on the command line path, or asked', async (name, c) => {
    const files = [{ name: `${name}.csv`, bytes: bytesOf(name) }];
    const run = importFiles(files, { crop: c.crop, overrides: [] });
    if (c.expect === 'asks') {
      const e = await run.then(
        () => null,
        (err: unknown) => err,
      );
      expect(e).toBeInstanceOf(ImportError);
      expect((e as ImportError).code).toBe('column-needs-answer');
      // One line naming the column and both ways to settle it.
      expect((e as ImportError).message).toContain(`"${c.header}"`);
      expect((e as ImportError).message).toMatch(/--map plotWeight=.*--column-unit plotWeight=/);
      expect((e as ImportError).message).toMatch(/--map yield=.*--column-unit yield=/);
      expect((e as ImportError).message).not.toContain('\n');
      return;
    }
    const { table, mapping } = await run;
    expect(table.plots[0].yieldKgHa).toBeCloseTo(c.expect.kgHa, 6);
    const column = mapping.find((m) => m.header === c.header);
    expect(column).toMatchObject({ role: c.expect.role, unit: c.expect.unit });
  });

  it.each(cases.filter(([, c]) => c.expect === 'asks'))(
    '%s: the answer settles it, and each answer gives what the question said',
    async (name, c) => {
      const raw = await readTrialFile({ name: `${name}.csv`, bytes: bytesOf(name) });
      const mapping = detectColumns(raw);
      const column = mapping.sheets[0].columns.find((col) => col.header === c.header)!;
      expect(column.question?.readings.map((r) => r.role).sort()).toEqual(['plotWeight', 'yield']);
      // The workspace path refuses too, naming the column's header cell.
      expect(() => buildPlotTable(raw, mapping, { crop: c.crop, rateBasis: 'nutrient' })).toThrow(
        /No yield is computed from a guess/,
      );
      for (const reading of column.question!.readings) {
        const files = [{ name: `${name}.csv`, bytes: bytesOf(name) }];
        const { table } = await importFiles(files, {
          crop: c.crop,
          overrides: [{ role: reading.role, header: c.header }],
          units: [{ role: reading.role, unit: reading.unit }],
        });
        const yields = table.plots.map((p) => p.yieldKgHa!).sort((a, b) => a - b);
        const median = (yields[2] + yields[3]) / 2;
        expect(median).toBeCloseTo(reading.medianYieldKgHa!, 6);
      }
    },
  );
});
