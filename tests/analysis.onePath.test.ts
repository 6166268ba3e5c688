// The command line and the workspace run one analysis: the same file and settings through
// the command line's path (analyzeCommand, in process) and through the workspace's path (its
// state classes with the worker's job handlers on a MessageChannel, under Node) give the same
// results file to 1e-12, and a price change or a model pick in the workspace refits nothing.
// The fitters and the join's profile interval (which refits along the join) are wrapped to
// count their calls (vi.mock keeps the real functions).
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it, vi } from 'vitest';

const calls = vi.hoisted(() => ({ fitAll: 0, estimate: 0, joinProfile: 0 }));
vi.mock('../shared/models/fitAllModels', async (importOriginal) => {
  const real = await importOriginal<typeof import('../shared/models/fitAllModels')>();
  return {
    ...real,
    fitAllModels: (...args: Parameters<typeof real.fitAllModels>) => {
      calls.fitAll++;
      return real.fitAllModels(...args);
    },
    fitAllModelsPrepared: (...args: Parameters<typeof real.fitAllModelsPrepared>) => {
      calls.fitAll++;
      return real.fitAllModelsPrepared(...args);
    },
  };
});
vi.mock('../shared/models/joinProfile', async (importOriginal) => {
  const real = await importOriginal<typeof import('../shared/models/joinProfile')>();
  return {
    ...real,
    joinProfileInterval: (...args: Parameters<typeof real.joinProfileInterval>) => {
      calls.joinProfile++;
      return real.joinProfileInterval(...args);
    },
  };
});
vi.mock('../shared/models/estimateCurve', async (importOriginal) => {
  const real = await importOriginal<typeof import('../shared/models/estimateCurve')>();
  return {
    ...real,
    estimateCurve: (...args: Parameters<typeof real.estimateCurve>) => {
      calls.estimate++;
      return real.estimateCurve(...args);
    },
  };
});

import { analyzeCommand } from '../cli/analyzeCommand';
import { parseArgs, type AnalyzeArgs } from '../cli/parseArgs';
import type { Workspace } from '../renderer/src/state/workspace.svelte';
import { nodeWorkspace } from './support/nodeWorkspace';
import { syntheticCsv } from '../shared/demo/syntheticTrial';
import { resultsJson } from '../shared/report/resultsJson';
import { KG_PER_LB } from '../shared/units/unitConstants';

const workspace = nodeWorkspace;

/** Every number of `a` equals `b`'s within 1e-12 (relative, absolute near zero); text equal. */
function sameNumbers(a: unknown, b: unknown, where: string, out: string[]): void {
  if (typeof a === 'number' && typeof b === 'number') {
    const close =
      (Number.isNaN(a) && Number.isNaN(b)) || Math.abs(a - b) <= 1e-12 * Math.max(1, Math.abs(a));
    if (!close) out.push(`${where}: ${a} vs ${b}`);
  } else if (Array.isArray(a) && Array.isArray(b)) {
    if (a.length !== b.length) out.push(`${where}: length ${a.length} vs ${b.length}`);
    else a.forEach((v, i) => sameNumbers(v, b[i], `${where}[${i}]`, out));
  } else if (a && b && typeof a === 'object' && typeof b === 'object') {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    for (const k of keys)
      sameNumbers(
        (a as Record<string, unknown>)[k],
        (b as Record<string, unknown>)[k],
        `${where}.${k}`,
        out,
      );
  } else if (a !== b) out.push(`${where}: ${JSON.stringify(a)} vs ${JSON.stringify(b)}`);
}

const csv = syntheticCsv({ sites: 4, seed: 21 });
const name = 'Four sites.csv';

async function commandLineResults(extra: string[]): Promise<Record<string, unknown>> {
  const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-paths-'));
  const input = path.join(dir, name);
  writeFileSync(input, csv);
  const json = path.join(dir, 'results.json');
  const cmd = parseArgs(['analyze', input, '--units', 'us', '--json', json, ...extra]);
  if (cmd.command !== 'analyze') throw new Error('not an analyze command');
  const quiet = { out: () => {}, err: () => {} };
  await analyzeCommand(cmd as unknown as AnalyzeArgs, quiet, '0.1.0', {
    createdAt: '2026-01-01T00:00:00Z',
  });
  return JSON.parse(readFileSync(json, 'utf8'));
}

async function analyzedWorkspace(): Promise<Workspace> {
  const ws = workspace();
  ws.settings.unitSystem = 'us';
  await ws.openFiles([{ name, bytes: new TextEncoder().encode(csv) }]);
  await ws.analysis.run(ws.trial.table);
  return ws;
}

function workspaceResults(ws: Workspace): Record<string, unknown> {
  const report = ws.report.report;
  if (!report) throw new Error('no report in the workspace');
  return JSON.parse(JSON.stringify(resultsJson({ ...report, createdAt: '2026-01-01T00:00:00Z' })));
}

describe('one analysis for the command line and the workspace', () => {
  it('gives the same results file with the illustrative prices', async () => {
    const cli = await commandLineResults([]);
    const ws = await analyzedWorkspace();
    const diffs: string[] = [];
    sameNumbers(cli, workspaceResults(ws), 'results', diffs);
    expect(diffs).toEqual([]);
    // The comparison covers intervals and the regional rate, not only point estimates.
    const sites = cli.sites as { models: { optimumCI: unknown }[] }[];
    expect(sites).toHaveLength(4);
    expect(sites.some((s) => s.models.some((m) => Array.isArray(m.optimumCI)))).toBe(true);
    expect(cli.acrossSites).toBeTruthy();
    // And the comparison sees a difference when there is one: another seed moves the intervals.
    const reseeded: string[] = [];
    sameNumbers(await commandLineResults(['--seed', '2']), workspaceResults(ws), 'r', reseeded);
    expect(reseeded.some((d) => d.includes('optimumCI'))).toBe(true);
  });

  it('gives the same results file at the user’s prices', async () => {
    const cli = await commandLineResults([
      '--grain-price',
      '4.1',
      '--product',
      'urea',
      '--product-price',
      '0.34',
    ]);
    const ws = await analyzedWorkspace();
    ws.prices.update({
      grainPerKg: 4.1 / (56 * KG_PER_LB),
      productId: 'urea',
      analysisPct: 46,
      productPerKg: 0.34 / KG_PER_LB,
    });
    const diffs: string[] = [];
    sameNumbers(cli, workspaceResults(ws), 'results', diffs);
    expect(diffs).toEqual([]);
  });

  it('re-prices and follows a model pick without fitting or resampling again', async () => {
    const ws = await analyzedWorkspace();
    const fitted = { ...calls };
    expect(fitted.fitAll).toBeGreaterThan(0);
    expect(fitted.estimate).toBeGreaterThan(0);
    expect(fitted.joinProfile).toBeGreaterThan(0);
    const before = ws.analysis.optima.map((o) => o.optimum?.rateKgHa ?? NaN);
    ws.prices.update({ productPerKg: ws.prices.settings.productPerKg * 2.5 });
    const site = ws.analysis.sites[0].site;
    ws.analysis.choose(site, 'quadratic');
    const after = ws.analysis.optima.map((o) => o.optimum?.rateKgHa ?? NaN);
    expect(ws.report.report?.sites[0].bestModel).toBe('quadratic');
    expect(ws.analysis.intervalFor(site)).not.toBeNull();
    expect(after).not.toEqual(before);
    expect(calls).toEqual(fitted);
  });
});
