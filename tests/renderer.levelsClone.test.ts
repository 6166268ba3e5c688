// The window gets the analysis from the worker by structured clone (postMessage); a rate × timing
// trial's levels (TrialAnalysis.levels: typed arrays, fits, draws, level tests) must arrive
// whole, so the window prices them as the command line does. The worker's analyze job runs here
// under Node, its output goes through the platform's structuredClone (the HTML algorithm
// postMessage uses), and the priced levels of the copy are compared with the original's.
import { describe, expect, it } from 'vitest';
import { PENDING_REASON } from '../shared/analysis/acrossSites';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import {
  analyzeTrial,
  withDraws,
  withRegionalModels,
  type TrialRegionalModels,
} from '../shared/analysis/analyzeTrial';
import { priceTrial } from '../shared/analysis/priceTrial';
import { demoTimingCsv } from '../shared/demo/demoTiming';
import { illustrativePrices } from '../shared/economics/illustrativePrices';
import { importFiles } from '../shared/import/importFiles';
import { jobHandlers } from '../renderer/src/worker/jobs';
import type { AnalysisPartial } from '../renderer/src/analysis/siteAnalysis';

describe('the worker’s analysis of a rate × timing trial', () => {
  it('keeps every level through structured clone, priced alike in the window', async () => {
    const { table } = await importFiles(
      [{ name: 'wrenhollow-timing-2025.csv', bytes: new TextEncoder().encode(demoTimingCsv()) }],
      { crop: 'corn', overrides: [] },
    );
    const prices = illustrativePrices('corn').canonical;
    const settings = analysisSettings({ prices, resamples: 40, seed: 5, blocks: 'auto' });
    const partials: AnalysisPartial[] = [];
    const ctx = {
      progress: async () => {},
      cancelled: false,
      partial: async (partial: unknown) => {
        partials.push(structuredClone(partial) as AnalysisPartial);
      },
    };
    const models = (await jobHandlers.analyze(
      { table, settings } as never,
      ctx,
    )) as TrialRegionalModels;
    // The window completes the preview with the draws and what the job returns (all cloned, as
    // postMessage does).
    expect(partials.map((p) => p.kind)).toEqual(['sites', 'draws']);
    const [sites, draws] = partials as [
      Extract<AnalysisPartial, { kind: 'sites' }>,
      Extract<AnalysisPartial, { kind: 'draws' }>,
    ];
    const output = withRegionalModels(
      withDraws(sites.analysis, draws.draws),
      structuredClone(models),
    );
    expect(output).toEqual(analyzeTrial(table, settings));
    // The preview the window shows first: the same sites without their draws, the same levels,
    // the regional models pending.
    const preview = sites.analysis;
    expect(preview.across.sites.map((s) => ({ ...s, draws: null }))).toEqual(
      output.across.sites.map((s) => ({ ...s, draws: null })),
    );
    expect(preview.across.sites.every((s) => s.draws === null)).toBe(true);
    expect(output.across.sites.every((s) => s.draws !== null)).toBe(true);
    expect(preview.levels).toEqual(output.levels);
    expect(preview.across.mixed).toEqual({ model: null, reason: PENDING_REASON });
    expect(output.across.mixed).not.toHaveProperty('reason', PENDING_REASON);
    expect(output.levels.map((l) => [l.site, l.factor, l.levels.map((x) => x.level)])).toEqual([
      ['Larkspur Bottom', 'Timing', ['At planting', 'Split (V6)']],
      ['Fennimore Rise', 'Timing', ['At planting', 'Split (V6)']],
    ]);
    const copy = structuredClone(output);
    expect(copy.levels).toEqual(output.levels);
    expect(copy.levels[0].levels[0].plots.rateKgHa).toBeInstanceOf(Float64Array);
    const here = priceTrial(output, prices, {}).levels;
    const there = priceTrial(copy, prices, {}).levels;
    expect(there).toEqual(here);
    expect(there[0].comparison.best).not.toBeNull();
  });
});
