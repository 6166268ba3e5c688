// The report takes an analysis and writes bytes: it fits nothing (DEVELOPERS.md, "Stages and
// what they may import"). eslint's REPORT_NO_FITTING checks the report's own import lines;
// this test follows every import chain from each file of shared/report/ (and from the curve
// half of the models, which the report and the chart code read) and fails, naming the chain,
// if a module that fits, resamples or solves is loaded at run time. Type-only imports vanish
// when compiling, so they do not count.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { importChain, readImportGraph, type ImportGraph } from './support/importGraph';

const ROOT = new URL('..', import.meta.url).pathname;

/** The modules that fit, resample or solve, by path from the repository root. */
const FITTING: readonly RegExp[] = [
  // The fitting catalog, the fits of all models at once, the fast estimate and their helpers.
  /^shared\/models\/(catalog|fitAllModels|estimateCurve|finishFit|prepareSite|plateauEstimate|pureError|responseOverCheck)\.ts$/,
  // Each model's fits (its curve facts are in shared/models/curves/, which is allowed).
  /^shared\/models\/(linear|proportional|quadratic|linearPlateau|quadraticPlateau|exponential)\.ts$/,
  /^shared\/models\/solve\//,
  /^shared\/economics\/bootstrap(Draws|Optimum)\.ts$/,
  /^shared\/optimize\//,
  /^shared\/stats\/(leastSquares|qr|rateBlockModel|randomizedBlockAnova|oneWayAnova|interceptTest)\.ts$/,
];

/** Files besides shared/report/ that must load no fitter: the curve half and the pricing. */
const CURVE_READERS = [
  'shared/models/curves.ts',
  'shared/models/curveValue.ts',
  'shared/models/modelCurve.ts',
  'shared/economics/economicOptimum.ts',
];

function isFitting(file: string): boolean {
  return FITTING.some((pattern) => pattern.test(file));
}

/**
 * Every start file's shortest import chain to a fitting module, written `a → b → c`.
 * @param graph the runtime import graph
 * @param starts the files that must load no fitter
 */
function fittingChains(graph: ImportGraph, starts: readonly string[]): string[] {
  const chains: string[] = [];
  for (const start of starts) {
    const chain = importChain(graph, start, isFitting);
    if (chain) chains.push(chain.join(' → '));
  }
  return chains;
}

describe('shared/report/ loads no fitting code', () => {
  const { graph } = readImportGraph(ROOT, ['shared'], { runtimeOnly: true });
  const reportFiles = [...graph.keys()].filter((file) => file.startsWith('shared/report/'));

  it('reads the report and finds every fitting module it names', () => {
    expect(reportFiles.length).toBeGreaterThan(15);
    for (const file of CURVE_READERS) expect(graph.has(file), file).toBe(true);
    // A pattern that matches no file would let a renamed fitter through unnoticed.
    const files = [...graph.keys()];
    for (const pattern of FITTING)
      expect(
        files.some((file) => pattern.test(file)),
        String(pattern),
      ).toBe(true);
  });

  it('reaches no fitting module from any report file or curve reader', () => {
    const chains = fittingChains(graph, [...reportFiles, ...CURVE_READERS]);
    expect(chains, `fitting code reachable:\n${chains.join('\n')}`).toEqual([]);
  });
});

describe('fittingChains', () => {
  it('names the chain from a report file to estimateCurve, and passes a clean graph', () => {
    const graph: ImportGraph = new Map([
      ['shared/report/trialReport.ts', ['shared/report/unitScale.ts']],
      ['shared/report/unitScale.ts', ['shared/models/curves.ts', 'shared/analysis/helper.ts']],
      ['shared/models/curves.ts', ['shared/models/curves/linear.ts']],
      ['shared/models/curves/linear.ts', []],
      ['shared/analysis/helper.ts', ['shared/models/estimateCurve.ts']],
      ['shared/models/estimateCurve.ts', ['shared/models/catalog.ts']],
    ]);
    expect(fittingChains(graph, ['shared/report/trialReport.ts'])).toEqual([
      'shared/report/trialReport.ts → shared/report/unitScale.ts → shared/analysis/helper.ts → shared/models/estimateCurve.ts',
    ]);
    graph.set('shared/analysis/helper.ts', ['shared/models/curves.ts']);
    expect(fittingChains(graph, ['shared/report/trialReport.ts'])).toEqual([]);
  });

  it('tells the curve files from the fit files of the same name', () => {
    expect(isFitting('shared/models/linearPlateau.ts')).toBe(true);
    expect(isFitting('shared/models/curves/linearPlateau.ts')).toBe(false);
    expect(isFitting('shared/models/solve/searchJoinPoint.ts')).toBe(true);
    expect(isFitting('shared/stats/distributions.ts')).toBe(false);
  });
});

describe('readImportGraph with runtimeOnly', () => {
  it('leaves out type-only imports and keeps what still loads a module', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plotrate-runtime-'));
    const write = (name: string, text: string) => writeFileSync(join(dir, name), text);
    write('fit.ts', 'export type Fit = number;\nexport const fit = 1;\n');
    write('typeOnly.ts', "import type { Fit } from './fit';\nexport type A = Fit;\n");
    write('reExportType.ts', "export type { Fit } from './fit';\n");
    // Under verbatimModuleSyntax this compiles to `import {} from './fit'`: still loaded.
    write('inlineType.ts', "import { type Fit } from './fit';\nexport type B = Fit;\n");
    write('value.ts', "import { fit } from './fit';\nexport const c = fit;\n");
    write('lazy.ts', "export const load = () => import('./fit');\n");
    write('typeQuery.ts', "export type D = typeof import('./fit');\n");
    const runtime = readImportGraph(dir, ['.'], { runtimeOnly: true }).graph;
    const all = readImportGraph(dir, ['.']).graph;
    const importsFit = (graph: ImportGraph) =>
      [...graph.keys()].filter((file) => graph.get(file)!.includes('fit.ts')).sort();
    expect(importsFit(runtime)).toEqual(['inlineType.ts', 'lazy.ts', 'value.ts']);
    expect(importsFit(all)).toEqual([
      'inlineType.ts',
      'lazy.ts',
      'reExportType.ts',
      'typeOnly.ts',
      'typeQuery.ts',
      'value.ts',
    ]);
  });
});
