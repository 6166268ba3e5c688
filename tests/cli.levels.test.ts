// A rate × timing file through the real command line (node cli/plotrate.mjs): the factor column
// named with --map factor=…, a level's own N price with --level-price, the summary, and the
// results JSON's sites[].levels[] and sites[].levelTest. The plots are the fixture the level
// tests are checked against R with (tests/fixtures/levels/levels.plots.csv; R 4.2.2's anova() in
// levels.anova.csv), so the F and p in the file are R's too. A level's recommendation is checked
// against the same plots imported as a site of their own (the one per-site analysis).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import type { ResultsJson } from '../shared/report/resultsJson';
import { readRCsv } from './analysis.fixtures';

const cli = path.join(__dirname, '..', 'cli', 'plotrate.mjs');
const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-levels-'));
const plots = readRCsv('../levels/levels.plots.csv');
const anova = readRCsv('../levels/levels.anova.csv');
let run: { code: number | null; out: string; err: string };
let alone: { code: number | null; out: string; err: string };

function plotrate(args: string[]) {
  const r = spawnSync(process.execPath, [cli, 'analyze', ...args], {
    cwd: dir,
    encoding: 'utf8',
    timeout: 180_000,
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

// Metric output: grain per tonne (t/ha yields), N per kg.
const prices = ['--grain-price', '180', '--nutrient-price', '1.26'];

beforeAll(() => {
  // "Programme" is a header no detection rule knows: the user names the factor.
  const lines = ['Site,Block,Plot,Programme,N rate (kg N/ha),Yield (kg/ha)'];
  for (const r of plots) lines.push([r.site, r.block, r.plot, r.timing, r.rate, r.yield].join(','));
  writeFileSync(path.join(dir, 'timing trial.csv'), lines.join('\n') + '\n');
  // Quill Hollow's split-timing plots and its checks alone, as a rate-only file of one site.
  const mine = ['Site,Block,Plot,N rate (kg N/ha),Yield (kg/ha)'];
  for (const r of plots.filter(
    (p) => p.site === 'Quill Hollow' && (p.rate === '0' || p.timing === 'Split'),
  ))
    mine.push(['Quill Hollow', r.block, r.plot, r.rate, r.yield].join(','));
  writeFileSync(path.join(dir, 'split alone.csv'), mine.join('\n') + '\n');
  const common = [...prices, '--boot', '100', '--units', 'metric'];
  run = plotrate([
    'timing trial.csv',
    ...common,
    '--map',
    'factor=Programme',
    '--level-price',
    'Split=1.40',
    '--json',
    'results.json',
  ]);
  alone = plotrate([
    'split alone.csv',
    ...common,
    '--nutrient-price',
    '1.40',
    '--json',
    'alone.json',
  ]);
});

describe('plotrate analyze with a rate × timing file', () => {
  it('--help names the factor role and --level-price', () => {
    const help = spawnSync(process.execPath, [cli, '--help'], { encoding: 'utf8' }).stdout;
    expect(help).toMatch(/factor: a treatment factor \(source, timing,/);
    expect(help).toMatch(/--level-price Level=N/);
  });

  it('writes sites[].levels[] { factor, level, recommendation, models } and sites[].levelTest', () => {
    expect(run.code).toBe(0);
    const json = JSON.parse(readFileSync(path.join(dir, 'results.json'), 'utf8')) as ResultsJson;
    expect(json.sites.map((s) => [s.site, s.levels.map((l) => l.level)])).toEqual([
      ['Quill Hollow', ['At planting', 'Split']],
      ['Sorrel Bank', ['At planting', 'Split']],
      ['Teasel Rise', ['Fall', 'Split', 'At planting']],
    ]);
    for (const s of json.sites) {
      for (const l of s.levels) {
        expect(l.factor).toBe('Programme');
        expect(l.n).toBe(24);
        expect(l.checkPlots).toBe(4);
        expect(l.models.map((m) => m.model)).toHaveLength(7);
        expect(l.recommendation.level).toBe(0.9);
        // The level's own price where given (1.40 per kg N), else the run's (1.26).
        expect(l.nutrientPricePerKgN).toBe(l.level === 'Split' ? 1.4 : 1.26);
        expect(l.ownNutrientPrice).toBe(l.level === 'Split');
      }
      const t = s.levelTest!;
      const r = anova.find((a) => a.site === s.site && a.model === 'quadratic')!;
      // R 4.2.2 anova() (levels.R): F and p to 1e-7 relative after the JSON's rounding.
      expect(Math.abs(t.quadratic!.F - Number(r.F))).toBeLessThan(1e-7 * Number(r.F));
      expect(Math.abs(t.quadratic!.p - Number(r.p))).toBeLessThan(1e-7 * Number(r.p));
      expect([t.quadratic!.df1, t.quadratic!.df2]).toEqual([Number(r.df), Number(r.resDf1)]);
      expect(t.differ).toBe(Number(r.p) < 0.05);
      expect(t.levels).toEqual(s.levels.map((l) => l.level));
      expect(t.differences).toHaveLength(s.levels.length - 1);
      expect(s.levels.map((l) => l.level)).toContain(t.best);
      expect(t.bestShare).toBeGreaterThan(0);
      expect(t.resamplesCompared + t.resamplesLeftOut).toBe(100);
    }
    // Teasel Rise's fall timing plateaus 2,000 kg/ha lower: it is not the best, and it returns
    // less than the best in the large majority of resamples (interval below 0).
    const teasel = json.sites[2].levelTest!;
    expect(teasel.best).not.toBe('Fall');
    const fall = teasel.differences.find((d) => d.level === 'Fall')!;
    expect(fall.returnDifferenceInterval![1]).toBeLessThan(0);
  });

  it("a level's recommendation is its plots' own analysis as a site (same models, rate and interval)", () => {
    expect(alone.code).toBe(0);
    const json = JSON.parse(readFileSync(path.join(dir, 'results.json'), 'utf8')) as ResultsJson;
    const single = JSON.parse(readFileSync(path.join(dir, 'alone.json'), 'utf8')) as ResultsJson;
    const split = json.sites[0].levels.find((l) => l.level === 'Split')!;
    const site = single.sites[0];
    // Quill Hollow is the first site, so its levels draw with the seed a one-site run uses.
    expect(split.recommendation).toEqual(site.recommendation);
    expect(split.models.map((m) => [m.model, m.sse, m.optimumRate])).toEqual(
      site.models.map((m) => [m.model, m.sse, m.optimumRate]),
    );
  });

  it('prints each level and which returns most in the summary', () => {
    const out = run.out;
    expect(out).toMatch(/^ {2}Programme Split: .*optimum \d+ kg N\/ha/m);
    expect(out).toMatch(/Programme levels do not differ detectably .*p = 0\.50/);
    expect(out).toMatch(/returns the most at its own recommended rate/);
  });

  it('warns about a --level-price that names no level', () => {
    const r = plotrate([
      'timing trial.csv',
      ...prices,
      '--boot',
      '0',
      '--map',
      'factor=Programme',
      '--level-price',
      'Fal=1.3',
    ]);
    expect(r.code).toBe(0);
    expect(r.err).toMatch(
      /--level-price names "Fal", which is no level .*levels: At planting, Split, Fall/,
    );
  });
});
