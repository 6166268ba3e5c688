// Inputs the command line must refuse at once with exit 2 and one line naming the file (and the
// cell, for impossible values), never with a hang, a raw errno or a recommendation: pipes,
// devices, folders, symbolic-link loops, and trials whose yields or rates cannot be real.
// The bounds behind "cannot be real" are shared/table/plotTable.ts's impossibleValue (common
// practice, stated there). The real command line runs as a child process on invented trials
// from the seeded generator.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import ExcelJS from 'exceljs';
import { beforeAll, describe, expect, it } from 'vitest';
import { syntheticCsv } from '../shared/demo';
import { runCli } from './support/runCli';

const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-inputs-'));
// Short enough that a hang fails the test instead of stalling the suite.
const run = (args: string[]) => runCli(dir, args, 30_000);

/** The generated trial with one column's values rewritten (5 = N rate, 6 = yield; 1-based). */
function rewritten(column: number, change: (value: string, row: number) => string): string {
  return syntheticCsv({ sites: 2, seed: 11 })
    .split('\n')
    .map((line, row) => {
      if (row === 0 || line === '') return line;
      const cells = line.split(',');
      cells[column - 1] = change(cells[column - 1], row);
      return cells.join(',');
    })
    .join('\n');
}

/** A one-site workbook whose rate and yield cells are written by `cells` (rate kg/ha, yield t/ha). */
async function workbook(name: string, cells: (rate: number, yieldTHa: number) => unknown[]) {
  const wb = new ExcelJS.Workbook();
  const ws = wb.addWorksheet('Plots');
  ws.addRow(['Site', 'Block', 'N rate (kg N/ha)', 'Yield (t/ha)']);
  for (const block of [1, 2, 3, 4])
    for (const rate of [0, 50, 100, 150, 200])
      ws.addRow(['Hazel Bank', block, ...cells(rate, 5 + Math.min(rate, 120) * 0.02 + block / 10)]);
  await wb.xlsx.writeFile(path.join(dir, name));
}

beforeAll(async () => {
  // Formulas saved with no calculated result (as some tools write them), and dates where rates belong.
  await workbook('formulas.xlsx', (rate, y) => [rate, { formula: `${y}*1` }]);
  await workbook('dates.xlsx', (rate, y) => [new Date(Date.UTC(2024, 0, 1 + rate)), y]);
  spawnSync('mkfifo', [path.join(dir, 'pipe.csv')]);
  symlinkSync(path.join(dir, 'loop-b.csv'), path.join(dir, 'loop-a.csv'));
  symlinkSync(path.join(dir, 'loop-a.csv'), path.join(dir, 'loop-b.csv'));
  writeFileSync(
    path.join(dir, 'negative.csv'),
    rewritten(6, (v) => `-${v}`),
  );
  writeFileSync(
    path.join(dir, 'huge-rates.csv'),
    rewritten(5, (v) => `${v}e300`),
  );
  writeFileSync(
    path.join(dir, 'one-typo.csv'),
    rewritten(6, (v, row) => (row === 3 ? `-${v}` : v)), // line 3 after the header: file row 4
  );
});

describe('plotrate analyze: files that are not trial files', () => {
  it.each([
    ['pipe.csv', /pipe\.csv: is not a regular file/],
    ['/dev/zero', /\/dev\/zero: is not a regular file/],
    ['loop-a.csv', /loop-a\.csv: is a loop of symbolic links/],
    ['.', /is a folder, not a file/],
    ['absent.csv', /absent\.csv: does not exist/],
  ])('%s is refused with exit 2 and one line', (file, reason) => {
    const r = run(['analyze', file, '--json', 'r.json']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(reason);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).not.toMatch(/\bat \w|E[A-Z]{3,}\b/); // no stack, no raw errno code
  });
});

describe('plotrate analyze: impossible values are refused, never fitted', () => {
  it('all yields negative: exit 2 naming a yield cell, and no rate printed', () => {
    const r = run(['analyze', 'negative.csv', '--boot', '0', '--json', 'neg.json']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/negative\.csv › F\d+: the yield is negative/);
    expect(r.out).not.toMatch(/optimum/);
  });

  it('rates of 1e300: exit 2 naming a rate cell as beyond any practice', () => {
    const r = run(['analyze', 'huge-rates.csv', '--boot', '0', '--json', 'huge.json']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/huge-rates\.csv › E\d+: the rate is beyond any practice/);
  });

  it.each([
    ['formulas.xlsx', /formulas\.xlsx › Plots D2 .* is a formula .* without a calculated result/],
    [
      'dates.xlsx',
      /dates\.xlsx › Plots › C2 should hold the rate as a number but says "2024-01-01"/,
    ],
  ])('%s: exit 2 naming the first cell to fix', (file, reason) => {
    const r = run(['analyze', file, '--boot', '0', '--json', 'x.json']);
    expect(r.code).toBe(2);
    expect(r.err.trim().split('\n').at(-1)).toMatch(reason);
  });

  it('one negative yield: the plot is named and left out, the rest is analysed', () => {
    const r = run(['analyze', 'one-typo.csv', '--boot', '0', '--json', 'typo.json']);
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/one-typo\.csv › F4: the yield is negative .* left out of the fits/);
    const json = JSON.parse(readFileSync(path.join(dir, 'typo.json'), 'utf8')) as {
      sites: { site: string; n: number }[];
    };
    // Both generated sites have 24 plots; the first loses the one with the negative yield.
    expect(json.sites.map((s) => s.n)).toEqual([23, 24]);
  });
});
