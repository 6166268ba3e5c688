// Which modules the command line loads. The bundle (dist-cli/, built by the
// vitest globalSetup) is run as a user runs it, node cli/plotrate.mjs, under a
// loader hook that lists every module URL Node loads (tests/support/
// recordLoads.mjs). --help and a JSON-only run must load none of the heavy
// output packages and compile no TypeScript; asking for a workbook or a PDF
// loads exactly the packages that output needs, which also shows the hook
// sees them (so the "none loaded" checks can fail).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { syntheticCsv } from '../shared/demo';

const root = path.join(__dirname, '..');
const cli = path.join(root, 'cli', 'plotrate.mjs');
const hook = path.join(root, 'tests', 'support', 'recordLoads.mjs');
const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-lazy-'));

/** Runs the command line and returns its exit code and the module URLs it loaded. */
function loadsOf(args: string[]): { code: number | null; err: string; urls: string[] } {
  const log = path.join(dir, `loads-${Math.random().toString(36).slice(2)}.txt`);
  writeFileSync(log, '');
  const r = spawnSync(process.execPath, ['--import', hook, cli, ...args], {
    cwd: dir,
    encoding: 'utf8',
    timeout: 120_000,
    env: { ...process.env, PLOTRATE_LOAD_LOG: log },
  });
  const urls = readFileSync(log, 'utf8').split('\n').filter(Boolean);
  return { code: r.status, err: r.stderr, urls };
}

/** Loaded URLs that belong to the named package or file. */
const matching = (urls: string[], part: string): string[] => urls.filter((u) => u.includes(part));

/**
 * Loaded bundle files holding the analysis: its code (with the bundled @stdlib distributions)
 * sits in a chunk of its own, found by the function that runs it.
 */
const analysisChunks = (urls: string[]): string[] =>
  urls.filter(
    (u) =>
      u.includes('/dist-cli/') &&
      readFileSync(fileURLToPath(u), 'utf8').includes('function* analyzeTrialSteps('),
  );

const heavy = [
  '/node_modules/exceljs/',
  '/node_modules/pdfkit/',
  '/node_modules/@resvg/',
  '/node_modules/fontkit/',
];
const priced = ['--grain-price', '4.5', '--nutrient-price', '0.6', '--boot', '0'];

beforeAll(() => {
  // Invented trial from the seeded generator: 2 sites × 24 plots.
  writeFileSync(path.join(dir, 'trial.csv'), syntheticCsv({ sites: 2, seed: 3 }));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('plotrate loads heavy modules only for the outputs that need them', () => {
  it('--help runs the bundle: no TypeScript compiled, no tsx, no analysis, no output packages', () => {
    const r = loadsOf(['--help']);
    expect(r.code, r.err).toBe(0);
    expect(matching(r.urls, '/dist-cli/plotrate.mjs')).toHaveLength(1);
    expect(r.urls.filter((u) => /\.(c|m)?ts$/.test(u))).toEqual([]);
    expect(matching(r.urls, '/node_modules/tsx/')).toEqual([]);
    // The analysis (with the @stdlib distributions bundled into it) is loaded only for a run.
    expect(analysisChunks(r.urls)).toEqual([]);
    expect(matching(r.urls, '/node_modules/@stdlib/')).toEqual([]);
    for (const p of heavy) expect(matching(r.urls, p), p).toEqual([]);
  });

  it('a JSON-only run of a CSV loads neither exceljs, pdfkit, resvg nor the chart worker', () => {
    const r = loadsOf(['analyze', 'trial.csv', '--json', 'only.json', ...priced]);
    expect(r.code, r.err).toBe(0);
    expect(JSON.parse(readFileSync(path.join(dir, 'only.json'), 'utf8')).sites).toHaveLength(2);
    // A run loads the analysis' chunk (so the check on --help can fail), and no @stdlib file
    // from node_modules: the distributions are bundled, not found and compiled at every start.
    expect(analysisChunks(r.urls)).toHaveLength(1);
    expect(matching(r.urls, '/node_modules/@stdlib/')).toEqual([]);
    for (const p of [...heavy, '/dist-cli/chartWorker.mjs'])
      expect(matching(r.urls, p), p).toEqual([]);
  });

  it('a PDF loads pdfkit but neither exceljs nor a rasterizer (its charts are vectors)', () => {
    const r = loadsOf(['analyze', 'trial.csv', '--pdf', 'only.pdf', ...priced]);
    expect(r.code, r.err).toBe(0);
    expect(matching(r.urls, '/node_modules/pdfkit/').length).toBeGreaterThan(0);
    expect(matching(r.urls, '/node_modules/@resvg/')).toEqual([]);
    expect(matching(r.urls, '/dist-cli/chartWorker.mjs')).toEqual([]);
    expect(matching(r.urls, '/node_modules/exceljs/')).toEqual([]);
  });

  it('a workbook loads exceljs and the charts but not pdfkit', () => {
    const r = loadsOf(['analyze', 'trial.csv', '--out', 'only.xlsx', ...priced]);
    expect(r.code, r.err).toBe(0);
    expect(matching(r.urls, '/node_modules/exceljs/').length).toBeGreaterThan(0);
    expect(matching(r.urls, '/node_modules/@resvg/').length).toBeGreaterThan(0);
    expect(matching(r.urls, '/dist-cli/chartWorker.mjs')).toHaveLength(1);
    expect(matching(r.urls, '/node_modules/pdfkit/')).toEqual([]);
  });
});
