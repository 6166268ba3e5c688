// Two files of the same invented sites for 2024 and 2025, each with a year column, through the
// real command line (node cli/plotrate.mjs): the summary, the results JSON and the workbook's
// across-site sheet name site-years and compare the years. The plots are the fixture the
// year comparison is checked against R with (tests/fixtures/siteyears/siteYears.plots.csv,
// R's numbers in yearsCompared.anova.csv), so the F and p printed here are R's too.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { readRCsv } from './analysis.fixtures';
import { HARVEST_YEARS, harvestCsv } from './siteYears.fixture';

const cli = path.join(__dirname, '..', 'cli', 'plotrate.mjs');
const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-siteyears-'));
const anova = readRCsv('../siteyears/yearsCompared.anova.csv');
let run: { code: number | null; out: string; err: string };

beforeAll(() => {
  for (const year of HARVEST_YEARS)
    writeFileSync(path.join(dir, `harvest ${year}.csv`), harvestCsv(year));
  const r = spawnSync(
    process.execPath,
    [
      cli,
      'analyze',
      'harvest 2024.csv',
      'harvest 2025.csv',
      '--boot',
      '0',
      '--json',
      'results.json',
      '--out',
      'report.xlsx',
    ],
    { cwd: dir, encoding: 'utf8', timeout: 120_000 },
  );
  run = { code: r.status, out: r.stdout, err: r.stderr };
});

describe('plotrate analyze with two years of the same sites', () => {
  it('counts site-years and prints one year comparison per site', () => {
    expect(run.code).toBe(0);
    expect(run.err).toMatch(/plotrate: 96 plots at 4 site-years \(2 sites\)/);
    const lines = run.out.split('\n');
    expect(lines.filter((l) => l.startsWith('Years compared: '))).toHaveLength(2);
    expect(run.out).toMatch(/^Wrenfield 2025: /m);
    expect(run.out).toMatch(/^Across 4 site-years: /m);
    expect(run.out).toMatch(
      /Years compared: Wrenfield, 2024 and 2025: .*the response to N differs between the years\. .* Read each year's curve on its own/,
    );
  });

  it('writes sites[].year and yearsCompared with R’s F and p into the results JSON', () => {
    const j = JSON.parse(readFileSync(path.join(dir, 'results.json'), 'utf8'));
    expect(j.sites.map((s: { site: string; year: number }) => [s.site, s.year])).toEqual([
      ['Wrenfield 2024', 2024],
      ["Hobb's Reach 2024", 2024],
      ['Wrenfield 2025', 2025],
      ["Hobb's Reach 2025", 2025],
    ]);
    expect(j.yearsCompared.map((c: { site: string }) => c.site)).toEqual([
      'Wrenfield',
      "Hobb's Reach",
    ]);
    for (const c of j.yearsCompared) {
      const r = anova.find((x) => x.site === c.site && x.test === 'levels-vs-site-curves')!;
      // The file keeps 12 significant digits.
      expect(Math.abs(c.response.F - Number(r.F))).toBeLessThanOrEqual(1e-10 * Number(r.F));
      expect(Math.abs(c.response.p - Number(r.p))).toBeLessThanOrEqual(1e-10 * Number(r.p));
      expect(c.response.df1).toBe(2);
      expect(c.years).toEqual([2024, 2025]);
    }
    expect(j.yearsCompared.map((c: { responseDiffers: boolean }) => c.responseDiffers)).toEqual([
      true,
      false,
    ]);
  });

  it('lists the years compared on the workbook’s across-site sheet', () => {
    const wb = XLSX.read(readFileSync(path.join(dir, 'report.xlsx')));
    const rows = XLSX.utils.sheet_to_json<unknown[]>(wb.Sheets['Across sites'], { header: 1 });
    const head = rows.findIndex((r) => r[0] === 'Site' && r[1] === 'Years');
    expect(head).toBeGreaterThan(0);
    expect(rows[head + 1].slice(0, 2)).toEqual(['Wrenfield', '2024, 2025']);
    expect(rows[head + 2].slice(0, 2)).toEqual(["Hobb's Reach", '2024, 2025']);
    expect(rows[head + 1][5] as number).toBeLessThan(0.001);
    expect(rows[head + 2][5] as number).toBeGreaterThan(0.5);
  });
});
